// Sample percentiles by linear interpolation between order statistics: with the n values sorted, the p-quantile
// is x[h] interpolated at h = (n − 1) p (Hyndman & Fan, The American Statistician 50(4), 1996, definition 7; the
// default of R, NumPy and d3-array).

/** The p-quantile (0 ≤ p ≤ 1) of values sorted in increasing order. */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) throw new Error('quantileSorted: no values');
  const h = (n - 1) * p, lo = Math.floor(h);
  if (lo >= n - 1) return sorted[n - 1];
  return sorted[lo] + (h - lo) * (sorted[lo + 1] - sorted[lo]);
}

/** The p-quantiles of `values` (not changed; a sorted copy is made). */
export function quantiles(values: ArrayLike<number>, ps: readonly number[]): number[] {
  const sorted = Float64Array.from(values).sort();
  return ps.map((p) => quantileSorted(sorted, p));
}
