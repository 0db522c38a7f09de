// Ratio of two records' spectra at the requested frequencies, e.g. R(f) = Ê_reflected / Ê_incident.
// Both records must share the time axis (t_n = n Δt), so any common time offset cancels.

import { dtft } from './dtft.ts';
import type { ComplexColumns } from './fft.ts';

/** Incident spectrum below this fraction of its in-band peak marks a frequency as weak (−60 dB). */
export const WEAK_RELATIVE = 1e-3;

export interface Response extends ComplexColumns {
  /** 1 where the denominator's spectrum is weak: the ratio there is unreliable (0 if it vanished). */
  weak: Uint8Array;
}

/** |X| at each frequency. */
export function magnitude(X: ComplexColumns): Float64Array {
  const out = new Float64Array(X.re.length);
  for (let k = 0; k < out.length; k++) out[k] = Math.hypot(X.re[k], X.im[k]);
  return out;
}

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

/** Spectrum of num over spectrum of den at f_Hz, by direct DTFT of both records. */
export function responseFromRecords(num: Float64Array, den: Float64Array, dt_s: number, f_Hz: Float64Array): Response {
  const D = dtft(den, dt_s, f_Hz);
  const weak = weakMask(D);
  const { re, im } = divideSpectra(dtft(num, dt_s, f_Hz), D, weak);
  return { re, im, weak };
}
