// Chart x axes (src/app/charts/axis.ts) and the cursor readout's lookup (src/app/charts/readout.ts):
// the log mapping against log10 (closed form), round trips, decade ticks, nearest-sample search
// against a linear scan (common practice, no source).

import { describe, expect, it } from 'vitest';
import { axisTicks, fromPx, toPx, type Axis } from '../../src/app/charts/axis.ts';
import { nearestIndex, parseReadout, readoutValue } from '../../src/app/charts/readout.ts';

describe('chart axis', () => {
  const log: Axis = { scale: 'log', lo: 1, hi: 100, left: 10, width: 200 };
  it('puts each decade at an equal share of a log axis', () => {
    expect(toPx(log, 1)).toBeCloseTo(10, 12);
    expect(toPx(log, 10)).toBeCloseTo(110, 12);
    expect(toPx(log, 100)).toBeCloseTo(210, 12);
    expect(toPx(log, 2)).toBeCloseTo(10 + 100 * Math.log10(2), 12);
  });

  it('maps pixels back to data on both scales', () => {
    const lin: Axis = { scale: 'linear', lo: 2, hi: 7, left: 0, width: 500 };
    for (const x of [2, 3.3, 6.99]) {
      expect(fromPx(lin, toPx(lin, x))).toBeCloseTo(x, 12);
      expect(fromPx(log, toPx(log, x * 10))).toBeCloseTo(x * 10, 10);
    }
  });

  it('ticks a log axis at 1, 2, 5 per decade and a short log axis at round linear steps', () => {
    expect(axisTicks(log, 10)).toEqual([1, 2, 5, 10, 20, 50, 100]);
    expect(axisTicks({ ...log, lo: 1, hi: 1e6 }, 8)).toEqual([1, 10, 100, 1000, 1e4, 1e5, 1e6]);
    const short = axisTicks({ ...log, lo: 8, hi: 12 }, 4);
    expect(short.length).toBeGreaterThanOrEqual(3);
    for (const t of short) expect(Number.isInteger(t)).toBe(true);
  });
});

describe('cursor readout lookup', () => {
  it('finds the nearest sample as a linear scan does', () => {
    const x = Float64Array.from({ length: 501 }, (_, i) => 1 + i * 0.01);
    for (const at of [0, 1, 1.004, 1.006, 3.14159, 5.2, 6, 9]) {
      let best = 0;
      for (let i = 1; i < x.length; i++) if (Math.abs(x[i] - at) < Math.abs(x[best] - at)) best = i;
      expect(nearestIndex(x, at)).toBe(best);
    }
    expect(nearestIndex(new Float64Array(0), 1)).toBe(-1);
  });

  it('writes values that read back to their shown precision', () => {
    expect(readoutValue(-12.04321, 3)).toBe('−12.043');
    expect(parseReadout(readoutValue(-12.04321, 3))).toBe(-12.043);
    expect(readoutValue(0.123456789)).toBe('0.12346');
    expect(readoutValue(Number.NaN)).toBe('—');
  });
});
