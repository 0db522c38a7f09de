// Per-frequency coefficients of the 1D Helmholtz problem in one homogeneous medium of relative
// permittivity ε_r and permeability μ_r:
//   TE (unknown E_y): ((1/μ_r) E')' + (k_z²/μ_r) E = 0,   weight a = 1/μ_r
//   TM (unknown H_y): ((1/ε_r) H')' + (k_z²/ε_r) H = 0,   weight a = 1/ε_r
// with k_z² = k0² ε_r μ_r − k_t², k_t = k0 √(ε_front μ_front) sin θ the wavenumber along the stack faces
// (Jin, The Finite Element Method in Electromagnetics, 3rd ed., 2014, the 1D scalar problem).
// Both read  (a u')' + a k_z² u = 0, so one element matrix a (S/h − k_z² h M) serves both.

import { type Complex, decayingSqrtInto, mul } from '../complex.ts';
import { permeability } from '../materials/permeability.ts';
import { permittivity } from '../materials/permittivity.ts';
import type { BulkModel } from '../materials/types.ts';
import type { Polarization } from '../stack/types.ts';
import { C0_m_per_s } from '../units.ts';

export const freeSpaceWavenumber = (f_Hz: number): number => (2 * Math.PI * f_Hz) / C0_m_per_s;

/** ε_r μ_r of a medium at f_Hz (the square of its complex refractive index). */
export const indexSquared = (m: BulkModel, f_Hz: number): Complex => mul(permittivity(m, f_Hz), permeability(m, f_Hz));

/** k_t² = k0² ε_front μ_front sin²θ (complex when the front medium is lossy). */
export function tangentialWavenumber2(front: BulkModel, f_Hz: number, angle_rad: number): Complex {
  const k0 = freeSpaceWavenumber(f_Hz), n2 = indexSquared(front, f_Hz), s2 = Math.sin(angle_rad) ** 2;
  return { re: k0 * k0 * n2.re * s2, im: k0 * k0 * n2.im * s2 };
}

/** k_z = √(k0² ε_r μ_r − k_t²) on the branch with Im k_z ≤ 0, so e^{−j k_z x} decays (or is undamped) along +x.
 *  `n2` is ε_r μ_r. */
export const normalWavenumber = (n2: Complex, k0: number, kt2: Complex): Complex =>
  setNormalWavenumber({ re: 0, im: 0 }, n2.re, n2.im, k0, kt2.re, kt2.im);

/** normalWavenumber written into `out` (no allocation; for the per-frequency loop); (n2Re, n2Im) = ε_r μ_r. */
export function setNormalWavenumber(out: Complex, n2Re: number, n2Im: number, k0: number, kt2Re: number, kt2Im: number): Complex {
  return decayingSqrtInto(out, k0 * k0 * n2Re - kt2Re, k0 * k0 * n2Im - kt2Im);
}

/** The weight a of the weak form: 1/μ_r for TE, 1/ε_r for TM. */
export const formWeight = (eps: Complex, mu: Complex, pol: Polarization): Complex =>
  setFormWeight({ re: 0, im: 0 }, eps, mu, pol);

/** formWeight written into `out` (no allocation). */
export function setFormWeight(out: Complex, eps: Complex, mu: Complex, pol: Polarization): Complex {
  const w = pol === 'TE' ? mu : eps;
  const d = w.re * w.re + w.im * w.im;
  out.re = w.re / d; out.im = -w.im / d;
  return out;
}
