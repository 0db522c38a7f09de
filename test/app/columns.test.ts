// The per-pixel-column reduction the workbench draws every curve with: at most two vertices per
// pixel column, each column's extremes kept exactly (so peaks are never lost), order preserved.
// Checked against a brute-force min/max per column (common practice for min/max decimation, no source).

import { describe, expect, it } from 'vitest';
import { columnPolyline, reduceColumns } from '../../src/app/charts/columns.ts';

function bruteForce(x: Float64Array, y: Float64Array, x0: number, x1: number, width: number): Map<number, [number, number]> {
  const out = new Map<number, [number, number]>();
  for (let i = 0; i < x.length; i++) {
    if (x[i] < x0 || x[i] > x1) continue;
    const c = Math.min(width - 1, Math.floor(((x[i] - x0) / (x1 - x0)) * width));
    const m = out.get(c);
    out.set(c, m === undefined ? [y[i], y[i]] : [Math.min(m[0], y[i]), Math.max(m[1], y[i])]);
  }
  return out;
}

describe('reduceColumns', () => {
  it('keeps each column’s min and max of a dense noisy signal with ≤ 2 vertices per column', () => {
    const n = 100_000, width = 640;
    const x = new Float64Array(n), y = new Float64Array(n);
    let seed = 12345;
    const rand = (): number => { seed = (seed * 1103515245 + 12345) % 2 ** 31; return seed / 2 ** 31; };
    for (let i = 0; i < n; i++) { x[i] = i * 1e-3; y[i] = Math.sin(i * 0.01) + 0.3 * (rand() - 0.5); }
    const line = reduceColumns(x, y, n, 0, x[n - 1], width, columnPolyline(width));
    expect(line.count).toBeLessThanOrEqual(2 * width);
    const expected = bruteForce(x, y, 0, x[n - 1], width);
    const got = new Map<number, [number, number]>();
    for (let k = 0; k < line.count; k++) {
      const c = Math.floor(line.px[k]);
      const m = got.get(c);
      got.set(c, m === undefined ? [line.y[k], line.y[k]] : [Math.min(m[0], line.y[k]), Math.max(m[1], line.y[k])]);
    }
    expect(got.size).toBe(expected.size);
    for (const [c, [lo, hi]] of expected) expect(got.get(c)).toEqual([lo, hi]);
    // Vertices run left to right.
    for (let k = 1; k < line.count; k++) expect(line.px[k]).toBeGreaterThanOrEqual(line.px[k - 1]);
  });

  it('passes sparse data through unchanged and breaks the line at NaN', () => {
    const x = Float64Array.from([0, 1, 2, 3, 4]);
    const y = Float64Array.from([0, 1, NaN, 3, 4]);
    const line = reduceColumns(x, y, 5, 0, 4, 400, columnPolyline(400));
    expect(Array.from(line.y.subarray(0, line.count))).toEqual([0, 1, 3, 4]);
    expect(Array.from(line.starts.subarray(0, line.startCount))).toEqual([0, 2]);
  });

  it('cuts the curve at the edges of the range, at the values interpolated there', () => {
    // Straight-line interpolation between the samples either side of each edge (closed form).
    const x = Float64Array.from([-2, -1, 0.5, 1.5, 3, 4]);
    const y = Float64Array.from([9, 1, 2, 3, 4, 9]);
    const line = reduceColumns(x, y, 6, 0, 2, 100, columnPolyline(100));
    const ys = Array.from(line.y.subarray(0, line.count));
    expect(ys.length).toBe(4);
    expect(ys[0]).toBeCloseTo(1 + 1 / 1.5, 12);
    expect(ys.slice(1, 3)).toEqual([2, 3]);
    expect(ys[3]).toBeCloseTo(3 + 0.5 / 1.5, 12);
    expect(line.px[0]).toBe(0);
    expect(line.px[line.count - 1]).toBe(100);
  });

  it('draws a segment that spans the whole range (zoomed in between two samples) edge to edge', () => {
    const x = Float64Array.from([-10, 10]);
    const y = Float64Array.from([-1, 1]);
    const line = reduceColumns(x, y, 2, -1, 1, 50, columnPolyline(50));
    expect(line.count).toBe(2);
    expect(line.y[0]).toBeCloseTo(-0.1, 12);
    expect(line.y[1]).toBeCloseTo(0.1, 12);
    expect([line.px[0], line.px[1]]).toEqual([0, 50]);
  });
});
