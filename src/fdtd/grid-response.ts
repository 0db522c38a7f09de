// The exact response of the grid itself at one frequency, before anything is allocated: the planner's
// prediction of the engine's error (discrete.ts for the recurrence and its waves).
//
// In the frequency domain the grid is a ladder (discrete.ts): a series μ_d per H node, a shunt ε_d per E node,
// each the subcell average of what fills its cell (build.ts). Cut it at the E nodes where the medium changes
// (faces, sheets, and both ends of an H cell that holds a face): between two such nodes every node is pure and
// the solution is the medium's two waves; at a cut node shared half and half by its neighbours L and R the
// waves match as on a line of admittance n_d, and whatever the node holds beyond that half-and-half mix — a
// face off the node, a layer thinner than a cell, a sheet — acts as a shunt B = j (2 sin(ωΔt/2)/S)
// (ε_d,i − (ε_d,L + ε_d,R)/2) (normalized to free space; a sheet of conductance G so becomes G cos(ωΔt/2)).
// An H cell holding a face is a one-cell piece of its own with the mixed μ_d. The layered recursion below
// then gives the grid's R at the front node and T at the back node exactly, apart from the boundaries and the
// records' length.

import { type DiscreteWave, discreteWave, discreteWaveOf } from './discrete.ts';
import type { LineMedium } from './media.ts';
import type { EffectiveStack } from './types.ts';
import { ETA0_ohm } from '../units.ts';

export interface GridSpacing { dx_m: number; dt_s: number; courant: number }

/** A sheet within this fraction of a cell of a node is stepped wholly on that node, else shared by the two
 *  nodes around it (build.ts); the planner looks for grids that put sheets this close to nodes. */
export const SHEET_ALIGN_TOL = 0.02;

interface Cx { re: number; im: number }
const mul = (a: Cx, b: Cx): Cx => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const div = (a: Cx, b: Cx): Cx => { const d = b.re * b.re + b.im * b.im; return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d }; };
const add = (a: Cx, b: Cx): Cx => ({ re: a.re + b.re, im: a.im + b.im });
const sub = (a: Cx, b: Cx): Cx => ({ re: a.re - b.re, im: a.im - b.im });
const ONE: Cx = { re: 1, im: 0 };

/** What fills a cell: media and the fraction of the cell each takes. */
type Mix = { model: LineMedium; w: number }[];

/** A node where the medium changes: what fills its cell, and the sheets the builder puts on it. */
interface CutNode { node: number; parts: Mix; sheetG: number }

/**
 * A run of cells between two cut nodes: uniform in `model`, or (with `series`) one cell whose H node holds a face,
 * its series side the mixture `series` and its shunt side `model`'s (any shunt would do: the cut nodes' own
 * shunts make up the difference).
 */
interface Piece { cells: number; model: LineMedium; series?: Mix }

/** The grid cut at its medium changes (depends on Δx only, not on the frequency). */
export interface GridGeometry {
  front: LineMedium;
  back: LineMedium | 'pec';
  /** Pieces between cut nodes. */
  pieces: Piece[];
  /** pieces.length + 1 cut nodes, front face first (the last is the wall behind a conductor). */
  cuts: CutNode[];
  /** The cut at the back face's node, where T is read. */
  backCut: number;
}

/** Faces this close to a node (in cells) leave the H nodes beside it pure. */
const ON_NODE = 1e-9;

export function gridGeometry(eff: EffectiveStack, dx: number, stackCells: number): GridGeometry {
  const segs = eff.segments, D = eff.thickness_m;
  const at = new Set<number>([0, stackCells]);
  const mixedH = new Set<number>();
  for (const s of segs) {
    for (const x of [s.x0_m, s.x1_m]) {
      const u = x / dx;
      at.add(Math.min(stackCells, Math.max(0, Math.round(u))));
      // A face between two E nodes lies inside the H cell between them: that H node is a mixture.
      if (Math.abs(u - Math.round(u)) > ON_NODE) { const h = Math.floor(u); mixedH.add(h); at.add(h); at.add(h + 1); }
    }
  }
  const sheetParts: { node: number; g: number }[] = [];
  for (const sh of eff.sheets) {
    // The builder's rule (build.ts): all on the nearest node within SHEET_ALIGN_TOL of a cell, else shared.
    const u = sh.x_m / dx, j = Math.floor(u), f = u - j;
    if (f <= SHEET_ALIGN_TOL) sheetParts.push({ node: j, g: sh.conductance_S });
    else if (f >= 1 - SHEET_ALIGN_TOL) sheetParts.push({ node: j + 1, g: sh.conductance_S });
    else sheetParts.push({ node: j, g: (1 - f) * sh.conductance_S }, { node: j + 1, g: f * sh.conductance_S });
  }
  for (const p of sheetParts) at.add(p.node);
  const nodes = [...at].sort((a, b) => a - b);
  const mediumAt = (x: number): LineMedium => {
    if (x < 0) return eff.front;
    for (const s of segs) if (x >= s.x0_m && x <= s.x1_m) return s.model;
    return eff.back === 'pec' ? segs[segs.length - 1]?.model ?? eff.front : eff.back;
  };
  // What fills [c0, c1] (as build.ts places it).
  const mix = (c0: number, c1: number): Mix => {
    const parts: Mix = [];
    const put = (model: LineMedium, a: number, b: number) => { const w = Math.max(0, Math.min(c1, b) - Math.max(c0, a)) / dx; if (w > 0) parts.push({ model, w }); };
    put(eff.front, -Infinity, 0);
    for (const s of segs) put(s.model, s.x0_m, s.x1_m);
    if (eff.back !== 'pec') put(eff.back, D, Infinity);
    return parts;
  };
  const pieces: Piece[] = nodes.slice(1).map((b, i) => {
    const a = nodes[i], model = mediumAt(((a + b) / 2) * dx);
    return b - a === 1 && mixedH.has(a) ? { cells: 1, model, series: mix(a * dx, b * dx) } : { cells: b - a, model };
  });
  const cuts: CutNode[] = nodes.map((j) => {
    let sheetG = 0;
    for (const p of sheetParts) if (p.node === j) sheetG += p.g;
    return { node: j, parts: mix((j - 0.5) * dx, (j + 0.5) * dx), sheetG };
  });
  return { front: eff.front, back: eff.back, pieces, cuts, backCut: nodes.indexOf(stackCells) };
}

/** The grid's R (at the front node) and T (at the back node) at f. */
export function gridResponse(geo: GridGeometry, f: number, g: GridSpacing): { R: Cx; T: Cx } {
  const waves = new Map<LineMedium, DiscreteWave>();
  const wave = (m: LineMedium) => { let w = waves.get(m); if (!w) { w = discreteWave(m, f, g.dx_m, g.dt_s, g.courant); waves.set(m, w); } return w; };
  const P = geo.pieces.length;
  const pieceWaves = geo.pieces.map((p) => {
    if (!p.series) return wave(p.model);
    // One cell whose H node mixes media: the cell's own series value with the shunt of `model`.
    let mu: Cx = { re: 0, im: 0 };
    for (const q of p.series) { const m = wave(q.model).mu; mu = { re: mu.re + q.w * m.re, im: mu.im + q.w * m.im }; }
    return discreteWaveOf(wave(p.model).eps, mu, f, g.dx_m, g.dt_s, g.courant);
  });
  const half = Math.PI * f * g.dt_s, shuntScale = (2 * Math.sin(half)) / g.courant, sheetScale = ETA0_ohm * Math.cos(half);
  const sideWave = (i: number): DiscreteWave | 'pec' => (i < 0 ? wave(geo.front) : i >= P ? (geo.back === 'pec' ? 'pec' : wave(geo.back)) : pieceWaves[i]);
  // Shunt at cut i: j (2 sin/S) (ε_node − (ε_L + ε_R)/2) + sheets.
  const shunt = (i: number): Cx => {
    const L = sideWave(i - 1), R = sideWave(i);
    if (L === 'pec' || R === 'pec') return { re: 0, im: 0 };
    let re = -(L.eps.re + R.eps.re) / 2, im = -(L.eps.im + R.eps.im) / 2;
    for (const p of geo.cuts[i].parts) { const e = wave(p.model).eps; re += p.w * e.re; im += p.w * e.im; }
    // j·(δε): (re, im) → (−im, re)
    return { re: -im * shuntScale + geo.cuts[i].sheetG * sheetScale, im: re * shuntScale };
  };
  const prop = (i: number): Cx => { // e^{−jk L Δx}, |·| ≤ 1
    const k = pieceWaves[i].k, L = geo.pieces[i].cells * g.dx_m;
    const mag = Math.exp(k.im * L);
    return { re: mag * Math.cos(k.re * L), im: -mag * Math.sin(k.re * L) };
  };
  // Backward: Γ at each piece's back and front face (inside it), as the exact solver's recursion (tmm/recursion.ts).
  const across = (Ya: Cx, Yn: Cx, gn: Cx, B: Cx): Cx => {
    const onePlus = add(ONE, gn), oneMinus = sub(ONE, gn);
    const a = mul(sub(Ya, B), onePlus), b = mul(Yn, oneMinus), c = mul(add(Ya, B), onePlus);
    return div(sub(a, b), add(c, b));
  };
  const gBack: Cx[] = new Array(P), gFront: Cx[] = new Array(P);
  let gNext: Cx = geo.back === 'pec' ? { re: -1, im: 0 } : { re: 0, im: 0 };
  let YNext: Cx = geo.back === 'pec' ? ONE : wave(geo.back).n;
  for (let i = P - 1; i >= 0; i--) {
    const Yi = pieceWaves[i].n;
    gBack[i] = geo.back === 'pec' && i === P - 1 ? { re: -1, im: 0 } : across(Yi, YNext, gNext, shunt(i + 1));
    const p = prop(i);
    gFront[i] = mul(gBack[i], mul(p, p));
    gNext = gFront[i]; YNext = Yi;
  }
  const R = across(wave(geo.front).n, YNext, gNext, shunt(0));
  if (geo.back === 'pec') return { R, T: { re: 0, im: 0 } };
  // Forward: the field at each cut (V) and the line current (I), incident amplitude 1; T is V at the back face's cut.
  let V = add(ONE, R), I = mul(wave(geo.front).n, sub(ONE, R));
  let T = geo.backCut === 0 ? V : { re: 0, im: 0 };
  for (let i = 0; i < P; i++) {
    const Yi = pieceWaves[i].n, Iin = sub(I, mul(shunt(i), V));
    const gp = add(ONE, gFront[i]), gm = sub(ONE, gFront[i]);
    const A = gp.re * gp.re + gp.im * gp.im >= gm.re * gm.re + gm.im * gm.im ? div(V, gp) : div(Iin, mul(Yi, gm));
    const Ap = mul(A, prop(i));
    V = mul(Ap, add(ONE, gBack[i]));
    I = mul(mul(Ap, sub(ONE, gBack[i])), Yi);
    if (i + 1 === geo.backCut) T = V;
  }
  return { R, T };
}
