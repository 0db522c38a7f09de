// The cell size: the coarsest grid whose predicted engine error is within its share of the target.
//
// The prediction is the layered model of the grid itself (discrete.ts, stepped-exact.ts gridError): the exact
// R and T the leapfrog grid gives, computed per frequency from each medium's discrete wavenumber and
// admittance, against the exact R and T of the stepped media. It sees what the probes see: a wall that
// swallows the wave does not pay for the phase error of its depth, a conductor behind doubles the path, a
// resonant layer multiplies its error. Δx = λ_min/N, with λ_min the shortest wavelength (|√(εμ)|, so
// evanescent media count) over the band in any medium the grid resolves; N ≥ MIN_CELLS_PER_WAVELENGTH and
// grows (Yee is second order: the error falls as N⁻²) until the prediction fits. Δx is then trimmed so the
// stack is a whole number of cells (front and back faces on E nodes); with sheets inside the stack, a grid
// up to SHEET_ALIGN_RANGE× finer is searched to put them on nodes too.
//
// A stack of a few microns is instead stepped within the cell at x = 0 (`lumped`) when that costs at most
// half the target: moving T's reference plane by d errs by about k d in the media around it, a conductor
// behind moved to x = 0 by 2 k d, lumping the stack by about (k d)² inside it.

import { C0_m_per_s } from '../units.ts';
import { type LineMedium, lineIndex } from './media.ts';
import { SHEET_ALIGN_TOL } from './grid-response.ts';
import { gridError } from './stepped-exact.ts';
import type { EffectiveStack } from './types.ts';

export const MIN_CELLS_PER_WAVELENGTH = 20;
const SHEET_ALIGN_RANGE = 3;
/** Candidate cell counts tried when aligning sheets (bounds the search on very fine grids). */
const SHEET_ALIGN_CANDIDATES = 4096;
/** Rounds of refinement before the search gives up (each multiplies N by at least 1.05). */
const MAX_ROUNDS = 60;

export interface CellChoice {
  N: number;
  dx_m: number;
  /** Cells across the stack (0 when lumped). */
  stackCells: number;
  /** Predicted engine error on this grid (max |ΔR|, |ΔT| over the band against the stepped media). */
  predicted: number;
  lumped: boolean;
  /** 2 k d of a lumped stack (its error order), else 0. */
  lumpedError: number;
  lambdaMin_m: number;
  /** Worst distance of an inner sheet from its node, in cells. */
  sheetMisalignment: number;
  /** True when the search stopped at the cell limit before meeting the budget. */
  overLimit: boolean;
}

export interface CellInputs {
  effective: EffectiveStack;
  /** Frequencies of the prediction (the band's ends included). */
  freqs: number[];
  courant: number;
  budget: number;
  accuracy: number;
  cellsPerWavelength?: number;
  maxCells: number;
}

/** Largest |k| = k0 |√(εμ)| over the frequencies, rad/m. */
function maxWavenumber(m: LineMedium, freqs: number[]): number {
  let k = 0;
  for (const f of freqs) {
    const r = lineIndex(m, f);
    k = Math.max(k, (2 * Math.PI * f * Math.hypot(r.re, r.im)) / C0_m_per_s);
  }
  return k;
}

export function chooseCells(c: CellInputs): CellChoice {
  const eff = c.effective, thickness = eff.thickness_m;
  const kOut = Math.max(maxWavenumber(eff.front, c.freqs), eff.back === 'pec' ? 0 : maxWavenumber(eff.back, c.freqs));
  const kIn = Math.max(0, ...eff.segments.map((s) => maxWavenumber(s.model, c.freqs)));
  const lumped = thickness > 0 && 2 * kOut * thickness <= c.accuracy / 2 && (kIn * thickness) ** 2 <= c.accuracy / 2;
  const lambdaMin = (2 * Math.PI) / (lumped ? kOut : Math.max(kOut, kIn));
  const innerSheets = eff.sheets.map((sh) => sh.x_m).filter((x) => x > 0 && x < thickness);
  const misalignment = (cells: number): number => {
    let worst = 0;
    for (const x of innerSheets) { const u = (x / thickness) * cells; worst = Math.max(worst, Math.abs(u - Math.round(u))); }
    return worst;
  };
  const cellsFor = (N: number): { dx: number; stackCells: number } => {
    const target = lambdaMin / N;
    if (thickness <= 0 || lumped) return { dx: target, stackCells: 0 };
    let stackCells = Math.max(1, Math.ceil(thickness / target - 1e-9));
    if (innerSheets.length > 0 && stackCells <= c.maxCells) {
      let best = stackCells, bestMis = misalignment(stackCells);
      const last = Math.min(Math.ceil(stackCells * SHEET_ALIGN_RANGE), stackCells + SHEET_ALIGN_CANDIDATES);
      for (let n = stackCells + 1; n <= last && bestMis > SHEET_ALIGN_TOL; n++) {
        const m = misalignment(n);
        if (m < bestMis - 1e-12) { best = n; bestMis = m; }
      }
      stackCells = best;
    }
    return { dx: thickness / stackCells, stackCells };
  };
  const stackCellsOf = (dx: number): number => (lumped || thickness <= 0 ? 0 : Math.round(thickness / dx));
  const seen = new Map<number, number>();
  const predict = (dx: number): number => {
    let p = seen.get(dx);
    if (p === undefined) {
      const e = gridError(eff, c.freqs, { dx_m: dx, dt_s: (c.courant * dx) / C0_m_per_s, courant: c.courant }, stackCellsOf(dx));
      p = Math.max(e.R, e.T);
      seen.set(dx, p);
    }
    return p;
  };
  const done = (N: number, overLimit: boolean): CellChoice => {
    const { dx, stackCells } = cellsFor(N);
    return {
      N, dx_m: dx, stackCells, predicted: predict(dx), lumped, lumpedError: lumped ? 2 * kOut * thickness : 0,
      lambdaMin_m: lambdaMin, sheetMisalignment: misalignment(stackCells), overLimit,
    };
  };
  if (c.cellsPerWavelength !== undefined) return done(c.cellsPerWavelength, false);
  let N = MIN_CELLS_PER_WAVELENGTH;
  for (let round = 0; round < MAX_ROUNDS; round++) {
    const { dx, stackCells } = cellsFor(N);
    if (stackCells > c.maxCells) return done(N, true);
    const p = predict(dx);
    if (!(p > c.budget)) break;
    // Second order: N ∝ √error; a little extra so the trimmed grid lands inside.
    N *= Math.min(4, Math.max(1.05, 1.03 * Math.sqrt(p / c.budget)));
  }
  return done(N, false);
}
