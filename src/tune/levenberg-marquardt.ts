// Levenberg–Marquardt least squares (Levenberg, Q. Appl. Math. 2, 1944, 164–168; Marquardt, SIAM J. Appl. Math.
// 11, 1963, 431–441) in the unit cube: the step solves (JᵀJ + λ D) δ = −Jᵀr with D the diagonal of JᵀJ
// (Marquardt's scaling, so the parameters' units do not matter), the trial point is clamped to [0, 1], λ shrinks
// by 3 after a step that lowers Σr² and grows by 4 after one that does not. J comes from forward differences,
// stepping inwards at a bound. A generator, like nelder-mead.ts: it yields points and is resumed with their
// residual vectors.

import { solveSpd } from './dense.ts';
import type { LocalEnd } from './nelder-mead.ts';

export interface LevenbergMarquardtOptions {
  /** Converged when a step moves no coordinate by more than this (unit-cube units) … */
  xtol: number;
  /** … or lowers Σr² by less than this fraction of it. */
  ftol: number;
}

/** Forward-difference step in unit-cube units (about √ε of a coordinate of order one, a little larger). */
export const FD_STEP = 1e-7;
const LAMBDA_START = 1e-3, LAMBDA_DOWN = 3, LAMBDA_UP = 4, LAMBDA_MAX = 1e12;

export const sumSquares = (r: Float64Array): number => { let s = 0; for (const x of r) s += x * x; return s; };

/** Minimize Σ r(u)² from `start`, whose residuals `rStart` are known. */
export function* levenbergMarquardt(start: Float64Array, rStart: Float64Array, o: LevenbergMarquardtOptions):
  Generator<Float64Array, LocalEnd, Float64Array> {
  const n = start.length, m = rStart.length;
  let u = Float64Array.from(start), r = rStart, S = sumSquares(r), lambda = LAMBDA_START;
  for (;;) {
    const J = new Float64Array(m * n); // row-major, m × n
    for (let k = 0; k < n; k++) {
      const h = u[k] + FD_STEP <= 1 ? FD_STEP : -FD_STEP;
      const v = Float64Array.from(u);
      v[k] += h;
      const rk: Float64Array = yield v;
      for (let i = 0; i < m; i++) J[i * n + k] = (rk[i] - r[i]) / h;
    }
    const { A, g } = normalEquations(J, r, m, n);
    let improved = false;
    while (!improved) {
      const delta = dampedStep(A, g, n, lambda);
      const trial = new Float64Array(n);
      let moved = 0;
      for (let k = 0; k < n; k++) {
        trial[k] = Math.min(1, Math.max(0, u[k] + (delta ? delta[k] : 0)));
        moved = Math.max(moved, Math.abs(trial[k] - u[k]));
      }
      if (moved <= o.xtol) return { u, f: S, converged: true };
      const rt: Float64Array = yield trial;
      const St = sumSquares(rt);
      if (St < S) {
        const gain = S - St;
        u = trial; r = rt; S = St;
        lambda = Math.max(lambda / LAMBDA_DOWN, 1e-12);
        improved = true;
        if (gain <= o.ftol * St) return { u, f: S, converged: true };
      } else {
        lambda *= LAMBDA_UP;
        if (lambda > LAMBDA_MAX) return { u, f: S, converged: true }; // no step lowers Σr²: a minimum within the bounds
      }
    }
  }
}

/** JᵀJ (n × n) and Jᵀr. */
export function normalEquations(J: Float64Array, r: Float64Array, m: number, n: number): { A: Float64Array; g: Float64Array } {
  const A = new Float64Array(n * n), g = new Float64Array(n);
  for (let i = 0; i < m; i++) {
    for (let a = 0; a < n; a++) {
      const Ja = J[i * n + a];
      g[a] += Ja * r[i];
      for (let b = 0; b <= a; b++) A[a * n + b] += Ja * J[i * n + b];
    }
  }
  for (let a = 0; a < n; a++) for (let b = 0; b < a; b++) A[b * n + a] = A[a * n + b];
  return { A, g };
}

/** δ of (A + λ D) δ = −g, D = diag(A) floored so a parameter the data do not see still gets a finite step. */
function dampedStep(A: Float64Array, g: Float64Array, n: number, lambda: number): Float64Array | null {
  let top = 0;
  for (let k = 0; k < n; k++) top = Math.max(top, A[k * n + k]);
  const M = Float64Array.from(A);
  for (let k = 0; k < n; k++) M[k * n + k] += lambda * Math.max(A[k * n + k], 1e-12 * top, 1e-300);
  return solveSpd(M, g.map((x) => -x), n);
}
