// Test material for the echo analysis, built from the exact transfer-matrix solution (itself checked
// against closed forms in test/tmm):
//   - records of a pulse run synthesized from it (incident pulse; reflected and transmitted records =
//     inverse FFT of the pulse's spectrum times the exact R(f), T(f));
//   - the exact band envelope the analysis is held to: the exact R(f) times the band pulse's spectrum,
//     inverse FFT to a real signal, then its Hilbert envelope by the FFT method (negative frequencies
//     removed, positive ones doubled), written here independently of src/echoes/envelope.ts.

import { expect } from 'vitest';
import { bandPulse, bandWindow } from '../../src/echoes/band-pulse.ts';
import type { EchoTable } from '../../src/echoes/table.ts';
import { inverseFft, nextPow2, realFft } from '../../src/spectra/fft.ts';
import type { PulseRecords } from '../../src/spectra/records.ts';
import type { Stack } from '../../src/stack/types.ts';
import { tmmAt } from '../../src/tmm/solve.ts';

/**
 * Records of `duration_s` sampled every dt_s (default 1/(6 f_max)): a Gaussian-modulated sine whose
 * spectrum is 12 dB down at the band edges, and the stack's exact response to it.
 */
export function exactRecords(stack: Stack, duration_s = 40e-9, dt_s = 1 / (6 * stack.band_Hz[1])): PulseRecords {
  const [f1, f2] = stack.band_Hz, f0 = (f1 + f2) / 2;
  const tau = Math.sqrt((12 * Math.LN10) / 20) / (Math.PI * ((f2 - f1) / 2)), t0 = 5 * tau;
  const N = nextPow2(Math.ceil(duration_s / dt_s));
  const incident = Float64Array.from({ length: N }, (_, n) => {
    const u = n * dt_s - t0;
    return Math.exp(-((u / tau) ** 2)) * Math.sin(2 * Math.PI * f0 * u);
  });
  const X = realFft(incident, N);
  let peak = 0;
  for (let k = 0; k <= N / 2; k++) peak = Math.max(peak, Math.hypot(X.re[k], X.im[k]));
  const R = { re: new Float64Array(N), im: new Float64Array(N) }, T = { re: new Float64Array(N), im: new Float64Array(N) };
  for (let k = 1; k < N / 2; k++) {
    if (Math.hypot(X.re[k], X.im[k]) < 1e-14 * peak) continue;
    const h = tmmAt(stack, k / (N * dt_s));
    for (const [out, v] of [[R, h.R], [T, h.T]] as const) {
      const re = X.re[k] * v.re - X.im[k] * v.im, im = X.re[k] * v.im + X.im[k] * v.re;
      out.re[k] = re; out.im[k] = im; out.re[N - k] = re; out.im[N - k] = -im;
    }
  }
  return { dt_s, count: N, incident, reflected: inverseFft(R).re, transmitted: inverseFft(T).re };
}

/** R and T of a stack at one frequency (the exact solution by default). */
export type Solver = (f_Hz: number) => { R: { re: number; im: number }; T: { re: number; im: number } };

export interface ExactEnvelope {
  t_s: Float64Array;
  /** Envelope relative to the incident band pulse's peak. */
  env: Float64Array;
}

/**
 * The exact band envelope of R (or T) over delays [−period/2, period/2), sampled every `step_s`: the
 * real band-limited signal x(t) = 2 Re Σ W(f_k) H(f_k) e^{j2πf_k t} by an inverse FFT, then |x + jH{x}|.
 */
export function exactEnvelope(stack: Stack, which: 'R' | 'T', step_s: number, period_s = 64e-9, solve: Solver = (f) => tmmAt(stack, f)): ExactEnvelope {
  const M = nextPow2(Math.ceil(period_s / step_s)), df = 1 / (M * step_s);
  const X = { re: new Float64Array(M), im: new Float64Array(M) };
  let peak = 0;
  for (let k = 1; k < M / 2; k++) {
    const w = bandWindow(k * df, stack.band_Hz);
    if (w === 0) continue;
    const h = solve(k * df)[which];
    X.re[k] = w * h.re; X.im[k] = w * h.im; X.re[M - k] = w * h.re; X.im[M - k] = -w * h.im;
    peak += w;
  }
  const x = inverseFft(X).re; // real: the band-limited response, (Σ over ± bins)/M
  // Hilbert envelope: transform back, drop negative frequencies, double positive ones.
  const Y = realFft(x, M);
  for (let k = 1; k < M / 2; k++) { Y.re[k] *= 2; Y.im[k] *= 2; }
  for (let k = M / 2 + 1; k < M; k++) { Y.re[k] = 0; Y.im[k] = 0; }
  const z = inverseFft(Y);
  const t_s = new Float64Array(M), env = new Float64Array(M);
  for (let i = 0; i < M; i++) {
    const m = (i + M / 2) % M; // delays from −period/2
    t_s[i] = (i - M / 2) * step_s;
    env[i] = (Math.hypot(z.re[m], z.im[m]) * M) / (2 * peak);
  }
  return { t_s, env };
}

/** The exact envelope at delay t (linear interpolation between samples). */
export function envelopeValue(e: ExactEnvelope, t: number): number {
  const step = e.t_s[1] - e.t_s[0], u = (t - e.t_s[0]) / step, i = Math.floor(u), a = u - i;
  return (1 - a) * e.env[i] + a * e.env[i + 1];
}

/** Local maxima of the exact envelope above `floor`, refined by a parabola through ln env. */
export function exactPeaks(e: ExactEnvelope, floor: number): { t_s: number; level: number }[] {
  const out: { t_s: number; level: number }[] = [];
  const step = e.t_s[1] - e.t_s[0];
  for (let i = 1; i < e.env.length - 1; i++) {
    const [a, b, c] = [e.env[i - 1], e.env[i], e.env[i + 1]];
    if (!(b >= floor && b >= a && b > c)) continue;
    const la = Math.log(a), lb = Math.log(b), lc = Math.log(c), den = la - 2 * lb + lc;
    const d = den < 0 ? (0.5 * (la - lc)) / den : 0;
    out.push({ t_s: e.t_s[i] + d * step, level: Math.exp(lb - 0.25 * (la - lc) * d) });
  }
  return out;
}

/** The exact peak nearest delay t. */
export const nearestExactPeak = (peaks: readonly { t_s: number; level: number }[], t: number) =>
  peaks.reduce((best, p) => (Math.abs(p.t_s - t) < Math.abs(best.t_s - t) ? p : best));

const FLOOR = 0.01; // −40 dB, the default floor

/**
 * The acceptance rules: every isolated exact envelope peak above the floor (no other within one pulse
 * width) is exactly one row, within 0.5 % of its time and 1 dB of its level; no row claims more than the
 * exact envelope holds at its time (+3 dB); no row before delay −width/10.
 */
export function expectExact(stack: Stack, table: EchoTable, which: 'R' | 'T', solve?: Solver): void {
  const W = bandPulse(stack.band_Hz).width_s;
  const exact = exactEnvelope(stack, which, W / 200, 64e-9, solve);
  const peaks = exactPeaks(exact, FLOOR);
  for (let i = 0; i < table.t_s.length; i++) {
    expect(table.t_s[i]).toBeGreaterThanOrEqual(-0.1 * W);
    expect(table.level_dB[i]).toBeLessThanOrEqual(20 * Math.log10(envelopeValue(exact, table.t_s[i])) + 3);
  }
  const isolated = peaks.filter((p) => peaks.every((q) => q === p || Math.abs(q.t_s - p.t_s) >= W));
  expect(isolated.length).toBeGreaterThan(0);
  for (const p of isolated) {
    const rows = Array.from(table.t_s.keys()).filter((i) => Math.abs(table.t_s[i] - p.t_s) < W / 2);
    expect(rows.length, `one row at ${p.t_s * 1e9} ns`).toBe(1);
    const i = rows[0];
    expect(Math.abs(table.t_s[i] - p.t_s)).toBeLessThanOrEqual(0.005 * Math.abs(p.t_s) + 0.1e-12);
    expect(Math.abs(table.level_dB[i] - 20 * Math.log10(p.level))).toBeLessThanOrEqual(1);
  }
}

