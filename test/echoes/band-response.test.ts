// The band-limited response and its analytic signal, on records of an echo train built in closed form:
// a sine-modulated Gaussian and scaled copies of it delayed by exact (fractional) delays. By the shift
// theorem (e.g. Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., Table 8.2) the record over
// the incident is H(f) = Σ a e^{−j2πfτ}; the band spectrum must be W(f)·H(f), and a single delayed copy
// must give the analytic signal a e^{j2πf0(t−τ)} b(t − τ) with b the band pulse's closed-form envelope.
import { describe, expect, it } from 'vitest';
import { bandPulse, bandWindow, envelopeShape } from '../../src/echoes/band-pulse.ts';
import { bandBins, bandRecords } from '../../src/echoes/band-response.ts';
import { analyticAt, analyticSamples, envelope, envelopeAt, envelopePeak, sampleTime } from '../../src/echoes/envelope.ts';

const band: [number, number] = [1e9, 6e9];
const B = band[1] - band[0], f0 = 3.5e9;
const W = bandPulse(band).width_s;
const dt = 20e-12, N = 3000, t0 = 1.5e-9, s = 90e-12;
const pulse = (t: number) => Math.exp(-(((t - t0) / s) ** 2)) * Math.sin(2 * Math.PI * f0 * (t - t0));
const train = (echoes: [number, number][]) => Float64Array.from({ length: N }, (_, n) => echoes.reduce((v, [tau, a]) => v + a * pulse(n * dt - tau), 0));
const incident = train([[0, 1]]);

describe('band response', () => {
  it("is W(f) times the echo train's transfer function at every bin of the band", () => {
    const echoes: [number, number][] = [[0, -0.4], [0.7371e-9, 0.25], [2.0003e-9, -0.06]];
    const { responses: [S], incident: I } = bandRecords(incident, [train(echoes)], dt, band);
    const { count } = bandBins(band, S.df_Hz);
    expect(S.re.length).toBe(count);
    let worst = 0, peak = 0;
    for (let k = 0; k < count; k++) {
      const f = S.f_first_Hz + k * S.df_Hz, w = bandWindow(f, band);
      expect(f).toBeGreaterThanOrEqual(band[0]);
      expect(f).toBeLessThanOrEqual(band[1]);
      const re = echoes.reduce((v, [tau, a]) => v + a * Math.cos(2 * Math.PI * f * tau), 0) * w;
      const im = echoes.reduce((v, [tau, a]) => v - a * Math.sin(2 * Math.PI * f * tau), 0) * w;
      worst = Math.max(worst, Math.hypot(S.re[k] - re, S.im[k] - im));
      peak += w;
    }
    expect(worst).toBeLessThan(1e-9);
    expect(S.peak).toBeCloseTo(peak, 9);
    expect(I.peak).toBe(S.peak);
  });

  it('of a silent record is zero, never NaN', () => {
    const { responses: [S] } = bandRecords(incident, [new Float64Array(N)], dt, band);
    expect(S.re.every((v) => v === 0) && S.im.every((v) => v === 0)).toBe(true);
  });
});

describe('analytic signal of a band response', () => {
  const tau = 0.81234e-9, a = -0.3;
  const { responses: [S] } = bandRecords(incident, [train([[tau, a]])], dt, band);
  const closed = (t: number) => {
    const b = a * envelopeShape(Math.PI * B * (t - tau)) * S.peak, ph = 2 * Math.PI * f0 * (t - tau);
    return { re: b * Math.cos(ph), im: b * Math.sin(ph) };
  };

  it('is a e^{j2πf0(t−τ)} b(t − τ) for one delayed copy, at any time and on the sampled grid', () => {
    for (const t of [tau, tau + 0.1e-9, tau - 0.37e-9, tau + 1.1e-9]) {
      const z = analyticAt(S, t), c = closed(t);
      expect(Math.hypot(z.re - c.re, z.im - c.im) / S.peak).toBeLessThan(1e-7);
    }
    const A = analyticSamples(S, W);
    expect(A.step_s).toBeLessThanOrEqual(W / 16);
    for (const m of [0, 17, 301, A.mag.length - 5]) {
      const t = sampleTime(A, m), c = closed(t);
      expect(Math.hypot(A.re[m] - c.re, A.im[m] - c.im) / S.peak).toBeLessThan(1e-7);
      expect(A.mag[m]).toBeCloseTo(envelopeAt(S, t), 9);
    }
  });

  it("has its envelope peak at the delay, with the copy's amplitude", () => {
    const p = envelopePeak(S, tau - W / 4, tau + W / 3, 1e-7 * W);
    expect(Math.abs(p.t - tau)).toBeLessThan(1e-16);
    expect(p.value / S.peak).toBeCloseTo(Math.abs(a), 9);
  });
});

describe('envelope of a raw record', () => {
  it('of a modulated Gaussian is its Gaussian envelope', () => {
    // Bedrosian's product theorem (Proc. IEEE 51, 1963): H{g(t) cos(ω t + φ)} = g(t) sin(ω t + φ) when
    // g's spectrum lies below ω; a Gaussian's spectrum leaks only ~exp(−2π²s²f_c²) ≈ 1e-19 past f_c here.
    const dt = 1e-12, n = 6000, s = 300e-12, t0 = 3e-9, fc = 5e9;
    const g = (t: number) => Math.exp(-((t - t0) ** 2) / (2 * s * s));
    const x = Float64Array.from({ length: n }, (_, i) => g(i * dt) * Math.cos(2 * Math.PI * fc * i * dt + 0.7));
    const env = envelope(x);
    let worst = 0;
    for (let i = 0; i < n; i++) worst = Math.max(worst, Math.abs(env[i] - g(i * dt)));
    expect(worst).toBeLessThan(1e-9);
  });
});
