// Quasi-random start points in the unit cube: the Halton sequence (Halton, Numer. Math. 2, 1960, 84–90), the
// radical inverse of the point's index in the k-th prime for coordinate k, shifted modulo 1 by a random vector
// (the Cranley–Patterson rotation, SIAM J. Numer. Anal. 13, 1976, 904–914), so a seed gives a different but
// equally even set and the same seed the same set. Index 0 (the origin before the shift) is skipped.

import { Mt19937 } from '../studies/random.ts';

const PRIMES = [2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47, 53, 59, 61, 67, 71];

/** Most coordinates the sequence offers (free parameters of one tuning). */
export const HALTON_MAX_DIMENSIONS = PRIMES.length;

/** The radical inverse of `index` in `base`: its digits mirrored about the point. */
export function radicalInverse(index: number, base: number): number {
  let inv = 0, f = 1 / base, i = index;
  while (i > 0) {
    inv += (i % base) * f;
    i = Math.floor(i / base);
    f /= base;
  }
  return inv;
}

/** `count` points in [0, 1)^dims, the Halton points 1 … count rotated by a shift drawn from `seed`. */
export function haltonPoints(count: number, dims: number, seed: number): Float64Array[] {
  if (dims > HALTON_MAX_DIMENSIONS) throw new RangeError(`at most ${HALTON_MAX_DIMENSIONS} dimensions`);
  const rng = new Mt19937(seed);
  const shift = Array.from({ length: dims }, () => rng.uniform());
  return Array.from({ length: count }, (_, n) => {
    const u = new Float64Array(dims);
    for (let k = 0; k < dims; k++) { const v = radicalInverse(n + 1, PRIMES[k]) + shift[k]; u[k] = v - Math.floor(v); }
    return u;
  });
}
