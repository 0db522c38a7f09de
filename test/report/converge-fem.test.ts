// The FEM refinement study behind `slabecho converge`: R and T of Lagrange elements of order p converge
// like h^{2p} (Ihlenburg & Babuška, Comput. Math. Appl. 30(9), 1995, for p = 1; Ainsworth, SIAM J. Numer.
// Anal. 42(2), 2004, for any p), so the observed order between rows should be close to 2p.
import { describe, expect, it } from 'vitest';
import { femStudy } from '../../src/report/converge.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { linspace } from '../../src/units.ts';
import { dielectric, layer, makeStack } from '../support/build-stack.ts';

describe('fem convergence study', () => {
  it('shows order ≈ 2p on a thick slab', () => {
    const stack = makeStack({ band_GHz: [1, 6], layers: [layer(dielectric(4, 0.01), 0.2)] });
    const f = linspace(1e9, 6e9, 21);
    const rows = femStudy(stack, solveTmm(stack, f), [1, 2]);
    for (const p of [1, 2]) {
      const orders = rows.filter((r) => r.label === `p = ${p}`).map((r) => r.order_obs).filter(Number.isFinite);
      expect(orders.length).toBeGreaterThan(1);
      // the finest rows, once the mesh resolves the wave (pre-asymptotic rows sit lower)
      expect(orders[orders.length - 1]).toBeGreaterThan(2 * p - 0.3);
      expect(orders[orders.length - 1]).toBeLessThan(2 * p + 0.3);
    }
  });

  it('two densities that give the same mesh show no order (not 0)', () => {
    // A 4 mm layer is one element at 4 and at 8 elements per wavelength up to 2 GHz.
    const stack = makeStack({ band_GHz: [1, 2], layers: [layer(dielectric(6.3), 0.004)] });
    const rows = femStudy(stack, solveTmm(stack, linspace(1e9, 2e9, 11)), [2]);
    expect(rows[0].size).toBe(rows[1].size);
    expect(Number.isNaN(rows[1].order_obs)).toBe(true);
  });
});
