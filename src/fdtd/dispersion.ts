// Numerical dispersion of the 1D Yee scheme (Taflove & Hagness, Computational Electrodynamics,
// 3rd ed., 2005, §2.5 / §4.4): in a medium of refractive index n with S = c0 Δt / Δx,
//   [sin(ω Δt / 2) / (v Δt)]² = [sin(k̃ Δx / 2) / Δx]²,  v = c0 / n.
// At S/n = 1 (the "magic time step") k̃ = k exactly.

import { C0_m_per_s } from '../units.ts';

/** Numerical wavenumber k̃ (rad/m) at f_Hz; Infinity above the grid's cut-off. */
export function yeeWavenumber(f_Hz: number, n: number, dx_m: number, dt_s: number): number {
  const v = C0_m_per_s / n;
  const arg = (dx_m / (v * dt_s)) * Math.sin(Math.PI * f_Hz * dt_s);
  if (arg >= 1) return Infinity;
  return (2 / dx_m) * Math.asin(arg);
}

/** Numerical phase velocity ω / k̃ (m/s). */
export function yeePhaseVelocity(f_Hz: number, n: number, dx_m: number, dt_s: number): number {
  return (2 * Math.PI * f_Hz) / yeeWavenumber(f_Hz, n, dx_m, dt_s);
}

/** |k̃ − k| (rad/m): the phase error per metre of travel. */
export function yeePhaseErrorPerMetre(f_Hz: number, n: number, dx_m: number, dt_s: number): number {
  const k = (2 * Math.PI * f_Hz * n) / C0_m_per_s;
  return Math.abs(yeeWavenumber(f_Hz, n, dx_m, dt_s) - k);
}
