// The Nelder–Mead simplex search (Nelder & Mead, Computer Journal 7, 1965, 308–313) with the usual coefficients
// (reflection 1, expansion 2, contraction ½, shrink ½; Lagarias, Reeds, Wright & Wright, SIAM J. Optim. 9, 1998,
// 112–147), in the unit cube: every trial point is clamped to [0, 1] in each coordinate (projection), so the
// search never leaves the bounds. It needs no derivatives, which suits a worst case over a band (a maximum of
// smooth curves, with corners where the worst frequency changes).
//
// Written as a generator: it yields each point it wants evaluated and is resumed with that point's objective,
// so the caller decides when to evaluate, when to report progress and when to stop.

/** Where a local search ended. */
export interface LocalEnd { u: Float64Array; f: number; converged: boolean }

export interface NelderMeadOptions {
  /** Size of the first simplex along each axis (unit-cube units). */
  step: number;
  /** Converged when every vertex lies within this of the best (unit-cube units) … */
  xtol: number;
  /** … and every objective within this of the best's (absolute). */
  ftol: number;
}

const clamp01 = (u: Float64Array): Float64Array => u.map((x) => Math.min(1, Math.max(0, x)));

/** A point between a and b: a + t (b − a), clamped to the cube. */
function along(a: Float64Array, b: Float64Array, t: number): Float64Array {
  const out = new Float64Array(a.length);
  for (let k = 0; k < a.length; k++) out[k] = a[k] + t * (b[k] - a[k]);
  return clamp01(out);
}

/** Minimize from `start` (whose objective `fStart` is known). */
export function* nelderMead(start: Float64Array, fStart: number, o: NelderMeadOptions): Generator<Float64Array, LocalEnd, number> {
  const n = start.length;
  const xs: Float64Array[] = [Float64Array.from(start)];
  const fs: number[] = [fStart];
  for (let k = 0; k < n; k++) {
    const v = Float64Array.from(start);
    v[k] = v[k] + o.step <= 1 ? v[k] + o.step : v[k] - o.step;
    xs.push(clamp01(v));
    fs.push(yield xs[k + 1]);
  }
  for (;;) {
    const order = fs.map((_, i) => i).sort((a, b) => fs[a] - fs[b]);
    const sx = order.map((i) => xs[i]), sf = order.map((i) => fs[i]);
    xs.splice(0, xs.length, ...sx); fs.splice(0, fs.length, ...sf);
    if (converged(xs, fs, o)) return { u: xs[0], f: fs[0], converged: true };
    const centroid = new Float64Array(n);
    for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) centroid[k] += xs[i][k] / n;
    const worst = xs[n];
    const xr = along(centroid, worst, -1), fr = yield xr;
    if (fr < fs[0]) {
      const xe = along(centroid, worst, -2), fe = yield xe;
      if (fe < fr) { xs[n] = xe; fs[n] = fe; } else { xs[n] = xr; fs[n] = fr; }
      continue;
    }
    if (fr < fs[n - 1]) { xs[n] = xr; fs[n] = fr; continue; }
    // Contraction: outside (towards the reflected point) when it beat the worst, else inside.
    const outside = fr < fs[n];
    const xc = along(centroid, outside ? xr : worst, 0.5), fc = yield xc;
    if (fc < (outside ? fr : fs[n])) { xs[n] = xc; fs[n] = fc; continue; }
    for (let i = 1; i <= n; i++) { xs[i] = along(xs[0], xs[i], 0.5); fs[i] = yield xs[i]; }
  }
}

function converged(xs: Float64Array[], fs: number[], o: NelderMeadOptions): boolean {
  for (let i = 1; i < xs.length; i++) {
    if (!(Math.abs(fs[i] - fs[0]) <= o.ftol)) return false;
    for (let k = 0; k < xs[0].length; k++) if (Math.abs(xs[i][k] - xs[0][k]) > o.xtol) return false;
  }
  return true;
}
