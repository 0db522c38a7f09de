// How long a pulse run lasts, estimated before anything is allocated: the source, the transits the probes
// can still see, the ring-down of resonant layers and the relaxation of the slowest pole.
//
// Loss-aware: a path counts only while the wave that takes it is above a small fraction of the accuracy
// target at the probes (one-way amplitude for T, round trip for R, at the band frequency that loses least),
// so the far side of a wall that swallows the wave costs no steps. The run itself ends when its spectra have
// settled and its stored energy has decayed (run.ts); this sets its expected length (progress, record
// capacity) and its step limit (three times the expectation).

import { ETA0_ohm, C0_m_per_s } from '../units.ts';
import { type Complex } from '../complex.ts';
import { type LineMedium, type StepModel, lineAdmittance, lineIndex } from './media.ts';
import { type PulseShape, pulseSpectrumRelative } from './pulse.ts';
import type { EffectiveStack } from './types.ts';

/** A path is seen by the probes while its amplitude is above this fraction of the accuracy target. */
const VISIBLE_FRACTION = 0.01;
/** Per-round-trip amplitude retention is capped here when estimating ring-down (keeps times finite). */
const MAX_RETENTION = 0.98;
/** For the ring-down, a sheet this close to a face (in metres per shortest wavelength) acts at that face. */
const SHEET_NEAR_FACE = 0.01;
/** A pole slower than this many times the other times is treated as never relaxing for the limit's sake. */
const LOSSLESS_LIMIT_FACTOR = 10;

export interface StepEstimate {
  /** Time the run is expected to need, s. */
  expected_s: number;
  /** Time without ring-down and relaxation (the least a run can take), s. */
  minimum_s: number;
  /** Slowest amplitude time constant of any pole in the stepped media, s (Infinity for a lossless pole). */
  slowestRelaxation_s: number;
  /** Step limit (three times the expectation, at least 500 steps more). */
  limit_s: number;
}

/** Slowest amplitude time constant of a line medium's poles, both sides. */
export const slowestRelaxation = (m: LineMedium): number => Math.max(slowestOf(m.shunt), slowestOf(m.series));

/** Slowest amplitude time constant of a model's poles: Debye τ; a second-order pole's slowest mode. */
function slowestOf(m: StepModel): number {
  let t = 0;
  for (const p of m.debye) t = Math.max(t, p.tau_s);
  for (const o of m.osc) {
    if (!(o.gamma > 0)) { t = Infinity; continue; }
    if (o.w0sq === 0) { t = Math.max(t, 1 / o.gamma); continue; } // Drude: the current decays as e^{−γt}
    const disc = (o.gamma * o.gamma) / 4 - o.w0sq;
    t = Math.max(t, disc > 0 ? 1 / (o.gamma / 2 - Math.sqrt(disc)) : 2 / o.gamma);
  }
  return t;
}

/** Index n − jk of a line medium (√(εμ)) and its admittance (√(ε/μ)). */
interface Index { n: number; k: number; y: Complex }
const indexOf = (m: LineMedium, f: number): Index => {
  const r = lineIndex(m, f);
  return { n: r.re, k: -r.im, y: lineAdmittance(m, f) };
};
/** |r| looking from a medium of admittance a into normalized admittance y (complex). */
function reflection(a: Complex, yRe: number, yIm: number): number {
  return Math.hypot(a.re - yRe, a.im - yIm) / Math.hypot(a.re + yRe, a.im + yIm);
}

export interface StepInputs {
  effective: EffectiveStack;
  band_Hz: [number, number];
  pulse: PulseShape;
  accuracy: number;
  decay_dB: number;
  /** Front gap (TF/SF plane to x = 0) and back gap (back face to the back PML), metres. */
  frontGap_m: number;
  backGap_m: number;
  /** Shortest wavelength the grid resolves, metres (sheets this close to a face act at it). */
  lambdaMin_m: number;
}

export function estimateSteps(s: StepInputs): StepEstimate {
  const { effective: eff, band_Hz: [f1, f2] } = s;
  const fMid = (f1 + f2) / 2;
  const segs = eff.segments;
  const visible = VISIBLE_FRACTION * s.accuracy;
  // Attenuation (Np/m) at the band frequency that loses least (bottom, middle or top).
  const alpha = (m: LineMedium): number => Math.min(...[f1, fMid, f2].map((f) => (2 * Math.PI * f * indexOf(m, f).k) / C0_m_per_s));
  const passing = (m: LineMedium, d: number): number => Math.exp(-alpha(m) * d);
  let amplitude = 1, seenTrip = 0, ring = 0, worstRho = 0, fullTrip = 0;
  for (let i = 0; i < segs.length; i++) {
    const g = segs[i], d = g.x1_m - g.x0_m, me = indexOf(g.model, fMid);
    const t = (d * me.n) / C0_m_per_s;
    fullTrip += t;
    if (amplitude * amplitude < visible) continue; // its echoes never reach the front probe
    // Echoes from deeper than this come back below the threshold.
    const a = alpha(g.model), seen = a > 0 ? Math.min(d, Math.log((amplitude * amplitude) / visible) / (2 * a)) : d;
    seenTrip += (2 * t * seen) / d;
    const rho = Math.min(MAX_RETENTION, faceReflection(s, i, g.x0_m, -1, me) * faceReflection(s, i, g.x1_m, 1, me) * passing(g.model, d) ** 2);
    worstRho = Math.max(worstRho, rho);
    if (rho > 0) ring = Math.max(ring, ((s.decay_dB + 10) / (-20 * Math.log10(rho))) * 2 * t);
    amplitude *= passing(g.model, d);
  }
  if (worstRho > 0) ring = Math.max(ring, ((s.decay_dB + 10) / (-20 * Math.log10(worstRho))) * seenTrip);
  const frontN = indexOf(eff.front, fMid).n;
  let transit = (s.frontGap_m * frontN) / C0_m_per_s + seenTrip / 2;
  // The transmitted wave counts when it reaches the back probe above the threshold.
  if (eff.back !== 'pec' && amplitude >= visible) transit = Math.max(transit, (s.frontGap_m * frontN) / C0_m_per_s + fullTrip);
  if (eff.back !== 'pec') transit += (s.backGap_m * indexOf(eff.back, fMid).n) / C0_m_per_s;
  const minimum = s.pulse.end_s + 2 * transit;
  const media = [eff.front, ...segs.map((g) => g.model), ...(eff.back === 'pec' ? [] : [eff.back])];
  const slowest = Math.max(0, ...media.map(slowestRelaxation));
  // A pole slower than the pulse's lowest content is barely excited (the pulse has no DC): its relaxation is
  // counted at most up to that content's period (the TM line of a faintly conducting layer has τ = ε0ε′/σ).
  const relaxation = Number.isFinite(slowest) ? (Math.min(slowest, slowestExcited(s.pulse)) * s.decay_dB * Math.LN10) / 20 : 0;
  const expected = minimum + ring + relaxation;
  const limit = 3 * expected + (Number.isFinite(slowest) ? 0 : LOSSLESS_LIMIT_FACTOR * expected);
  return { expected_s: expected, minimum_s: minimum, slowestRelaxation_s: slowest, limit_s: limit };
}

/** Content of the pulse below this fraction of its peak excites nothing that matters. */
const EXCITED_LEVEL = 1e-6;

/** The slowest time constant the pulse excites: 1/(2π f) at the lowest f where its spectrum is above EXCITED_LEVEL. */
export function slowestExcited(pulse: PulseShape): number {
  const peak = pulseSpectrumRelative(pulse, pulse.f0_Hz);
  let f = pulse.f0_Hz;
  while (f > pulse.f0_Hz * 1e-3 && pulseSpectrumRelative(pulse, f / 1.05) > EXCITED_LEVEL * peak) f /= 1.05;
  return 1 / (2 * Math.PI * f);
}

/** |r| seen from inside segment i at its face x (dir −1: front face, +1: back face), sheets at the face included. */
function faceReflection(s: StepInputs, i: number, x: number, dir: -1 | 1, me: Index): number {
  const eff = s.effective, fMid = (s.band_Hz[0] + s.band_Hz[1]) / 2;
  const j = i + dir;
  let y: Complex;
  if (j < 0) y = indexOf(eff.front, fMid).y;
  else if (j >= eff.segments.length) {
    if (eff.back === 'pec') return 1;
    y = indexOf(eff.back, fMid).y;
  } else y = indexOf(eff.segments[j].model, fMid).y;
  // A conductor film's sheet sits at the film's centre, microns behind the face, and still closes the layer.
  let g = 0;
  for (const sh of eff.sheets) {
    const beyond = dir * (sh.x_m - x);
    if (beyond >= -1e-12 && beyond <= SHEET_NEAR_FACE * s.lambdaMin_m) g += sh.conductance_S * ETA0_ohm;
  }
  return reflection(me.y, y.re + g, y.im);
}
