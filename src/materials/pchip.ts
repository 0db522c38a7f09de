// Piecewise cubic Hermite interpolation that preserves the shape of the data (PCHIP): on every interval the
// cubic is monotone between its two samples, so it never overshoots them, and a local extremum of the data
// stays one of the interpolant. Node derivatives are the weighted harmonic mean of the neighbouring secants
// (zero where the secants change sign or one is zero), Fritsch & Butland, SIAM J. Sci. Stat. Comput. 5 (1984)
// 300–304, which meets the monotonicity region of Fritsch & Carlson, SIAM J. Numer. Anal. 17 (1980) 238–246;
// the end derivatives are the three-point one-sided formula, set to zero when its sign differs from the end
// secant's and capped at three times that secant where the data turn (the end rule of common PCHIP
// implementations, e.g. Moler, Numerical Computing with MATLAB, 2004, §3.4; recalled from memory).
// Two samples give the straight line through them.

export interface Pchip {
  /** Abscissae, strictly increasing. */
  readonly x: Float64Array;
  readonly y: Float64Array;
  /** dy/dx at each node. */
  readonly d: Float64Array;
}

/** The interpolant through (x[i], y[i]); x strictly increasing, at least two samples. */
export function pchip(x: Float64Array, y: Float64Array): Pchip {
  const n = x.length;
  if (n < 2 || y.length !== n) throw new RangeError('pchip: needs at least two samples, x and y of one length');
  const h = new Float64Array(n - 1), s = new Float64Array(n - 1);
  for (let i = 0; i < n - 1; i++) {
    h[i] = x[i + 1] - x[i];
    if (!(h[i] > 0)) throw new RangeError('pchip: x must be strictly increasing');
    s[i] = (y[i + 1] - y[i]) / h[i];
  }
  const d = new Float64Array(n);
  if (n === 2) { d[0] = d[1] = s[0]; return { x, y, d }; }
  for (let i = 1; i < n - 1; i++) {
    const a = s[i - 1], b = s[i];
    if (a * b <= 0) { d[i] = 0; continue; }
    const w1 = 2 * h[i] + h[i - 1], w2 = h[i] + 2 * h[i - 1];
    d[i] = (w1 + w2) / (w1 / a + w2 / b);
  }
  d[0] = endSlope(h[0], h[1], s[0], s[1]);
  d[n - 1] = endSlope(h[n - 2], h[n - 3], s[n - 2], s[n - 3]);
  return { x, y, d };
}

/** One-sided three-point derivative at an end, kept shape-preserving. */
function endSlope(h0: number, h1: number, s0: number, s1: number): number {
  const d = ((2 * h0 + h1) * s0 - h0 * s1) / (h0 + h1);
  if (d * s0 <= 0) return 0;
  if (s0 * s1 <= 0 && Math.abs(d) > Math.abs(3 * s0)) return 3 * s0;
  return d;
}

/** Index i of the interval [x[i], x[i+1]] holding t (t inside [x[0], x[n−1]]). */
export function intervalOf(x: Float64Array, t: number): number {
  let lo = 0, hi = x.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (x[mid] <= t) lo = mid; else hi = mid;
  }
  return lo;
}

/** The interpolant at t, which must lie in [x[0], x[n−1]] (the caller checks the range). */
export function pchipAt(p: Pchip, t: number): number {
  const i = intervalOf(p.x, t);
  const h = p.x[i + 1] - p.x[i], u = (t - p.x[i]) / h;
  const u2 = u * u, u3 = u2 * u;
  const h00 = 2 * u3 - 3 * u2 + 1, h10 = u3 - 2 * u2 + u, h01 = -2 * u3 + 3 * u2, h11 = u3 - u2;
  return h00 * p.y[i] + h10 * h * p.d[i] + h01 * p.y[i + 1] + h11 * h * p.d[i + 1];
}
