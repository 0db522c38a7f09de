// Ratio of two spectra at the same frequencies, e.g. R(f) = Ê_reflected / Ê_incident, with a guard where
// the denominator is weak. Both records must share the time axis (t_n = n Δt), so any common offset cancels.

import { magnitude, type ComplexColumns } from './fft.ts';

/** Incident spectrum below this fraction of its in-band peak marks a frequency as weak (−60 dB). */
export const WEAK_RELATIVE = 1e-3;

/** Weak-frequency mask: |den| < relative × max|den| over the requested frequencies, or not finite. */
export function weakMask(den: ComplexColumns, relative = WEAK_RELATIVE): Uint8Array {
  const mag = magnitude(den);
  let peak = 0;
  for (const v of mag) if (Number.isFinite(v) && v > peak) peak = v;
  const mask = new Uint8Array(mag.length);
  for (let k = 0; k < mag.length; k++) mask[k] = !(mag[k] >= relative * peak) || peak === 0 ? 1 : 0;
  return mask;
}

/**
 * num/den of two spectra; where the mask says weak and |den| is zero or not finite, 0 instead of NaN.
 * Non-finite numerators give 0 and set the mask.
 */
export function divideSpectra(num: ComplexColumns, den: ComplexColumns, weak: Uint8Array): ComplexColumns {
  const m = num.re.length;
  const re = new Float64Array(m), im = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    const a = num.re[k], b = num.im[k], c = den.re[k], d = den.im[k];
    const q = c * c + d * d;
    const r = (a * c + b * d) / q, i = (b * c - a * d) / q;
    if (Number.isFinite(r) && Number.isFinite(i)) { re[k] = r; im[k] = i; } else weak[k] = 1;
  }
  return { re, im };
}
