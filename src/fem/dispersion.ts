// Discrete dispersion of Lagrange elements and the a-priori error estimate that sizes the default mesh.
//
// A uniform chain of identical elements carries discrete plane waves e^{−j k_h x}; after static condensation
// each element is the 2×2 matrix C on its vertices and the vertex recurrence gives
//   cos(k_h h) = −(C_00 + C_11) / (2 C_01)                     (exact for any order)
// For p = 1 this is Ihlenburg & Babuška (Comput. Math. Appl. 30(9), 1995):
//   cos(k_h h) = (1 − (kh)²/3) / (1 + (kh)²/6).
// For small kh the relative wavenumber error of order p is (Ainsworth, SIAM J. Numer. Anal. 42(2), 2004)
//   (k − k_h)/k ≈ ½ [p!/(2p)!]² (kh)^{2p} / (2p + 1),
// i.e. (kh)²/24, (kh)⁴/1440, (kh)⁶/201600 for p = 1, 2, 3 (k_h < k: the discrete wave is slightly long).

import type { FemOrder } from './basis.ts';
import { createCondenser } from './condense.ts';

/** Ihlenburg & Babuška's closed form for p = 1: cos(k_h h) as a function of kh. */
export const linearDispersionCos = (kh: number): number => (1 - (kh * kh) / 3) / (1 + (kh * kh) / 6);

const factorial = (n: number): number => (n <= 1 ? 1 : n * factorial(n - 1));

/** Leading coefficient c_p of the relative wavenumber error c_p (kh)^{2p} (Ainsworth 2004). */
export const dispersionCoefficient = (p: FemOrder): number =>
  (0.5 * (factorial(p) / factorial(2 * p)) ** 2) / (2 * p + 1);

/** Ainsworth's asymptotic relative wavenumber error (k − k_h)/k at kh. */
export const asymptoticPhaseError = (p: FemOrder, kh: number): number => dispersionCoefficient(p) * kh ** (2 * p);

/** k_h h of order p at real kh from the condensed element itself (lossless medium, kh below the cut-off). */
export function discreteWavenumberTimesH(p: FemOrder, kh: number): number {
  const c = createCondenser(p).condense(1, 0, kh * kh, 0);
  return Math.acos(-(c.d0Re + c.d1Re) / (2 * c.oRe));
}

/** Fewest elements per wavelength any default mesh uses: keeps kh ≤ π/2, well below the interior
 *  resonance of a p = 3 element (kh ≈ π) that static condensation must avoid. */
export const MIN_DENSITY = 4;

/**
 * The leading-order pollution figure below is tight for a resonant slab (there the measured error reaches 0.9 of
 * it); terms of the next order in kh come on top, so the estimate is this many times the leading term.
 */
export const ESTIMATE_MARGIN = 2;

/**
 * A-priori estimate of max |R − R_exact|, |T − T_exact| for order p at `density` elements per wavelength on a stack of
 * electrical size `phase_rad` = Σ |k_z| d over its layers (already multiplied by the stack's worst bounce factor,
 * bounce.ts) with `interfaces` material boundaries (likewise): each radian of path accumulates the relative
 * wavenumber error (pollution), each interface adds one more, and a round trip doubles it; ESTIMATE_MARGIN on top.
 * Nodal values carry only this error. Measured on random stacks the error stays below half of it.
 */
export function errorEstimate(p: FemOrder, density: number, phase_rad: number, interfaces: number): number {
  return ESTIMATE_MARGIN * 2 * asymptoticPhaseError(p, (2 * Math.PI) / density) * (phase_rad + interfaces);
}

/** max over ξ ∈ [0, 1] of |ω(ξ)| and of |ω'(ξ)|, ω(ξ) = Π_i (ξ − i/p) the node polynomial of the Lagrange remainder. */
function nodePolynomialMax(p: number): { value: number; slope: number } {
  let value = 0, slope = 0;
  const N = 3000;
  for (let k = 0; k <= N; k++) {
    const xi = k / N;
    let v = 1, d = 0;
    for (let i = 0; i <= p; i++) { d = d * (xi - i / p) + v; v *= xi - i / p; }
    value = Math.max(value, Math.abs(v));
    slope = Math.max(slope, Math.abs(d));
  }
  return { value, slope };
}
const NODE_POLY = [{ value: 0, slope: 0 }, nodePolynomialMax(1), nodePolynomialMax(2), nodePolynomialMax(3)];

/**
 * Between nodes the field also carries the interpolation error of degree p. For a plane wave of unit amplitude the
 * Lagrange remainder bounds it by (kh)^{p+1} / (p+1)! · max|ω| (any numerical analysis text, e.g. Süli & Mayers,
 * An Introduction to Numerical Analysis, 2003, Thm 6.2); its derivative over k, which is what a tangential E read
 * from an H_y solution carries, to leading order by (kh)^p / (p+1)! · max|ω'|. Used to size profile meshes.
 */
export function interpolationEstimate(p: FemOrder, density: number, derivative = false): number {
  let fact = 1;
  for (let i = 2; i <= p + 1; i++) fact *= i;
  const kh = (2 * Math.PI) / density;
  return derivative ? (kh ** p / fact) * NODE_POLY[p].slope : (kh ** (p + 1) / fact) * NODE_POLY[p].value;
}

/** What the field between nodes must meet: a budget, for values or for derivatives. */
export interface BetweenNodes { budget: number; derivative: boolean }

/** Smallest density (elements per wavelength, one decimal, ≥ MIN_DENSITY) whose pollution estimate is within
 *  `budget` and, when `between` is given, whose interpolation estimate is within its budget. */
export function densityFor(p: FemOrder, budget: number, phase_rad: number, interfaces: number, between?: BetweenNodes): number {
  const kh = (budget / (ESTIMATE_MARGIN * 2 * dispersionCoefficient(p) * (phase_rad + interfaces))) ** (1 / (2 * p));
  let n = (2 * Math.PI) / kh;
  if (between) {
    const unit = interpolationEstimate(p, 2 * Math.PI, between.derivative); // its value at kh = 1
    n = Math.max(n, (2 * Math.PI) / (between.budget / unit) ** (1 / (between.derivative ? p : p + 1)));
  }
  return Math.max(MIN_DENSITY, Math.ceil(n * 10) / 10);
}
