// The production time step of a pulse run in WebAssembly (entry of the module bin/build-wasm.mjs builds):
// both grids, the TF/SF coupling, the hard source, the probes and the profile's running DFT, in the order of
// run.ts, so the results match the TypeScript kernel to the bit. JavaScript lays the arena out once
// (src/fdtd/wasm/arena.ts), calls step(run, n, k) per batch of at most BATCH_STEPS steps and reads views.

import { at, get, node, put, real, setReal, word } from './mem.ts';
import { gridE, gridH } from './grid.ts';
import { storedEnergy } from './energy.ts';
import { feedSpectra } from './spectra.ts';
import {
  G_E, G_H, R_AUX, R_AUX_OFFSET, R_BACK, R_DFT_IM, R_DFT_LEN, R_DFT_LO, R_DFT_RE, R_DFT_STRIDE, R_DT, R_EPS_INF, R_MU_INF,
  R_FRONT, R_INC_IM, R_INC_RE, R_MAIN, R_PHASORS, R_PROBES, R_SF_PROBE, R_SRC, R_SRC_LEN, R_TFSF,
} from '../wasm/slots.ts';

/** First byte the arena may use (after the module's own static data). */
export function heapBase(): usize {
  return (__heap_base + 15) & ~15;
}

/** Steps n + 1 … n + k of the run described at `r`. */
export function step(r: usize, n: i32, k: i32): void {
  const main = word(r, R_MAIN), aux = word(r, R_AUX);
  const a = node(r, R_TFSF), off = node(r, R_AUX_OFFSET);
  const auxE = word(aux, G_E), auxH = word(aux, G_H);
  const src = word(r, R_SRC), srcLen = node(r, R_SRC_LEN);
  for (let j = 0; j < k; j++) {
    // H half step (TF/SF: the scattered H in front of the plane must not see the incident E).
    const injH = -get(auxE, a - off);
    gridH(aux, -1, 0);
    gridH(main, a - 1, injH);
    // E step (TF/SF: the first total E node needs the incident H of the node in front).
    const injE = -get(auxH, a - 1 - off);
    gridE(main, a, injE);
    gridE(aux, -1, 0);
    const t = n + j + 1;
    put(auxE, 0, t < srcLen ? get(src, t) : 0);
    sample(r, main, auxE, off, t, j);
  }
}

/** Probe samples of step t (row j of the probe table, fed to the running spectra) and, on DFT steps, one term of the profile's DFT. */
function sample(r: usize, main: usize, auxE: usize, off: i32, t: i32, j: i32): void {
  const e = word(main, G_E), probes = word(r, R_PROBES) + (<usize>(j << 2) << 3);
  const front = node(r, R_FRONT), back = node(r, R_BACK);
  const inc = get(auxE, front - off), tot = get(e, front);
  const ref = tot - inc, tra = back < 0 ? 0 : get(e, back);
  store<f64>(probes, inc);
  store<f64>(probes + 8, ref);
  store<f64>(probes + 16, tra);
  store<f64>(probes + 24, get(e, node(r, R_SF_PROBE)));
  feedSpectra(r, t, inc, ref, tra);
  if (t % node(r, R_DFT_STRIDE) != 0) return;
  const ph = word(r, R_PHASORS) + (<usize>(j << 1) << 3);
  const c = load<f64>(ph), s = load<f64>(ph + 8);
  dftTerm(at(e, node(r, R_DFT_LO)), word(r, R_DFT_RE), word(r, R_DFT_IM), node(r, R_DFT_LEN), c, s);
  setReal(r, R_INC_RE, real(r, R_INC_RE) + inc * c);
  setReal(r, R_INC_IM, real(r, R_INC_IM) - inc * s);
}

/** re += v·c, im −= v·s over len nodes (e^{−jωt} kernel). */
function dftTerm(v: usize, re: usize, im: usize, len: i32, c: f64, s: f64): void {
  const cv = f64x2.splat(c), sv = f64x2.splat(s);
  let i = 0;
  for (; i + 2 <= len; i += 2) {
    const x = v128.load(at(v, i));
    v128.store(at(re, i), f64x2.add(v128.load(at(re, i)), f64x2.mul(x, cv)));
    v128.store(at(im, i), f64x2.sub(v128.load(at(im, i)), f64x2.mul(x, sv)));
  }
  for (; i < len; i++) {
    const x = get(v, i);
    put(re, i, get(re, i) + x * c);
    put(im, i, get(im, i) - x * s);
  }
}

/** Stored energy of the main grid now (fields and pole states). */
export function energy(r: usize): f64 {
  return storedEnergy(word(r, R_MAIN), word(r, R_EPS_INF), word(r, R_MU_INF), real(r, R_DT));
}
