// Mesh refinement study: FEM error against a reference spectrum at a sequence of densities, with the observed
// order of convergence between successive densities, p_obs = ln(e_i / e_{i+1}) / ln(N_{i+1} / N_i).
// Theory for R and T (nodal values, pollution-dominated): error ∝ (kh)^{2p}, so p_obs → 2p
// (Ihlenburg & Babuška 1995; Ainsworth 2004).

import type { Spectrum } from '../results.ts';
import type { Stack } from '../stack/types.ts';
import type { FemOrder } from './basis.ts';
import { solveFem } from './solve.ts';

export interface ConvergenceRow {
  density: number;
  elements: number;
  unknowns: number;
  /** max over frequency of |R − R_ref| and |T − T_ref|. */
  R_err: number;
  T_err: number;
  /** Observed order from the previous row (NaN on the first row or when an error is at round-off). */
  order_obs: number;
}

/** Observed order between two (density, error) pairs; NaN when either error is not meaningful. */
export function observedOrder(n1: number, e1: number, n2: number, e2: number): number {
  if (!(e1 > 0 && e2 > 0) || n2 === n1) return NaN;
  return Math.log(e1 / e2) / Math.log(n2 / n1);
}

const maxDiff = (a: Spectrum, b: Spectrum, re: 'R_re' | 'T_re', im: 'R_im' | 'T_im'): number => {
  let m = 0;
  for (let i = 0; i < a.f_Hz.length; i++) m = Math.max(m, Math.hypot(a[re][i] - b[re][i], a[im][i] - b[im][i]));
  return m;
};

/** Errors below this are round-off, not discretisation; no order is read from them. */
export const ROUND_OFF_FLOOR = 1e-12;

export function convergenceStudy(stack: Stack, reference: Spectrum, order: FemOrder, densities: number[]): ConvergenceRow[] {
  const rows: ConvergenceRow[] = [];
  for (const density of densities) {
    const { spectrum, mesh } = solveFem(stack, reference.f_Hz, { order, density });
    const R_err = maxDiff(spectrum, reference, 'R_re', 'R_im'), T_err = maxDiff(spectrum, reference, 'T_re', 'T_im');
    const prev = rows[rows.length - 1];
    // Read the order from the larger of the two errors (T is 0 = 0 behind a conductor).
    const e = Math.max(R_err, T_err);
    const ePrev = prev ? Math.max(prev.R_err, prev.T_err) : NaN;
    const order_obs = prev && e > ROUND_OFF_FLOOR && ePrev > ROUND_OFF_FLOOR ? observedOrder(prev.density, ePrev, density, e) : NaN;
    rows.push({ density, elements: mesh.elements, unknowns: mesh.unknowns, R_err, T_err, order_obs });
  }
  return rows;
}
