// The linear-memory arena of one pulse run, laid out once: every array of both grids (fields, coefficients,
// CPML, poles), the source, the DFT and the batch tables, and the descriptors the WebAssembly step reads
// (slots.ts). Addresses are reserved first, then one memory of exactly that size is made and filled.
// Pole state is stored pair-interleaved (nodes 2p, 2p + 1 in the lanes of one vector, slots.ts).

import type { DispersiveSpan, KernelState, PmlRegion, PoleGroup } from '../kernel.ts';
import type { EngineInput } from '../engine.ts';
import { BATCH_STEPS } from '../engine.ts';
import * as S from './slots.ts';

/** The arena starts here; the module's own static data must end before it (checked on instantiation). */
export const ARENA_BASE = 4096;
const PAGE_BYTES = 65536;

/** Reserves addresses and records what to write there once the memory exists. */
class ArenaPlan {
  top = ARENA_BASE;
  private readonly copies: Array<[number, Float64Array]> = [];
  private readonly words: Array<[number, number]> = [];
  private readonly reals: Array<[number, number]> = [];

  private reserve(bytes: number, lead = 0): number {
    // 16-byte aligned, or 8 past it when `lead` = 8 (so element 1 of an E-node array is aligned).
    const at = ((this.top - lead + 15) & ~15) + lead;
    this.top = at + Math.max(8, bytes);
    return at;
  }

  /** An f64 array holding `src` (or `length` zeros). */
  array(src: Float64Array | number, lead = 0): number {
    const length = typeof src === 'number' ? src : src.length;
    const at = this.reserve(8 * length, lead);
    if (typeof src !== 'number') this.copies.push([at, src]);
    return at;
  }

  desc(words: number): number { return this.reserve(4 * words); }
  word(d: number, slot: number, v: number): void { this.words.push([d + 4 * slot, v]); }
  real(d: number, slot: number, v: number): void { this.reals.push([d + 4 * slot, v]); }

  pages(): number { return Math.ceil(this.top / PAGE_BYTES) + 1; }

  write(memory: WebAssembly.Memory): void {
    const f64 = new Float64Array(memory.buffer), i32 = new Int32Array(memory.buffer);
    for (const [at, src] of this.copies) f64.set(src, at / 8);
    for (const [at, v] of this.words) i32[at / 4] = v;
    for (const [at, v] of this.reals) f64[at / 8] = v;
  }
}

/** Node-major pole state (k·per + q, `width` values per pole) → pair-interleaved (16 (p·per + q) bytes per lane pair). */
function interleave(state: Float64Array, nodes: number, per: number, width: number): Float64Array {
  const pairs = (nodes + 1) >> 1, out = new Float64Array(2 * width * per * pairs);
  for (let k = 0; k < nodes; k++) {
    const p = k >> 1, lane = k & 1;
    for (let q = 0; q < per; q++) {
      for (let w = 0; w < width; w++) out[2 * (width * (p * per + q) + w) + lane] = state[width * (k * per + q) + w];
    }
  }
  return out;
}

/**
 * Pairs [lo, hi) of group g (pair p: its nodes 2p, 2p + 1) whose nodes are `alone` (in this group only, in no
 * CPML, not injected, not a wall): the longest such run.
 */
function fusedPairs(g: PoleGroup, alone: (node: number) => boolean): [number, number] {
  let best: [number, number] = [0, 0], start = -1;
  const pairs = (g.hi - g.lo) >> 1;
  for (let p = 0; p <= pairs; p++) {
    const ok = p < pairs && alone(g.lo + 2 * p) && alone(g.lo + 2 * p + 1);
    if (ok && start < 0) start = p;
    if (!ok && start >= 0) { if (p - start > best[1] - best[0]) best = [start, p]; start = -1; }
  }
  return best;
}

function groupDesc(a: ArenaPlan, d: number, g: PoleGroup, alone: (node: number) => boolean): void {
  const len = g.hi - g.lo;
  // Only a plain group's pairs are fused (the fused pass takes ζ0·f(2Fⁿ + Fⁿ⁻¹)).
  const [fa, fb] = g.plain ? fusedPairs(g, alone) : [0, 0];
  a.word(d, S.Q_FUSED_LO, fa);
  a.word(d, S.Q_FUSED_HI, fb);
  const fill = new Float64Array(len + (len & 1));
  fill.set(g.fill);
  a.word(d, S.Q_LO, g.lo);
  a.word(d, S.Q_LEN, len);
  a.word(d, S.Q_FILL, a.array(fill));
  a.word(d, S.Q_ND, g.nd);
  const dc = new Float64Array(3 * g.nd);
  for (let q = 0; q < g.nd; q++) { dc[3 * q] = g.da[q]; dc[3 * q + 1] = 1 - g.da[q]; dc[3 * q + 2] = g.db[q]; }
  a.word(d, S.Q_D_COEF, a.array(dc));
  a.word(d, S.Q_D_STATE, a.array(interleave(g.dState, len, g.nd, 1)));
  a.word(d, S.Q_D_EPS, a.array(g.dEps));
  a.word(d, S.Q_NO, g.no);
  const oc = new Float64Array(3 * g.no);
  for (let q = 0; q < g.no; q++) { oc[3 * q] = g.oa[q]; oc[3 * q + 1] = g.ox[q]; oc[3 * q + 2] = g.oz[q]; }
  a.word(d, S.Q_O_COEF, a.array(oc));
  a.word(d, S.Q_O_STATE, a.array(interleave(g.oState, len, g.no, 2)));
  a.word(d, S.Q_O_C, a.array(g.oc));
  a.word(d, S.Q_O_W0SQ, a.array(g.ow0sq));
  const full = new Float64Array(2 * g.no);
  for (let q = 0; q < g.no; q++) { full[2 * q] = g.o1[q]; full[2 * q + 1] = g.o2[q]; }
  a.word(d, S.Q_O_FULL, g.plain ? 0 : a.array(full));
}

/** Whether an E node of grid s has only its bulk update and one group's poles to do (see fusedPairs). */
function aloneTest(s: KernelState, span: DispersiveSpan, inj: number): (node: number) => boolean {
  const groups = new Int32Array(s.n), special = new Uint8Array(s.n);
  for (const g of span.groups) for (let i = g.lo; i < g.hi; i++) groups[i]++;
  for (const p of s.pml) for (let i = p.eLo; i < p.eHi; i++) special[i] = 1;
  special[0] = 1;
  special[s.n - 1] = 1;
  if (inj >= 0) special[inj] = 1;
  return (i) => groups[i] === 1 && special[i] === 0;
}

/** A span's descriptor; `alone` says which nodes may be fused (none on the H side). */
function dispDesc(a: ArenaPlan, span: DispersiveSpan, alone: (node: number) => boolean): number {
  const d = a.desc(S.DISP_WORDS);
  a.word(d, S.D_LO, span.lo);
  a.word(d, S.D_HI, span.hi);
  a.word(d, S.D_CP, a.array(span.cp));
  a.word(d, S.D_E_OLD, a.array(span.eOld));
  a.word(d, S.D_ACC, a.array(span.acc));
  a.word(d, S.D_GROUP_COUNT, span.groups.length);
  const groups = a.desc(S.GROUP_WORDS * span.groups.length);
  a.word(d, S.D_GROUPS, groups);
  span.groups.forEach((g, i) => groupDesc(a, groups + 4 * S.GROUP_WORDS * i, g, alone));
  return d;
}

function pmlDesc(a: ArenaPlan, d: number, p: PmlRegion): void {
  a.word(d, S.P_E_LO, p.eLo); a.word(d, S.P_E_HI, p.eHi);
  a.word(d, S.P_BE, a.array(p.be)); a.word(d, S.P_CE, a.array(p.ce)); a.word(d, S.P_PSI_E, a.array(p.psiE));
  a.word(d, S.P_H_LO, p.hLo); a.word(d, S.P_H_HI, p.hHi);
  a.word(d, S.P_BH, a.array(p.bh)); a.word(d, S.P_CH, a.array(p.ch)); a.word(d, S.P_PSI_H, a.array(p.psiH));
}

const uniform = (x: Float64Array): boolean => x.every((v) => v === x[0]);

/** A grid's descriptor (E injection at node inj, −1 for none); returns it and the addresses of its E and H. */
function gridDesc(a: ArenaPlan, s: KernelState, inj: number): { desc: number; e: number; h: number } {
  const d = a.desc(S.GRID_WORDS);
  const e = a.array(s.e, 8), h = a.array(s.h);
  a.word(d, S.G_N, s.n);
  a.word(d, S.G_E, e);
  a.word(d, S.G_H, h);
  a.word(d, S.G_CA, a.array(s.ca, 8));
  a.word(d, S.G_CB, a.array(s.cb, 8));
  // db is one number without series terms (S/μ∞ everywhere); with them, and da, it is per node.
  const flat = s.mdisp === null && s.db.length > 0 && uniform(s.db);
  a.word(d, S.G_DB, flat ? 0 : a.array(s.db));
  a.real(d, S.G_S, flat ? s.db[0] : 0);
  a.word(d, S.G_DA, s.mdisp === null ? 0 : a.array(s.da));
  a.word(d, S.G_HDISP, s.mdisp === null ? 0 : dispDesc(a, s.mdisp, () => false));
  a.word(d, S.G_PML_COUNT, s.pml.length);
  const pml = a.desc(S.PML_WORDS * Math.max(1, s.pml.length));
  a.word(d, S.G_PML, pml);
  s.pml.forEach((p, i) => pmlDesc(a, pml + 4 * S.PML_WORDS * i, p));
  a.word(d, S.G_DISP, s.disp === null ? 0 : dispDesc(a, s.disp, aloneTest(s, s.disp, inj)));
  return { desc: d, e, h };
}

/** Addresses the engine reads back. */
export interface ArenaLayout {
  run: number;
  mainE: number; mainH: number; auxE: number;
  dftRe: number; dftIm: number; phasors: number; probes: number;
  spectra: { acc: number; phasor: number; rotation: number; seeds: number };
  pages: number;
  write(memory: WebAssembly.Memory): void;
}

/** Lay out a run: both grids, the run descriptor and its tables. */
export function layoutArena(input: EngineInput): ArenaLayout {
  const { grids, setup } = input;
  const a = new ArenaPlan();
  const r = a.desc(S.RUN_WORDS);
  const main = gridDesc(a, grids.main, setup.tfsf), aux = gridDesc(a, grids.aux, -1);
  const dftRe = a.array(setup.dftLength), dftIm = a.array(setup.dftLength);
  const phasors = a.array(2 * BATCH_STEPS), probes = a.array(4 * BATCH_STEPS);
  const w = (slot: number, v: number) => a.word(r, slot, v);
  w(S.R_MAIN, main.desc); w(S.R_AUX, aux.desc);
  w(S.R_TFSF, setup.tfsf); w(S.R_AUX_OFFSET, setup.auxOffset);
  w(S.R_SRC, a.array(setup.source)); w(S.R_SRC_LEN, setup.source.length);
  w(S.R_FRONT, setup.front); w(S.R_BACK, setup.back); w(S.R_SF_PROBE, setup.sfProbe);
  w(S.R_DFT_LO, setup.dftLo); w(S.R_DFT_LEN, setup.dftLength); w(S.R_DFT_RE, dftRe); w(S.R_DFT_IM, dftIm);
  w(S.R_DFT_STRIDE, setup.stride); w(S.R_PHASORS, phasors); w(S.R_PROBES, probes);
  w(S.R_EPS_INF, a.array(grids.weights.epsInf));
  w(S.R_MU_INF, a.array(grids.weights.muInf));
  a.real(r, S.R_INC_RE, 0); a.real(r, S.R_INC_IM, 0); a.real(r, S.R_DT, setup.dt_s);
  const nf = setup.spectraFrequencies;
  const spectra = { acc: a.array(6 * nf), phasor: a.array(2 * nf), rotation: a.array(2 * nf), seeds: a.array(2 * nf) };
  w(S.R_SPEC_N, nf); w(S.R_SPEC_ACC, spectra.acc); w(S.R_SPEC_PHASOR, spectra.phasor);
  w(S.R_SPEC_ROTATION, spectra.rotation); w(S.R_SPEC_SEEDS, spectra.seeds);
  return {
    run: r, mainE: main.e, mainH: main.h, auxE: aux.e, dftRe, dftIm, phasors, probes, spectra,
    pages: a.pages(), write: (m) => a.write(m),
  };
}
