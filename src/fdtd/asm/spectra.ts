// The running spectra of the probe records at the check frequencies (convergence.ts SpectraWatch.feed), one
// sample per step, two frequencies per vector: x (c − j s) added to each accumulator, the phasor rotated by ωΔt,
// re-seeded from the run's exact table at every step index that is a multiple of SPEC_RESEED. Every lane does the
// scalar feed's operations in its order, so the sums are the same to the bit.

import { at, word } from './mem.ts';
import { R_SPEC_ACC, R_SPEC_N, R_SPEC_PHASOR, R_SPEC_ROTATION, R_SPEC_SEEDS, SPEC_RESEED } from '../wasm/slots.ts';

/** Feed sample t: incident xi, reflected xr, transmitted xt. */
export function feedSpectra(r: usize, t: i32, xi: f64, xr: f64, xt: f64): void {
  const n = <i32>word(r, R_SPEC_N), acc = word(r, R_SPEC_ACC), ph = word(r, R_SPEC_PHASOR), rot = word(r, R_SPEC_ROTATION);
  if (t % SPEC_RESEED == 0) memory.copy(ph, word(r, R_SPEC_SEEDS), <usize>(2 * n) << 3);
  const vi = f64x2.splat(xi), vr = f64x2.splat(xr), vt = f64x2.splat(xt);
  for (let q = 0; q < n; q += 2) {
    const pc = at(ph, q), ps = at(ph, n + q);
    const c = v128.load(pc), s = v128.load(ps), cs = v128.load(at(rot, q)), sn = v128.load(at(rot, n + q));
    accumulate(at(acc, q), at(acc, n + q), vi, c, s);
    accumulate(at(acc, 2 * n + q), at(acc, 3 * n + q), vr, c, s);
    accumulate(at(acc, 4 * n + q), at(acc, 5 * n + q), vt, c, s);
    v128.store(pc, f64x2.sub(f64x2.mul(c, cs), f64x2.mul(s, sn)));
    v128.store(ps, f64x2.add(f64x2.mul(s, cs), f64x2.mul(c, sn)));
  }
}

/** re += x·c, im −= x·s. */
// @ts-ignore: decorator
@inline function accumulate(re: usize, im: usize, x: v128, c: v128, s: v128): void {
  v128.store(re, f64x2.add(v128.load(re), f64x2.mul(x, c)));
  v128.store(im, f64x2.sub(v128.load(im), f64x2.mul(x, s)));
}
