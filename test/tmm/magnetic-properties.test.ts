// Property tests (fast-check) with μ ≠ 1 at any angle: the exact solver against the independent ABCD cascade,
// reciprocity, energy balance, and the FEM against the exact solver. Random stacks of fixed-model layers with
// ε' − jσ/(ωε0) and μ' − jμ'', resistive sheets, magnetic or plain half-spaces, a conductor behind.

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveFem } from '../../src/fem/solve.ts';
import type { BulkMaterial, Layer, Stack } from '../../src/stack/types.ts';
import { absorption, solveTmm, tmmAt } from '../../src/tmm/solve.ts';
import { AIR, layer, magnetic, makeStack, sheet } from '../support/build-stack.ts';
import { referenceOf, referenceRT } from '../support/field-reference.ts';

const medium = (lossy: boolean) => fc.record({
  eps: fc.double({ min: 1, max: 10, noNaN: true }),
  sigma: lossy ? fc.double({ min: 0, max: 0.2, noNaN: true }) : fc.constant(0),
  mu: fc.double({ min: 0.5, max: 8, noNaN: true }),
  muLoss: lossy ? fc.double({ min: 0, max: 3, noNaN: true }) : fc.constant(0),
}).map((m): BulkMaterial => magnetic(m.eps, m.sigma, m.mu, m.muLoss));

const layerArb = (lossy: boolean, sheets: boolean): fc.Arbitrary<Layer> => fc.oneof(
  { weight: 6, arbitrary: fc.tuple(medium(lossy), fc.double({ min: 0.5e-3, max: 30e-3, noNaN: true })).map(([m, d]) => layer(m, d)) },
  { weight: sheets ? 1 : 0, arbitrary: fc.double({ min: 20, max: 800, noNaN: true }).map((r) => sheet(r)) },
);

/** Lossless front (air or a magnetic dielectric), any angle and polarization, a frequency in 1–12 GHz. */
const setting = fc.record({
  front: fc.oneof(fc.constant(AIR), medium(false)),
  angle_deg: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 85, noNaN: true })),
  polarization: fc.constantFrom('TE' as const, 'TM' as const),
  f_Hz: fc.double({ min: 1e9, max: 12e9, noNaN: true }),
});

const stackArb = (lossy: boolean, sheets: boolean, pecBack: boolean) => fc.record({
  s: setting,
  layers: fc.array(layerArb(lossy, sheets), { minLength: 1, maxLength: 5 }),
  back: pecBack ? fc.oneof({ weight: 1, arbitrary: fc.constant('pec' as const) }, { weight: 3, arbitrary: medium(false) }) : medium(false),
}).map(({ s, layers, back }) => ({
  f_Hz: s.f_Hz,
  stack: makeStack({ front: s.front, layers, back, angle_deg: s.angle_deg, polarization: s.polarization, band_GHz: [1, 12] }),
}));

const dist = (a: { re: number; im: number }, b: { re: number; im: number }) => Math.hypot(a.re - b.re, a.im - b.im);

describe('random magnetic stacks at any angle (fast-check)', () => {
  it('the exact solver agrees with the textbook ABCD cascade to 1e-9 (300 stacks; Orfanidis ch. 5–8)', () => {
    fc.assert(fc.property(stackArb(true, true, true), ({ stack, f_Hz }) => {
      const a = tmmAt(stack, f_Hz), b = referenceRT(referenceOf(stack, f_Hz), f_Hz);
      expect(dist(a.R, b.R)).toBeLessThan(1e-9);
      expect(dist(a.T, b.T)).toBeLessThan(1e-9);
    }), { numRuns: 300, seed: 2040 });
  });

  it('is reciprocal: T is unchanged when a stack between equal half-spaces is reversed (reciprocity theorem; 200 stacks)', () => {
    fc.assert(fc.property(stackArb(true, true, false), ({ stack, f_Hz }) => {
      const between: Stack = { ...stack, back: stack.front };
      const reversed: Stack = { ...between, layers: [...between.layers].reverse() };
      const a = tmmAt(between, f_Hz).T, b = tmmAt(reversed, f_Hz).T;
      expect(dist(a, b)).toBeLessThan(1e-9 * Math.max(1, Math.hypot(a.re, a.im)));
    }), { numRuns: 200, seed: 11 });
  });

  it('conserves energy when lossless, |R|² + P|T|² = 1 with P = Re(Y_back)/Re(Y_front) (physics reference, power fractions; 200 stacks)', () => {
    fc.assert(fc.property(stackArb(false, false, true), ({ stack, f_Hz }) => {
      const f = Float64Array.of(f_Hz);
      expect(Math.abs(absorption(stack, solveTmm(stack, f))[0])).toBeLessThan(1e-10);
    }), { numRuns: 200, seed: 7 });
  });

  it('absorbs between none and all of the power when lossy, 0 ≤ 1 − |R|² − P|T|² ≤ 1 (200 stacks)', () => {
    fc.assert(fc.property(stackArb(true, true, true), ({ stack, f_Hz }) => {
      const A = absorption(stack, solveTmm(stack, Float64Array.of(f_Hz)))[0];
      // (rounding allowed at the energy test's 1e-10)
      expect(A).toBeGreaterThanOrEqual(-1e-10);
      expect(A).toBeLessThanOrEqual(1 + 1e-10);
    }), { numRuns: 200, seed: 8 });
  });

  it('the FEM meets its 1e-5 target against the exact solver (40 stacks, 3 frequencies each)', () => {
    fc.assert(fc.property(stackArb(true, true, true), ({ stack, f_Hz }) => {
      const f = Float64Array.of(1e9, f_Hz, 12e9);
      const fem = solveFem(stack, f).spectrum;
      for (let i = 0; i < 3; i++) {
        const t = tmmAt(stack, f[i]);
        expect(dist(t.R, { re: fem.R_re[i], im: fem.R_im[i] })).toBeLessThan(1e-5);
        expect(dist(t.T, { re: fem.T_re[i], im: fem.T_im[i] })).toBeLessThan(1e-5);
      }
    }), { numRuns: 40, seed: 3 });
  });
});
