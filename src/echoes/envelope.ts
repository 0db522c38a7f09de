// Stage 2: the analytic signal of a band spectrum and its envelope. The band spectrum holds positive
// frequencies only, so its inverse transform is already the analytic signal (the Hilbert transform
// pair of the real response); its modulus is the envelope. Two ways to evaluate it:
//   - on a uniform time grid by one inverse FFT (fft.js) of the bins shifted to baseband, zero-padded
//     for the sample spacing wanted (the carrier e^{j2π f_first t} is put back for the phase);
//   - at any one time exactly, as the sum over the bins.
// z(t) = Σ_k S_k e^{j2π f_k t}, so the incident band pulse has z(0) = Σ W = `peak`.
// For a raw time record (the workbench's clip timing), `envelope` gives the same by the FFT method.

import { type ComplexColumns, inverseFft, magnitude, nextPow2, realFft } from '../spectra/fft.ts';

/** A spectrum on uniformly spaced frequencies f_k = f_first + k·df (positive frequencies only). */
export interface UniformSpectrum {
  f_first_Hz: number;
  df_Hz: number;
  re: Float64Array;
  im: Float64Array;
}

/** z sampled at t = m·step_s, m = 0 … M − 1; the axis is periodic (1/df), so late samples are negative times. */
export interface AnalyticSamples extends ComplexColumns {
  step_s: number;
  period_s: number;
  /** |z| at each sample. */
  mag: Float64Array;
}

/** Samples of z(t) at least `perWidth` per pulse width (`width_s`) over one period. */
export function analyticSamples(S: UniformSpectrum, width_s: number, perWidth = 16): AnalyticSamples {
  const period = 1 / S.df_Hz, K = S.re.length;
  const M = nextPow2(Math.max(2 * K, Math.ceil((perWidth * period) / width_s)));
  const X = { re: new Float64Array(M), im: new Float64Array(M) };
  X.re.set(S.re); X.im.set(S.im);
  const z = inverseFft(X);
  const mag = new Float64Array(M);
  const w = (2 * Math.PI * S.f_first_Hz * period) / M;
  for (let m = 0; m < M; m++) {
    const c = Math.cos(w * m) * M, s = Math.sin(w * m) * M;
    const re = z.re[m] * c - z.im[m] * s, im = z.re[m] * s + z.im[m] * c;
    z.re[m] = re; z.im[m] = im;
    mag[m] = Math.hypot(re, im);
  }
  return { re: z.re, im: z.im, mag, step_s: period / M, period_s: period };
}

/** Time of sample m, with the second half of the period read as negative times. */
export const sampleTime = (a: AnalyticSamples, m: number): number => (m < a.mag.length / 2 ? m : m - a.mag.length) * a.step_s;

/** Sample index holding time t (rounded; t within half a period of 0). */
export const sampleIndex = (a: AnalyticSamples, t_s: number): number => {
  const M = a.mag.length;
  return ((Math.round(t_s / a.step_s) % M) + M) % M;
};

/** z(t) exactly, at one time: Σ_k S_k e^{j2π f_k t} (a rotating phasor, re-seeded every 256 bins). */
export function analyticAt(S: UniformSpectrum, t_s: number): { re: number; im: number } {
  const K = S.re.length;
  const w0 = 2 * Math.PI * S.f_first_Hz * t_s, dw = 2 * Math.PI * S.df_Hz * t_s;
  const cs = Math.cos(dw), sn = Math.sin(dw);
  let sr = 0, si = 0, pr = 1, pi = 0;
  for (let k = 0; k < K; k++) {
    if ((k & 255) === 0) { pr = Math.cos(w0 + dw * k); pi = Math.sin(w0 + dw * k); }
    sr += S.re[k] * pr - S.im[k] * pi;
    si += S.re[k] * pi + S.im[k] * pr;
    const t = pr * cs - pi * sn; pi = pr * sn + pi * cs; pr = t;
  }
  return { re: sr, im: si };
}

/** |z(t)| exactly. */
export const envelopeAt = (S: UniformSpectrum, t_s: number): number => { const z = analyticAt(S, t_s); return Math.hypot(z.re, z.im); };

/**
 * g = |z|² and its first two time derivatives, from the baseband sums Σ S_k (j2πν_k)^n e^{j2πν_k t}
 * with ν_k = f_k − f_mid (the carrier, which does not change |z|, taken out so nothing cancels).
 */
function envelopeDerivatives(S: UniformSpectrum, t_s: number): [number, number, number] {
  const K = S.re.length, mid = (K - 1) / 2;
  let z0r = 0, z0i = 0, z1r = 0, z1i = 0, z2r = 0, z2i = 0;
  for (let k = 0; k < K; k++) {
    const w = 2 * Math.PI * (k - mid) * S.df_Hz, ph = w * t_s;
    const c = Math.cos(ph), s = Math.sin(ph);
    const ar = S.re[k] * c - S.im[k] * s, ai = S.re[k] * s + S.im[k] * c;
    z0r += ar; z0i += ai;
    z1r -= w * ai; z1i += w * ar; // × jw
    z2r -= w * w * ar; z2i -= w * w * ai; // × (jw)²
  }
  const g = z0r * z0r + z0i * z0i;
  const g1 = 2 * (z0r * z1r + z0i * z1i);
  const g2 = 2 * (z1r * z1r + z1i * z1i + z0r * z2r + z0i * z2i);
  return [g, g1, g2];
}

/**
 * The envelope maximum inside [a, b] (which must bracket it), by Newton's method on d|z|²/dt = 0 kept
 * inside a shrinking bracket (bisection when a step would leave it), to a tolerance of tol_s.
 */
export function envelopePeak(S: UniformSpectrum, a: number, b: number, tol_s: number): { t: number; value: number } {
  let t = (a + b) / 2;
  for (let it = 0; it < 60; it++) {
    const [, g1, g2] = envelopeDerivatives(S, t);
    if (g1 > 0) a = t; else b = t;
    let next = g2 < 0 ? t - g1 / g2 : NaN;
    if (!(next > a && next < b)) next = (a + b) / 2;
    const done = Math.abs(next - t) < tol_s || b - a < tol_s;
    t = next;
    if (done) break;
  }
  return { t, value: envelopeAt(S, t) };
}

/**
 * Analytic signal of a real record by FFT: negative frequencies removed, positive ones doubled, DC and
 * Nyquist kept once; zero-padded to at least twice its length so the end does not wrap onto the start.
 */
export function analyticSignal(x: Float64Array): ComplexColumns {
  const n = x.length;
  if (n === 0) return { re: new Float64Array(0), im: new Float64Array(0) };
  const nfft = nextPow2(2 * n), half = nfft / 2;
  const X = realFft(x, nfft);
  for (let k = 1; k < half; k++) { X.re[k] *= 2; X.im[k] *= 2; }
  for (let k = half + 1; k < nfft; k++) { X.re[k] = 0; X.im[k] = 0; }
  const z = inverseFft(X);
  return { re: z.re.slice(0, n), im: z.im.slice(0, n) };
}

/** The envelope |x + jH{x}| of a real record. */
export const envelope = (x: Float64Array): Float64Array => magnitude(analyticSignal(x));
