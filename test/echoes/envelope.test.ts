// Envelope and peak refinement against closed forms.
import { describe, expect, it } from 'vitest';
import { analyticSignal, envelope } from '../../src/echoes/envelope.ts';
import { refinePeak, widthAtHalf } from '../../src/echoes/peaks.ts';

describe('envelope', () => {
  it('of a modulated Gaussian is its Gaussian envelope', () => {
    // Bedrosian's product theorem (Proc. IEEE 51, 1963): H{g(t) cos(ω t + φ)} = g(t) sin(ω t + φ) when
    // g's spectrum lies below ω; a Gaussian's spectrum leaks only ~exp(−2π²s²f_c²) ≈ 1e-19 past f_c here.
    const dt = 1e-12, N = 6000, s = 300e-12, t0 = 3e-9, fc = 5e9;
    const g = (t: number) => Math.exp(-((t - t0) ** 2) / (2 * s * s));
    const x = new Float64Array(N).map((_, i) => g(i * dt) * Math.cos(2 * Math.PI * fc * i * dt + 0.7));
    const env = envelope(x);
    let worst = 0;
    for (let i = 0; i < N; i++) worst = Math.max(worst, Math.abs(env[i] - g(i * dt)));
    expect(worst).toBeLessThan(1e-9);
    // the analytic signal's phase is the carrier's
    const z = analyticSignal(x), i0 = Math.round(t0 / dt);
    expect(Math.atan2(z.im[i0], z.re[i0])).toBeCloseTo(Math.atan2(Math.sin(2 * Math.PI * fc * i0 * dt + 0.7), Math.cos(2 * Math.PI * fc * i0 * dt + 0.7)), 8);
  });
});

describe('peaks', () => {
  it('parabolic interpolation of the log-envelope is exact for a Gaussian', () => {
    // ln of a Gaussian is a parabola, so three samples fix its vertex exactly (closed form).
    const c = 40.37, s = 6.2, a = 0.83;
    const env = new Float64Array(100).map((_, i) => a * Math.exp(-((i - c) ** 2) / (2 * s * s)));
    const p = refinePeak(env, 40);
    expect(p.index).toBeCloseTo(c, 10);
    expect(p.value).toBeCloseTo(a, 12);
    // FWHM of a Gaussian = 2√(2 ln 2) s (closed form); linear interpolation of the crossings is close
    expect(widthAtHalf(env, 40)).toBeCloseTo(2 * Math.sqrt(2 * Math.LN2) * s, 1);
  });
});
