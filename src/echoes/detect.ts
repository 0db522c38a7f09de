// Stage 3: echoes detected on the envelope of a band response.
//   1. Local maxima of the sampled envelope above the floor (relative to the incident band pulse's own
//      envelope peak), each refined to its exact maximum.
//   2. A peak that the band pulse's own shape can explain from a stronger peak (it lies under that
//      peak's main lobe or sidelobes, `leakBeyond`, with a factor 2 to spare) is part of that peak.
//   3. Peaks closer than one pulse width (FWHM) are one echo: the strongest speaks for the group (two
//      paths that close interfere into humps that are not where either path is). In front of delay
//      −width/10 a group is represented by its strongest member after that time when there is one
//      within 6 dB (nothing arrives before the front face; such humps come from interference).

import { bandPulse, leakBeyond } from './band-pulse.ts';
import type { BandSpectrum } from './band-response.ts';
import { type AnalyticSamples, analyticAt, envelopePeak, sampleTime } from './envelope.ts';
import { localMaxima } from './peaks.ts';

export interface Peak {
  t_s: number;
  /** Envelope relative to the incident band pulse's peak. */
  level: number;
  /** Analytic signal there, relative to the same peak (its phase is the echo's phase at the band centre). */
  re: number;
  im: number;
}

/** One detected echo: the peak that represents it and every peak merged into it. */
export interface DetectedEcho extends Peak { members: Peak[] }

export interface DetectOptions {
  /** Floor relative to the incident band pulse's envelope peak (linear). */
  floor: number;
  /** Search window of delays (s). */
  earliest_s: number;
  latest_s: number;
}

/** A peak within this factor of the band pulse's own leakage from a stronger peak is that peak's. */
const LEAK_MARGIN = 2;
/** Humps of a group earlier than this many widths before delay 0 yield to a later member within 6 dB. */
const EARLIEST_WIDTHS = 0.1;

export function refinedPeaks(S: BandSpectrum, a: AnalyticSamples, o: DetectOptions, width_s: number): Peak[] {
  const from = Math.floor(o.earliest_s / a.step_s), to = Math.ceil(o.latest_s / a.step_s);
  const raw = localMaxima(a.mag, 0.7 * o.floor * S.peak, from, to + 1);
  const out: Peak[] = [];
  for (const m of raw) {
    const t = sampleTime(a, m);
    const r = envelopePeak(S, t - a.step_s, t + a.step_s, 1e-7 * width_s);
    const level = r.value / S.peak;
    if (!(level >= o.floor) || r.t < o.earliest_s || r.t > o.latest_s) continue;
    const z = analyticAt(S, r.t);
    out.push({ t_s: r.t, level, re: z.re / S.peak, im: z.im / S.peak });
  }
  return out;
}

/** Peaks explained by a stronger peak's own shape are dropped; the rest are grouped within one pulse width. */
export function groupPeaks(peaks: Peak[], band_Hz: readonly [number, number]): DetectedEcho[] {
  const B = band_Hz[1] - band_Hz[0], width = bandPulse(band_Hz).width_s;
  const byLevel = peaks.slice().sort((p, q) => q.level - p.level);
  const kept: Peak[] = [];
  for (const p of byLevel) {
    if (kept.some((q) => p.level <= LEAK_MARGIN * leakBeyond(p.t_s - q.t_s, B) * q.level)) continue;
    kept.push(p);
  }
  const groups: Peak[][] = [];
  for (const p of kept) {
    const g = groups.find((members) => Math.abs(members[0].t_s - p.t_s) < width);
    if (g) g.push(p); else groups.push([p]);
  }
  return groups.map((members) => {
    let rep = members[0];
    if (rep.t_s < -EARLIEST_WIDTHS * width) {
      const later = members.find((m) => m.t_s >= -EARLIEST_WIDTHS * width && m.level >= 0.5 * rep.level);
      if (later) rep = later;
    }
    return { ...rep, members: members.slice().sort((p, q) => p.t_s - q.t_s) };
  }).sort((p, q) => p.t_s - q.t_s);
}

export function detectEchoes(S: BandSpectrum, a: AnalyticSamples, band_Hz: readonly [number, number], o: DetectOptions): DetectedEcho[] {
  return groupPeaks(refinedPeaks(S, a, o, bandPulse(band_Hz).width_s), band_Hz);
}
