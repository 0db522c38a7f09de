// A conductor's standing wave from the FEM profile (common practice, no source): in front of a perfect
// conductor at x = 0, E = e^{−jkx} − e^{+jkx} = −2j sin(kx): |E| peaks at 2 a quarter wavelength from it and every
// half wavelength after, nulls every half wavelength, and with e^{+jωt} the phase is +90° in the first half
// wavelength in front of the conductor and −90° in the second, alternating from then on.

import { describe, expect, it } from 'vitest';
import { profileFem } from '../../src/fem/profile.ts';
import { solveFem } from '../../src/fem/solve.ts';
import { C0_m_per_s } from '../../src/units.ts';
import { makeStack } from '../support/build-stack.ts';

const f = 5e9;
const lambda = C0_m_per_s / f;
const stack = makeStack({ back: 'pec', band_GHz: [1, 10] });
const N = 1500;
const x = new Float64Array(N + 1).map((_, i) => -1.5 * lambda * (1 - i / N)); // −1.5λ … 0
const pr = profileFem(stack, f, x);
const mag = (i: number) => Math.hypot(pr.E_re[i], pr.E_im[i]);
const phaseDeg = (i: number) => (Math.atan2(pr.E_im[i], pr.E_re[i]) * 180) / Math.PI;

describe('bare conductor standing wave (common practice, no source)', () => {
  it('R = −1 at normal incidence, TE and TM', () => {
    for (const polarization of ['TE', 'TM'] as const) {
      const { spectrum } = solveFem(makeStack({ back: 'pec', polarization, angle_deg: 0 }), Float64Array.of(2e9, 7e9));
      for (let i = 0; i < 2; i++) { expect(spectrum.R_re[i]).toBeCloseTo(-1, 12); expect(spectrum.T_re[i]).toBe(0); }
    }
  });

  it('|E| peaks at 2 at λ/4, 3λ/4, 5λ/4 and vanishes at 0, λ/2, λ, 3λ/2 from the conductor', () => {
    const at = (d: number) => Math.round(N * (1 - d / (1.5 * lambda)));
    for (const d of [0.25, 0.75, 1.25]) expect(Math.abs(mag(at(d * lambda)) - 2)).toBeLessThan(1e-5);
    for (const d of [0, 0.5, 1, 1.5]) expect(mag(at(d * lambda))).toBeLessThan(1e-5);
    let peak = 0;
    for (let i = 0; i <= N; i++) peak = Math.max(peak, mag(i));
    expect(Math.abs(peak - 2)).toBeLessThan(1e-5);
  });

  it('phase is +90° within the first half wavelength, −90° in the second, +90° in the third', () => {
    for (let i = 0; i <= N; i++) {
      const d = -x[i] / lambda; // distance from the conductor in wavelengths
      const frac = d % 0.5;
      if (frac < 0.02 || frac > 0.48) continue; // skip the nulls, where the phase is undefined
      const expected = Math.floor(d / 0.5) % 2 === 0 ? 90 : -90;
      expect(Math.abs(phaseDeg(i) - expected)).toBeLessThan(0.01);
    }
  });

  it('between nodes the field comes from the basis, not straight lines between nodes', () => {
    // 4 cubic elements per wavelength put vertices every λ/4 from the conductor (peaks and nulls); midway, at
    // λ/8 and 3λ/8, |E| = 2 sin(π/4) ≈ 1.414, where a straight line between the vertex values gives 1.0.
    const mid = Float64Array.of(-lambda / 8, -3 * lambda / 8, -5 * lambda / 8);
    const coarse = profileFem(stack, f, Float64Array.of(-1.5 * lambda, ...mid, 0), { order: 3, density: 4 });
    for (let i = 1; i <= 3; i++) {
      const k = (2 * Math.PI) / lambda, e = -2 * Math.sin(k * mid[i - 1]); // E = −2j sin(kx): imaginary part
      expect(Math.abs(coarse.E_re[i])).toBeLessThan(0.02);
      expect(Math.abs(coarse.E_im[i] - e)).toBeLessThan(0.02);
    }
  });
});
