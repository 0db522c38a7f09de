// The exact solution of one case with its engineering quantities: each frequency's regions are evaluated once
// and serve both the recursion and the power factors. R and T are those of tmm/solve.ts solveTmm (the same
// functions on the same numbers), so a study's rows equal `solve`'s.

import { emptySpectrum, type Spectrum } from '../results.ts';
import type { Stack } from '../stack/types.ts';
import { stackAtFrequency } from '../tmm/media.ts';
import { solveAt } from '../tmm/recursion.ts';
import { emptyQuantities, writeQuantities, type Quantities } from './quantities.ts';

export interface ExactWithQuantities { spectrum: Spectrum; quantities: Quantities }

/** R, T and the quantities at every frequency of f_Hz. */
export function solveExactWithQuantities(stack: Stack, f_Hz: Float64Array): ExactWithQuantities {
  const n = f_Hz.length, spectrum = emptySpectrum(f_Hz), quantities = emptyQuantities(n);
  for (let i = 0; i < n; i++) {
    const saf = stackAtFrequency(stack, f_Hz[i]);
    const { R, T } = solveAt(saf);
    spectrum.R_re[i] = R.re; spectrum.R_im[i] = R.im;
    spectrum.T_re[i] = T.re; spectrum.T_im[i] = T.im;
    writeQuantities(quantities, i, saf, R, T);
  }
  return { spectrum, quantities };
}
