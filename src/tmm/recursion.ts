// The exact layered solution by a stable reflection-coefficient recursion, equivalent to the
// product of ABCD (transfer) matrices [[cos φ, jZ sin φ], [j sin φ / Z, cos φ]] of each layer and
// [[1, 0], [1/R_s, 1]] of each sheet (Orfanidis, Electromagnetic Waves and Antennas, ch. 5–8;
// ITU-R P.2040-3 Attachment 1), but never overflowing: only e^{−jφ} with Im φ ≤ 0 appears, so every
// factor has magnitude ≤ 1 however thick or lossy a layer is.
//
// Within a region the tangential field is V(z) = A (e^{−jk z} + Γ_b e^{−jk (2d − z)}) with z from the
// region's front face, A the forward amplitude there and Γ_b the reflection coefficient (tangential E)
// looking into the load at its back face.

import { type Complex, abs2, add, cx, div, exp, mul, scale, sub } from '../complex.ts';
import type { Region, StackAtFrequency } from './media.ts';

const ONE = cx(1);
const jneg = (z: Complex): Complex => ({ re: z.im, im: -z.re }); // −j·z

/** e^{−j φ} for φ = k_x d (|·| ≤ 1 when Im k_x ≤ 0). */
const propagator = (r: Region, d: number): Complex => exp(jneg(scale(r.kx, d)));

/**
 * Reflection coefficient at the back face of a region of admittance Y, looking into the next region
 * (admittance Yn, reflection coefficient Γn at its own front face) across a sheet of conductance G.
 * Written without dividing by (1 + Γn), so a short circuit (Γn = −1) is no special case.
 */
export function reflectionAcross(Y: Complex, Yn: Complex, gammaNext: Complex, G: number): Complex {
  const onePlus = add(ONE, gammaNext), oneMinus = sub(ONE, gammaNext);
  const a = mul(add(Y, cx(-G)), onePlus); // (Y − G)(1 + Γn)
  const b = mul(Yn, oneMinus);
  const c = mul(add(Y, cx(G)), onePlus);
  return div(sub(a, b), add(c, b));
}

/** Everything the forward pass and the profile need, per bulk layer. */
export interface Solution {
  /** Reflection coefficient at x = 0 (tangential E), incident amplitude 1. */
  R: Complex;
  /** Tangential E at the back face over incident E at x = 0 (0 for a conductor behind). */
  T: Complex;
  /** Per bulk layer: forward amplitude at its front face and Γ at its back face. */
  A: Complex[];
  gammaBack: Complex[];
}

/** Solves one frequency. */
export function solveAt(s: StackAtFrequency): Solution {
  const n = s.layers.length;
  const G = s.sheetG;
  // Backward pass: Γ at each layer's back face (gammaBack) and front face (gammaFront).
  const gammaBack: Complex[] = new Array(n);
  const gammaFront: Complex[] = new Array(n);
  // Beyond the back face: a matched half-space (Γ = 0) or a conductor (Γ = −1, any admittance).
  let gNext: Complex = s.back ? cx(0) : cx(-1);
  let YNext: Complex = s.back ? s.back.Y : ONE;
  for (let i = n - 1; i >= 0; i--) {
    const L = s.layers[i];
    gammaBack[i] = reflectionAcross(L.Y, YNext, gNext, G[i + 1]);
    const p = propagator(L, L.thickness_m);
    gammaFront[i] = mul(gammaBack[i], mul(p, p));
    gNext = gammaFront[i];
    YNext = L.Y;
  }
  const R = reflectionAcross(s.front.Y, YNext, gNext, G[0]);

  // Forward pass: tangential E (V) and H (I) at each interface, incident amplitude 1.
  let V = add(ONE, R);
  let I = mul(s.front.Y, sub(ONE, R)); // just in front of interface 0
  const A: Complex[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const L = s.layers[i];
    const Iin = sub(I, scale(V, G[i])); // the sheet takes G·V of the current
    const gp = add(ONE, gammaFront[i]), gm = sub(ONE, gammaFront[i]);
    // A from V or from I, whichever is better conditioned (|1+Γ| + |1−Γ| ≥ 2).
    A[i] = abs2(gp) >= abs2(gm) ? div(V, gp) : div(Iin, mul(L.Y, gm));
    const p = propagator(L, L.thickness_m);
    const Ap = mul(A[i], p);
    V = mul(Ap, add(ONE, gammaBack[i]));
    I = mul(mul(Ap, sub(ONE, gammaBack[i])), L.Y);
  }
  const T = s.back ? V : cx(0);
  return { R, T, A, gammaBack };
}

/** Total tangential E at depth z (0 ≤ z ≤ d) inside bulk layer i of a solved stack. */
export function fieldInLayer(s: StackAtFrequency, sol: Solution, i: number, z: number): Complex {
  const L = s.layers[i];
  const fwd = propagator(L, z);
  const bwd = propagator(L, 2 * L.thickness_m - z);
  return mul(sol.A[i], add(fwd, mul(sol.gammaBack[i], bwd)));
}

/** e^{−j k_x x} in a region (x may be negative: then the magnitude may exceed 1). */
export const wave = (r: Region, x: number): Complex => propagator(r, x);
