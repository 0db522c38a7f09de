// Stage 3: echoes detected on the envelope of a band response.
//   1. The envelope is searched from delay −width/10 on: nothing arrives before the incident pulse, and
//      what the band-limited envelope shows earlier is interference of paths closer than the resolution
//      (a thin layer's front and back face nearly cancel into humps either side of them). Its local
//      maxima above the floor (relative to the incident band pulse's own envelope peak) are refined to
//      their exact maxima; where the envelope falls from the start of the window, that start is a peak.
//   2. A peak that the band pulse's own shape can explain from a stronger peak (it lies under that
//      peak's main lobe or sidelobes, `leakBeyond`, with a factor 2 to spare) is part of that peak.
//   3. Peaks closer than one pulse width (FWHM) are one echo: the strongest speaks for the group (two
//      paths that close interfere into humps that are not where either path is).

import { bandPulse, leakBeyond } from './band-pulse.ts';
import type { BandSpectrum } from './band-response.ts';
import { type AnalyticSamples, analyticAt, envelopeAt, envelopePeak, sampleTime } from './envelope.ts';
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
  /** Search window of delays (s); −width/10 (EARLIEST_WIDTHS) in the echo tables. */
  earliest_s: number;
  latest_s: number;
}

/** A peak within this factor of the band pulse's own leakage from a stronger peak is that peak's. */
const LEAK_MARGIN = 2;
/** The envelope is searched from this many pulse widths before delay 0. */
export const EARLIEST_WIDTHS = 0.1;

export function refinedPeaks(S: BandSpectrum, a: AnalyticSamples, o: DetectOptions, width_s: number): Peak[] {
  const from = Math.ceil(o.earliest_s / a.step_s), to = Math.ceil(o.latest_s / a.step_s);
  const peak = (t: number, level: number): Peak => { const z = analyticAt(S, t); return { t_s: t, level, re: z.re / S.peak, im: z.im / S.peak }; };
  const out: Peak[] = [];
  for (const m of localMaxima(a.mag, 0.7 * o.floor * S.peak, from, to + 1)) {
    const t = sampleTime(a, m);
    const r = envelopePeak(S, Math.max(o.earliest_s, t - a.step_s), t + a.step_s, 1e-7 * width_s);
    const level = r.value / S.peak;
    if (level >= o.floor && r.t >= o.earliest_s && r.t <= o.latest_s) out.push(peak(r.t, level));
  }
  // the window's start, when the envelope falls from it (unless a refined peak already sits there)
  const start = envelopeAt(S, o.earliest_s) / S.peak;
  if (start >= o.floor && start > envelopeAt(S, o.earliest_s + 1e-3 * width_s) / S.peak && !out.some((p) => p.t_s - o.earliest_s < 1e-3 * width_s)) {
    out.unshift(peak(o.earliest_s, start));
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
  return groups.map((members) => ({ ...members[0], members: members.slice().sort((p, q) => p.t_s - q.t_s) }))
    .sort((p, q) => p.t_s - q.t_s);
}

export function detectEchoes(S: BandSpectrum, a: AnalyticSamples, band_Hz: readonly [number, number], o: DetectOptions): DetectedEcho[] {
  return groupPeaks(refinedPeaks(S, a, o, bandPulse(band_Hz).width_s), band_Hz);
}
