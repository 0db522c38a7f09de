// Test-side spectra of FDTD records: a direct DFT (independent of src/spectra) and error figures.

import type { PulseRun } from '../../src/fdtd/types.ts';
import type { Spectrum } from '../../src/results.ts';

export interface Cx { re: number; im: number }

/** X(f) = Σ x[n] e^{−j2πf nΔt} by direct summation (e^{+jωt} convention). */
export function dft(x: Float64Array, dt_s: number, f_Hz: number): Cx {
  let re = 0, im = 0;
  const w = 2 * Math.PI * f_Hz * dt_s;
  for (let n = 0; n < x.length; n++) { re += x[n] * Math.cos(w * n); im -= x[n] * Math.sin(w * n); }
  return { re, im };
}

export const cdiv = (a: Cx, b: Cx): Cx => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};

/** R(f) and T(f) of a finished run at the given frequencies. */
export function runSpectrum(run: PulseRun, f_Hz: Float64Array): { R: Cx[]; T: Cx[]; incidentMag: number[] } {
  const r = run.records();
  const R: Cx[] = [], T: Cx[] = [], incidentMag: number[] = [];
  for (const f of f_Hz) {
    const I = dft(r.incident, r.dt_s, f);
    R.push(cdiv(dft(r.reflected, r.dt_s, f), I));
    T.push(cdiv(dft(r.transmitted, r.dt_s, f), I));
    incidentMag.push(Math.hypot(I.re, I.im));
  }
  return { R, T, incidentMag };
}

/** max |R − R_ref| and max |T − T_ref| over the frequencies. */
export function maxDiff(got: { R: Cx[]; T: Cx[] }, ref: Spectrum): { R: number; T: number } {
  let eR = 0, eT = 0;
  for (let k = 0; k < got.R.length; k++) {
    eR = Math.max(eR, Math.hypot(got.R[k].re - ref.R_re[k], got.R[k].im - ref.R_im[k]));
    eT = Math.max(eT, Math.hypot(got.T[k].re - ref.T_re[k], got.T[k].im - ref.T_im[k]));
  }
  return { R: eR, T: eT };
}
