// What the grid does to a medium, exactly, at one frequency (time dependence e^{+jωt}).
//
// Every constitutive term of the kernel is trapezoidal in time (kernel.ts), i.e. the bilinear map
// jω → (2/Δt)(z − 1)/(z + 1) on z = e^{jωΔt}, so the grid's permittivity at ω is the model's own at the
// warped frequency ω̃ = (2/Δt) tan(ωΔt/2):  ε_d(ω) = ε(ω̃).
// Eliminating H from the leapfrog updates gives, on the E nodes, E_{i+1} − 2E_i + E_{i−1} + q_i E_i = 0 with
// q_i = 4 ε_d,i sin²(ωΔt/2)/S² (S = c0Δt/Δx). In a uniform medium its waves are e^{∓jk̃ iΔx} with
//   sin(k̃Δx/2) = u,  u = √ε_d sin(ωΔt/2)/S           (the 1D Yee dispersion relation, Taflove & Hagness §2.5,
//                                                      with ε_d in place of ε),
// and at an interface on a node (the node's cell shared half and half, as subcell averaging makes it) the
// wave is continuous and the difference of the neighbours carries over, so the grid reflects as a line of
// normalized admittance n_d = S sin(k̃Δx)/(2 sin(ωΔt/2)) = √ε_d √(1 − u²) (→ √ε as Δx → 0). A sheet of
// conductance G on a node acts as G cos(ωΔt/2). Together these are an exact layered model of the grid's
// response (stepped-exact.ts, gridEquivalent), which the planner compares with the media's own.

import { type Complex, mul, sqrt, sub } from '../complex.ts';
import { type StepModel, stepModelPermittivity } from './media.ts';

/** The grid's frequency for the media at f: tan(π f Δt)/(π Δt) (Infinity at and above the Nyquist frequency). */
export function warpedFrequency(f_Hz: number, dt_s: number): number {
  const a = Math.PI * f_Hz * dt_s;
  return a >= Math.PI / 2 ? Infinity : Math.tan(a) / (Math.PI * dt_s);
}

/** ε_d(f): the permittivity the grid steps at f. */
export const discretePermittivity = (m: StepModel, f_Hz: number, dt_s: number): Complex =>
  stepModelPermittivity(m, warpedFrequency(f_Hz, dt_s));

/** √z on the branch with Im ≤ 0 (and Re ≥ 0 when Im = 0): the decaying wave of e^{−jkx}. */
export function decayingRoot(z: Complex): Complex {
  const r = sqrt(z);
  return r.im > 0 || (r.im === 0 && r.re < 0) ? { re: -r.re, im: -r.im } : r;
}

/** asin z = −j ln(jz + √(1 − z²)). */
function asin(z: Complex): Complex {
  const w = sqrt(sub({ re: 1, im: 0 }, mul(z, z)));
  const a = { re: w.re - z.im, im: w.im + z.re };
  return { re: Math.atan2(a.im, a.re), im: -Math.log(Math.hypot(a.re, a.im)) };
}

export interface DiscreteWave {
  /** k̃, rad/m (Im ≤ 0). */
  k: Complex;
  /** n_d: admittance of the grid's wave relative to free space. */
  n: Complex;
  /** ε_d. */
  eps: Complex;
}

/** The grid's wave in a medium of step model m at f (normal incidence; oblique TE is already folded into m). */
export function discreteWave(m: StepModel, f_Hz: number, dx_m: number, dt_s: number, courant: number): DiscreteWave {
  const eps = discretePermittivity(m, f_Hz, dt_s);
  const root = decayingRoot(eps);
  const s = Math.sin(Math.PI * f_Hz * dt_s) / courant;
  const u = { re: root.re * s, im: root.im * s };
  const a = asin(u);
  // asin keeps u's quadrant (Re ≥ 0, Im ≤ 0); rounding may leave a lossless medium's Im at +1e−17.
  const k = { re: (2 * Math.abs(a.re)) / dx_m, im: (2 * Math.min(0, a.im)) / dx_m };
  const c = sqrt(sub({ re: 1, im: 0 }, mul(u, u)));
  return { k, n: mul(root, c), eps };
}
