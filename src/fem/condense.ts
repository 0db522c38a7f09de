// One element's matrix A = α S − β M (complex α, β; S, M the reference stiffness and mass) and its
// static condensation onto the two vertices: the interior unknowns u_I = G u_V are eliminated, leaving
// the 2×2 Schur complement C = A_VV − A_VI A_II⁻¹ A_IV. Every element of a region shares α and β, so this runs
// once per region and frequency. Work buffers are allocated once per order and reused.

import type { FemOrder } from './basis.ts';
import { referenceElement } from './basis.ts';

export interface CondensedElement {
  /** C_00, C_11 (vertex diagonals) and C_01 = C_10. */
  d0Re: number; d0Im: number; d1Re: number; d1Im: number; oRe: number; oIm: number;
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
  // Augmented interior system [A_II | A_IV], m × (m + 2).
  const w = m + 2;
  const xRe = new Float64Array(Math.max(1, m * w)), xIm = new Float64Array(Math.max(1, m * w));
  const out: CondensedElement = {
    d0Re: 0, d0Im: 0, d1Re: 0, d1Im: 0, oRe: 0, oIm: 0,
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
    const pr = re[c * w + c], pi = im[c * w + c], den = pr * pr + pi * pi;
    const ir = pr / den, ii = -pi / den;
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
