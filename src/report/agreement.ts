// How far two spectra agree: the largest |ΔR| and |ΔT| over the band and where each occurs.

import type { Spectrum } from '../results.ts';

export interface Agreement {
  R_max: number;
  R_worst_f_GHz: number;
  T_max: number;
  T_worst_f_GHz: number;
}

/** Max over frequency of |R_test − R_ref| and |T_test − T_ref| (complex differences). */
export function compareSpectra(test: Spectrum, ref: Spectrum): Agreement {
  if (test.f_Hz.length !== ref.f_Hz.length) throw new Error('compareSpectra: spectra have different frequency counts');
  let R_max = 0, T_max = 0, iR = 0, iT = 0;
  for (let i = 0; i < ref.f_Hz.length; i++) {
    const dR = Math.hypot(test.R_re[i] - ref.R_re[i], test.R_im[i] - ref.R_im[i]);
    const dT = Math.hypot(test.T_re[i] - ref.T_re[i], test.T_im[i] - ref.T_im[i]);
    if (dR > R_max) { R_max = dR; iR = i; }
    if (dT > T_max) { T_max = dT; iT = i; }
  }
  return { R_max, R_worst_f_GHz: ref.f_Hz[iR] / 1e9, T_max, T_worst_f_GHz: ref.f_Hz[iT] / 1e9 };
}
