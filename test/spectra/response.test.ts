// R(f) from records against closed forms; the weak-spectrum guard; group delay.
import { describe, expect, it } from 'vitest';
import { spectrumFromRecords } from '../../src/spectra/spectrum.ts';
import { groupDelay, unwrappedPhase } from '../../src/spectra/groupDelay.ts';
import { linspace } from '../../src/units.ts';

const gauss = (t: number, t0: number, s: number) => Math.exp(-((t - t0) ** 2) / (2 * s * s));
/** Sine-modulated Gaussian: an echo of it is just a shifted, scaled copy (closed form at any delay). */
const pulse = (t: number, t0: number, s: number, fc: number) => gauss(t, t0, s) * Math.sin(2 * Math.PI * fc * (t - t0));
const sample = (n: number, dt: number, fn: (t: number) => number) => new Float64Array(n).map((_, i) => fn(i * dt));

describe('spectrumFromRecords', () => {
  it('ratio of two Gaussians matches the closed-form ratio of their transforms', () => {
    // G_s(f) = s√(2π) exp(−2π²s²f²) e^{−j2πf t0} (standard Fourier pair, Bracewell ch. 6), so
    // G_2/G_1 = (s2/s1) exp(−2π²(s2² − s1²) f²) e^{−j2πf (t2 − t1)}.
    const dt = 1e-12, N = 4000, s1 = 40e-12, s2 = 60e-12, t1 = 0.5e-9, t2 = 1.7e-9;
    const den = sample(N, dt, (t) => gauss(t, t1, s1));
    const num = sample(N, dt, (t) => 0.8 * gauss(t, t2, s2));
    const f = linspace(0.2e9, 4e9, 39);
    const r = spectrumFromRecords({ dt_s: dt, count: N, incident: den, reflected: num, transmitted: num }, f);
    let worst = 0;
    f.forEach((fk, i) => {
      const m = (0.8 * s2 / s1) * Math.exp(-2 * Math.PI ** 2 * (s2 * s2 - s1 * s1) * fk * fk);
      const ph = -2 * Math.PI * fk * (t2 - t1);
      worst = Math.max(worst, Math.hypot(r.R_re[i] - m * Math.cos(ph), r.R_im[i] - m * Math.sin(ph)));
      worst = Math.max(worst, Math.hypot(r.T_re[i] - m * Math.cos(ph), r.T_im[i] - m * Math.sin(ph)));
      expect(r.weak[i]).toBe(0);
    });
    expect(worst).toBeLessThan(1e-9);
    expect(r.warnings).toEqual([]);
  });

  it('marks frequencies where the incident spectrum is weak and never returns NaN', () => {
    const dt = 1e-12, N = 2000, s = 30e-12;
    const den = sample(N, dt, (t) => gauss(t, 0.5e-9, s)); // |G| falls ~ exp(−2π²s²f²): −60 dB near 8.8 GHz
    const num = sample(N, dt, (t) => -0.5 * gauss(t, 0.6e-9, s));
    const f = linspace(1e9, 40e9, 40);
    const r = spectrumFromRecords({ dt_s: dt, count: N, incident: den, reflected: num }, f);
    expect(r.weak[0]).toBe(0);
    expect(r.weak[39]).toBe(1);
    for (let i = 0; i < 40; i++) { expect(Number.isFinite(r.R_re[i])).toBe(true); expect(Number.isFinite(r.R_im[i])).toBe(true); }
    expect(r.warnings.join()).toMatch(/more than 60 dB below its peak at \d+ of 40 frequencies .*unreliable/);
    // No transmitted record (a conductor behind): T is zero, not NaN.
    expect(Array.from(r.T_re).every((v) => v === 0)).toBe(true);
    const zero = spectrumFromRecords({ dt_s: dt, count: N, incident: new Float64Array(N), reflected: num }, f);
    expect(Array.from(zero.weak).every((w) => w === 1)).toBe(true);
    expect(Array.from(zero.R_re).every((v) => v === 0)).toBe(true);
    expect(Array.from(zero.R_im).every((v) => v === 0)).toBe(true);
  });

  it('a slab built from its echoes gives the closed-form (Airy) R and T', () => {
    // Lossless slab ε_r = 4, d = 30 mm in air. Multiple-reflection sum (Born & Wolf §7.6.1;
    // Orfanidis, Electromagnetic Waves and Antennas, ch. 5):
    // R = r1 + t1 t1' r2 e^{−jω2τ} / (1 − r1' r2 e^{−jω2τ}), T = t1 t2 e^{−jωτ} / (1 − r1' r2 e^{−jω2τ}),
    // r1 = (1 − n)/(1 + n), r1' = r2 = −r1, t1 = 2/(1 + n), t1' = t2 = 2n/(1 + n), τ = n d / c.
    const n = 2, d = 0.03, c = 299792458, tau = (n * d) / c;
    const r1 = (1 - n) / (1 + n), r2 = -r1, t1 = 2 / (1 + n), t1p = (2 * n) / (1 + n);
    const dt = 2e-12, N = 16000, s = 60e-12, fc = 3e9, t0 = 0.5e-9;
    const inc = sample(N, dt, (t) => pulse(t, t0, s, fc));
    const refl = new Float64Array(N), trans = new Float64Array(N);
    for (let i = 0; i < N; i++) {
      const t = i * dt;
      let v = r1 * pulse(t, t0, s, fc);
      let w = 0;
      for (let m = 0; m < 40; m++) {
        const a = t1 * t1p * r2 * (r2 * r2) ** m; // r1' = −r1 = r2
        v += a * pulse(t, t0 + 2 * tau * (m + 1), s, fc);
        w += t1 * t1p * (r2 * r2) ** m * pulse(t, t0 + tau * (2 * m + 1), s, fc);
      }
      refl[i] = v; trans[i] = w;
    }
    const f = linspace(1e9, 5e9, 81);
    const sp = spectrumFromRecords({ dt_s: dt, count: N, incident: inc, reflected: refl, transmitted: trans }, f);
    let worstR = 0, worstT = 0;
    for (let i = 0; i < f.length; i++) {
      const ph = -2 * Math.PI * f[i] * 2 * tau;
      const e2 = { re: Math.cos(ph), im: Math.sin(ph) };
      const e1 = { re: Math.cos(ph / 2), im: Math.sin(ph / 2) };
      const den = { re: 1 - (-r1 * r2) * e2.re, im: -(-r1 * r2) * e2.im };
      const q = den.re ** 2 + den.im ** 2;
      const numR = { re: t1 * t1p * r2 * e2.re, im: t1 * t1p * r2 * e2.im };
      const R = { re: r1 + (numR.re * den.re + numR.im * den.im) / q, im: (numR.im * den.re - numR.re * den.im) / q };
      const numT = { re: t1 * t1p * e1.re, im: t1 * t1p * e1.im };
      const T = { re: (numT.re * den.re + numT.im * den.im) / q, im: (numT.im * den.re - numT.re * den.im) / q };
      worstR = Math.max(worstR, Math.hypot(sp.R_re[i] - R.re, sp.R_im[i] - R.im));
      worstT = Math.max(worstT, Math.hypot(sp.T_re[i] - T.re, sp.T_im[i] - T.im));
    }
    expect(sp.warnings).toEqual([]);
    expect(worstR).toBeLessThan(1e-6);
    expect(worstT).toBeLessThan(1e-6);
  });
});

describe('group delay', () => {
  it('a pure delay e^{−jωτ} has group delay τ across phase wraps', () => {
    const tau = 3.3e-9, f = linspace(1e9, 10e9, 200);
    const re = f.map((fk) => Math.cos(-2 * Math.PI * fk * tau));
    const im = f.map((fk) => Math.sin(-2 * Math.PI * fk * tau));
    const phi = unwrappedPhase(re, im);
    for (let k = 1; k < f.length; k++) expect(Math.abs(phi[k] - phi[k - 1])).toBeLessThan(Math.PI);
    const g = groupDelay(f, re, im);
    for (const v of g) expect(v).toBeCloseTo(tau, 15);
  });
});
