// Small dense symmetric matrices (n ≤ 20, row-major Float64Array): Cholesky solves and the eigen-decomposition
// by cyclic Jacobi rotations (Golub & Van Loan, Matrix Computations, 4th ed., 2013, §8.5), which is accurate to
// rounding for every eigenvalue however small — what an identifiability check needs.

/** Solve A x = b for a symmetric positive definite A (n × n); null when A is not positive definite. */
export function solveSpd(A: Float64Array, b: Float64Array, n: number): Float64Array | null {
  const L = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = A[i * n + j];
      for (let k = 0; k < j; k++) s -= L[i * n + k] * L[j * n + k];
      if (i === j) {
        if (!(s > 0)) return null;
        L[i * n + i] = Math.sqrt(s);
      } else L[i * n + j] = s / L[j * n + j];
    }
  }
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let k = 0; k < i; k++) s -= L[i * n + k] * y[k];
    y[i] = s / L[i * n + i];
  }
  const x = new Float64Array(n);
  for (let i = n - 1; i >= 0; i--) {
    let s = y[i];
    for (let k = i + 1; k < n; k++) s -= L[k * n + i] * x[k];
    x[i] = s / L[i * n + i];
  }
  return x;
}

/** Eigenvalues (ascending) and unit eigenvectors (column j of `vectors` belongs to values[j]) of a symmetric A. */
export function symmetricEigen(A: Float64Array, n: number): { values: Float64Array; vectors: Float64Array } {
  const a = Float64Array.from(A), v = new Float64Array(n * n);
  for (let i = 0; i < n; i++) v[i * n + i] = 1;
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0, diag = 0;
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) (i === j ? (diag += a[i * n + i] ** 2) : (off += a[i * n + j] ** 2));
    if (off <= 1e-30 * diag || off === 0) break;
    for (let p = 0; p < n - 1; p++) for (let q = p + 1; q < n; q++) rotate(a, v, n, p, q);
  }
  const order = Array.from({ length: n }, (_, i) => i).sort((i, j) => a[i * n + i] - a[j * n + j]);
  const values = new Float64Array(n), vectors = new Float64Array(n * n);
  order.forEach((src, j) => {
    values[j] = a[src * n + src];
    for (let i = 0; i < n; i++) vectors[i * n + j] = v[i * n + src];
  });
  return { values, vectors };
}

/** One Jacobi rotation zeroing a[p][q] (and a[q][p]); v accumulates the rotations. */
function rotate(a: Float64Array, v: Float64Array, n: number, p: number, q: number): void {
  const apq = a[p * n + q];
  if (apq === 0) return;
  const theta = (a[q * n + q] - a[p * n + p]) / (2 * apq);
  const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
  const c = 1 / Math.sqrt(t * t + 1), s = t * c;
  for (let k = 0; k < n; k++) {
    const akp = a[k * n + p], akq = a[k * n + q];
    a[k * n + p] = c * akp - s * akq;
    a[k * n + q] = s * akp + c * akq;
  }
  for (let k = 0; k < n; k++) {
    const apk = a[p * n + k], aqk = a[q * n + k];
    a[p * n + k] = c * apk - s * aqk;
    a[q * n + k] = s * apk + c * aqk;
  }
  for (let k = 0; k < n; k++) {
    const vkp = v[k * n + p], vkq = v[k * n + q];
    v[k * n + p] = c * vkp - s * vkq;
    v[k * n + q] = s * vkp + c * vkq;
  }
}
