// Exact R(f) and T(f) of a stack over a set of frequencies.

import { type Complex, abs2 } from '../complex.ts';
import { type Spectrum, emptySpectrum } from '../results.ts';
import type { Stack } from '../stack/types.ts';
import { stackAtFrequency } from './media.ts';
import { solveAt } from './recursion.ts';

/** R and T (tangential-E ratios, reference planes x = 0 and the back face) at one frequency. */
export function tmmAt(stack: Stack, f_Hz: number): { R: Complex; T: Complex } {
  const { R, T } = solveAt(stackAtFrequency(stack, f_Hz));
  return { R, T };
}

/** R and T at every frequency of f_Hz, as columns. */
export function solveTmm(stack: Stack, f_Hz: Float64Array): Spectrum {
  const out = emptySpectrum(f_Hz);
  for (let i = 0; i < f_Hz.length; i++) {
    const { R, T } = tmmAt(stack, f_Hz[i]);
    out.R_re[i] = R.re; out.R_im[i] = R.im;
    out.T_re[i] = T.re; out.T_im[i] = T.im;
  }
  return out;
}

/**
 * Factor P such that the power carried away behind the stack is P·|T|² of the incident power:
 * Re(Y_back) / Re(Y_front), with Y the wave admittances along x (0 behind a conductor).
 * Valid for a lossless front medium, where incident and reflected powers separate.
 */
export function transmittedPowerFactor(stack: Stack, f_Hz: number): number {
  const s = stackAtFrequency(stack, f_Hz);
  return s.back ? s.back.Y.re / s.front.Y.re : 0;
}

/** Absorbed fraction 1 − |R|² − P|T|² at each frequency of a spectrum. */
export function absorption(stack: Stack, sp: Spectrum): Float64Array {
  const out = new Float64Array(sp.f_Hz.length);
  for (let i = 0; i < out.length; i++) {
    const P = transmittedPowerFactor(stack, sp.f_Hz[i]);
    out[i] = 1 - abs2({ re: sp.R_re[i], im: sp.R_im[i] }) - P * abs2({ re: sp.T_re[i], im: sp.T_im[i] });
  }
  return out;
}
