// The Yee updates of one grid's bulk, two nodes per 128-bit vector (f64x2), in the order of the TypeScript
// kernel (kernel.ts) so that every node's arithmetic, and so its rounding, is the same.

import { at, get, put } from './mem.ts';

/** h[i] += S·(e[i+1] − e[i]) for i in [lo, hi). */
export function hUniform(e: usize, h: usize, lo: i32, hi: i32, S: f64): void {
  const s = f64x2.splat(S);
  let i = lo;
  for (; i + 2 <= hi; i += 2) {
    const l = v128.load(at(e, i)), r = v128.load(at(e, i + 1));
    v128.store(at(h, i), f64x2.add(v128.load(at(h, i)), f64x2.mul(s, f64x2.sub(r, l))));
  }
  for (; i < hi; i++) put(h, i, get(h, i) + S * (get(e, i + 1) - get(e, i)));
}

/** h[i] += db[i]·(e[i+1] − e[i]) for i in [lo, hi). */
export function hPerNode(e: usize, h: usize, db: usize, lo: i32, hi: i32): void {
  let i = lo;
  for (; i + 2 <= hi; i += 2) {
    const l = v128.load(at(e, i)), r = v128.load(at(e, i + 1));
    v128.store(at(h, i), f64x2.add(v128.load(at(h, i)), f64x2.mul(v128.load(at(db, i)), f64x2.sub(r, l))));
  }
  for (; i < hi; i++) put(h, i, get(h, i) + get(db, i) * (get(e, i + 1) - get(e, i)));
}

/** e[i] = ca[i]·e[i] + cb[i]·(h[i] − h[i−1]) for i in [lo, hi). */
export function eBulk(e: usize, h: usize, ca: usize, cb: usize, lo: i32, hi: i32): void {
  let i = lo;
  for (; i + 2 <= hi; i += 2) {
    const curl = f64x2.sub(v128.load(at(h, i)), v128.load(at(h, i - 1)));
    v128.store(at(e, i), f64x2.add(f64x2.mul(v128.load(at(ca, i)), v128.load(at(e, i))), f64x2.mul(v128.load(at(cb, i)), curl)));
  }
  for (; i < hi; i++) put(e, i, get(ca, i) * get(e, i) + get(cb, i) * (get(h, i) - get(h, i - 1)));
}

/** The same, saving Eⁿ of node i into old[i − lo] (the second-order poles need it at the next step). */
export function eBulkSaving(e: usize, h: usize, ca: usize, cb: usize, lo: i32, hi: i32, old: usize): void {
  let i = lo;
  for (; i + 2 <= hi; i += 2) {
    const E = v128.load(at(e, i));
    v128.store(at(old, i - lo), E);
    const curl = f64x2.sub(v128.load(at(h, i)), v128.load(at(h, i - 1)));
    v128.store(at(e, i), f64x2.add(f64x2.mul(v128.load(at(ca, i)), E), f64x2.mul(v128.load(at(cb, i)), curl)));
  }
  for (; i < hi; i++) {
    const E = get(e, i);
    put(old, i - lo, E);
    put(e, i, get(ca, i) * E + get(cb, i) * (get(h, i) - get(h, i - 1)));
  }
}

/** h[i] = da[i]·h[i] + db[i]·(e[i+1] − e[i]) for i in [lo, hi) (H nodes with series terms). */
export function hDamped(e: usize, h: usize, da: usize, db: usize, lo: i32, hi: i32): void {
  let i = lo;
  for (; i + 2 <= hi; i += 2) {
    const l = v128.load(at(e, i)), r = v128.load(at(e, i + 1));
    v128.store(at(h, i), f64x2.add(f64x2.mul(v128.load(at(da, i)), v128.load(at(h, i))), f64x2.mul(v128.load(at(db, i)), f64x2.sub(r, l))));
  }
  for (; i < hi; i++) put(h, i, get(da, i) * get(h, i) + get(db, i) * (get(e, i + 1) - get(e, i)));
}
