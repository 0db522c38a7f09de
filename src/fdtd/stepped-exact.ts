// The exact layered solution of the stack *as the engine steps it*: power laws replaced by their
// fitted causal models, conductor layers by a wall or a sheet. Comparing the pulse run with this
// isolates the engine's own error (grid, boundaries, truncation) from the fit's; comparing with the
// exact solution of the original stack gives the end-to-end figure.

import { type Spectrum, emptySpectrum } from '../results.ts';
import { type Region, type StackAtFrequency, regionOf } from '../tmm/media.ts';
import { solveAt } from '../tmm/recursion.ts';
import { type StepModel, stepModelPermittivity } from './media.ts';
import type { EffectiveStack } from './types.ts';

const NORMAL = { re: 0, im: 0 };
/** A stepped medium as a region of the exact solver (normal incidence: oblique TE is already folded into ε). */
const region = (m: StepModel, thickness_m: number, f_Hz: number): Region =>
  regionOf(stepModelPermittivity(m, f_Hz), thickness_m, f_Hz, NORMAL, 'TE');

/** Normal-incidence R and T of the effective stack at each frequency. */
export function solveEffective(eff: EffectiveStack, f_Hz: Float64Array): Spectrum {
  // Split segments at sheets that fall inside them; attach each sheet to the interface at its position.
  const cuts = new Set<number>();
  for (const s of eff.sheets) cuts.add(s.x_m);
  const pieces: { x0: number; x1: number; model: StepModel }[] = [];
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
  const out = emptySpectrum(f_Hz);
  for (let k = 0; k < f_Hz.length; k++) {
    const f = f_Hz[k];
    const s: StackAtFrequency = {
      f_Hz: f,
      front: region(eff.front, Infinity, f),
      layers: pieces.map((p) => region(p.model, p.x1 - p.x0, f)),
      back: eff.back === 'pec' ? null : region(eff.back, Infinity, f),
      sheetG,
      interface_m: faces,
    };
    const sol = solveAt(s);
    out.R_re[k] = sol.R.re; out.R_im[k] = sol.R.im;
    out.T_re[k] = sol.T.re; out.T_im[k] = sol.T.im;
  }
  return out;
}
