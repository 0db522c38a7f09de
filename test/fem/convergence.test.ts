// Observed order of convergence against theory.
// R and T are read from nodal values, whose error in 1D is the accumulated phase error of the discrete wave:
//   O((kh)^{2p}) (Ihlenburg & Babuška, Comput. Math. Appl. 30(9), 1995 for p = 1; Ainsworth, SIAM J. Numer. Anal.
//   42(2), 2004 for any p). So doubling the density should cut |R − R_exact| by 2^{2p}: orders 2, 4, 6.
// The field between nodes converges like the best approximation in the maximum norm, O(h^{p+1})
//   (Lagrange interpolation remainder; the nodal error is of higher order for p ≥ 2): orders 2, 3, 4.

import { describe, expect, it } from 'vitest';
import type { FemOrder } from '../../src/fem/basis.ts';
import { convergenceStudy } from '../../src/fem/convergence.ts';
import { profileFem } from '../../src/fem/profile.ts';
import { profileTmm } from '../../src/tmm/profile.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { C0_m_per_s } from '../../src/units.ts';
import { dielectric, layer, makeStack } from '../support/build-stack.ts';

// A 2-wavelength slab of ε_r = 4 on a half-space of ε_r = 2.25, one frequency: density × 2 exactly doubles the
// element count (k d / 2π = 2 wavelengths).
const f = 3e9;
const lambda = C0_m_per_s / f / 2;
const stack = makeStack({ layers: [layer(dielectric(4), 2 * lambda)], back: dielectric(2.25) });
const ref = solveTmm(stack, Float64Array.of(f));

const DENSITIES: Record<FemOrder, number[]> = { 1: [8, 16, 32, 64], 2: [4, 8, 16, 32], 3: [4, 8, 16] };

describe('observed order of convergence of R and T (theory: 2p)', () => {
  for (const p of [1, 2, 3] as FemOrder[]) {
    it(`p = ${p}: order → ${2 * p}`, () => {
      const rows = convergenceStudy(stack, ref, p, DENSITIES[p]);
      // Errors fall monotonically and the last observed order is within 0.3 of 2p.
      for (let i = 1; i < rows.length; i++) expect(rows[i].R_err).toBeLessThan(rows[i - 1].R_err);
      const last = rows[rows.length - 1].order_obs;
      expect(Math.abs(last - 2 * p)).toBeLessThan(0.3);
    });
  }
});

describe('observed order of the field between nodes (theory: p + 1)', () => {
  const x = new Float64Array(2001).map((_, i) => (i / 2000) * 2 * lambda); // inside the slab
  const exact = profileTmm(stack, f, x);
  const fieldError = (p: FemOrder, density: number) => {
    const pr = profileFem(stack, f, x, { order: p, density });
    let e = 0;
    for (let i = 0; i < x.length; i++) e = Math.max(e, Math.hypot(pr.E_re[i] - exact.E_re[i], pr.E_im[i] - exact.E_im[i]));
    return e;
  };
  const cases: [FemOrder, number, number][] = [[1, 32, 64], [2, 16, 32], [3, 8, 16]];
  for (const [p, n1, n2] of cases) {
    it(`p = ${p}: order ≈ ${p + 1}`, () => {
      const order = Math.log(fieldError(p, n1) / fieldError(p, n2)) / Math.log(n2 / n1);
      expect(Math.abs(order - (p + 1))).toBeLessThan(0.3);
    });
  }
});
