// What the grid does to a medium, exactly, at one frequency (time dependence e^{+jωt}).
//
// Every constitutive term of the kernel is trapezoidal in time (kernel.ts), i.e. the bilinear map
// jω → (2/Δt)(z − 1)/(z + 1) on z = e^{jωΔt}, so the grid's permittivity and permeability at ω are the models'
// own at the warped frequency ω̃ = (2/Δt) tan(ωΔt/2):  ε_d(ω) = ε(ω̃), μ_d(ω) = μ(ω̃) (shunt and series models).
// In the frequency domain the leapfrog grid is a ladder: a series impedance j(2 sin(ωΔt/2)/S) μ_d per H node and
// a shunt admittance j(2 sin(ωΔt/2)/S) ε_d per E node (S = c0Δt/Δx). A uniform run of it, cut at E nodes into
// symmetric Π sections, has the Bloch waves e^{∓jk̃ iΔx} with
//   sin(k̃Δx/2) = u,  u = √(ε_d μ_d) sin(ωΔt/2)/S    (the 1D Yee dispersion relation, Taflove & Hagness §2.5,
//                                                    with ε_d μ_d in place of ε),
// and the image admittance n_d = √(ε_d μ_d) √(1 − u²)/μ_d (→ √(ε/μ) as Δx → 0), the line the grid reflects as
// when it is cut at a node whose cell is shared half and half. A sheet of conductance G on a node acts as
// G cos(ωΔt/2). Together these are an exact layered model of the grid's response (grid-response.ts), which the
// planner compares with the media's own.

import { type Complex, div, mul, sqrt, sub } from '../complex.ts';
import { type LineMedium, type StepModel, stepModelPermittivity } from './media.ts';

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
  /** ε_d and μ_d. */
  eps: Complex;
  mu: Complex;
}

/** The grid's wave on a line of discrete permittivity eps and permeability mu (values at f). */
export function discreteWaveOf(eps: Complex, mu: Complex, f_Hz: number, dx_m: number, dt_s: number, courant: number): DiscreteWave {
  const root = decayingRoot(mul(eps, mu));
  const s = Math.sin(Math.PI * f_Hz * dt_s) / courant;
  const u = { re: root.re * s, im: root.im * s };
  const a = asin(u);
  // asin keeps u's quadrant (Re ≥ 0, Im ≤ 0); rounding may leave a lossless medium's Im at +1e−17.
  const k = { re: (2 * Math.abs(a.re)) / dx_m, im: (2 * Math.min(0, a.im)) / dx_m };
  const c = sqrt(sub({ re: 1, im: 0 }, mul(u, u)));
  return { k, n: div(mul(root, c), mu), eps, mu };
}

/** The grid's wave in a line medium at f (the phase-matched line: oblique incidence is already folded into m). */
export const discreteWave = (m: LineMedium, f_Hz: number, dx_m: number, dt_s: number, courant: number): DiscreteWave =>
  discreteWaveOf(discretePermittivity(m.shunt, f_Hz, dt_s), discretePermittivity(m.series, f_Hz, dt_s), f_Hz, dx_m, dt_s, courant);
