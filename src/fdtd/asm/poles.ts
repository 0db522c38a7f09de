// The pole passes of one dispersive span (trapezoidal ADEs, kernel.ts), two nodes per vector: nodes 2p and
// 2p + 1 of a group share one f64x2 per pole, so every lane does exactly the scalar kernel's arithmetic.
// Before the E update each pole is advanced but for its Eⁿ⁺¹ term and its share of the polarization terms is
// added to acc; after it, e += cp·acc (and acc is cleared for the next step).

import { at, get, put, word } from './mem.ts';
import {
  D_ACC, D_CP, D_E_OLD, D_GROUP_COUNT, D_GROUPS, D_HI, D_LO, GROUP_WORDS,
  Q_D_COEF, Q_D_STATE, Q_FILL, Q_LEN, Q_LO, Q_ND, Q_O_COEF, Q_O_STATE, Q_NO,
} from '../wasm/slots.ts';

/** Every group of span d: poles advanced, their terms added to acc. */
export function polesPre(d: usize, e: usize): void {
  const count = <i32>word(d, D_GROUP_COUNT), groups = word(d, D_GROUPS);
  const lo = <i32>word(d, D_LO), eOld = word(d, D_E_OLD), acc = word(d, D_ACC);
  for (let g = 0; g < count; g++) groupPre(groups + (<usize>(g * GROUP_WORDS) << 2), e, lo, eOld, acc);
}

function groupPre(G: usize, e: usize, spanLo: i32, eOld: usize, acc: usize): void {
  const lo = <i32>word(G, Q_LO), len = <i32>word(G, Q_LEN), fill = word(G, Q_FILL);
  const nd = <i32>word(G, Q_ND), dc = word(G, Q_D_COEF), ds = word(G, Q_D_STATE);
  const no = <i32>word(G, Q_NO), oc = word(G, Q_O_COEF), os = word(G, Q_O_STATE);
  const off = lo - spanLo, pairs = len >> 1;
  for (let p = 0; p < pairs; p++) {
    const k = p << 1;
    const E = v128.load(at(e, lo + k)), f = v128.load(at(fill, k));
    let sum = f64x2.splat(0);
    let sp = ds + (<usize>(p * nd) << 4);
    for (let q = 0; q < nd; q++, sp += 16) {
      const c = dc + (<usize>(3 * q) << 3);
      const bE = f64x2.mul(f64x2.mul(v128.load64_splat(c + 16), f), E);
      const P = f64x2.add(v128.load(sp), bE);
      sum = f64x2.add(sum, f64x2.mul(v128.load64_splat(c + 8), P));
      v128.store(sp, f64x2.add(f64x2.mul(v128.load64_splat(c), P), bE));
    }
    if (no > 0) {
      const E2 = f64x2.add(f64x2.mul(f64x2.splat(2), E), v128.load(at(eOld, off + k)));
      let so = os + (<usize>(p * no) << 5);
      for (let q = 0; q < no; q++, so += 32) {
        const c = oc + (<usize>(3 * q) << 3);
        const z = f64x2.mul(v128.load64_splat(c + 16), f);
        const P = f64x2.add(v128.load(so), f64x2.mul(z, E));
        const partial = f64x2.add(
          f64x2.add(f64x2.mul(v128.load64_splat(c), P), f64x2.mul(v128.load64_splat(c + 8), v128.load(so + 16))),
          f64x2.mul(z, E2));
        sum = f64x2.sub(sum, f64x2.sub(partial, P));
        v128.store(so, partial);
        v128.store(so + 16, P);
      }
    }
    const a = at(acc, off + k);
    v128.store(a, f64x2.add(v128.load(a), sum));
  }
  if (len & 1) groupPreLast(G, e, off, eOld, acc, pairs);
}

/** The last node of an odd-length group: lane 0 of pair `p`, scalar. */
function groupPreLast(G: usize, e: usize, off: i32, eOld: usize, acc: usize, p: i32): void {
  const lo = <i32>word(G, Q_LO), fill = word(G, Q_FILL);
  const nd = <i32>word(G, Q_ND), dc = word(G, Q_D_COEF), ds = word(G, Q_D_STATE);
  const no = <i32>word(G, Q_NO), oc = word(G, Q_O_COEF), os = word(G, Q_O_STATE);
  const k = p << 1;
  const E = get(e, lo + k), f = get(fill, k);
  let sum: f64 = 0;
  let sp = ds + (<usize>(p * nd) << 4);
  for (let q = 0; q < nd; q++, sp += 16) {
    const c = dc + (<usize>(3 * q) << 3);
    const bE = load<f64>(c + 16) * f * E;
    const P = load<f64>(sp) + bE;
    sum += load<f64>(c + 8) * P;
    store<f64>(sp, load<f64>(c) * P + bE);
  }
  const E2 = 2 * E + get(eOld, off + k);
  let so = os + (<usize>(p * no) << 5);
  for (let q = 0; q < no; q++, so += 32) {
    const c = oc + (<usize>(3 * q) << 3);
    const z = load<f64>(c + 16) * f;
    const P = load<f64>(so) + z * E;
    const partial = load<f64>(c) * P + load<f64>(c + 8) * load<f64>(so + 16) + z * E2;
    sum -= partial - P;
    store<f64>(so, partial);
    store<f64>(so + 16, P);
  }
  put(acc, off + k, get(acc, off + k) + sum);
}

/** After the E update: e += cp·acc over the span, acc cleared. */
export function polesPost(d: usize, e: usize): void {
  const lo = <i32>word(d, D_LO), len = <i32>word(d, D_HI) - lo, cp = word(d, D_CP), acc = word(d, D_ACC);
  const zero = f64x2.splat(0);
  let k = 0;
  for (; k + 2 <= len; k += 2) {
    const a = v128.load(at(acc, k));
    v128.store(at(e, lo + k), f64x2.add(v128.load(at(e, lo + k)), f64x2.mul(v128.load(at(cp, k)), a)));
    v128.store(at(acc, k), zero);
  }
  for (; k < len; k++) {
    put(e, lo + k, get(e, lo + k) + get(cp, k) * get(acc, k));
    put(acc, k, 0);
  }
}
