// One grid's half steps in the TypeScript kernel's order (kernel.ts updateH / updateE): the bulk, the CPML
// regions, the one-node TF/SF injection, and around the E update the pole passes.

import { at, get, put, real, word } from './mem.ts';
import { eBulk, eBulkSaving, hPerNode, hUniform } from './yee.ts';
import { pmlE, pmlH } from './pml.ts';
import { polesPost, polesPre } from './poles.ts';
import {
  D_E_OLD, D_HI, D_LO, G_CA, G_CB, G_DB, G_DISP, G_E, G_H, G_N, G_PML, G_PML_COUNT, G_S, PML_WORDS,
} from '../wasm/slots.ts';

// @ts-ignore: decorator
@inline function pmlAt(g: usize, r: i32): usize {
  return word(g, G_PML) + (<usize>(r * PML_WORDS) << 2);
}

/** hⁿ⁺¹ᐟ² from hⁿ⁻¹ᐟ² and eⁿ; node `inj` (≥ 0) also gets db·injValue. */
export function gridH(g: usize, inj: i32, injValue: f64): void {
  const n = <i32>word(g, G_N), e = word(g, G_E), h = word(g, G_H), db = word(g, G_DB), S = real(g, G_S);
  if (db == 0) hUniform(e, h, 0, n - 1, S);
  else hPerNode(e, h, db, 0, n - 1);
  const regions = <i32>word(g, G_PML_COUNT);
  for (let r = 0; r < regions; r++) pmlH(pmlAt(g, r), e, h, db, S);
  if (inj >= 0) put(h, inj, get(h, inj) + (db == 0 ? S : get(db, inj)) * injValue);
}

/** eⁿ⁺¹ from eⁿ and hⁿ⁺¹ᐟ²; node `inj` (≥ 0) also gets cb·injValue. */
export function gridE(g: usize, inj: i32, injValue: f64): void {
  const n = <i32>word(g, G_N), e = word(g, G_E), h = word(g, G_H), ca = word(g, G_CA), cb = word(g, G_CB);
  const d = word(g, G_DISP), m = n - 1;
  if (d != 0) {
    polesPre(d, e);
    const lo = <i32>word(d, D_LO), hi = <i32>word(d, D_HI), old = word(d, D_E_OLD);
    const a = max(1, lo), b = min(m, hi);
    // Walls inside the span are never updated, but their Eⁿ is saved like every span node's.
    if (lo < 1) put(old, 0, get(e, 0));
    if (hi > m) put(old, m - lo, get(e, m));
    if (a > 1) eBulk(e, h, ca, cb, 1, a);
    eBulkSaving(e, h, ca, cb, a, b, at(old, a - lo));
    if (b < m) eBulk(e, h, ca, cb, b, m);
  } else eBulk(e, h, ca, cb, 1, m);
  const regions = <i32>word(g, G_PML_COUNT);
  for (let r = 0; r < regions; r++) pmlE(pmlAt(g, r), e, h, cb);
  if (inj >= 0) put(e, inj, get(e, inj) + get(cb, inj) * injValue);
  if (d != 0) polesPost(d, e);
}
