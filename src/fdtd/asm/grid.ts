// One grid's half steps in the TypeScript kernel's order (kernel.ts updateH / updateE): the bulk, the CPML
// regions, the one-node TF/SF injection, and around the E update the pole passes (fused with it where a node
// has nothing else to do, poles.ts).

import { at, get, put, real, word } from './mem.ts';
import { eBulk, eBulkSaving, hDamped, hPerNode, hUniform } from './yee.ts';
import { pmlE, pmlH } from './pml.ts';
import { fusedPairs, groupAt, polesPost, polesPre } from './poles.ts';
import {
  D_E_OLD, D_GROUP_COUNT, D_HI, D_LO, G_CA, G_CB, G_DA, G_DB, G_DISP, G_E, G_H, G_HDISP, G_N, G_PML, G_PML_COUNT, G_S, PML_WORDS,
  Q_FUSED_HI, Q_FUSED_LO, Q_LO,
} from '../wasm/slots.ts';

// @ts-ignore: decorator
@inline function pmlAt(g: usize, r: i32): usize {
  return word(g, G_PML) + (<usize>(r * PML_WORDS) << 2);
}

/**
 * hⁿ⁺¹ᐟ² from hⁿ⁻¹ᐟ² and eⁿ; node `inj` (≥ 0) also gets db·injValue. With series terms (G_HDISP) the H nodes'
 * poles are advanced first (their Hⁿ⁻¹ᐟ² saved), h = da·h + db·curl, and their terms added last, as on the E side.
 */
export function gridH(g: usize, inj: i32, injValue: f64): void {
  const n = <i32>word(g, G_N), e = word(g, G_E), h = word(g, G_H), db = word(g, G_DB), S = real(g, G_S);
  const hd = word(g, G_HDISP), da = word(g, G_DA);
  if (hd != 0) {
    polesPre(hd, h);
    const lo = <i32>word(hd, D_LO), hi = <i32>word(hd, D_HI);
    memory.copy(word(hd, D_E_OLD), at(h, lo), <usize>(hi - lo) << 3);
  }
  if (da != 0) hDamped(e, h, da, db, 0, n - 1);
  else if (db == 0) hUniform(e, h, 0, n - 1, S);
  else hPerNode(e, h, db, 0, n - 1);
  const regions = <i32>word(g, G_PML_COUNT);
  for (let r = 0; r < regions; r++) pmlH(pmlAt(g, r), e, h, db, S);
  if (inj >= 0) put(h, inj, get(h, inj) + (db == 0 ? S : get(db, inj)) * injValue);
  if (hd != 0) polesPost(hd, h, <i32>word(hd, D_LO), <i32>word(hd, D_HI));
}

/** eⁿ⁺¹ from eⁿ and hⁿ⁺¹ᐟ²; node `inj` (≥ 0) also gets cb·injValue. */
export function gridE(g: usize, inj: i32, injValue: f64): void {
  const n = <i32>word(g, G_N), e = word(g, G_E), h = word(g, G_H), ca = word(g, G_CA), cb = word(g, G_CB);
  const d = word(g, G_DISP), m = n - 1;
  if (d != 0) dispersiveE(d, e, h, ca, cb, m);
  else eBulk(e, h, ca, cb, 1, m);
  const regions = <i32>word(g, G_PML_COUNT);
  for (let r = 0; r < regions; r++) pmlE(pmlAt(g, r), e, h, cb);
  if (inj >= 0) put(e, inj, get(e, inj) + get(cb, inj) * injValue);
  if (d != 0) outsideFused(d, 2, e, h, ca, cb, 0);
}

/** The E update of a grid with a dispersive span d (nodes 1 … m − 1 updated). */
function dispersiveE(d: usize, e: usize, h: usize, ca: usize, cb: usize, m: i32): void {
  polesPre(d, e);
  const count = <i32>word(d, D_GROUP_COUNT);
  for (let q = 0; q < count; q++) fusedPairs(groupAt(d, q), d, e, h, ca, cb);
  const lo = <i32>word(d, D_LO), hi = <i32>word(d, D_HI), old = word(d, D_E_OLD);
  // Walls inside the span are never updated, but their Eⁿ is saved like every span node's.
  if (lo < 1) put(old, 0, get(e, 0));
  if (hi > m) put(old, m - lo, get(e, m));
  if (lo > 1) eBulk(e, h, ca, cb, 1, min(lo, m));
  outsideFused(d, 1, e, h, ca, cb, m);
  if (hi < m) eBulk(e, h, ca, cb, max(hi, 1), m);
}

/**
 * Over the span's nodes (within [1, m) for the Yee update) that are in no fused pair: job 1, the Yee update
 * saving Eⁿ; job 2, e += cp·acc.
 */
function outsideFused(d: usize, job: i32, e: usize, h: usize, ca: usize, cb: usize, m: i32): void {
  const lo = <i32>word(d, D_LO), hi = <i32>word(d, D_HI), count = <i32>word(d, D_GROUP_COUNT);
  const a0 = job == 1 ? max(lo, 1) : lo, b0 = job == 1 ? min(hi, m) : hi;
  let x = a0;
  for (let q = 0; q <= count; q++) {
    let to = b0, next = b0;
    if (q < count) {
      const G = groupAt(d, q), fa = <i32>word(G, Q_FUSED_LO), fb = <i32>word(G, Q_FUSED_HI);
      if (fb <= fa) continue;
      const glo = <i32>word(G, Q_LO);
      to = glo + (fa << 1);
      next = glo + (fb << 1);
    }
    if (to > x) {
      if (job == 1) eBulkSaving(e, h, ca, cb, x, to, at(word(d, D_E_OLD), x - lo));
      else polesPost(d, e, x, to);
    }
    x = max(x, next);
  }
}
