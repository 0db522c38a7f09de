// The exact layered solution of the stack *as the engine steps it*: power laws replaced by their
// fitted causal models, conductor layers by a wall or a sheet. Comparing the pulse run with this
// isolates the engine's own error (grid, boundaries, truncation) from the fit's; comparing with the
// exact solution of the original stack gives the end-to-end figure.
//
// `gridError` compares it with the grid's own exact response (grid-response.ts): the engine's error as the
// planner predicts it before anything is allocated.

import type { Complex } from '../complex.ts';
import { type Spectrum, emptySpectrum } from '../results.ts';
import { type Region, type StackAtFrequency, regionOf } from '../tmm/media.ts';
import { solveAt } from '../tmm/recursion.ts';
import { type GridSpacing, gridGeometry, gridResponse } from './grid-response.ts';
import { type LineMedium, linePermittivity } from './media.ts';
import type { EffectiveStack } from './types.ts';

const NORMAL = { re: 0, im: 0 };
/**
 * A stepped line medium as a region of the exact solver: normal incidence on the shunt ε and series μ (the
 * angle and polarization are already folded into them, oblique.ts), so Y = √(ε/μ)/η0 and k = k0 √(εμ).
 */
const region = (m: LineMedium, thickness_m: number, f_Hz: number): Region => {
  const { eps, mu } = linePermittivity(m, f_Hz);
  return regionOf(eps, thickness_m, f_Hz, NORMAL, 'TE', mu);
};

/** Bulk pieces of the effective stack split at the sheets inside them, and each sheet's interface. */
interface Pieces { pieces: { x0: number; x1: number; model: LineMedium }[]; faces: Float64Array; sheetG: Float64Array }

function piecesOf(eff: EffectiveStack): Pieces {
  const cuts = new Set<number>();
  for (const s of eff.sheets) cuts.add(s.x_m);
  const pieces: Pieces['pieces'] = [];
  for (const seg of eff.segments) {
    const inner = [...cuts].filter((x) => x > seg.x0_m + 1e-15 && x < seg.x1_m - 1e-15).sort((a, b) => a - b);
    let x0 = seg.x0_m;
    for (const x of [...inner, seg.x1_m]) { pieces.push({ x0, x1: x, model: seg.model }); x0 = x; }
  }
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

type RegionMaker = (m: LineMedium, thickness_m: number, f_Hz: number) => Region;

function solveWith(eff: EffectiveStack, p: Pieces, f: number, make: RegionMaker): { R: Complex; T: Complex } {
  const s: StackAtFrequency = {
    f_Hz: f,
    front: make(eff.front, Infinity, f),
    layers: p.pieces.map((q) => make(q.model, q.x1 - q.x0, f)),
    back: eff.back === 'pec' ? null : make(eff.back, Infinity, f),
    sheetG: p.sheetG,
    interface_m: p.faces,
  };
  const sol = solveAt(s);
  return { R: sol.R, T: sol.T };
}

/** R and T of the effective stack at each frequency (its line media at normal incidence: what is stepped). */
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

/**
 * Largest |ΔR| and |ΔT| over the frequencies between the grid's own exact response (grid-response.ts) on a
 * grid of `stackCells` cells across the stack and the effective stack's exact response: the engine's error
 * as predicted before the run.
 */
export function gridError(eff: EffectiveStack, f_Hz: readonly number[], g: GridSpacing, stackCells: number): { R: number; T: number } {
  const p = piecesOf(eff);
  const geo = gridGeometry(eff, g.dx_m, stackCells);
  let R = 0, T = 0;
  for (const f of f_Hz) {
    const a = solveWith(eff, p, f, region);
    const b = gridResponse(geo, f, g);
    R = Math.max(R, Math.hypot(a.R.re - b.R.re, a.R.im - b.R.im));
    T = Math.max(T, Math.hypot(a.T.re - b.T.re, a.T.im - b.T.im));
  }
  return { R: Number.isFinite(R) ? R : Infinity, T: Number.isFinite(T) ? T : Infinity };
}
