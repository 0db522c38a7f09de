// The cursor readout's arithmetic: the sample nearest a position, and the value texts.

/** Index of the finite sample of `x` (ascending) nearest to `at`, or -1 when there is none. */
export function nearestIndex(x: ArrayLike<number>, at: number, n = x.length): number {
  if (n === 0 || !Number.isFinite(at)) return -1;
  let lo = 0, hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (x[mid] <= at) lo = mid; else hi = mid;
  }
  const best = Math.abs(x[lo] - at) <= Math.abs(x[hi] - at) ? lo : hi;
  if (Number.isFinite(x[best])) return best;
  // A non-finite x (rare): look outwards for the closest finite one.
  for (let d = 1; d < n; d++) {
    if (best - d >= 0 && Number.isFinite(x[best - d])) return best - d;
    if (best + d < n && Number.isFinite(x[best + d])) return best + d;
  }
  return -1;
}

/**
 * A value as the readout shows it: `decimals` places when given, else 5 significant digits;
 * a minus sign (U+2212) for negatives; "—" for a missing value.
 */
export function readoutValue(v: number, decimals?: number): string {
  if (!Number.isFinite(v)) return '—';
  let s: string;
  if (decimals !== undefined) s = v.toFixed(decimals);
  else {
    const a = Math.abs(v);
    s = a !== 0 && (a >= 1e6 || a < 1e-4) ? v.toExponential(4) : String(Number(v.toPrecision(5)));
  }
  return s.replace(/^-/, '−');
}

/** Parse a readout value back (for checks): U+2212 as a minus sign. */
export const parseReadout = (s: string): number => Number(s.trim().replace(/^−/, '-'));
