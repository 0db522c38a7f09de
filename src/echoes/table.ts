// The echo tables of a pulse run: the stages in order.
//   band-response.ts   records → band spectra W·R and W·T (the response to the clean band pulse)
//   envelope.ts        analytic signal and envelope of each
//   detect.ts          envelope peaks above the floor, grouped within one pulse width
//   lattice.ts         bounce paths over the band, exact coefficients and propagators
//   paths.ts           each path's own echo through the same band pulse
//   attribute.ts       which paths each echo is
// Delays are measured from the incident pulse's arrival at x = 0 (so the front-face echo is at 0 and a
// transmitted echo's delay is its time through the stack); levels are envelope peaks relative to the
// incident band pulse's own peak.

import type { PulseRecords } from '../spectra/records.ts';
import { trimmed } from '../spectra/records.ts';
import type { Stack } from '../stack/types.ts';
import { attributeEchoes, type AttributedEcho } from './attribute.ts';
import { type BandPulse, bandPulse, envelopeShape } from './band-pulse.ts';
import { bandRecords, type BandSpectrum } from './band-response.ts';
import { detectEchoes, EARLIEST_WIDTHS } from './detect.ts';
import { type AnalyticSamples, analyticSamples, envelopePeak, sampleIndex } from './envelope.ts';
import { layerGroupDelays_s } from './delays.ts';
import { latticePaths, type PathSet } from './lattice.ts';
import { MAX_PATH_CHARS, type RowName, reflectedPathName, rowText, transmittedPathName } from './names.ts';
import { latticeFrequencies, predictPaths, type PredictedPaths } from './paths.ts';

/** A bounce path's own echo through the band pulse; `crossings` counts its crossings of each bulk layer. */
export interface PathEcho { path: string; t_s: number; level_dB: number; crossings: Int32Array }

/** One table (reflected or transmitted), a row per echo in order of delay. */
export interface EchoTable {
  t_s: Float64Array;
  level_dB: Float64Array;
  /** |a| with the sign of Re a; a = the analytic signal at the peak over the incident band pulse's peak. */
  amplitude: Float64Array;
  amplitude_re: Float64Array;
  amplitude_im: Float64Array;
  predicted_t_s: Float64Array;
  /** Path text of at most 80 characters; "unexplained" when no path accounts for the echo. */
  path: string[];
  /** Every path of each row in full, in order of arrival, with its own echo's delay and level. */
  members: PathEcho[][];
  /** For an unexplained echo, the path whose echo is nearest in time; else "". */
  nearest_path: string[];
  /** False when the row stands for paths closer than the resolution. */
  resolved: boolean[];
  /** Paths whose echoes reach the floor but that no detected echo took (their echoes merge into a neighbour's). */
  unseen: PathEcho[];
  /**
   * How far the paths followed fall short of the whole response: max over the lattice's frequencies of
   * |Σ paths − exact R (or T)|. Small (below the floor) when every path that matters was followed; large
   * when the lattice had to drop too many (a stack of many layers of equal delay, such as a quarter-wave
   * mirror, has more paths of each delay than can be followed): names and predictions are then incomplete.
   */
  lattice_residual: number;
}

/** Envelopes for display on the run's own time axis (t = 0 at the start of the run), relative to the incident band pulse's peak. */
export interface EchoEnvelopes {
  t_s: Float64Array;
  incident: Float64Array;
  reflected: Float64Array;
  transmitted: Float64Array | null;
}

export interface EchoAnalysis {
  reflected: EchoTable;
  /** Null behind a conductor. */
  transmitted: EchoTable | null;
  pulse: BandPulse;
  floor_dB: number;
  /** Arrival of the incident pulse at x = 0 (s from the start of the run): delay 0. */
  incidentAt_s: number;
  envelopes: EchoEnvelopes;
  /** One-way group delay of each bulk layer at the band centre, the lattice's own (empty without a pulse). */
  layerDelays_s: Float64Array;
}

export interface EchoOptions {
  /** Floor for echoes, dB relative to the incident band pulse's envelope peak. Default −40. */
  floor_dB?: number;
  /** Lattice frequencies over the band (their spacing B/16 makes each path's response repeat every 6 pulse widths). Default 16. */
  latticeFrequencies?: number;
}

export const DEFAULT_FLOOR_dB = -40;
/** Layers whose delays differ by less than this many pulse widths are one class when the lattice merges paths. */
const SAME_DELAY_WIDTHS = 5e-3;
/** Waves this far below the floor (20 dB) are not followed further through the lattice. */
const LATTICE_BELOW_FLOOR = 0.1;
/** A stack whose round trip is below this fraction of the pulse width has its single bounces followed only. */
const THIN_STACK_WIDTHS = 0.01;

export function emptyEchoTable(): EchoTable {
  const z = () => new Float64Array(0);
  return { t_s: z(), level_dB: z(), amplitude: z(), amplitude_re: z(), amplitude_im: z(), predicted_t_s: z(), path: [], members: [], nearest_path: [], resolved: [], unseen: [], lattice_residual: 0 };
}

/** The analysis of records too short or empty to hold a pulse: no rows, no envelopes. */
function emptyAnalysis(stack: Stack, pulse: BandPulse, floor_dB: number): EchoAnalysis {
  const none = new Float64Array(0);
  return {
    reflected: emptyEchoTable(), transmitted: stack.back === 'pec' ? null : emptyEchoTable(), pulse, floor_dB, incidentAt_s: 0,
    envelopes: { t_s: none, incident: none, reflected: none, transmitted: stack.back === 'pec' ? null : none },
    layerDelays_s: none,
  };
}

/** The incident pulse's arrival: the peak of its own band-limited envelope (W·incident spectrum). */
function arrival(incident: BandSpectrum, record: Float64Array, dt_s: number, width_s: number): number {
  // the record's largest sample lies within half a carrier period of it; its envelope is one lobe there
  let k0 = 0;
  for (let k = 1; k < record.length; k++) if (Math.abs(record[k]) > Math.abs(record[k0])) k0 = k;
  return envelopePeak(incident, k0 * dt_s - width_s / 2, k0 * dt_s + width_s / 2, 1e-7 * width_s).t;
}

type Namer = (stack: Stack, crossings: ArrayLike<number>, compact?: boolean) => string;

function tableOf(rows: AttributedEcho[], unseen: number[], P: PredictedPaths, stack: Stack, name: Namer): EchoTable {
  const full = (p: number) => name(stack, P.set.crossings[p]);
  const named = (p: number): RowName => ({ full: full(p), compact: name(stack, P.set.crossings[p], true), t_s: P.t_s[p], level: P.level[p] });
  const echo = (p: number): PathEcho => ({ path: full(p), t_s: P.t_s[p], level_dB: 20 * Math.log10(P.level[p]), crossings: P.set.crossings[p] });
  const t: EchoTable = {
    t_s: Float64Array.from(rows, (r) => r.echo.t_s),
    level_dB: Float64Array.from(rows, (r) => 20 * Math.log10(r.echo.level)),
    amplitude: Float64Array.from(rows, (r) => (r.echo.re >= 0 ? 1 : -1) * r.echo.level),
    amplitude_re: Float64Array.from(rows, (r) => r.echo.re),
    amplitude_im: Float64Array.from(rows, (r) => r.echo.im),
    predicted_t_s: Float64Array.from(rows, (r) => r.predicted_t_s),
    path: rows.map((r) => (r.paths.length ? rowText(r.paths.map(named), MAX_PATH_CHARS) : 'unexplained')),
    members: rows.map((r) => r.paths.map(echo)),
    nearest_path: rows.map((r) => (r.paths.length === 0 && r.nearest >= 0 ? rowText([named(r.nearest)], MAX_PATH_CHARS) : '')),
    resolved: rows.map((r) => r.paths.length <= 1),
    unseen: unseen.map(echo),
    lattice_residual: 0,
  };
  return t;
}


interface Side { S: BandSpectrum; a: AnalyticSamples; set: PathSet; name: Namer }

function analyseSide(side: Side, stack: Stack, pulse: BandPulse, floor: number, latest_s: number): EchoTable {
  const band = pulse.band_Hz, B = band[1] - band[0];
  const earliest_s = -EARLIEST_WIDTHS * pulse.width_s;
  const echoes = detectEchoes(side.S, side.a, band, { floor, earliest_s, latest_s });
  const P = predictPaths(side.set, band, pulse.width_s, floor);
  const a = side.a, peak = side.S.peak;
  const envelope = (t: number) => a.mag[sampleIndex(a, t)] / peak;
  const { rows, unseen } = attributeEchoes(echoes, P, { floor, width_s: pulse.width_s, bandWidth_Hz: B, envelope, earliest_s });
  return { ...tableOf(rows, unseen, P, stack, side.name), lattice_residual: side.set.residual };
}

/** Envelope samples on the run's time axis, from t = 0 to the end of the records. */
function displayEnvelopes(a: AnalyticSamples, aT: AnalyticSamples | null, t_inc: number, end_s: number, pulse: BandPulse, peak: number, peakT: number): EchoEnvelopes {
  const B = pulse.band_Hz[1] - pulse.band_Hz[0];
  const first = Math.ceil(-t_inc / a.step_s), last = Math.floor((end_s - t_inc) / a.step_s);
  const n = Math.max(0, last - first + 1);
  const out: EchoEnvelopes = { t_s: new Float64Array(n), incident: new Float64Array(n), reflected: new Float64Array(n), transmitted: aT ? new Float64Array(n) : null };
  for (let i = 0; i < n; i++) {
    const d = (first + i) * a.step_s;
    out.t_s[i] = t_inc + d;
    out.incident[i] = Math.abs(envelopeShape(Math.PI * B * d));
    out.reflected[i] = a.mag[sampleIndex(a, d)] / peak;
    if (aT && out.transmitted) out.transmitted[i] = aT.mag[sampleIndex(aT, d)] / peakT;
  }
  return out;
}

export function analyseEchoes(stack: Stack, records: PulseRecords, options: EchoOptions = {}): EchoAnalysis {
  const pulse = bandPulse(stack.band_Hz);
  const floor_dB = options.floor_dB ?? DEFAULT_FLOOR_dB, floor = 10 ** (floor_dB / 20);
  const incident = trimmed(records.incident, records.count), reflected = trimmed(records.reflected, records.count);
  const trans = trimmed(records.transmitted, records.count);
  const withT = stack.back !== 'pec' && trans.some((v) => v !== 0);
  if (records.count < 8 || !(records.dt_s > 0) || !incident.some((v) => v !== 0)) return emptyAnalysis(stack, pulse, floor_dB);
  const end_s = records.count * records.dt_s;
  const b = bandRecords(incident, withT ? [reflected, trans] : [reflected], records.dt_s, stack.band_Hz);
  const t_inc = arrival(b.incident, incident, records.dt_s, pulse.width_s);
  const latest = end_s - t_inc;
  const F = options.latticeFrequencies ?? 16;
  // A stack whose round trip is far shorter than the pulse cannot separate even its front and back faces: all
  // its paths are one unresolved echo. Following its multiples would only enumerate ~width/round-trip bounces
  // (a 3 mm wall at 1–2 MHz: 1.7e5 paths, 11 s, a 38 MB table), and between very lossy media, where a face's
  // |r| can pass 1, their series need not even converge (that wall's sums grew to 1e29): only the single
  // bounces are followed, and the lattice residual says how much of the response they leave out.
  const roundTrip_s = 2 * layerGroupDelays_s(stack, pulse.f0_Hz).reduce((a, x) => a + Math.abs(x), 0);
  const thin = roundTrip_s < THIN_STACK_WIDTHS * pulse.width_s;
  const lattice = latticePaths(stack, latticeFrequencies(stack.band_Hz, F), pulse.f0_Hz, {
    minAmplitude: LATTICE_BELOW_FLOOR * floor, maxDelay_s: latest + 2 * pulse.width_s, sameDelay_s: SAME_DELAY_WIDTHS * pulse.width_s,
    ...(thin ? { maxCrossings: 2 * stack.layers.length } : {}),
  });
  const aR = analyticSamples(b.responses[0], pulse.width_s);
  const aT = withT ? analyticSamples(b.responses[1], pulse.width_s) : null;
  const reflectedTable = analyseSide({ S: b.responses[0], a: aR, set: lattice.reflected, name: reflectedPathName }, stack, pulse, floor, latest);
  const transmittedTable = aT ? analyseSide({ S: b.responses[1], a: aT, set: lattice.transmitted, name: transmittedPathName }, stack, pulse, floor, latest) : null;
  return {
    reflected: reflectedTable,
    transmitted: stack.back === 'pec' ? null : transmittedTable ?? emptyEchoTable(),
    pulse, floor_dB, incidentAt_s: t_inc,
    envelopes: displayEnvelopes(aR, aT, t_inc, end_s, pulse, b.responses[0].peak, aT ? b.responses[1].peak : 1),
    layerDelays_s: lattice.layerDelays_s,
  };
}

