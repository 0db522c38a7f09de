// Refinement studies behind `slabecho converge`: a method's error against the exact solution at a sequence of
// resolutions, with the observed order between successive rows. DOM-free.
//   FEM: densities in elements per wavelength; R and T converge like (kh)^{2p} (Ihlenburg & Babuška 1995;
//        Ainsworth 2004), so the expected order is 2p.
//   FDTD: cells per wavelength; the Yee scheme is second order in Δx at a fixed Courant number (Taflove &
//        Hagness 2005, ch. 4), so the expected order is 2 — until the fixed parts of its error (power-law fits,
//        CPML reflection, record truncation) take over.

import type { FemOrder } from '../fem/basis.ts';
import { convergenceStudy, observedOrder, ROUND_OFF_FLOOR, type ConvergenceRow } from '../fem/convergence.ts';
import { createPulseRun, runToEndSync } from '../fdtd/run.ts';
import { solveEffective } from '../fdtd/stepped-exact.ts';
import { compareSpectra } from './agreement.ts';
import type { Spectrum } from '../results.ts';
import { spectrumFromRecords } from '../spectra/spectrum.ts';
import type { Stack } from '../stack/types.ts';

export interface StudyRow {
  /** "p = 3" for the FEM, "fdtd" for the pulse engine. */
  label: string;
  /** Elements or cells per wavelength. */
  density: number;
  /** Elements (FEM) or E nodes (FDTD). */
  size: number;
  R_err: number;
  T_err: number;
  order_obs: number;
  /** The order theory predicts. */
  order_theory: number;
}

export const FEM_DENSITIES: Record<FemOrder, number[]> = {
  1: [8, 16, 32, 64, 128, 256],
  2: [4, 8, 16, 32, 64],
  3: [4, 8, 16, 32],
};
/** A study row stops here (elements) to keep `converge` quick. */
export const MAX_STUDY_ELEMENTS = 400_000;

export function femStudy(stack: Stack, ref: Spectrum, orders: FemOrder[]): StudyRow[] {
  const rows: StudyRow[] = [];
  for (const p of orders) {
    let prev: ConvergenceRow | undefined;
    for (const d of FEM_DENSITIES[p]) {
      const r = convergenceStudy(stack, ref, p, [d])[0];
      const err = Math.max(r.R_err, r.T_err);
      // Against the element counts actually used (every layer has at least one element, and counts are
      // rounded up), so two densities that give the same mesh show no order rather than 0.
      const order_obs = prev && err > ROUND_OFF_FLOOR ? observedOrder(prev.elements, Math.max(prev.R_err, prev.T_err), r.elements, err) : NaN;
      rows.push({ label: `p = ${p}`, density: d, size: r.elements, R_err: r.R_err, T_err: r.T_err, order_obs, order_theory: 2 * p });
      prev = r;
      if (err < ROUND_OFF_FLOOR || r.elements * 2 > MAX_STUDY_ELEMENTS) break;
    }
  }
  return rows;
}

export const FDTD_CELLS_PER_WAVELENGTH = [10, 20, 40, 80];

export interface FdtdStudy {
  rows: StudyRow[];
  /**
   * When the engine steps other media than the stack names (fitted power laws, metal as a wall or sheet),
   * the rows measure the grid against the exact solution of the stepped media, and `modelFloor` is that
   * solution's own difference from the exact solution of the stack: a floor no grid removes.
   */
  modelFloor: { R: number; T: number } | null;
}

/** FDTD error at each cells-per-wavelength figure, over the frequencies where the pulse is strong. */
export function fdtdStudy(stack: Stack, exact: Spectrum, cells = FDTD_CELLS_PER_WAVELENGTH): FdtdStudy {
  const rows: StudyRow[] = [];
  let modelFloor: FdtdStudy['modelFloor'] = null;
  for (const c of cells) {
    const run = runToEndSync(createPulseRun(stack, { cellsPerWavelength: c }));
    let ref = exact;
    if (run.plan.effective.substitutions > 0) {
      ref = solveEffective(run.plan.effective, exact.f_Hz);
      const a = compareSpectra(ref, exact);
      modelFloor = { R: a.R_max, T: a.T_max };
    }
    const sp = spectrumFromRecords(run.records(), ref.f_Hz);
    let R_err = 0, T_err = 0;
    for (let i = 0; i < ref.f_Hz.length; i++) {
      if (sp.weak[i]) continue;
      R_err = Math.max(R_err, Math.hypot(sp.R_re[i] - ref.R_re[i], sp.R_im[i] - ref.R_im[i]));
      T_err = Math.max(T_err, Math.hypot(sp.T_re[i] - ref.T_re[i], sp.T_im[i] - ref.T_im[i]));
    }
    const prev = rows[rows.length - 1];
    rows.push({
      label: 'fdtd', density: c, size: run.plan.nodes.total, R_err, T_err,
      order_obs: prev ? observedOrder(prev.density, Math.max(prev.R_err, prev.T_err), c, Math.max(R_err, T_err)) : NaN,
      order_theory: 2,
    });
  }
  return { rows, modelFloor };
}

/** The study as a compact text table. */
export function formatStudy(rows: readonly StudyRow[], unit: string): string {
  const head = ['method', unit, 'size', 'max|dR|', 'max|dT|', 'order', 'theory'];
  const body = rows.map((r) => [
    r.label, String(r.density), String(r.size), r.R_err.toExponential(2), r.T_err.toExponential(2),
    Number.isFinite(r.order_obs) ? r.order_obs.toFixed(2) : '-', String(r.order_theory),
  ]);
  const w = head.map((h, j) => Math.max(h.length, ...body.map((b) => b[j].length)));
  const line = (c: string[]) => c.map((x, j) => (j === 0 ? x.padEnd(w[j]) : x.padStart(w[j]))).join('  ');
  return [line(head), ...body.map(line)].join('\n');
}
