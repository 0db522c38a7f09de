// The stored energy of the main grid as engine-js.ts sums it (fieldEnergy, poleEnergy): Σ ε∞E² + Σ μ∞h², then the
// pole states' energy on both fields (P̃²/Δε per Debye pole, (P̃'² + ω0²P̃²)/c per second-order pole), each in the two lanes of
// one vector (even and odd places) added at the end, so the sums round as the TypeScript ones do.

import { at, get, word } from './mem.ts';
import { groupAt } from './poles.ts';
import {
  D_GROUP_COUNT, G_DISP, G_E, G_H, G_HDISP, G_N,
  Q_D_COEF, Q_D_EPS, Q_D_STATE, Q_FILL, Q_LEN, Q_LO, Q_ND, Q_NO, Q_O_C, Q_O_COEF, Q_O_STATE, Q_O_W0SQ,
} from '../wasm/slots.ts';

// @ts-ignore: decorator
@inline function addLane0(acc: v128, x: f64): v128 {
  return f64x2.replace_lane(acc, 0, f64x2.extract_lane(acc, 0) + x);
}

// @ts-ignore: decorator
@inline function lanesSum(acc: v128): f64 {
  return f64x2.extract_lane(acc, 0) + f64x2.extract_lane(acc, 1);
}

export function storedEnergy(g: usize, epsInf: usize, muInf: usize, dt: f64): f64 {
  const n = <i32>word(g, G_N), e = word(g, G_E), h = word(g, G_H);
  let acc = f64x2.splat(0), i = 0;
  for (; i + 2 <= n; i += 2) {
    const v = v128.load(at(e, i));
    acc = f64x2.add(acc, f64x2.mul(f64x2.mul(v128.load(at(epsInf, i)), v), v));
  }
  if (i < n) { const v = get(e, i); acc = addLane0(acc, get(epsInf, i) * v * v); }
  for (i = 0; i + 2 <= n - 1; i += 2) {
    const v = v128.load(at(h, i));
    acc = f64x2.add(acc, f64x2.mul(f64x2.mul(v128.load(at(muInf, i)), v), v));
  }
  if (i < n - 1) { const v = get(h, i); acc = addLane0(acc, get(muInf, i) * v * v); }
  const d = word(g, G_DISP), hd = word(g, G_HDISP);
  return lanesSum(acc) + (d == 0 ? 0 : poleEnergy(d, e, dt)) + (hd == 0 ? 0 : poleEnergy(hd, h, dt));
}

function poleEnergy(d: usize, e: usize, dt: f64): f64 {
  const count = <i32>word(d, D_GROUP_COUNT);
  let acc = f64x2.splat(0);
  for (let g = 0; g < count; g++) acc = groupEnergy(groupAt(d, g), e, dt, acc);
  return lanesSum(acc);
}

/** One group's pole energy added to the lanes of acc (a node of fill 0 adds nothing, as in the scalar sum). */
function groupEnergy(G: usize, e: usize, dt: f64, acc: v128): v128 {
  const lo = <i32>word(G, Q_LO), len = <i32>word(G, Q_LEN), fill = word(G, Q_FILL);
  const nd = <i32>word(G, Q_ND), dc = word(G, Q_D_COEF), ds = word(G, Q_D_STATE), deps = word(G, Q_D_EPS);
  const no = <i32>word(G, Q_NO), oc = word(G, Q_O_COEF), os = word(G, Q_O_STATE), c = word(G, Q_O_C), w0sq = word(G, Q_O_W0SQ);
  const zero = f64x2.splat(0), two = f64x2.splat(2), step = f64x2.splat(dt);
  // Pairs, both lanes; the last node of an odd-length group is lane 0 of a pair whose lane 1 has fill 0.
  const pairs = (len + 1) >> 1;
  for (let p = 0; p < pairs; p++) {
    const k = p << 1;
    let f = v128.load(at(fill, k));
    if (k + 1 >= len) f = f64x2.replace_lane(f, 1, 0);
    const E = k + 1 < len ? v128.load(at(e, lo + k)) : f64x2.splat(get(e, lo + k));
    const fE = f64x2.mul(f, E), live = f64x2.gt(f, zero);
    for (let q = 0; q < nd; q++) {
      const P = f64x2.add(v128.load(ds + (<usize>(p * nd + q) << 4)), f64x2.mul(v128.load64_splat(dc + (<usize>(3 * q + 2) << 3)), fE));
      const t = f64x2.div(f64x2.mul(P, P), f64x2.mul(f, v128.load64_splat(at(deps, q))));
      acc = f64x2.add(acc, v128.bitselect(t, zero, live));
    }
    for (let q = 0; q < no; q++) {
      const s = os + (<usize>(p * no + q) << 5);
      const P = f64x2.add(v128.load(s), f64x2.mul(v128.load64_splat(oc + (<usize>(3 * q + 2) << 3)), fE)), old = v128.load(s + 16);
      const rate = f64x2.div(f64x2.sub(P, old), step), mean = f64x2.div(f64x2.add(P, old), two);
      const num = f64x2.add(f64x2.mul(rate, rate), f64x2.mul(f64x2.mul(v128.load64_splat(at(w0sq, q)), mean), mean));
      const t = f64x2.div(num, f64x2.mul(f, v128.load64_splat(at(c, q))));
      acc = f64x2.add(acc, v128.bitselect(t, zero, live));
    }
  }
  return acc;
}
