// The statistics behind the confidence intervals, against outside figures:
// - Student t quantiles t(0.975, ν) from the standard table (Abramowitz & Stegun 1964, Table 26.10; values from
//   memory, the well-known 12.706, 4.303, 2.571, 2.228, 2.042, 1.980 and the normal 1.960);
// - the symmetric eigen-decomposition: [[2, 1], [1, 2]] has eigenvalues 1 and 3 (closed form), and A v = λ v;
// - the intervals of a straight-line fit y = a + b x by ordinary least squares, where the linear theory is exact:
//   se(b) = s / √Σ(x − x̄)², se(a) = s √(1/n + x̄²/Σ(x − x̄)²) (Draper & Smith, Applied Regression Analysis,
//   3rd ed., 1998, §1.4 and §3.2; common practice).
import { describe, expect, it } from 'vitest';
import { symmetricEigen, solveSpd } from '../../src/tune/dense.ts';
import { inferParameters } from '../../src/tune/inference.ts';
import { incompleteBeta, studentQuantile } from '../../src/tune/student-t.ts';
import { Mt19937 } from '../../src/studies/random.ts';

describe('Student t', () => {
  it('t(0.975, ν) as tabulated', () => {
    const table: [number, number][] = [[1, 12.706], [2, 4.303], [5, 2.571], [10, 2.228], [30, 2.042], [120, 1.980], [1e7, 1.960]];
    for (const [nu, t] of table) expect(studentQuantile(0.95, nu)).toBeCloseTo(t, 3);
  });
  it('the incomplete beta function at closed forms: I_x(1, 1) = x, I_x(a, 1) = x^a, I_½(a, a) = ½', () => {
    expect(incompleteBeta(0.3, 1, 1)).toBeCloseTo(0.3, 14);
    expect(incompleteBeta(0.4, 3.5, 1)).toBeCloseTo(0.4 ** 3.5, 13);
    expect(incompleteBeta(0.5, 7.25, 7.25)).toBeCloseTo(0.5, 13);
  });
});

describe('dense symmetric matrices', () => {
  it('eigenvalues of [[2, 1], [1, 2]] are 1 and 3', () => {
    const { values } = symmetricEigen(new Float64Array([2, 1, 1, 2]), 2);
    expect(values[0]).toBeCloseTo(1, 14);
    expect(values[1]).toBeCloseTo(3, 14);
  });
  it('A v = λ v and orthonormal vectors for a random symmetric 6 × 6 matrix; Cholesky solves A x = b', () => {
    const rng = new Mt19937(3), n = 6;
    const B = Array.from({ length: n * n }, () => rng.normal());
    const A = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) A[i * n + j] += B[i * n + k] * B[j * n + k];
    const { values, vectors } = symmetricEigen(A, n);
    for (let j = 0; j < n; j++) {
      for (let i = 0; i < n; i++) {
        let av = 0;
        for (let k = 0; k < n; k++) av += A[i * n + k] * vectors[k * n + j];
        expect(av).toBeCloseTo(values[j] * vectors[i * n + j], 10);
      }
      for (let l = 0; l < n; l++) {
        let dot = 0;
        for (let i = 0; i < n; i++) dot += vectors[i * n + j] * vectors[i * n + l];
        expect(dot).toBeCloseTo(j === l ? 1 : 0, 12);
      }
    }
    const b = new Float64Array(n).map(() => rng.normal());
    const x = solveSpd(A, b, n)!;
    for (let i = 0; i < n; i++) { let s = 0; for (let k = 0; k < n; k++) s += A[i * n + k] * x[k]; expect(s).toBeCloseTo(b[i], 9); }
    expect(solveSpd(new Float64Array([1, 2, 2, 1]), new Float64Array([1, 1]), 2)).toBeNull(); // indefinite
  });
});

describe('least-squares inference', () => {
  it('a straight-line fit: the textbook standard errors and t intervals', () => {
    const rng = new Mt19937(11), n = 25;
    const x = Array.from({ length: n }, (_, i) => i * 0.4);
    const y = x.map((xi) => 1.5 - 0.7 * xi + 0.05 * rng.normal());
    // OLS by the normal equations (closed form).
    const xm = x.reduce((s, v) => s + v, 0) / n, ym = y.reduce((s, v) => s + v, 0) / n;
    const sxx = x.reduce((s, v) => s + (v - xm) ** 2, 0);
    const b = x.reduce((s, v, i) => s + (v - xm) * (y[i] - ym), 0) / sxx, a = ym - b * xm;
    const res = new Float64Array(y.map((yi, i) => a + b * x[i] - yi));
    const s = Math.sqrt(res.reduce((q, v) => q + v * v, 0) / (n - 2));
    // The parameters searched in a cube: a in [0, 4], b in [−2, 1]; J per unit-cube coordinate.
    const ranges = [{ name: 'a', lo: 0, hi: 4 }, { name: 'b', lo: -2, hi: 1 }];
    const J = new Float64Array(n * 2);
    for (let i = 0; i < n; i++) { J[i * 2] = 4; J[i * 2 + 1] = 3 * x[i]; }
    const inf = inferParameters(J, res, [a, b], ranges);
    const seB = s / Math.sqrt(sxx), seA = s * Math.sqrt(1 / n + (xm * xm) / sxx);
    expect(inf.dof).toBe(n - 2);
    expect(inf.standardError[0]).toBeCloseTo(seA, 12);
    expect(inf.standardError[1]).toBeCloseTo(seB, 12);
    const t = studentQuantile(0.95, n - 2);
    expect(inf.interval95[1]![0]).toBeCloseTo(b - t * seB, 12);
    expect(inf.interval95[1]![1]).toBeCloseTo(b + t * seB, 12);
    // corr(a, b) = −x̄ / √(x̄² + sxx/n) (same source).
    expect(inf.correlation[1]).toBeCloseTo(-xm / Math.sqrt(xm * xm + sxx / n), 12);
    expect(inf.warnings).toEqual([]);
  });

  it('a parameter the residuals do not depend on gets no interval and a warning naming it', () => {
    const n = 10, r = new Float64Array(n).map((_, i) => 0.01 * Math.sin(i));
    const J = new Float64Array(n * 2);
    for (let i = 0; i < n; i++) J[i * 2] = 1 + i; // the second column is zero
    const inf = inferParameters(J, r, [1, 2], [{ name: 'thick', lo: 0, hi: 1 }, { name: 'blind', lo: 0, hi: 5 }]);
    expect(inf.interval95[1]).toBeNull();
    expect(inf.interval95[0]).not.toBeNull();
    expect(inf.warnings.join('\n')).toMatch(/not identifiable: blind/);
  });
});
