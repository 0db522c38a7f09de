// Discrete-time Fourier transform of a sampled record at arbitrary frequencies:
// X(f) = Σ x[n] e^{−j2πf n Δt} (the FFT's kernel, e^{+jωt} convention), samples at t_n = n Δt.
//
// Why not a zero-padded FFT interpolated to the requested frequencies: the DTFT evaluated
// directly is exactly the transform the FFT bins sample, so it carries no interpolation error;
// a padded FFT with linear interpolation needs heavy padding to reach the same figure
// (measured figures in DEVELOPERS.md "Spectra and echoes"). Cost is O(N·M), fine for FDTD
// records (10⁴–10⁵ samples) at a few hundred to a thousand frequencies.

import type { ComplexColumns } from './fft.ts';

/** Re-seed the rotating phasor with exact cos/sin this often (bounds rounding drift). */
const RESEED = 256;

/** X(f_Hz[m]) for every requested frequency. */
export function dtft(x: Float64Array, dt_s: number, f_Hz: Float64Array): ComplexColumns {
  const m = f_Hz.length, n = x.length;
  const re = new Float64Array(m), im = new Float64Array(m);
  // Skip leading and trailing exact zeros (they add nothing).
  let lo = 0, hi = n;
  while (lo < hi && x[lo] === 0) lo++;
  while (hi > lo && x[hi - 1] === 0) hi--;
  for (let k = 0; k < m; k++) {
    const w = -2 * Math.PI * f_Hz[k] * dt_s; // phase step per sample
    const cs = Math.cos(w), sn = Math.sin(w);
    let sr = 0, si = 0;
    for (let b = lo; b < hi; b += RESEED) {
      let pr = Math.cos(w * b), pi = Math.sin(w * b);
      const e = Math.min(b + RESEED, hi);
      for (let i = b; i < e; i++) {
        const v = x[i];
        sr += v * pr; si += v * pi;
        const t = pr * cs - pi * sn;
        pi = pr * sn + pi * cs;
        pr = t;
      }
    }
    re[k] = sr; im[k] = si;
  }
  return { re, im };
}
