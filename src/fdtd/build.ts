// Allocation of the kernel states from a plan: per-node coefficients by subcell averaging,
// sheets, pole arrays, CPML at the open ends, and the auxiliary (incident) grid.

import { EPS0_F_per_m } from '../units.ts';
import { type PmlGrading, PML_ORDER, PML_SIGMA_FACTOR, pmlRegion } from './cpml.ts';
import { type DispersiveSpan, type KernelState, type PoleGroup, emptyKernelState } from './kernel.ts';
import { type StepModel, refractiveIndex, stepModelPermittivity } from './media.ts';
import { SHEET_ALIGN_TOL } from './grid-response.ts';
import type { GridPlan } from './types.ts';

/** α_max Δt/ε0 as a fraction of 2π f_min Δt (CFS term; small). */
const ALPHA_FRACTION = 0.05;

/** A material filling [x0, x1] (metres from the front face; ±Infinity for half-spaces). */
interface Placed { x0: number; x1: number; model: StepModel }

interface NodeMedium {
  epsInf: Float64Array; sigma: Float64Array;
  groups: PoleGroup[];
  /** Σ b of the Debye poles and Σ ζ of the second-order poles per node (their shares of the Eⁿ⁺¹ coefficient). */
  debyeSum: Float64Array; oscSum: Float64Array;
}

/** A material's poles over nodes [a, b) with the given fills (coefficients per kernel.ts). */
function poleGroup(model: StepModel, a: number, fill: Float64Array, dt: number): PoleGroup {
  const nd = model.debye.length, no = model.osc.length, n = fill.length;
  const g: PoleGroup = {
    lo: a, hi: a + n, fill,
    nd, da: new Float64Array(nd), db: new Float64Array(nd), dEps: new Float64Array(nd), dState: new Float64Array(n * nd),
    no, oa: new Float64Array(no), ox: new Float64Array(no), oz: new Float64Array(no), oc: new Float64Array(no), ow0sq: new Float64Array(no),
    oState: new Float64Array(2 * n * no),
  };
  model.debye.forEach((p, q) => {
    const denom = 2 * p.tau_s + dt;
    g.da[q] = (2 * p.tau_s - dt) / denom; g.db[q] = (p.deps * dt) / denom; g.dEps[q] = p.deps;
  });
  model.osc.forEach((p, q) => {
    // Trapezoidal second-order ADE: D = 1/Δt² + γ/(2Δt) + ω0²/4.
    const D = 1 / (dt * dt) + p.gamma / (2 * dt) + p.w0sq / 4;
    g.oa[q] = (2 / (dt * dt) - p.w0sq / 2) / D;
    g.ox[q] = -(1 / (dt * dt) - p.gamma / (2 * dt) + p.w0sq / 4) / D;
    g.oz[q] = p.c / (4 * D); g.oc[q] = p.c; g.ow0sq[q] = p.w0sq;
  });
  return g;
}

/** Fill per-node media of a grid of n nodes whose node i sits at x = (i − i0) dx. */
function placeMedia(n: number, i0: number, dx: number, dt: number, placed: Placed[]): NodeMedium {
  const epsInf = new Float64Array(n), sigma = new Float64Array(n), debyeSum = new Float64Array(n), oscSum = new Float64Array(n);
  const groups: PoleGroup[] = [];
  for (const p of placed) {
    // Nodes whose cell [x − dx/2, x + dx/2] overlaps (x0, x1).
    const lo = Math.max(0, Math.floor((p.x0 / dx + i0 - 0.5)) );
    const hi = Math.min(n, Math.ceil((p.x1 / dx + i0 + 0.5)) + 1);
    if (!(hi > lo)) continue;
    const w = new Float64Array(hi - lo);
    let first = -1, last = -1;
    for (let i = lo; i < hi; i++) {
      const c0 = (i - i0 - 0.5) * dx, c1 = (i - i0 + 0.5) * dx;
      const ov = Math.max(0, Math.min(c1, p.x1) - Math.max(c0, p.x0)) / dx;
      w[i - lo] = ov;
      if (ov > 0) { if (first < 0) first = i; last = i; }
    }
    if (first < 0) continue;
    const a = first, b = last + 1;
    for (let i = a; i < b; i++) {
      const wi = w[i - lo];
      epsInf[i] += wi * p.model.epsInf;
      sigma[i] += wi * p.model.sigma;
    }
    if (p.model.debye.length + p.model.osc.length === 0) continue;
    const g = poleGroup(p.model, a, w.slice(a - lo, b - lo), dt);
    for (let i = a; i < b; i++) {
      const f = g.fill[i - a];
      for (let q = 0; q < g.nd; q++) debyeSum[i] += f * g.db[q];
      for (let q = 0; q < g.no; q++) oscSum[i] += f * g.oz[q];
    }
    groups.push(g);
  }
  return { epsInf, sigma, groups, debyeSum, oscSum };
}

/** Coefficients of a state from its per-node media (walls at both ends stay zero). */
function fillCoefficients(s: KernelState, m: NodeMedium, courant: number, dt: number): Float64Array {
  const n = s.n;
  for (let i = 0; i < n - 1; i++) s.db[i] = courant;
  let dLo = n, dHi = 0;
  for (const g of m.groups) { dLo = Math.min(dLo, g.lo); dHi = Math.max(dHi, g.hi); }
  const cp = dHi > dLo ? new Float64Array(dHi - dLo) : null;
  for (let i = 1; i < n - 1; i++) {
    const sg = (m.sigma[i] * dt) / (2 * EPS0_F_per_m);
    const den = m.epsInf[i] + sg + m.debyeSum[i] + m.oscSum[i];
    s.ca[i] = (m.epsInf[i] - sg - m.debyeSum[i]) / den;
    s.cb[i] = courant / den;
    if (cp && i >= dLo && i < dHi) cp[i - dLo] = 1 / den;
  }
  if (cp) {
    const span: DispersiveSpan = {
      lo: dLo, hi: dHi, cp, eOld: new Float64Array(dHi - dLo), acc: new Float64Array(dHi - dLo),
      groups: m.groups,
    };
    s.disp = span;
  }
  return m.epsInf;
}

export interface BuiltGrids {
  main: KernelState;
  aux: KernelState;
  /** ε∞ per main node (energy weights). */
  epsInf: Float64Array;
}

function grading(plan: GridPlan, model: StepModel, band_Hz: [number, number]): PmlGrading {
  const fMid = (band_Hz[0] + band_Hz[1]) / 2;
  return {
    cells: plan.pmlCells, order: PML_ORDER, sigmaFactor: PML_SIGMA_FACTOR,
    alphaN: ALPHA_FRACTION * 2 * Math.PI * band_Hz[0] * plan.dt_s,
    n: refractiveIndex(stepModelPermittivity(model, fMid)), courant: plan.courant,
  };
}

export function buildGrids(plan: GridPlan, band_Hz: [number, number]): BuiltGrids {
  const { dx_m: dx, dt_s: dt, courant, nodes, effective } = plan;
  const P = plan.pmlCells;
  // Main grid.
  const main = emptyKernelState(nodes.total);
  const placed: Placed[] = [{ x0: -Infinity, x1: 0, model: effective.front }];
  for (const s of effective.segments) placed.push({ x0: s.x0_m, x1: s.x1_m, model: s.model });
  if (effective.back !== 'pec') placed.push({ x0: effective.thickness_m, x1: Infinity, model: effective.back });
  const media = placeMedia(nodes.total, nodes.front, dx, dt, placed);
  // Sheets: all of the conductance on the nearest node when the sheet is within SHEET_ALIGN_TOL of a cell
  // of it (the planner aims for that), else split between the two nearest nodes. Splitting even a sliver
  // off a low-resistance sheet would put a strong scatterer on the neighbouring node.
  for (const sh of effective.sheets) {
    const u = sh.x_m / dx + nodes.front;
    const j = Math.floor(u), f = u - j;
    const gPerLength = sh.conductance_S / dx;
    if (f <= SHEET_ALIGN_TOL) media.sigma[j] += gPerLength;
    else if (f >= 1 - SHEET_ALIGN_TOL) media.sigma[j + 1] += gPerLength;
    else { media.sigma[j] += (1 - f) * gPerLength; media.sigma[j + 1] += f * gPerLength; }
  }
  const epsInf = fillCoefficients(main, media, courant, dt);
  main.pml.push(pmlRegion(P, 0, grading(plan, effective.front, band_Hz)));
  if (effective.back !== 'pec') main.pml.push(pmlRegion(nodes.pmlBackStart, nodes.total - 1, grading(plan, effective.back, band_Hz)));
  // Auxiliary grid: the front medium everywhere, hard source at node 0, CPML at the far end.
  const aux = emptyKernelState(nodes.auxTotal);
  const auxMedia = placeMedia(nodes.auxTotal, 0, dx, dt, [{ x0: -Infinity, x1: Infinity, model: effective.front }]);
  fillCoefficients(aux, auxMedia, courant, dt);
  aux.pml.push(pmlRegion(nodes.auxTotal - 1 - P, nodes.auxTotal - 1, grading(plan, effective.front, band_Hz)));
  return { main, aux, epsInf };
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
export function uniformGrid(n: number, model: StepModel, o: UniformGridOptions): KernelState {
  const s = emptyKernelState(n);
  const media = placeMedia(n, 0, 1, o.dt_s, [{ x0: -Infinity, x1: Infinity, model }]);
  fillCoefficients(s, media, o.courant, o.dt_s);
  const fMid = (o.band_Hz[0] + o.band_Hz[1]) / 2;
  const g = (cells: number): PmlGrading => ({
    cells, order: PML_ORDER, sigmaFactor: PML_SIGMA_FACTOR,
    alphaN: ALPHA_FRACTION * 2 * Math.PI * o.band_Hz[0] * o.dt_s,
    n: refractiveIndex(stepModelPermittivity(model, fMid)), courant: o.courant,
  });
  if (o.pmlFront > 0) s.pml.push(pmlRegion(o.pmlFront, 0, g(o.pmlFront)));
  if (o.pmlBack > 0) s.pml.push(pmlRegion(n - 1 - o.pmlBack, n - 1, g(o.pmlBack)));
  return s;
}
