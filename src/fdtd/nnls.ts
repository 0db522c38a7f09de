// Non-negative least squares, min ‖A x − b‖ subject to x ≥ 0 (Lawson & Hanson, Solving Least
// Squares Problems, 1974, ch. 23, the active-set algorithm). Small dense problems only.
// A is row-major m × n.

/** Unconstrained least squares on the columns `cols` of A (Householder QR). Returns the coefficients. */
function lsqColumns(A: Float64Array, m: number, n: number, b: Float64Array, cols: number[]): Float64Array {
  const k = cols.length;
  const Q = new Float64Array(m * k);
  for (let i = 0; i < m; i++) for (let j = 0; j < k; j++) Q[i * k + j] = A[i * n + cols[j]];
  const y = Float64Array.from(b);
  for (let j = 0; j < k; j++) {
    let norm = 0;
    for (let i = j; i < m; i++) norm += Q[i * k + j] ** 2;
    norm = Math.sqrt(norm);
    if (norm === 0) continue;
    const alpha = Q[j * k + j] > 0 ? -norm : norm;
    const v = new Float64Array(m);
    v[j] = Q[j * k + j] - alpha;
    for (let i = j + 1; i < m; i++) v[i] = Q[i * k + j];
    let vv = 0;
    for (let i = j; i < m; i++) vv += v[i] * v[i];
    if (vv === 0) continue;
    for (let c = j; c < k; c++) {
      let s = 0;
      for (let i = j; i < m; i++) s += v[i] * Q[i * k + c];
      s = (2 * s) / vv;
      for (let i = j; i < m; i++) Q[i * k + c] -= s * v[i];
    }
    let s = 0;
    for (let i = j; i < m; i++) s += v[i] * y[i];
    s = (2 * s) / vv;
    for (let i = j; i < m; i++) y[i] -= s * v[i];
  }
  const x = new Float64Array(k);
  for (let j = k - 1; j >= 0; j--) {
    let s = y[j];
    for (let c = j + 1; c < k; c++) s -= Q[j * k + c] * x[c];
    const d = Q[j * k + j];
    x[j] = d !== 0 ? s / d : 0;
  }
  return x;
}

export function nnls(A: Float64Array, m: number, n: number, b: Float64Array, maxIter = 3 * n + 30): Float64Array {
  const x = new Float64Array(n);
  const passive = new Uint8Array(n);
  const w = new Float64Array(n);
  const residual = (): void => {
    for (let j = 0; j < n; j++) w[j] = 0;
    for (let i = 0; i < m; i++) {
      let r = b[i];
      for (let j = 0; j < n; j++) r -= A[i * n + j] * x[j];
      for (let j = 0; j < n; j++) w[j] += A[i * n + j] * r;
    }
  };
  let scale = 0;
  for (let i = 0; i < m * n; i++) scale = Math.max(scale, Math.abs(A[i]));
  let bn = 0;
  for (let i = 0; i < m; i++) bn = Math.max(bn, Math.abs(b[i]));
  const tol = 1e-12 * Math.max(1, scale * bn * m);
  for (let outer = 0; outer < maxIter; outer++) {
    residual();
    let t = -1, best = tol;
    for (let j = 0; j < n; j++) if (!passive[j] && w[j] > best) { best = w[j]; t = j; }
    if (t < 0) break;
    passive[t] = 1;
    for (let inner = 0; inner < maxIter; inner++) {
      const cols: number[] = [];
      for (let j = 0; j < n; j++) if (passive[j]) cols.push(j);
      const zc = lsqColumns(A, m, n, b, cols);
      let ok = true;
      for (let c = 0; c < cols.length; c++) if (zc[c] <= 0) ok = false;
      if (ok) {
        for (let c = 0; c < cols.length; c++) x[cols[c]] = zc[c];
        break;
      }
      let alpha = 1;
      for (let c = 0; c < cols.length; c++) {
        const j = cols[c];
        if (zc[c] <= 0) {
          const d = x[j] - zc[c];
          if (d > 0) alpha = Math.min(alpha, x[j] / d);
        }
      }
      for (let c = 0; c < cols.length; c++) {
        const j = cols[c];
        x[j] += alpha * (zc[c] - x[j]);
        if (x[j] <= 1e-15 * Math.max(1, Math.abs(zc[c]))) { x[j] = 0; passive[j] = 0; }
      }
    }
  }
  return x;
}
