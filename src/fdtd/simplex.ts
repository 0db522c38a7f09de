// A small dense linear program: minimize cᵀx subject to G x ≥ h, x ≥ 0, with c ≥ 0.
// Solved through its dual, maximize hᵀy subject to Gᵀy ≤ c, y ≥ 0, whose origin is feasible when
// c ≥ 0, so the primal simplex method (Dantzig's rule, Bland's rule once progress stalls) needs no
// first phase; the primal x is read off the final tableau as the dual prices of the dual's
// constraints (LP duality, e.g. Chvátal, Linear Programming, 1983, ch. 5). Small problems only
// (tens of variables, hundreds of constraints): the tableau is dense.

export interface LpResult {
  /** The minimizer (length n). */
  x: Float64Array;
  /** cᵀx at the minimizer. */
  value: number;
  /** False when the iteration limit was reached (x is then the last feasible point of the dual's path). */
  optimal: boolean;
}

/** Pivots without progress before switching to Bland's rule (anti-cycling). */
const STALL_PIVOTS = 40;
const EPS = 1e-11;

/**
 * @param G row-major m × n constraint matrix (row i: G_i x ≥ h_i)
 * @param c length n, every entry ≥ 0
 */
export function minimizeLp(c: Float64Array, G: Float64Array, h: Float64Array, m: number, n: number, maxPivots = 20 * (m + n)): LpResult {
  for (let j = 0; j < n; j++) if (!(c[j] >= 0)) throw new Error('minimizeLp: c must be ≥ 0 (the dual origin must be feasible)');
  // Dual tableau: n rows (one per primal variable), columns: m dual variables, n slacks, right-hand side.
  const cols = m + n + 1, rows = n + 1;
  const T = new Float64Array(rows * cols);
  for (let j = 0; j < n; j++) {
    const r = j * cols;
    for (let i = 0; i < m; i++) T[r + i] = G[i * n + j];
    T[r + m + j] = 1;
    T[r + cols - 1] = c[j];
  }
  const obj = n * cols;
  for (let i = 0; i < m; i++) T[obj + i] = -h[i];
  const basis = new Int32Array(n);
  for (let j = 0; j < n; j++) basis[j] = m + j;

  let optimal = false, stall = 0, last = 0;
  for (let it = 0; it < maxPivots; it++) {
    const bland = stall >= STALL_PIVOTS;
    let enter = -1, best = -EPS;
    for (let k = 0; k < cols - 1; k++) {
      const v = T[obj + k];
      if (v < best) { enter = k; if (bland) break; best = v; }
    }
    if (enter < 0) { optimal = true; break; }
    let leave = -1, ratio = Infinity;
    for (let r = 0; r < n; r++) {
      const a = T[r * cols + enter];
      if (a > EPS) {
        const q = T[r * cols + cols - 1] / a;
        if (q < ratio - 1e-14 || (q <= ratio + 1e-14 && leave >= 0 && basis[r] < basis[leave])) { ratio = q; leave = r; }
      }
    }
    if (leave < 0) break; // unbounded dual: the primal is infeasible (cannot happen for the fits here)
    pivot(T, rows, cols, leave, enter);
    basis[leave] = enter;
    const value = T[obj + cols - 1];
    stall = value > last + 1e-13 * Math.max(1, Math.abs(value)) ? 0 : stall + 1;
    last = value;
  }
  const x = new Float64Array(n);
  for (let j = 0; j < n; j++) x[j] = Math.max(0, T[obj + m + j]);
  let value = 0;
  for (let j = 0; j < n; j++) value += c[j] * x[j];
  return { x, value, optimal };
}

function pivot(T: Float64Array, rows: number, cols: number, pr: number, pc: number): void {
  const base = pr * cols, inv = 1 / T[base + pc];
  for (let k = 0; k < cols; k++) T[base + k] *= inv;
  T[base + pc] = 1;
  for (let r = 0; r < rows; r++) {
    if (r === pr) continue;
    const row = r * cols, f = T[row + pc];
    if (f === 0) continue;
    for (let k = 0; k < cols; k++) T[row + k] -= f * T[base + k];
    T[row + pc] = 0;
  }
}
