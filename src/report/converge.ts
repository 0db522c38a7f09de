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
/** An order is shown only when the error fell by at least this factor between two rows (else it says nothing). */
const MEANINGFUL_DROP = 1.5;

export interface FdtdStudyRow {
  /** Cells per wavelength (at the band top, slowest medium) and E nodes. */
  density: number;
  size: number;
  /** The engine's own error: the run against the exact solution of the media it steps. */
  engine: { R: number; T: number };
  /** Observed order of the engine's error from the previous row (NaN when not meaningful). */
  engineOrder: number;
  /** The run against the exact solution of the stack as its tables describe it (engine + model share). */
  total: { R: number; T: number };
  totalOrder: number;
}

export interface FdtdStudy {
  rows: FdtdStudyRow[];
  /**
   * When the engine steps other media than the stack names (fitted power laws, metal as a wall or sheet): the
   * exact solution of the stepped media against that of the stack, a share of the error no grid removes.
   */
  modelShare: { R: number; T: number } | null;
  /** The first density at which the engine's error is below the model share (null when it never is, or no share). */
  engineBelowShareFrom: number | null;
}

const worst = (e: { R: number; T: number }): number => Math.max(e.R, e.T);

/** Order between two rows, or NaN when the error did not fall enough for one to mean anything. */
function meaningfulOrder(n1: number, e1: number, n2: number, e2: number): number {
  if (!(e1 > ROUND_OFF_FLOOR && e2 > ROUND_OFF_FLOOR) || e1 < MEANINGFUL_DROP * e2) return NaN;
  return observedOrder(n1, e1, n2, e2);
}

/** Largest |ΔR|, |ΔT| of the run against a reference over the frequencies where the pulse is strong. */
function runError(sp: ReturnType<typeof spectrumFromRecords>, ref: Spectrum): { R: number; T: number } {
  let R = 0, T = 0;
  for (let i = 0; i < ref.f_Hz.length; i++) {
    if (sp.weak[i]) continue;
    R = Math.max(R, Math.hypot(sp.R_re[i] - ref.R_re[i], sp.R_im[i] - ref.R_im[i]));
    T = Math.max(T, Math.hypot(sp.T_re[i] - ref.T_re[i], sp.T_im[i] - ref.T_im[i]));
  }
  return { R, T };
}

/**
 * FDTD error at each cells-per-wavelength figure: the engine's own (against the exact solution of the
 * stepped media) and the total (against `exact`, the exact solution of the stack as written), each with its order.
 */
export function fdtdStudy(stack: Stack, exact: Spectrum, cells = FDTD_CELLS_PER_WAVELENGTH): FdtdStudy {
  const rows: FdtdStudyRow[] = [];
  let modelShare: FdtdStudy['modelShare'] = null;
  for (const c of cells) {
    const run = runToEndSync(createPulseRun(stack, { cellsPerWavelength: c }));
    let ref = exact;
    if (run.plan.effective.substitutions > 0) {
      ref = solveEffective(run.plan.effective, exact.f_Hz);
      const a = compareSpectra(ref, exact);
      modelShare = { R: a.R_max, T: a.T_max };
    }
    const sp = spectrumFromRecords(run.records(), ref.f_Hz);
    const engine = runError(sp, ref), total = ref === exact ? engine : runError(sp, exact);
    const prev = rows[rows.length - 1];
    rows.push({
      density: c, size: run.plan.nodes.total, engine, total,
      engineOrder: prev ? meaningfulOrder(prev.density, worst(prev.engine), c, worst(engine)) : NaN,
      totalOrder: prev ? meaningfulOrder(prev.density, worst(prev.total), c, worst(total)) : NaN,
    });
  }
  const share = modelShare;
  const below = share ? rows.find((r) => worst(r.engine) < worst(share)) : undefined;
  return { rows, modelShare, engineBelowShareFrom: below ? below.density : null };
}

const sci = (x: number): string => x.toExponential(2);
const ord = (x: number): string => (Number.isFinite(x) ? x.toFixed(2) : '-');

/** The FDTD study as text: the table, then what the model share means for it. */
export function formatFdtdStudy(study: FdtdStudy): string {
  const share = study.modelShare;
  const head = ['cells/λ', 'cells', 'engine max|dR|', 'max|dT|', 'order', ...(share ? ['total max|dR|', 'max|dT|', 'order'] : []), 'theory'];
  const body = study.rows.map((r) => [
    String(r.density), String(r.size), sci(r.engine.R), sci(r.engine.T), ord(r.engineOrder),
    ...(share ? [sci(r.total.R), sci(r.total.T), ord(r.totalOrder)] : []), '2',
  ]);
  const w = head.map((h, j) => Math.max(h.length, ...body.map((b) => b[j].length)));
  const line = (c: string[]) => c.map((x, j) => x.padStart(w[j])).join('  ');
  const out = [line(head), ...body.map(line)];
  out.push('engine: the run against the exact solution of the media it steps; an order is shown where the error fell by 1.5× or more.');
  if (share) {
    out.push('total: the run against the exact solution of the stack as written; whatever the grid, it cannot fall below the');
    out.push(`model share, max|dR| ${sci(share.R)}, max|dT| ${sci(share.T)} (the exact solution of the stepped media against the tables).`);
    out.push(study.engineBelowShareFrom !== null
      ? `From ${study.engineBelowShareFrom} cells/λ on the engine's error is already below the model share: a finer grid does not bring\n` +
        'the result closer to the tables (the total barely falls there, so it shows no order).'
      : 'The engine\'s error stays above the model share on every grid shown: refining the grid still helps.');
  }
  return out.join('\n');
}

/** The FEM study as a compact text table. */
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
