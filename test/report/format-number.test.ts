// formatNumber's fast path writes the same text as its definition, String(Number(x.toPrecision(12))): 12
// significant digits, trailing zeros dropped, JavaScript's own exponent form outside [1e-7, 1e21).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fixedDecimals, formatNumber, ordinal } from '../../src/report/table.ts';

const definition = (x: number): string => (x === 0 ? '0' : String(Number(x.toPrecision(12))));

describe('formatNumber', () => {
  it('equals its definition for any finite double (fast-check)', () => {
    fc.assert(fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => formatNumber(x) === definition(x)), { numRuns: 50000 });
    // and most often where the tables' numbers live
    fc.assert(fc.property(fc.double({ min: -1e4, max: 1e4, noNaN: true }), (x) => formatNumber(x) === definition(x)), { numRuns: 50000 });
  });

  it('equals it on 12-digit decimals and on values halfway between two of them, where rounding is closest', () => {
    const near = fc.tuple(fc.integer({ min: 1e11, max: 1e12 - 1 }), fc.integer({ min: -8, max: 13 }), fc.constantFrom(0, 0.5, 0.4999, 0.5001), fc.boolean());
    fc.assert(fc.property(near, ([m, e, f, neg]) => {
      const x = (neg ? -1 : 1) * (m + f) * 10 ** (e - 11);
      return formatNumber(x) === definition(x);
    }), { numRuns: 50000 });
  });

  it('equals it at the edges of the fixed notation and where rounding carries a digit', () => {
    for (const x of [1e-6, 9.999999999995e-7, 1e-7, 0.000001234, 999999999999.5, 1e12, 123456789012, 0.5, -0.5, 1, -0, 1e21, 5e-324]) {
      expect(formatNumber(x)).toBe(definition(x));
    }
  });
});

describe('ordinal (English ordinals, common practice, no source)', () => {
  it('writes 1st 2nd 3rd 4th, the teens with th, and 21st 22nd 23rd 101st 111th 112th', () => {
    const cases: [number, string][] = [[1, '1st'], [2, '2nd'], [3, '3rd'], [4, '4th'], [10, '10th'], [11, '11th'], [12, '12th'], [13, '13th'],
      [21, '21st'], [22, '22nd'], [23, '23rd'], [101, '101st'], [111, '111th'], [112, '112th'], [1002, '1002nd']];
    for (const [n, text] of cases) expect(ordinal(n)).toBe(text);
  });
});

describe('fixedDecimals', () => {
  it('is toFixed except that a rounding to zero never carries a minus sign (common practice, no source)', () => {
    expect(fixedDecimals(-1e-13, 2)).toBe('0.00');
    expect(fixedDecimals(-0, 1)).toBe('0.0');
    expect(fixedDecimals(-0.004, 0)).toBe('0');
    expect(fixedDecimals(-0.005, 2)).toBe('-0.01');
    fc.assert(fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.integer({ min: 0, max: 6 }), (x, n) => {
      const s = fixedDecimals(x, n);
      return Number(s) === Number(x.toFixed(n)) && !/^-0(\.0*)?$/.test(s);
    }), { numRuns: 2000 });
  });
});
