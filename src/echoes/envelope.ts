// Analytic signal and envelope of a real record, by FFT: zero the negative frequencies, double
// the positive ones, keep DC and Nyquist once, transform back. The record is zero-padded to at
// least twice its length so the circular transform does not wrap its end onto its start.

import { type ComplexColumns, inverseFft, magnitude, nextPow2, realFft } from '../spectra/fft.ts';

/** z[n] = x[n] + j·H{x}[n] for the record's own length. */
export function analyticSignal(x: Float64Array): ComplexColumns {
  const n = x.length;
  if (n === 0) return { re: new Float64Array(0), im: new Float64Array(0) };
  const nfft = nextPow2(2 * n);
  const X = realFft(x, nfft);
  const half = nfft / 2;
  for (let k = 1; k < half; k++) { X.re[k] *= 2; X.im[k] *= 2; }
  for (let k = half + 1; k < nfft; k++) { X.re[k] = 0; X.im[k] = 0; }
  const z = inverseFft(X);
  return { re: z.re.slice(0, n), im: z.im.slice(0, n) };
}

/** The envelope |x + jH{x}| of a real record. */
export const envelope = (x: Float64Array): Float64Array => magnitude(analyticSignal(x));
