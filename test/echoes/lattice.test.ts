// The lattice of bounce paths: summed over enough bounces its paths are the exact R(f) and T(f) (the
// multiple-reflection series of Born & Wolf §1.6 and Orfanidis ch. 6, which the exact solver sums in
// closed form), for lossless, lossy and dispersive layers, sheets, a conductor and oblique TE; and its
// first arrivals are the single-interface Fresnel products.
import { describe, expect, it } from 'vitest';
import { latticePaths } from '../../src/echoes/lattice.ts';
import { catalogMaterial } from '../../src/materials/catalog.ts';
import type { BulkMaterial, Stack } from '../../src/stack/types.ts';
import { tmmAt } from '../../src/tmm/solve.ts';
import { dielectric, layer, makeStack, sheet } from '../support/build-stack.ts';

const C0 = 299792458;
const f = Float64Array.from([1.3e9, 2.9e9, 4.4e9]);
const all = { minAmplitude: 1e-13, maxDelay_s: 1e-6, maxCrossings: 4000, maxWaves: 20000 };

function expectSums(stack: Stack) {
  const { reflected, transmitted } = latticePaths(stack, f, 3e9, all);
  for (let l = 0; l < f.length; l++) {
    const { R, T } = tmmAt(stack, f[l]);
    const sum = (s: typeof reflected) => {
      let re = 0, im = 0;
      for (let p = 0; p < s.crossings.length; p++) { re += s.re[p * f.length + l]; im += s.im[p * f.length + l]; }
      return { re, im };
    };
    const r = sum(reflected), t = sum(transmitted);
    expect(Math.hypot(r.re - R.re, r.im - R.im)).toBeLessThan(1e-8);
    expect(Math.hypot(t.re - T.re, t.im - T.im)).toBeLessThan(1e-8);
  }
}

describe('bounce-path lattice', () => {
  it('sums to the exact R and T: two lossless layers on a dielectric backing', () => {
    expectSums(makeStack({ layers: [layer(dielectric(4), 0.03), layer(dielectric(2.25), 0.06)], back: dielectric(9) }));
  });
  it('sums to the exact R and T: lossy and dispersive layers (ITU brick, Debye water) with a sheet between', () => {
    expectSums(makeStack({ layers: [layer(catalogMaterial('brick') as BulkMaterial, 0.05), sheet(300), layer(catalogMaterial('water-25c') as BulkMaterial, 0.002)] }));
  });
  it('sums to the exact R: a sheet in front of a spacer on a conductor (T = 0)', () => {
    const { transmitted } = latticePaths(makeStack({ layers: [sheet(377), layer(dielectric(1.05), 0.0075)], back: 'pec' }), f, 3e9, all);
    expect(transmitted.crossings.length).toBe(0);
    expectSums(makeStack({ layers: [sheet(377), layer(dielectric(1.05), 0.0075)], back: 'pec' }));
  });
  it('sums to the exact R and T at 40° TE', () => {
    expectSums(makeStack({ layers: [layer(dielectric(5, 0.01), 0.02), layer(dielectric(2), 0.01)], angle_deg: 40, polarization: 'TE' }));
  });

  it('first arrivals of a slab are the Fresnel products with the propagation phase', () => {
    // Air | ε = 4, 30 mm | air: r01 = −1/3; back face t01 r12 t10 = (2/3)(1/3)(4/3) = 8/27 times
    // e^{−j2kd}, k = 2π f √ε / c; transmitted t01 t12 = (2/3)(4/3) times e^{−jkd}.
    const d = 0.03, stack = makeStack({ layers: [layer(dielectric(4, 0, 'slab'), d)] });
    const { reflected, transmitted } = latticePaths(stack, f, 3e9, { minAmplitude: 1e-6, maxDelay_s: 1e-8 });
    expect(Array.from(reflected.crossings[0])).toEqual([0]);
    expect(Array.from(reflected.crossings[1])).toEqual([2]);
    expect(Array.from(transmitted.crossings[0])).toEqual([1]);
    expect(reflected.delay0_s[1]).toBeCloseTo((2 * d * 2) / C0, 15);
    for (let l = 0; l < f.length; l++) {
      const phi = (2 * Math.PI * f[l] * 2 * d) / C0;
      expect(reflected.re[l]).toBeCloseTo(-1 / 3, 12);
      expect(reflected.re[f.length + l]).toBeCloseTo((8 / 27) * Math.cos(2 * phi), 12);
      expect(reflected.im[f.length + l]).toBeCloseTo(-(8 / 27) * Math.sin(2 * phi), 12);
      expect(transmitted.re[l]).toBeCloseTo((8 / 9) * Math.cos(phi), 12);
      expect(transmitted.im[l]).toBeCloseTo(-(8 / 9) * Math.sin(phi), 12);
    }
  });

  it('stops at the delay the record can hold', () => {
    const stack = makeStack({ layers: [layer(dielectric(4), 0.03)] });
    const { reflected } = latticePaths(stack, f, 3e9, { minAmplitude: 1e-12, maxDelay_s: 1.5e-9 });
    expect(Math.max(...reflected.delay0_s)).toBeLessThanOrEqual(1.5e-9);
    expect(reflected.crossings.length).toBe(4); // 0, 0.4, 0.8, 1.2 ns
  });
});

describe('a quarter-wave mirror: layers of one delay followed as one class (Orfanidis, ch. 6)', () => {
  // Six pairs of quarter-wave layers at 10 GHz, n = 2 and 1.2 (an invented mirror): the paths of each delay grow
  // combinatorially, more than 3000 waves in flight can hold. Merged by their crossings of the one class of equal
  // layers, the paths sum to the exact R and T, with |R| = tanh(6 ln(2/1.2)) at the centre.
  it('sums to the exact R and T to 1e-4 with waves down to 1e-6', () => {
    const lam = C0 / 10e9, hi = dielectric(4, 0, 'hi'), lo = dielectric(1.44, 0, 'lo');
    const stack = makeStack({ band_GHz: [5, 15], layers: Array.from({ length: 12 }, (_, i) => (i % 2 === 0 ? layer(hi, lam / 8) : layer(lo, lam / 4.8))) });
    const fm = Float64Array.from([6.1e9, 8.3e9, 10e9, 12.7e9]);
    const { reflected, transmitted } = latticePaths(stack, fm, 10e9, { minAmplitude: 1e-6, maxDelay_s: 1e-6, maxCrossings: 2000, maxWaves: 3000 });
    expect(reflected.residual).toBeLessThan(1e-4);
    expect(transmitted.residual).toBeLessThan(1e-4);
    let re = 0, im = 0;
    for (let p = 0; p < reflected.crossings.length; p++) { re += reflected.re[p * 4 + 2]; im += reflected.im[p * 4 + 2]; }
    expect(Math.abs(Math.hypot(re, im) - Math.tanh(6 * Math.log(2 / 1.2)))).toBeLessThan(1e-4);
  });
});
