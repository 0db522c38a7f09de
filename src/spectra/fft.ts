// Thin wrappers over fft.js (radix-4, power-of-two sizes).
// fft.js's forward kernel is e^{−j2πkn/N}, the one the e^{+jωt} convention wants
// (checked in test/spectra/fft.test.ts). Its realTransform fills only the left half of
// the output; completeSpectrum must follow before reading bins above N/2.

import FFT from 'fft.js';

export interface ComplexColumns { re: Float64Array; im: Float64Array }

/** |X| at each index. */
export function magnitude(X: ComplexColumns): Float64Array {
  const out = new Float64Array(X.re.length);
  for (let k = 0; k < out.length; k++) out[k] = Math.hypot(X.re[k], X.im[k]);
  return out;
}

const plans = new Map<number, FFT>();

/** A cached fft.js plan of size n (a power of two ≥ 2). */
function plan(n: number): FFT {
  let p = plans.get(n);
  if (!p) {
    p = new FFT(n);
    if (plans.size > 8) plans.clear();
    plans.set(n, p);
  }
  return p;
}

/** Smallest power of two ≥ max(n, 2). */
export function nextPow2(n: number): number {
  let p = 2;
  while (p < n) p *= 2;
  return p;
}

/**
 * Full forward DFT X[k] = Σ x[n] e^{−j2πkn/N} of a real record zero-padded to nfft
 * (a power of two ≥ x.length). Returns all nfft bins.
 */
export function realFft(x: Float64Array, nfft = nextPow2(x.length)): ComplexColumns {
  if (nfft < x.length || nfft !== nextPow2(nfft)) throw new Error(`realFft: nfft ${nfft} must be a power of two ≥ ${x.length}`);
  const input = new Float64Array(nfft);
  input.set(x);
  const out = new Float64Array(2 * nfft);
  const p = plan(nfft);
  p.realTransform(out, input);
  p.completeSpectrum(out);
  return deinterleave(out, nfft);
}

/** Inverse DFT x[n] = (1/N) Σ X[k] e^{+j2πkn/N} of a full complex spectrum (length a power of two). */
export function inverseFft(X: ComplexColumns): ComplexColumns {
  const n = X.re.length;
  const data = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) { data[2 * k] = X.re[k]; data[2 * k + 1] = X.im[k]; }
  const out = new Float64Array(2 * n);
  plan(n).inverseTransform(out, data);
  return deinterleave(out, n);
}

function deinterleave(buf: Float64Array, n: number): ComplexColumns {
  const re = new Float64Array(n), im = new Float64Array(n);
  for (let k = 0; k < n; k++) { re[k] = buf[2 * k]; im[k] = buf[2 * k + 1]; }
  return { re, im };
}
