// The pole passes of one dispersive span (trapezoidal ADEs, kernel.ts), on the E nodes or the H nodes alike (F is
// the field), two nodes per vector: nodes 2p and 2p + 1 of a group share one f64x2 per pole, so every lane does
// exactly the scalar kernel's arithmetic. A plain group's second-order terms take ζ0·f(2Fⁿ + Fⁿ⁻¹), the others
// ζ1·fFⁿ + ζ2·fFⁿ⁻¹ (slots.ts Q_O_FULL).
// Nodes of a group's fused pairs (slots.ts) are advanced, E-updated and given their polarization terms in one
// pass (fusedPairs). Every other node's poles are advanced before the E update with their terms added to acc
// (groupPre), and e += cp·acc after it (polesPost, which also clears acc).

import { at, get, put, word } from './mem.ts';
import {
  D_ACC, D_CP, D_E_OLD, D_GROUP_COUNT, D_GROUPS, D_LO, GROUP_WORDS,
  Q_D_COEF, Q_D_STATE, Q_FILL, Q_FUSED_HI, Q_FUSED_LO, Q_LEN, Q_LO, Q_ND, Q_O_COEF, Q_O_FULL, Q_O_STATE, Q_NO,
} from '../wasm/slots.ts';

// @ts-ignore: decorator
@inline export function groupAt(d: usize, g: i32): usize {
  return word(d, D_GROUPS) + (<usize>(g * GROUP_WORDS) << 2);
}

/**
 * Poles of pair p advanced; returns the pair's polarization terms. fE = f·Fⁿ; `second` = f·(2Fⁿ + Fⁿ⁻¹) for a
 * plain group, f·Fⁿ⁻¹ for one with s-numerators.
 */
// @ts-ignore: decorator
@inline function pairPoles(G: usize, p: i32, fE: v128, second: v128): v128 {
  const nd = <i32>word(G, Q_ND), dc = word(G, Q_D_COEF), no = <i32>word(G, Q_NO), oc = word(G, Q_O_COEF);
  let sum = f64x2.splat(0);
  let sp = word(G, Q_D_STATE) + (<usize>(p * nd) << 4);
  const dEnd = dc + (<usize>(3 * nd) << 3);
  for (let c = dc; c < dEnd; c += 24, sp += 16) {
    const bE = f64x2.mul(v128.load64_splat(c + 16), fE);
    const P = f64x2.add(v128.load(sp), bE);
    sum = f64x2.add(sum, f64x2.mul(v128.load64_splat(c + 8), P));
    v128.store(sp, f64x2.add(f64x2.mul(v128.load64_splat(c), P), bE));
  }
  let so = word(G, Q_O_STATE) + (<usize>(p * no) << 5), c = oc, full = word(G, Q_O_FULL);
  const end = c + (<usize>(3 * no) << 3);
  for (; c < end; c += 24, so += 32, full += full != 0 ? 16 : 0) {
    const z = v128.load64_splat(c + 16);
    const P = f64x2.add(v128.load(so), f64x2.mul(z, fE));
    const past = f64x2.add(f64x2.mul(v128.load64_splat(c), P), f64x2.mul(v128.load64_splat(c + 8), v128.load(so + 16)));
    const drive = full == 0 ? f64x2.mul(z, second)
      : f64x2.add(f64x2.mul(v128.load64_splat(full), fE), f64x2.mul(v128.load64_splat(full + 8), second));
    const partial = f64x2.add(past, drive);
    sum = f64x2.sub(sum, f64x2.sub(partial, P));
    v128.store(so, partial);
    v128.store(so + 16, P);
  }
  return sum;
}

/** The `second` argument of pairPoles for fills f, Fⁿ and Fⁿ⁻¹ (see there). */
// @ts-ignore: decorator
@inline function secondOf(G: usize, f: v128, E: v128, Eold: v128): v128 {
  return word(G, Q_O_FULL) == 0 ? f64x2.mul(f, f64x2.add(f64x2.mul(f64x2.splat(2), E), Eold)) : f64x2.mul(f, Eold);
}

/** The second pair's terms from quadPoles. */
let quadSecond: v128 = f64x2.splat(0);

/**
 * pairPoles for pairs p and p + 1 at once (each pole's coefficients loaded once for four nodes, two independent
 * chains for the processor to overlap): returns pair p's terms, leaves pair p + 1's in quadSecond.
 */
// @ts-ignore: decorator
@inline function quadPoles(G: usize, p: i32, fEa: v128, fE2a: v128, fEb: v128, fE2b: v128): v128 {
  const nd = <i32>word(G, Q_ND), dc = word(G, Q_D_COEF), no = <i32>word(G, Q_NO), oc = word(G, Q_O_COEF);
  let sa = f64x2.splat(0), sb = f64x2.splat(0);
  let pa = word(G, Q_D_STATE) + (<usize>(p * nd) << 4), pb = pa + (<usize>nd << 4);
  const dEnd = dc + (<usize>(3 * nd) << 3);
  for (let c = dc; c < dEnd; c += 24, pa += 16, pb += 16) {
    const a = v128.load64_splat(c), oma = v128.load64_splat(c + 8), b = v128.load64_splat(c + 16);
    const bEa = f64x2.mul(b, fEa), bEb = f64x2.mul(b, fEb);
    const Pa = f64x2.add(v128.load(pa), bEa), Pb = f64x2.add(v128.load(pb), bEb);
    sa = f64x2.add(sa, f64x2.mul(oma, Pa));
    sb = f64x2.add(sb, f64x2.mul(oma, Pb));
    v128.store(pa, f64x2.add(f64x2.mul(a, Pa), bEa));
    v128.store(pb, f64x2.add(f64x2.mul(a, Pb), bEb));
  }
  let ua = word(G, Q_O_STATE) + (<usize>(p * no) << 5), ub = ua + (<usize>no << 5);
  const oEnd = oc + (<usize>(3 * no) << 3);
  for (let c = oc; c < oEnd; c += 24, ua += 32, ub += 32) {
    const al = v128.load64_splat(c), xi = v128.load64_splat(c + 8), z = v128.load64_splat(c + 16);
    const Pa = f64x2.add(v128.load(ua), f64x2.mul(z, fEa)), Pb = f64x2.add(v128.load(ub), f64x2.mul(z, fEb));
    const qa = f64x2.add(f64x2.add(f64x2.mul(al, Pa), f64x2.mul(xi, v128.load(ua + 16))), f64x2.mul(z, fE2a));
    const qb = f64x2.add(f64x2.add(f64x2.mul(al, Pb), f64x2.mul(xi, v128.load(ub + 16))), f64x2.mul(z, fE2b));
    sa = f64x2.sub(sa, f64x2.sub(qa, Pa));
    sb = f64x2.sub(sb, f64x2.sub(qb, Pb));
    v128.store(ua, qa);
    v128.store(ua + 16, Pa);
    v128.store(ub, qb);
    v128.store(ub + 16, Pb);
  }
  quadSecond = sb;
  return sa;
}

/** Pairs [from, to) of group G: poles advanced, their terms added to acc. */
function pairsPre(G: usize, e: usize, off: i32, eOld: usize, acc: usize, from: i32, to: i32): void {
  const lo = <i32>word(G, Q_LO), fill = word(G, Q_FILL);
  for (let p = from; p < to; p++) {
    const k = p << 1;
    const E = v128.load(at(e, lo + k)), f = v128.load(at(fill, k));
    const sum = pairPoles(G, p, f64x2.mul(f, E), secondOf(G, f, E, v128.load(at(eOld, off + k))));
    const a = at(acc, off + k);
    v128.store(a, f64x2.add(v128.load(a), sum));
  }
}

/** The last node of an odd-length group: lane 0 of pair `p`, scalar. */
function lastPre(G: usize, e: usize, off: i32, eOld: usize, acc: usize, p: i32): void {
  const lo = <i32>word(G, Q_LO), fill = word(G, Q_FILL);
  const nd = <i32>word(G, Q_ND), dc = word(G, Q_D_COEF), ds = word(G, Q_D_STATE);
  const no = <i32>word(G, Q_NO), oc = word(G, Q_O_COEF), os = word(G, Q_O_STATE);
  const k = p << 1;
  const E = get(e, lo + k), f = get(fill, k), full = word(G, Q_O_FULL);
  const fE = f * E, second = full == 0 ? f * (2 * E + get(eOld, off + k)) : f * get(eOld, off + k);
  let sum: f64 = 0;
  let sp = ds + (<usize>(p * nd) << 4);
  for (let q = 0; q < nd; q++, sp += 16) {
    const c = dc + (<usize>(3 * q) << 3);
    const bE = load<f64>(c + 16) * fE;
    const P = load<f64>(sp) + bE;
    sum += load<f64>(c + 8) * P;
    store<f64>(sp, load<f64>(c) * P + bE);
  }
  let so = os + (<usize>(p * no) << 5);
  for (let q = 0; q < no; q++, so += 32) {
    const c = oc + (<usize>(3 * q) << 3);
    const z = load<f64>(c + 16);
    const P = load<f64>(so) + z * fE;
    const past = load<f64>(c) * P + load<f64>(c + 8) * load<f64>(so + 16);
    const o = full + (<usize>(2 * q) << 3);
    const partial = past + (full == 0 ? z * second : load<f64>(o) * fE + load<f64>(o + 8) * second);
    sum -= partial - P;
    store<f64>(so, partial);
    store<f64>(so + 16, P);
  }
  put(acc, off + k, get(acc, off + k) + sum);
}

/** Every group of span d: the poles of the nodes outside its fused pairs advanced, their terms added to acc. */
export function polesPre(d: usize, e: usize): void {
  const count = <i32>word(d, D_GROUP_COUNT), spanLo = <i32>word(d, D_LO), eOld = word(d, D_E_OLD), acc = word(d, D_ACC);
  for (let g = 0; g < count; g++) {
    const G = groupAt(d, g), len = <i32>word(G, Q_LEN), off = <i32>word(G, Q_LO) - spanLo, pairs = len >> 1;
    pairsPre(G, e, off, eOld, acc, 0, <i32>word(G, Q_FUSED_LO));
    pairsPre(G, e, off, eOld, acc, <i32>word(G, Q_FUSED_HI), pairs);
    if (len & 1) lastPre(G, e, off, eOld, acc, pairs);
  }
}

/**
 * The fused pairs of group G in one pass: poles advanced, Eⁿ saved, e = ca·e + cb·(h[i] − h[i−1]), then
 * e += cp·(terms) (the order, and so the rounding, of the separate passes).
 */
export function fusedPairs(G: usize, d: usize, e: usize, h: usize, ca: usize, cb: usize): void {
  const from = <i32>word(G, Q_FUSED_LO), to = <i32>word(G, Q_FUSED_HI);
  const lo = <i32>word(G, Q_LO), fill = word(G, Q_FILL), off = lo - <i32>word(d, D_LO);
  const eOld = word(d, D_E_OLD), cp = word(d, D_CP), two = f64x2.splat(2);
  let p = from;
  for (; p + 2 <= to; p += 2) {
    const k = p << 1, i = lo + k;
    const Ea = v128.load(at(e, i)), Eb = v128.load(at(e, i + 2));
    const fa = v128.load(at(fill, k)), fb = v128.load(at(fill, k + 2)), old = at(eOld, off + k);
    const fE2a = f64x2.mul(fa, f64x2.add(f64x2.mul(two, Ea), v128.load(old)));
    const fE2b = f64x2.mul(fb, f64x2.add(f64x2.mul(two, Eb), v128.load(old + 16)));
    const sa = quadPoles(G, p, f64x2.mul(fa, Ea), fE2a, f64x2.mul(fb, Eb), fE2b), sb = quadSecond;
    v128.store(old, Ea);
    v128.store(old + 16, Eb);
    const ha = v128.load(at(h, i - 1)), hb = v128.load(at(h, i)), hc = v128.load(at(h, i + 1)), hd = v128.load(at(h, i + 2));
    const ya = f64x2.add(f64x2.mul(v128.load(at(ca, i)), Ea), f64x2.mul(v128.load(at(cb, i)), f64x2.sub(hb, ha)));
    const yb = f64x2.add(f64x2.mul(v128.load(at(ca, i + 2)), Eb), f64x2.mul(v128.load(at(cb, i + 2)), f64x2.sub(hd, hc)));
    v128.store(at(e, i), f64x2.add(ya, f64x2.mul(v128.load(at(cp, off + k)), sa)));
    v128.store(at(e, i + 2), f64x2.add(yb, f64x2.mul(v128.load(at(cp, off + k + 2)), sb)));
  }
  for (; p < to; p++) {
    const k = p << 1, i = lo + k;
    const E = v128.load(at(e, i)), f = v128.load(at(fill, k)), old = at(eOld, off + k);
    const fE2 = f64x2.mul(f, f64x2.add(f64x2.mul(two, E), v128.load(old)));
    const sum = pairPoles(G, p, f64x2.mul(f, E), fE2);
    v128.store(old, E);
    const curl = f64x2.sub(v128.load(at(h, i)), v128.load(at(h, i - 1)));
    const yee = f64x2.add(f64x2.mul(v128.load(at(ca, i)), E), f64x2.mul(v128.load(at(cb, i)), curl));
    v128.store(at(e, i), f64x2.add(yee, f64x2.mul(v128.load(at(cp, off + k)), sum)));
  }
}

/** e += cp·acc over span nodes [a, b) (absolute), acc cleared. */
export function polesPost(d: usize, e: usize, a: i32, b: i32): void {
  const lo = <i32>word(d, D_LO), cp = word(d, D_CP), acc = word(d, D_ACC);
  const zero = f64x2.splat(0);
  let i = a;
  for (; i + 2 <= b; i += 2) {
    const k = i - lo, x = v128.load(at(acc, k));
    v128.store(at(e, i), f64x2.add(v128.load(at(e, i)), f64x2.mul(v128.load(at(cp, k)), x)));
    v128.store(at(acc, k), zero);
  }
  for (; i < b; i++) {
    const k = i - lo;
    put(e, i, get(e, i) + get(cp, k) * get(acc, k));
    put(acc, k, 0);
  }
}
