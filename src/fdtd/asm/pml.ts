// CPML corrections (Roden & Gedney 2000, κ = 1) of one region, after the bulk update, as in kernel.ts:
//   ψ ← b ψ + c·(difference);  field += coefficient·ψ.

import { at, get, put, word } from './mem.ts';
import { P_BE, P_BH, P_CE, P_CH, P_E_HI, P_E_LO, P_H_HI, P_H_LO, P_PSI_E, P_PSI_H } from '../wasm/slots.ts';

/** H nodes of region p: h[i] += db·ψ with db = S (uniform, dbs = 0) or dbs[i]. */
export function pmlH(p: usize, e: usize, h: usize, dbs: usize, S: f64): void {
  const lo = <i32>word(p, P_H_LO), hi = <i32>word(p, P_H_HI);
  const b = word(p, P_BH), c = word(p, P_CH), psi = word(p, P_PSI_H);
  let i = lo;
  if (dbs == 0) {
    const s = f64x2.splat(S);
    for (; i + 2 <= hi; i += 2) {
      const k = i - lo;
      const diff = f64x2.sub(v128.load(at(e, i + 1)), v128.load(at(e, i)));
      const v = f64x2.add(f64x2.mul(v128.load(at(b, k)), v128.load(at(psi, k))), f64x2.mul(v128.load(at(c, k)), diff));
      v128.store(at(psi, k), v);
      v128.store(at(h, i), f64x2.add(v128.load(at(h, i)), f64x2.mul(s, v)));
    }
  }
  for (; i < hi; i++) {
    const k = i - lo;
    const v = get(b, k) * get(psi, k) + get(c, k) * (get(e, i + 1) - get(e, i));
    put(psi, k, v);
    put(h, i, get(h, i) + (dbs == 0 ? S : get(dbs, i)) * v);
  }
}

/** E nodes of region p: e[i] += cb[i]·ψ. */
export function pmlE(p: usize, e: usize, h: usize, cb: usize): void {
  const lo = <i32>word(p, P_E_LO), hi = <i32>word(p, P_E_HI);
  const b = word(p, P_BE), c = word(p, P_CE), psi = word(p, P_PSI_E);
  let i = lo;
  for (; i + 2 <= hi; i += 2) {
    const k = i - lo;
    const curl = f64x2.sub(v128.load(at(h, i)), v128.load(at(h, i - 1)));
    const v = f64x2.add(f64x2.mul(v128.load(at(b, k)), v128.load(at(psi, k))), f64x2.mul(v128.load(at(c, k)), curl));
    v128.store(at(psi, k), v);
    v128.store(at(e, i), f64x2.add(v128.load(at(e, i)), f64x2.mul(v128.load(at(cb, i)), v)));
  }
  for (; i < hi; i++) {
    const k = i - lo;
    const v = get(b, k) * get(psi, k) + get(c, k) * (get(h, i) - get(h, i - 1));
    put(psi, k, v);
    put(e, i, get(e, i) + get(cb, i) * v);
  }
}
