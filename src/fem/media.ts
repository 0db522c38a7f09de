// Per-frequency coefficients of the 1D Helmholtz problem in one homogeneous medium (μ_r = 1):
//   TE (unknown E_y): (E')' + k_z² E = 0,            weight a = 1
//   TM (unknown H_y): ((1/ε_r) H')' + (k_z²/ε_r) H = 0, weight a = 1/ε_r
// with k_z² = k0² ε_r − k_t², k_t = k0 √ε_front sin θ the wavenumber along the stack faces.
// Both read  (a u')' + a k_z² u = 0, so one element matrix a (S/h − k_z² h M) serves both.

import { type Complex, decayingSqrtInto } from '../complex.ts';
import { permittivity } from '../materials/permittivity.ts';
import type { BulkModel } from '../materials/types.ts';
import type { Polarization } from '../stack/types.ts';
import { C0_m_per_s } from '../units.ts';

export const freeSpaceWavenumber = (f_Hz: number): number => (2 * Math.PI * f_Hz) / C0_m_per_s;

/** k_t² = k0² ε_front sin²θ (complex when the front medium is lossy). */
export function tangentialWavenumber2(front: BulkModel, f_Hz: number, angle_rad: number): Complex {
  const k0 = freeSpaceWavenumber(f_Hz), e = permittivity(front, f_Hz), s2 = Math.sin(angle_rad) ** 2;
  return { re: k0 * k0 * e.re * s2, im: k0 * k0 * e.im * s2 };
}

/** k_z = √(k0² ε − k_t²) on the branch with Im k_z ≤ 0, so e^{−j k_z x} decays (or is undamped) along +x. */
export const normalWavenumber = (eps: Complex, k0: number, kt2: Complex): Complex =>
  setNormalWavenumber({ re: 0, im: 0 }, eps.re, eps.im, k0, kt2.re, kt2.im);

/** normalWavenumber written into `out` (no allocation; for the per-frequency loop). */
export function setNormalWavenumber(out: Complex, epsRe: number, epsIm: number, k0: number, kt2Re: number, kt2Im: number): Complex {
  return decayingSqrtInto(out, k0 * k0 * epsRe - kt2Re, k0 * k0 * epsIm - kt2Im);
}

/** The weight a of the weak form: 1 for TE, 1/ε_r for TM. */
export const formWeight = (eps: Complex, pol: Polarization): Complex => setFormWeight({ re: 0, im: 0 }, eps.re, eps.im, pol);

/** formWeight written into `out` (no allocation). */
export function setFormWeight(out: Complex, epsRe: number, epsIm: number, pol: Polarization): Complex {
  if (pol === 'TE') { out.re = 1; out.im = 0; return out; }
  const d = epsRe * epsRe + epsIm * epsIm;
  out.re = epsRe / d; out.im = -epsIm / d;
  return out;
}
