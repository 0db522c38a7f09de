// The exact layered solution of the stack *as the engine steps it*: power laws replaced by their
// fitted causal models, conductor layers by a wall or a sheet. Comparing the pulse run with this
// isolates the engine's own error (grid, boundaries, truncation) from the fit's; comparing with the
// exact solution of the original stack gives the end-to-end figure.
//
// The same layered solver, given the grid's own waves instead of the media's (discrete.ts), is an exact
// model of the grid's response when the faces and sheets sit on nodes: `gridResponse` is what the planner
// uses to predict the engine's error before anything is allocated.

import type { Complex } from '../complex.ts';
import { type Spectrum, emptySpectrum } from '../results.ts';
import { type Region, type StackAtFrequency, regionOf } from '../tmm/media.ts';
import { solveAt } from '../tmm/recursion.ts';
import { ETA0_ohm } from '../units.ts';
import { discreteWave } from './discrete.ts';
import { type StepModel, stepModelPermittivity } from './media.ts';
import type { EffectiveStack } from './types.ts';

const NORMAL = { re: 0, im: 0 };
/** A stepped medium as a region of the exact solver (normal incidence: oblique TE is already folded into ε). */
const region = (m: StepModel, thickness_m: number, f_Hz: number): Region =>
  regionOf(stepModelPermittivity(m, f_Hz), thickness_m, f_Hz, NORMAL, 'TE');

/** Bulk pieces of the effective stack split at the sheets inside them, and each sheet's interface. */
interface Pieces { pieces: { x0: number; x1: number; model: StepModel; segment: number }[]; faces: Float64Array; sheetG: Float64Array }

function piecesOf(eff: EffectiveStack): Pieces {
  const cuts = new Set<number>();
  for (const s of eff.sheets) cuts.add(s.x_m);
  const pieces: Pieces['pieces'] = [];
  eff.segments.forEach((seg, segment) => {
    const inner = [...cuts].filter((x) => x > seg.x0_m + 1e-15 && x < seg.x1_m - 1e-15).sort((a, b) => a - b);
    let x0 = seg.x0_m;
    for (const x of [...inner, seg.x1_m]) { pieces.push({ x0, x1: x, model: seg.model, segment }); x0 = x; }
  });
  const faces = new Float64Array(pieces.length + 1);
  pieces.forEach((p, i) => { faces[i] = p.x0; faces[i + 1] = p.x1; });
  const sheetG = new Float64Array(pieces.length + 1);
  for (const s of eff.sheets) {
    let best = 0;
    for (let k = 1; k < faces.length; k++) if (Math.abs(faces[k] - s.x_m) < Math.abs(faces[best] - s.x_m)) best = k;
    sheetG[best] += s.conductance_S;
  }
  return { pieces, faces, sheetG };
}

/** A region for a medium; `segment` is the segment's index (−1 for the half-spaces). */
type RegionMaker = (m: StepModel, thickness_m: number, f_Hz: number, segment: number) => Region;

function solveWith(eff: EffectiveStack, p: Pieces, f: number, make: RegionMaker, sheetScale = 1): { R: Complex; T: Complex } {
  const s: StackAtFrequency = {
    f_Hz: f,
    front: make(eff.front, Infinity, f, -1),
    layers: p.pieces.map((q) => make(q.model, q.x1 - q.x0, f, q.segment)),
    back: eff.back === 'pec' ? null : make(eff.back, Infinity, f, -1),
    sheetG: sheetScale === 1 ? p.sheetG : p.sheetG.map((g) => g * sheetScale),
    interface_m: p.faces,
  };
  const sol = solveAt(s);
  return { R: sol.R, T: sol.T };
}

/** Normal-incidence R and T of the effective stack at each frequency. */
export function solveEffective(eff: EffectiveStack, f_Hz: Float64Array): Spectrum {
  const p = piecesOf(eff);
  const out = emptySpectrum(f_Hz);
  for (let k = 0; k < f_Hz.length; k++) {
    const { R, T } = solveWith(eff, p, f_Hz[k], region);
    out.R_re[k] = R.re; out.R_im[k] = R.im;
    out.T_re[k] = T.re; out.T_im[k] = T.im;
  }
  return out;
}

export interface GridSpacing { dx_m: number; dt_s: number; courant: number }

/**
 * Largest |ΔR| and |ΔT| over the frequencies between the grid's response and the effective stack's own
 * (faces and sheets taken on nodes). With `only`, just that segment is stepped as the grid steps it.
 */
export function gridError(eff: EffectiveStack, f_Hz: readonly number[], g: GridSpacing, only?: number): { R: number; T: number } {
  const p = piecesOf(eff);
  const discrete: RegionMaker = (m, d, f, segment) => {
    if (only !== undefined && segment !== only) return region(m, d, f);
    const w = discreteWave(m, f, g.dx_m, g.dt_s, g.courant);
    return { eps: w.eps, kx: w.k, Y: { re: w.n.re / ETA0_ohm, im: w.n.im / ETA0_ohm }, thickness_m: d };
  };
  let R = 0, T = 0;
  for (const f of f_Hz) {
    const a = solveWith(eff, p, f, region);
    const b = solveWith(eff, p, f, discrete, Math.cos(Math.PI * f * g.dt_s));
    R = Math.max(R, Math.hypot(a.R.re - b.R.re, a.R.im - b.R.im));
    T = Math.max(T, Math.hypot(a.T.re - b.T.re, a.T.im - b.T.im));
  }
  return { R: Number.isFinite(R) ? R : Infinity, T: Number.isFinite(T) ? T : Infinity };
}
