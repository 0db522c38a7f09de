// The study generator and percentile estimator against published values and general-purpose libraries.
import { mersenne } from 'pure-rand/generator/mersenne';
import { quantile } from 'd3-array';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { quantiles, quantileSorted } from '../../src/studies/percentile.ts';
import { Mt19937 } from '../../src/studies/random.ts';

describe('MT19937', () => {
  it('gives 4123659995 as its 10000th output from the default seed 5489 (ISO C++ [rand.predef], mt19937)', () => {
    const g = new Mt19937(5489);
    let x = 0;
    for (let i = 0; i < 10000; i++) x = g.nextUint32();
    expect(x).toBe(4123659995);
  });

  it('matches pure-rand\'s Mersenne Twister output for output on several seeds (npm pure-rand 8)', () => {
    for (const seed of [0, 1, 42, 123456789, 0xffffffff]) {
      const ours = new Mt19937(seed), theirs = mersenne(seed);
      for (let i = 0; i < 2000; i++) expect(ours.nextUint32()).toBe(theirs.next() >>> 0);
    }
  });

  it('draws uniforms in [0, 1) and normals of mean 0 and variance 1 within sampling error (Box–Muller)', () => {
    const g = new Mt19937(7), n = 200_000;
    let s = 0, s2 = 0, u = 0, lo = 1, hi = 0;
    for (let i = 0; i < n; i++) {
      const z = g.normal(); s += z; s2 += z * z;
      const v = g.uniform(); u += v; lo = Math.min(lo, v); hi = Math.max(hi, v);
    }
    const mean = s / n, variance = s2 / n - mean * mean;
    expect(Math.abs(mean)).toBeLessThan(4 / Math.sqrt(n)); // 4 standard errors
    expect(Math.abs(variance - 1)).toBeLessThan(4 * Math.sqrt(2 / n)); // var of s² ≈ 2σ⁴/n for a normal
    expect(Math.abs(u / n - 0.5)).toBeLessThan(4 * Math.sqrt(1 / 12 / n));
    expect(lo).toBeGreaterThanOrEqual(0);
    expect(hi).toBeLessThan(1);
  });

  it('repeats itself for a seed', () => {
    const a = new Mt19937(99), b = new Mt19937(99);
    for (let i = 0; i < 100; i++) expect(a.normal()).toBe(b.normal());
  });
});

describe('percentiles', () => {
  it('interpolate between order statistics like d3-array\'s quantile (Hyndman & Fan definition 7; npm d3-array 3)', () => {
    fc.assert(fc.property(
      fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 60 }),
      fc.double({ min: 0, max: 1, noNaN: true }),
      (xs, p) => {
        const ours = quantiles(xs, [p])[0], ref = quantile(xs, p)!;
        return Math.abs(ours - ref) <= 1e-9 * Math.max(1, Math.abs(ref));
      }), { numRuns: 3000 });
  });

  it('give the textbook values on a small sample (Hyndman & Fan 1996, definition 7)', () => {
    const sorted = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    expect(quantileSorted(sorted, 0.5)).toBe(5.5);
    expect(quantileSorted(sorted, 0.05)).toBeCloseTo(1.45, 14); // h = 0.45
    expect(quantileSorted(sorted, 0.95)).toBeCloseTo(9.55, 14);
    expect(quantileSorted(sorted, 1)).toBe(10);
  });
});
