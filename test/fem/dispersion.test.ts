// Discrete dispersion of the FEM against the published formulas.
// Ihlenburg & Babuška, "Finite element solution of the Helmholtz equation with high wave number, Part I",
//   Comput. Math. Appl. 30(9), 1995: linear elements satisfy cos(k_h h) = (1 − (kh)²/3)/(1 + (kh)²/6).
// Ainsworth, "Discrete dispersion relation for hp-version finite element approximation at high wave number",
//   SIAM J. Numer. Anal. 42(2), 2004: (k − k_h)/k ≈ ½[p!/(2p)!]² (kh)^{2p}/(2p+1) for small kh.

import { describe, expect, it } from 'vitest';
import type { FemOrder } from '../../src/fem/basis.ts';
import { asymptoticPhaseError, discreteWavenumberTimesH, linearDispersionCos } from '../../src/fem/dispersion.ts';
import { profileFem } from '../../src/fem/profile.ts';
import { C0_m_per_s } from '../../src/units.ts';
import { dielectric, layer, makeStack } from '../support/build-stack.ts';

describe('discrete dispersion of Lagrange elements', () => {
  it('p = 1 element matrices reproduce Ihlenburg & Babuška’s cos(k_h h) = (1 − (kh)²/3)/(1 + (kh)²/6)', () => {
    for (const kh of [0.1, 0.5, 1, 2, 3]) {
      expect(Math.cos(discreteWavenumberTimesH(1, kh))).toBeCloseTo(linearDispersionCos(kh), 12);
    }
  });

  it('the phase the p = 1 solution shows over 40 wavelengths is the Ihlenburg & Babuška k_h', () => {
    // A 40-wavelength layer of ε_r = 4 between half-spaces of the same medium: a pure forward wave.
    const eps = dielectric(4), f = 3e9, lambda = C0_m_per_s / f / 2, d = 40 * lambda, density = 10;
    const stack = makeStack({ front: eps, back: eps, layers: [layer(eps, d)] });
    const elements = 40 * density, h = d / elements, kh = (2 * Math.PI) / density;
    const x = new Float64Array(elements + 1).map((_, i) => i * h);
    const pr = profileFem(stack, f, x, { order: 1, density });
    let phase = 0; // unwrapped phase lost from x = 0 to x = d, element by element
    for (let i = 0; i < elements; i++) {
      const ar = pr.E_re[i], ai = pr.E_im[i], br = pr.E_re[i + 1], bi = pr.E_im[i + 1];
      phase -= Math.atan2(bi * ar - br * ai, br * ar + bi * ai); // arg(u_{i+1} / u_i) = −k_h h
    }
    const predicted = elements * Math.acos(linearDispersionCos(kh));
    const exact = elements * kh;
    // The discrete wave is measurably slower than the true one (≈ 4 rad short over 40 wavelengths) …
    expect(exact - phase).toBeGreaterThan(3.5);
    // … and the measured lag matches the formula's to 1 %.
    expect(Math.abs((exact - phase) - (exact - predicted)) / (exact - predicted)).toBeLessThan(0.01);
  });

  it('higher orders follow Ainsworth’s (k − k_h)/k ≈ ½[p!/(2p)!]² (kh)^{2p}/(2p+1) at small kh', () => {
    for (const p of [1, 2, 3] as FemOrder[]) {
      for (const kh of [0.2, 0.4]) {
        const measured = 1 - discreteWavenumberTimesH(p, kh) / kh;
        expect(measured).toBeGreaterThan(0);
        expect(Math.abs(measured / asymptoticPhaseError(p, kh) - 1)).toBeLessThan(0.03);
      }
    }
  });

  it('raising p cuts the phase error far faster than more elements (pollution, Ihlenburg & Babuška)', () => {
    // Same number of unknowns per wavelength (12): p = 1 at 12 elements vs p = 3 at 4 elements.
    const e1 = 1 - discreteWavenumberTimesH(1, (2 * Math.PI) / 12) / ((2 * Math.PI) / 12);
    const e3 = 1 - discreteWavenumberTimesH(3, (2 * Math.PI) / 4) / ((2 * Math.PI) / 4);
    expect(e3 * 100).toBeLessThan(e1);
  });
});
