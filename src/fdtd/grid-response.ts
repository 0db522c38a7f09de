// The exact response of the grid itself at one frequency, before anything is allocated: the planner's
// prediction of the engine's error (discrete.ts for the recurrence and its waves).
//
// On the E nodes the grid solves E_{i+1} − 2E_i + E_{i−1} + q_i E_i = 0, q_i = 4 ε_d,i sin²(ωΔt/2)/S², with
// ε_d,i the node's subcell average (build.ts). Cut it at the nodes where the medium changes (faces, sheets):
// between two such nodes every node is pure and the solution is the medium's two waves; at a cut node shared
// half and half by its neighbours L and R the waves match as on a line of admittance n_d (discrete.ts), and
// whatever the node holds beyond that half-and-half mix — a face off the node, a layer thinner than a cell, a
// sheet — acts as a shunt B = j (2 sin(ωΔt/2)/S) (ε_d,i − (ε_d,L + ε_d,R)/2) (normalized to free space; a
// sheet of conductance G so becomes G cos(ωΔt/2)). The layered recursion below then gives the grid's R at the
// front node and T at the back node exactly, apart from the boundaries and the records' length.

import { discreteWave } from './discrete.ts';
import { type StepModel } from './media.ts';
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

/** A node where the medium changes: what fills its cell, and the sheets the builder puts on it. */
interface CutNode { parts: { model: StepModel; w: number }[]; sheetG: number }

/** The grid cut at its medium changes (depends on Δx only, not on the frequency). */
export interface GridGeometry {
  front: StepModel;
  back: StepModel | 'pec';
  /** Pieces between cut nodes: medium and length in cells. */
  pieces: { model: StepModel; cells: number }[];
  /** pieces.length + 1 cut nodes, front face first (the last is the wall behind a conductor). */
  cuts: CutNode[];
}

export function gridGeometry(eff: EffectiveStack, dx: number, stackCells: number): GridGeometry {
  const segs = eff.segments, D = stackCells * dx;
  const at = new Set<number>([0, stackCells]);
  for (const s of segs) for (const x of [s.x0_m, s.x1_m]) at.add(Math.min(stackCells, Math.max(0, Math.round(x / dx))));
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
  const mediumAt = (x: number): StepModel => {
    if (x < 0) return eff.front;
    for (const s of segs) if (x >= s.x0_m && x <= s.x1_m) return s.model;
    return eff.back === 'pec' ? segs[segs.length - 1]?.model ?? eff.front : eff.back;
  };
  const pieces = nodes.slice(1).map((b, i) => ({ model: mediumAt(((nodes[i] + b) / 2) * dx), cells: b - nodes[i] }));
  const cuts: CutNode[] = nodes.map((j) => {
    const c0 = (j - 0.5) * dx, c1 = (j + 0.5) * dx;
    const parts: CutNode['parts'] = [];
    const put = (model: StepModel, a: number, b: number) => { const w = Math.max(0, Math.min(c1, b) - Math.max(c0, a)) / dx; if (w > 0) parts.push({ model, w }); };
    put(eff.front, -Infinity, 0);
    for (const s of segs) put(s.model, s.x0_m, s.x1_m);
    if (eff.back !== 'pec') put(eff.back, D, Infinity);
    let sheetG = 0;
    for (const p of sheetParts) if (p.node === j) sheetG += p.g;
    return { parts, sheetG };
  });
  return { front: eff.front, back: eff.back, pieces, cuts };
}

/** The grid's R (at the front node) and T (at the back node) at f. */
export function gridResponse(geo: GridGeometry, f: number, g: GridSpacing): { R: Cx; T: Cx } {
  const waves = new Map<StepModel, ReturnType<typeof discreteWave>>();
  const wave = (m: StepModel) => { let w = waves.get(m); if (!w) { w = discreteWave(m, f, g.dx_m, g.dt_s, g.courant); waves.set(m, w); } return w; };
  const half = Math.PI * f * g.dt_s, shuntScale = (2 * Math.sin(half)) / g.courant, sheetScale = ETA0_ohm * Math.cos(half);
  const P = geo.pieces.length;
  const sideModel = (i: number): StepModel | 'pec' => (i < 0 ? geo.front : i >= P ? geo.back : geo.pieces[i].model);
  // Shunt at cut i: j (2 sin/S) (ε_node − (ε_L + ε_R)/2) + sheets.
  const shunt = (i: number): Cx => {
    const L = sideModel(i - 1), R = sideModel(i);
    if (L === 'pec' || R === 'pec') return { re: 0, im: 0 };
    let re = -(wave(L).eps.re + wave(R).eps.re) / 2, im = -(wave(L).eps.im + wave(R).eps.im) / 2;
    for (const p of geo.cuts[i].parts) { const e = wave(p.model).eps; re += p.w * e.re; im += p.w * e.im; }
    // j·(δε): (re, im) → (−im, re)
    return { re: -im * shuntScale + geo.cuts[i].sheetG * sheetScale, im: re * shuntScale };
  };
  const Y = (m: StepModel): Cx => wave(m).n;
  const prop = (i: number): Cx => { // e^{−jk L Δx}, |·| ≤ 1
    const k = wave(geo.pieces[i].model).k, L = geo.pieces[i].cells * g.dx_m;
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
  let YNext: Cx = geo.back === 'pec' ? ONE : Y(geo.back);
  for (let i = P - 1; i >= 0; i--) {
    const Yi = Y(geo.pieces[i].model);
    gBack[i] = geo.back === 'pec' && i === P - 1 ? { re: -1, im: 0 } : across(Yi, YNext, gNext, shunt(i + 1));
    const p = prop(i);
    gFront[i] = mul(gBack[i], mul(p, p));
    gNext = gFront[i]; YNext = Yi;
  }
  const R = across(Y(geo.front), YNext, gNext, shunt(0));
  if (geo.back === 'pec') return { R, T: { re: 0, im: 0 } };
  // Forward: the field at each cut (V) and the line current (I), incident amplitude 1.
  let V = add(ONE, R), I = mul(Y(geo.front), sub(ONE, R));
  for (let i = 0; i < P; i++) {
    const Yi = Y(geo.pieces[i].model), Iin = sub(I, mul(shunt(i), V));
    const gp = add(ONE, gFront[i]), gm = sub(ONE, gFront[i]);
    const A = gp.re * gp.re + gp.im * gp.im >= gm.re * gm.re + gm.im * gm.im ? div(V, gp) : div(Iin, mul(Yi, gm));
    const Ap = mul(A, prop(i));
    V = mul(Ap, add(ONE, gBack[i]));
    I = mul(mul(Ap, sub(ONE, gBack[i])), Yi);
  }
  return { R, T: V };
}
