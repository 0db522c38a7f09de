// PCHIP (src/materials/pchip.ts) against what its sources prove of it: Fritsch & Carlson, SIAM J. Numer. Anal.
// 17 (1980): a cubic Hermite piece whose end slopes have the secant's sign and lie within three times it is
// monotone, so monotone data give a monotone interpolant that never leaves the data's range; Fritsch & Butland
// (1984): the weighted harmonic mean of the secants meets that region. Closed forms: straight-line data are
// reproduced exactly (every slope equals the secant, and the Hermite cubic with those slopes is the line);
// the samples themselves are interpolated; a smooth function is approached as the spacing shrinks
// (order 2 or better for this rule, common practice, no source; asserted loosely as 1.5).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { pchip, pchipAt } from '../../src/materials/pchip.ts';

const grid = (xs: number[]) => new Float64Array(xs);

describe('PCHIP', () => {
  it('reproduces straight-line data exactly, also on an uneven grid', () => {
    const x = grid([0, 0.3, 1.1, 1.2, 4]), y = x.map((t) => 2.5 - 0.7 * t);
    const p = pchip(x, y);
    for (let t = 0; t <= 4; t += 0.037) expect(Math.abs(pchipAt(p, t) - (2.5 - 0.7 * t))).toBeLessThan(1e-13);
  });

  it('two samples give the line through them', () => {
    const p = pchip(grid([1, 3]), grid([2, 6]));
    expect(pchipAt(p, 2.5)).toBeCloseTo(5, 14);
  });

  it('passes through every sample', () => {
    const x = grid([0, 1, 2.5, 3, 7]), y = grid([1, 4, -2, -2, 5]);
    const p = pchip(x, y);
    x.forEach((t, i) => expect(pchipAt(p, t)).toBeCloseTo(y[i], 13));
  });

  it('monotone data give a monotone interpolant inside the data range (fast-check, random data)', () => {
    fc.assert(fc.property(
      fc.array(fc.tuple(fc.double({ min: 0.01, max: 3, noNaN: true }), fc.double({ min: 0, max: 5, noNaN: true })), { minLength: 2, maxLength: 12 }),
      (steps) => {
        const x = new Float64Array(steps.length), y = new Float64Array(steps.length);
        let xs = 0, ys = 0;
        steps.forEach(([dx, dy], i) => { xs += dx; ys += dy; x[i] = xs; y[i] = ys; });
        const p = pchip(x, y);
        let prev = -Infinity;
        for (let k = 0; k <= 400; k++) {
          const t = x[0] + ((x[x.length - 1] - x[0]) * k) / 400;
          const v = pchipAt(p, t);
          if (v < prev - 1e-9 * (1 + Math.abs(prev))) return false;
          if (v < y[0] - 1e-9 || v > y[y.length - 1] + 1e-9) return false;
          prev = v;
        }
        return true;
      }), { numRuns: 200, seed: 14 });
  });

  it('no overshoot at a step: the interpolant stays between the neighbouring samples', () => {
    const x = grid([0, 1, 2, 3, 4, 5]), y = grid([0, 0, 0, 1, 1, 1]);
    const p = pchip(x, y);
    for (let t = 0; t <= 5; t += 0.01) { const v = pchipAt(p, t); expect(v).toBeGreaterThanOrEqual(-1e-15); expect(v).toBeLessThanOrEqual(1 + 1e-15); }
  });

  it('converges to a smooth function as the spacing halves', () => {
    const f = (t: number) => 1 / (1 + t * t); // a Debye-like relaxation shape in t = ωτ
    const err = (n: number) => {
      const x = new Float64Array(n).map((_, i) => (4 * i) / (n - 1));
      const p = pchip(x, x.map(f));
      let e = 0;
      for (let t = 0; t <= 4; t += 0.001) e = Math.max(e, Math.abs(pchipAt(p, t) - f(t)));
      return e;
    };
    const e1 = err(17), e2 = err(33), e3 = err(65);
    expect(Math.log2(e1 / e2)).toBeGreaterThan(1.5);
    expect(Math.log2(e2 / e3)).toBeGreaterThan(1.5);
  });

  it('refuses fewer than two samples or frequencies that do not increase', () => {
    expect(() => pchip(grid([1]), grid([1]))).toThrow(RangeError);
    expect(() => pchip(grid([1, 1]), grid([1, 2]))).toThrow(RangeError);
  });
});
