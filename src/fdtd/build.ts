// Allocation of the kernel states from a plan: per-node coefficients by subcell averaging (shunt models on
// the E nodes, series models on the H nodes), sheets, pole arrays, CPML at the open ends, and the auxiliary
// (incident) grid.

import { EPS0_F_per_m } from '../units.ts';
import { type PmlGrading, PML_ORDER, PML_SIGMA_FACTOR, pmlRegion } from './cpml.ts';
import { type DispersiveSpan, type KernelState, type PoleGroup, emptyKernelState } from './kernel.ts';
import { type LineMedium, type StepModel, hasPoles, lineIndex } from './media.ts';
import { SHEET_ALIGN_TOL } from './grid-response.ts';
import type { GridPlan } from './types.ts';

/** α_max Δt/ε0 as a fraction of 2π f_min Δt (CFS term; small). */
const ALPHA_FRACTION = 0.05;

/** A line medium filling [x0, x1] (metres from the front face; ±Infinity for half-spaces). */
interface Placed { x0: number; x1: number; model: LineMedium }

/** One field's per-node media: the constant parts and the pole groups (shunt models on E, series on H). */
interface NodeMedium {
  inf: Float64Array; sigma: Float64Array;
  groups: PoleGroup[];
  /** Σ b of the Debye poles and Σ ζ0 of the second-order poles per node (their shares of the Fⁿ⁺¹ coefficient). */
  debyeSum: Float64Array; oscSum: Float64Array;
}

/** A material's poles over nodes [a, a + fill.length) with the given fills (coefficients per kernel.ts). */
export function poleGroup(model: StepModel, a: number, fill: Float64Array, dt: number): PoleGroup {
  const nd = model.debye.length, no = model.osc.length, n = fill.length;
  const arr = (k: number) => new Float64Array(k);
  const g: PoleGroup = {
    lo: a, hi: a + n, fill,
    nd, da: arr(nd), db: arr(nd), dEps: arr(nd), dState: arr(n * nd),
    no, oa: arr(no), ox: arr(no), oz: arr(no), o1: arr(no), o2: arr(no), oc: arr(no), ow0sq: arr(no), oState: arr(2 * n * no),
    plain: true,
  };
  model.debye.forEach((p, q) => {
    const denom = 2 * p.tau_s + dt;
    g.da[q] = (2 * p.tau_s - dt) / denom; g.db[q] = (p.deps * dt) / denom; g.dEps[q] = Math.abs(p.deps);
  });
  model.osc.forEach((p, q) => {
    // Trapezoidal second-order ADE: D = 1/Δt² + γ/(2Δt) + ω0²/4; (c + d s) → c(F⁺ + 2F + F⁻)/4 + d(F⁺ − F⁻)/(2Δt).
    const D = 1 / (dt * dt) + p.gamma / (2 * dt) + p.w0sq / 4, d = p.d ?? 0;
    g.oa[q] = (2 / (dt * dt) - p.w0sq / 2) / D;
    g.ox[q] = -(1 / (dt * dt) - p.gamma / (2 * dt) + p.w0sq / 4) / D;
    g.oz[q] = (p.c / 4 + d / (2 * dt)) / D;
    g.o1[q] = p.c / (2 * D);
    g.o2[q] = (p.c / 4 - d / (2 * dt)) / D;
    // The energy's scale: c for a Lorentz or Drude term; |c| + ω0|d| for a partial fraction's term.
    g.oc[q] = d === 0 && p.c > 0 ? p.c : Math.abs(p.c) + Math.sqrt(p.w0sq) * Math.abs(d);
    g.ow0sq[q] = p.w0sq;
  });
  // Without an s-numerator ζ1 = 2ζ0 and ζ2 = ζ0 to the bit (halving and doubling round alike).
  g.plain = g.o1.every((v, q) => v === 2 * g.oz[q]) && g.o2.every((v, q) => v === g.oz[q]);
  return g;
}

/**
 * Per-node media of one field on a grid whose node i's cell is [(i − i0 + c0) dx, (i − i0 + c0 + 1) dx]
 * (E nodes: c0 = −½; H nodes: c0 = 0), each model taken from its line medium by `side`.
 */
function placeMedia(n: number, i0: number, c0: number, dx: number, dt: number, placed: Placed[], side: keyof LineMedium): NodeMedium {
  const inf = new Float64Array(n), sigma = new Float64Array(n), debyeSum = new Float64Array(n), oscSum = new Float64Array(n);
  const groups: PoleGroup[] = [];
  for (const p of placed) {
    const model = p.model[side];
    // Nodes whose cell overlaps (x0, x1).
    const lo = Math.max(0, Math.floor(p.x0 / dx + i0 - c0 - 1));
    const hi = Math.min(n, Math.ceil(p.x1 / dx + i0 - c0) + 1);
    if (!(hi > lo)) continue;
    const w = new Float64Array(hi - lo);
    let first = -1, last = -1;
    for (let i = lo; i < hi; i++) {
      const a = (i - i0 + c0) * dx, b = a + dx;
      const ov = Math.max(0, Math.min(b, p.x1) - Math.max(a, p.x0)) / dx;
      w[i - lo] = ov;
      if (ov > 0) { if (first < 0) first = i; last = i; }
    }
    if (first < 0) continue;
    const a = first, b = last + 1;
    for (let i = a; i < b; i++) {
      const wi = w[i - lo];
      inf[i] += wi * model.epsInf;
      sigma[i] += wi * model.sigma;
    }
    if (!hasPoles(model)) continue;
    const g = poleGroup(model, a, w.slice(a - lo, b - lo), dt);
    for (let i = a; i < b; i++) {
      const f = g.fill[i - a];
      for (let q = 0; q < g.nd; q++) debyeSum[i] += f * g.db[q];
      for (let q = 0; q < g.no; q++) oscSum[i] += f * g.oz[q];
    }
    groups.push(g);
  }
  return { inf, sigma, groups, debyeSum, oscSum };
}

/**
 * One field's coefficients over nodes [from, to): `keep` (ca or da) and `curl` (cb or db), and its pole span.
 * The trapezoidal update of kernel.ts: den = ∞ + σΔt/(2ε0) + Σb + Σζ0.
 */
function fillSide(keep: Float64Array, curl: Float64Array, m: NodeMedium, from: number, to: number, courant: number, dt: number): DispersiveSpan | null {
  let dLo = to, dHi = from;
  for (const g of m.groups) { dLo = Math.min(dLo, g.lo); dHi = Math.max(dHi, g.hi); }
  const cp = dHi > dLo ? new Float64Array(dHi - dLo) : null;
  for (let i = from; i < to; i++) {
    const sg = (m.sigma[i] * dt) / (2 * EPS0_F_per_m);
    const den = m.inf[i] + sg + m.debyeSum[i] + m.oscSum[i];
    keep[i] = (m.inf[i] - sg - m.debyeSum[i]) / den;
    curl[i] = courant / den;
    if (cp && i >= dLo && i < dHi) cp[i - dLo] = 1 / den;
  }
  if (!cp) return null;
  return { lo: dLo, hi: dHi, cp, eOld: new Float64Array(dHi - dLo), acc: new Float64Array(dHi - dLo), groups: m.groups };
}

/** Conductance per length added to E nodes (sheets), before the coefficients are made. */
type SheetLoad = (sigma: Float64Array) => void;

/** Both fields of a state from the placed media (E walls at both ends stay zero). Returns the energy weights. */
function fillState(s: KernelState, placed: Placed[], i0: number, dx: number, dt: number, courant: number, sheets?: SheetLoad): EnergyWeights {
  const eMedia = placeMedia(s.n, i0, -0.5, dx, dt, placed, 'shunt');
  const hMedia = placeMedia(s.n - 1, i0, 0, dx, dt, placed, 'series');
  sheets?.(eMedia.sigma);
  s.disp = fillSide(s.ca, s.cb, eMedia, 1, s.n - 1, courant, dt);
  s.mdisp = fillSide(s.da, s.db, hMedia, 0, s.n - 1, courant, dt);
  // updateH skips da when mdisp is null: a series σ without poles still needs the full update (an empty span).
  if (s.mdisp === null && s.da.some((v) => v !== 1)) s.mdisp = { lo: 0, hi: 0, cp: new Float64Array(0), eOld: new Float64Array(0), acc: new Float64Array(0), groups: [] };
  return { epsInf: eMedia.inf, muInf: hMedia.inf };
}

/** ε∞ per E node and μ∞ per H node of the main grid (the field energy's weights). */
export interface EnergyWeights { epsInf: Float64Array; muInf: Float64Array }

export interface BuiltGrids {
  main: KernelState;
  aux: KernelState;
  weights: EnergyWeights;
}

function grading(cells: number, courant: number, dt: number, model: LineMedium, band_Hz: [number, number]): PmlGrading {
  const fMid = (band_Hz[0] + band_Hz[1]) / 2;
  return {
    cells, order: PML_ORDER, sigmaFactor: PML_SIGMA_FACTOR,
    alphaN: ALPHA_FRACTION * 2 * Math.PI * band_Hz[0] * dt,
    n: lineIndex(model, fMid).re, courant,
  };
}

export function buildGrids(plan: GridPlan, band_Hz: [number, number]): BuiltGrids {
  const { dx_m: dx, dt_s: dt, courant, nodes, effective } = plan;
  const P = plan.pmlCells;
  const pml = (model: LineMedium) => grading(P, courant, dt, model, band_Hz);
  // Main grid.
  const main = emptyKernelState(nodes.total);
  const placed: Placed[] = [{ x0: -Infinity, x1: 0, model: effective.front }];
  for (const s of effective.segments) placed.push({ x0: s.x0_m, x1: s.x1_m, model: s.model });
  if (effective.back !== 'pec') placed.push({ x0: effective.thickness_m, x1: Infinity, model: effective.back });
  // Sheets: all of the conductance on the nearest node when the sheet is within SHEET_ALIGN_TOL of a cell
  // of it (the planner aims for that), else split between the two nearest nodes. Splitting even a sliver
  // off a low-resistance sheet would put a strong scatterer on the neighbouring node.
  const sheets: SheetLoad = (sigma) => {
    for (const sh of effective.sheets) {
      const u = sh.x_m / dx + nodes.front;
      const j = Math.floor(u), f = u - j;
      const gPerLength = sh.conductance_S / dx;
      if (f <= SHEET_ALIGN_TOL) sigma[j] += gPerLength;
      else if (f >= 1 - SHEET_ALIGN_TOL) sigma[j + 1] += gPerLength;
      else { sigma[j] += (1 - f) * gPerLength; sigma[j + 1] += f * gPerLength; }
    }
  };
  const weights = fillState(main, placed, nodes.front, dx, dt, courant, sheets);
  main.pml.push(pmlRegion(P, 0, pml(effective.front)));
  if (effective.back !== 'pec') main.pml.push(pmlRegion(nodes.pmlBackStart, nodes.total - 1, pml(effective.back)));
  // Auxiliary grid: the front medium everywhere (both sides, so TF/SF stays exact), hard source at node 0,
  // CPML at the far end.
  const aux = emptyKernelState(nodes.auxTotal);
  fillState(aux, [{ x0: -Infinity, x1: Infinity, model: effective.front }], 0, dx, dt, courant);
  aux.pml.push(pmlRegion(nodes.auxTotal - 1 - P, nodes.auxTotal - 1, pml(effective.front)));
  return { main, aux, weights };
}

export interface UniformGridOptions {
  courant: number;
  dt_s: number;
  /** Band the CPML is graded for. */
  band_Hz: [number, number];
  /** CPML cells at the near end (node 0 side) and at the far end; 0 leaves a bare conductor wall. */
  pmlFront: number;
  pmlBack: number;
}

/** A grid of n E nodes filled with one medium, walls at both ends, optional CPML at either end (bench, boundary tests). */
export function uniformGrid(n: number, model: LineMedium, o: UniformGridOptions): KernelState {
  const s = emptyKernelState(n);
  fillState(s, [{ x0: -Infinity, x1: Infinity, model }], 0, 1, o.dt_s, o.courant);
  if (o.pmlFront > 0) s.pml.push(pmlRegion(o.pmlFront, 0, grading(o.pmlFront, o.courant, o.dt_s, model, o.band_Hz)));
  if (o.pmlBack > 0) s.pml.push(pmlRegion(n - 1 - o.pmlBack, n - 1, grading(o.pmlBack, o.courant, o.dt_s, model, o.band_Hz)));
  return s;
}
