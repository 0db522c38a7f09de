// One element's matrix A = α S − β M (complex α, β; S, M the reference stiffness and mass) and its
// static condensation onto the two vertices: the interior unknowns u_I = G u_V are eliminated, leaving
// the 2×2 Schur complement C = A_VV − A_VI A_II⁻¹ A_IV. Every element of a region shares α and β, so this runs
// once per region and frequency. Work buffers are allocated once per order and reused.
//
// The row sums P = C·[1, 1]ᵀ (the element's shunt part, what is left of C once its series coupling −C_01 is
// taken out) are computed without cancellation: S·1 = 0 exactly (the stiffness of a constant), so A·1 = −β M·1,
// and with u = 1 + δ (δ = 0 on the vertices) the interior correction solves A_II δ_I = β (M·1)_I, giving
// P = −β (M·1)_V + A_VI δ_I. Formed as C_00 + C_01, P would lose the digits |α| / |β| ~ 1 / (k h)² of an
// electrically thin element (a 0.01 nm film at 1 GHz, or 10 nm at 1 MHz, lost 4 to 5 of them).

import type { FemOrder } from './basis.ts';
import { referenceElement } from './basis.ts';

export interface CondensedElement {
  /** C_00, C_11 (vertex diagonals) and C_01 = C_10. */
  d0Re: number; d0Im: number; d1Re: number; d1Im: number; oRe: number; oIm: number;
  /** Row sums C_00 + C_01 and C_11 + C_01, computed without cancellation (see the head of the file). */
  p0Re: number; p0Im: number; p1Re: number; p1Im: number;
  /** Interior recovery u_I = G u_V: m × 2 complex, row-major (m = p − 1). */
  gRe: Float64Array; gIm: Float64Array;
}

export interface Condenser {
  p: FemOrder;
  /** Condense A = α S − β M; the result is overwritten on the next call. */
  condense(alphaRe: number, alphaIm: number, betaRe: number, betaIm: number): CondensedElement;
}

export function createCondenser(p: FemOrder): Condenser {
  const ref = referenceElement(p);
  const n = p + 1, m = p - 1;
  const aRe = new Float64Array(n * n), aIm = new Float64Array(n * n);
  // Augmented interior system [A_II | A_IV | β (M·1)_I], m × (m + 3).
  const w = m + 3;
  const mRow = Float64Array.from({ length: n }, (_, i) => { let t = 0; for (let j = 0; j < n; j++) t += ref.M[i * n + j]; return t; });
  const xRe = new Float64Array(Math.max(1, m * w)), xIm = new Float64Array(Math.max(1, m * w));
  const out: CondensedElement = {
    d0Re: 0, d0Im: 0, d1Re: 0, d1Im: 0, oRe: 0, oIm: 0, p0Re: 0, p0Im: 0, p1Re: 0, p1Im: 0,
    gRe: new Float64Array(Math.max(1, m * 2)), gIm: new Float64Array(Math.max(1, m * 2)),
  };
  const V = [0, p];
  const c = new Float64Array(4), ci = new Float64Array(4);

  function condense(alRe: number, alIm: number, beRe: number, beIm: number): CondensedElement {
    for (let k = 0; k < n * n; k++) {
      aRe[k] = alRe * ref.S[k] - beRe * ref.M[k];
      aIm[k] = alIm * ref.S[k] - beIm * ref.M[k];
    }
    // Interior block and coupling to the vertices, interior local nodes 1 … p−1.
    for (let i = 0; i < m; i++) {
      for (let j = 0; j < m; j++) { xRe[i * w + j] = aRe[(i + 1) * n + j + 1]; xIm[i * w + j] = aIm[(i + 1) * n + j + 1]; }
      for (let v = 0; v < 2; v++) { xRe[i * w + m + v] = aRe[(i + 1) * n + V[v]]; xIm[i * w + m + v] = aIm[(i + 1) * n + V[v]]; }
      xRe[i * w + m + 2] = beRe * mRow[i + 1]; xIm[i * w + m + 2] = beIm * mRow[i + 1];
    }
    solveSmall(xRe, xIm, m, w);
    // G = −A_II⁻¹ A_IV
    for (let i = 0; i < m; i++)
      for (let v = 0; v < 2; v++) { out.gRe[i * 2 + v] = -xRe[i * w + m + v]; out.gIm[i * 2 + v] = -xIm[i * w + m + v]; }
    // C = A_VV + A_VI G
    for (let r = 0; r < 2; r++)
      for (let s = 0; s < 2; s++) {
        let re = aRe[V[r] * n + V[s]], im = aIm[V[r] * n + V[s]];
        for (let i = 0; i < m; i++) {
          const pr = aRe[V[r] * n + i + 1], pi = aIm[V[r] * n + i + 1];
          const gr = out.gRe[i * 2 + s], gi = out.gIm[i * 2 + s];
          re += pr * gr - pi * gi;
          im += pr * gi + pi * gr;
        }
        c[r * 2 + s] = re; ci[r * 2 + s] = im;
      }
    out.d0Re = c[0]; out.d0Im = ci[0]; out.d1Re = c[3]; out.d1Im = ci[3];
    // P_r = −β (M·1)_{V_r} + Σ_i A_{V_r, i} δ_i, δ = A_II⁻¹ β (M·1)_I (the last augmented column)
    for (let r = 0; r < 2; r++) {
      let re = -beRe * mRow[V[r]], im = -beIm * mRow[V[r]];
      for (let i = 0; i < m; i++) {
        const pr = aRe[V[r] * n + i + 1], pi = aIm[V[r] * n + i + 1], dr = xRe[i * w + m + 2], di = xIm[i * w + m + 2];
        re += pr * dr - pi * di;
        im += pr * di + pi * dr;
      }
      if (r === 0) { out.p0Re = re; out.p0Im = im; } else { out.p1Re = re; out.p1Im = im; }
    }
    // C is complex symmetric; average the two off-diagonals to keep it exactly so.
    out.oRe = (c[1] + c[2]) / 2; out.oIm = (ci[1] + ci[2]) / 2;
    return out;
  }
  return { p, condense };
}

/** In-place Gauss–Jordan with partial pivoting on an m × w complex augmented matrix; the last w − m columns
 *  become A⁻¹ B. m ≤ 2 for the orders used, so this is a handful of operations. */
function solveSmall(re: Float64Array, im: Float64Array, m: number, w: number): void {
  for (let c = 0; c < m; c++) {
    let piv = c, best = Math.hypot(re[c * w + c], im[c * w + c]);
    for (let r = c + 1; r < m; r++) {
      const v = Math.hypot(re[r * w + c], im[r * w + c]);
      if (v > best) { best = v; piv = r; }
    }
    if (piv !== c)
      for (let j = 0; j < w; j++) {
        let t = re[c * w + j]; re[c * w + j] = re[piv * w + j]; re[piv * w + j] = t;
        t = im[c * w + j]; im[c * w + j] = im[piv * w + j]; im[piv * w + j] = t;
      }
    // Scale the pivot row by 1 / pivot.
    const pr = re[c * w + c], pi = im[c * w + c];
    // 1 / pivot by Smith's scaling (Smith, CACM 5(8), 1962), safe from overflow for the thinnest elements
    let ir: number, ii: number;
    if (Math.abs(pr) >= Math.abs(pi)) { const q = pi / pr, d = pr + pi * q; ir = 1 / d; ii = -q / d; }
    else { const q = pr / pi, d = pr * q + pi; ir = q / d; ii = -1 / d; }
    for (let j = 0; j < w; j++) {
      const a = re[c * w + j], b = im[c * w + j];
      re[c * w + j] = a * ir - b * ii; im[c * w + j] = a * ii + b * ir;
    }
    for (let r = 0; r < m; r++) {
      if (r === c) continue;
      const fr = re[r * w + c], fi = im[r * w + c];
      for (let j = 0; j < w; j++) {
        const a = re[c * w + j], b = im[c * w + j];
        re[r * w + j] -= fr * a - fi * b; im[r * w + j] -= fr * b + fi * a;
      }
    }
  }
}
