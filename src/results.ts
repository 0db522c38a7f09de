// Columnar results shared by every method (exact, FEM, FDTD): one Float64Array per quantity.

import { linspace } from './units.ts';
import type { Stack } from './stack/types.ts';

/** R and T at each frequency, reference planes as in README "Conventions". */
export interface Spectrum {
  f_Hz: Float64Array;
  R_re: Float64Array; R_im: Float64Array;
  T_re: Float64Array; T_im: Float64Array;
}

/**
 * Total-field phasors along the normal line (x, at one point of the faces) at one frequency:
 * tangential E over the incident tangential E at x = 0 and, where a method gives it, tangential H over
 * the incident tangential H at x = 0 (both incident amplitudes 1 there).
 */
export interface Profile {
  f_Hz: number;
  x_m: Float64Array;
  E_re: Float64Array; E_im: Float64Array;
  H_re?: Float64Array; H_im?: Float64Array;
}

export function emptySpectrum(f_Hz: Float64Array): Spectrum {
  const n = f_Hz.length;
  return { f_Hz, R_re: new Float64Array(n), R_im: new Float64Array(n), T_re: new Float64Array(n), T_im: new Float64Array(n) };
}

/** The stack's spectrum frequencies: `points` linear over the band, ends included. */
export const bandFrequencies = (stack: Stack): Float64Array =>
  linspace(stack.band_Hz[0], stack.band_Hz[1], stack.points);
