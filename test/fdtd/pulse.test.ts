// The excitation pulse against the closed forms of a modulated Gaussian: its spectrum at the band edges
// (Fourier transform of a Gaussian, exp(−(π τ f)²); any table of transforms) and the lead-in the
// animation skips (the envelope exp(−((t − t0)/τ)²) is below 1e−3 of its peak before it).
import { describe, expect, it } from 'vitest';
import { leadInSteps, pulseForBand, pulseSpectrumRelative } from '../../src/fdtd/pulse.ts';

describe('excitation pulse', () => {
  const band: [number, number] = [2e9, 8e9];
  const p = pulseForBand(band, 1e-12);

  it('sits 12 dB down at the band edges and peaks at the band centre', () => {
    const edge = 20 * Math.log10(pulseSpectrumRelative(p, band[0]) / pulseSpectrumRelative(p, 5e9));
    expect(edge).toBeCloseTo(-12, 1);
    expect(pulseSpectrumRelative(p, 5e9)).toBeGreaterThan(pulseSpectrumRelative(p, 4.5e9));
  });

  it('the lead-in ends where the envelope first reaches 1e−3 of its peak', () => {
    const dt = 1e-12, n = leadInSteps(p, dt);
    const env = (t: number) => Math.exp(-(((t - p.t0_s) / p.tau_s) ** 2));
    expect(n).toBeGreaterThan(0);
    expect(env(n * dt)).toBeLessThanOrEqual(1e-3);
    expect(env((n + 1) * dt)).toBeGreaterThan(1e-3);
  });
});
