// Stage 4b: each bounce path's own echo, as the band pulse would show it. A path's amplitude over the
// band (lattice.ts, exact coefficients and propagators) times the band pulse's spectrum is that path's
// band response; its envelope peak is where the path's echo appears — for a lossy, dispersive layer
// that is not 2 d √ε′/c but wherever loss and dispersion over the band put it — and its height is
// the path's level. The same window and normalization as the measured response (band-response.ts),
// on the lattice's own frequencies (a uniform midpoint grid over the band).

import { bandWindow } from './band-pulse.ts';
import { type UniformSpectrum, analyticAt, envelopeAt, envelopePeak } from './envelope.ts';
import type { PathSet } from './lattice.ts';

/** Frequencies of the lattice: F midpoints of equal parts of the band. */
export function latticeFrequencies(band_Hz: readonly [number, number], F: number): Float64Array {
  const B = band_Hz[1] - band_Hz[0];
  return Float64Array.from({ length: F }, (_, l) => band_Hz[0] + ((l + 0.5) * B) / F);
}

export interface PredictedPaths {
  set: PathSet;
  /** Path p's amplitudes times W(f_l)/Σ W: its band spectrum (re/im[p · F + l]). */
  weighted: { re: Float64Array; im: Float64Array };
  /** Each path's own envelope peak: delay (s), level relative to the incident band pulse, analytic value. */
  t_s: Float64Array;
  level: Float64Array;
  re: Float64Array;
  im: Float64Array;
}

type Weighted = Pick<PredictedPaths, 'set' | 'weighted'>;

/** Path p's band spectrum (views, no copy). */
export function pathSpectrum(P: Weighted, p: number): UniformSpectrum {
  const f = P.set.f_Hz, F = f.length;
  return { f_first_Hz: f[0], df_Hz: F > 1 ? f[1] - f[0] : 0, re: P.weighted.re.subarray(p * F, (p + 1) * F), im: P.weighted.im.subarray(p * F, (p + 1) * F) };
}

/** z_p(t): the band response of path p at one time (relative to the incident band pulse's peak). */
export const pathAt = (P: Weighted, p: number, t_s: number): { re: number; im: number } => analyticAt(pathSpectrum(P, p), t_s);

/** The band spectrum of a group of paths (their sum). */
export function groupSpectrum(P: Weighted, group: readonly number[]): UniformSpectrum {
  const first = pathSpectrum(P, 0), F = first.re.length;
  const re = new Float64Array(F), im = new Float64Array(F);
  for (const p of group) { const s = pathSpectrum(P, p); for (let l = 0; l < F; l++) { re[l] += s.re[l]; im[l] += s.im[l]; } }
  return { f_first_Hz: first.f_first_Hz, df_Hz: first.df_Hz, re, im };
}

/** The highest envelope peak of a spectrum within ±span of t_s: sampled every quarter pulse width, then refined. */
export function peakNear(S: UniformSpectrum, t_s: number, span_s: number, width_s: number): { t: number; value: number } {
  const step = width_s / 4, n = Math.max(2, Math.ceil((2 * span_s) / step));
  let best = t_s, bestValue = -1;
  for (let i = 0; i <= n; i++) {
    const t = t_s - span_s + (2 * span_s * i) / n, v = envelopeAt(S, t);
    if (v > bestValue) { bestValue = v; best = t; }
  }
  const h = (2 * span_s) / n;
  const r = envelopePeak(S, best - h, best + h, 1e-7 * width_s);
  return r.value >= bestValue ? r : { t: best, value: bestValue };
}

/**
 * The local envelope maximum nearest t_s within ±within_s (sampled every twentieth of a pulse width,
 * then refined), or null when the envelope has none there (it only rises towards a stronger echo).
 */
export function nearestPeak(S: UniformSpectrum, t_s: number, within_s: number, width_s: number): { t: number; value: number } | null {
  const step = width_s / 20, n = Math.ceil(within_s / step);
  const v = Float64Array.from({ length: 2 * n + 3 }, (_, i) => envelopeAt(S, t_s + (i - n - 1) * step));
  let best = -1;
  for (let i = 1; i < v.length - 1; i++) {
    if (v[i] >= v[i - 1] && v[i] > v[i + 1] && (best < 0 || Math.abs(i - n - 1) < Math.abs(best - n - 1))) best = i;
  }
  if (best < 0) return null;
  const t = t_s + (best - n - 1) * step;
  return envelopePeak(S, t - step, t + step, 1e-7 * width_s);
}

/** The highest envelope peak of a group of paths' summed band responses within ±span of t_s. */
export const groupPeak = (P: Weighted, group: readonly number[], t_s: number, span_s: number, width_s: number): { t: number; value: number } =>
  peakNear(groupSpectrum(P, group), t_s, span_s, width_s);

/** Half-width (in pulse widths) of the bracket searched for a path's own peak around its band-centre delay. */
const MAIN_LOBE = 0.75;

/**
 * Every path's own echo: its envelope peak near its band-centre delay. A path
 * that cannot reach `relevant` (Σ_l W_l |A_p(f_l)|, an upper bound of its envelope, stays below) keeps
 * its band-centre delay and its envelope there, without the search.
 */
export function predictPaths(set: PathSet, band_Hz: readonly [number, number], width_s: number, relevant = 0): PredictedPaths {
  const F = set.f_Hz.length, n = set.delay0_s.length;
  const weight = Float64Array.from(set.f_Hz, (f) => bandWindow(f, band_Hz));
  const sum = weight.reduce((a, b) => a + b, 0);
  const re = new Float64Array(n * F), im = new Float64Array(n * F);
  for (let i = 0; i < n * F; i++) { const w = weight[i % F] / sum; re[i] = set.re[i] * w; im[i] = set.im[i] * w; }
  const out: PredictedPaths = { set, weighted: { re, im }, t_s: new Float64Array(n), level: new Float64Array(n), re: new Float64Array(n), im: new Float64Array(n) };
  for (let p = 0; p < n; p++) {
    const S = pathSpectrum(out, p);
    let bound = 0;
    for (let l = 0; l < F; l++) bound += Math.hypot(S.re[l], S.im[l]);
    // the main lobe is unimodal out to its first null (1.48 widths): Newton from the band-centre delay
    const d0 = set.delay0_s[p];
    const t = bound >= relevant ? envelopePeak(S, d0 - MAIN_LOBE * width_s, d0 + MAIN_LOBE * width_s, 1e-7 * width_s).t : d0;
    const z = analyticAt(S, t);
    out.t_s[p] = t; out.level[p] = Math.hypot(z.re, z.im); out.re[p] = z.re; out.im[p] = z.im;
  }
  return out;
}
