// The pulse run's agreement rows: against the exact solution and the FEM and, when the engine stepped other media
// than the stack names (power laws fitted, metal as a wall or a sheet), the figure split in two: the engine
// against the exact solution of what it stepped (its own numerical error), and that exact solution against the
// original (the material model's share). With --media stepped the tmm columns already are the stepped media and
// solve's report has the share, so the split is left out (`split` false). Shared by `run` and the studies.

import { solveEffective } from '../fdtd/stepped-exact.ts';
import type { PulseRun } from '../fdtd/types.ts';
import type { Spectrum } from '../results.ts';
import { agreementRow, type AgreementRow } from './format-agreement.ts';

export function fdtdAgreementRows(run: PulseRun, fdtd: Spectrum, tmm: Spectrum | null, fem: Spectrum | null, split = true): AgreementRow[] {
  const rows: AgreementRow[] = [];
  const target = run.plan.accuracyTarget;
  if (tmm) rows.push(agreementRow('fdtd-tmm', fdtd, tmm, target));
  if (fem) rows.push(agreementRow('fdtd-fem', fdtd, fem, target));
  if (tmm && split && run.plan.effective.substitutions > 0) {
    const stepped = solveEffective(run.plan.effective, fdtd.f_Hz);
    rows.push(agreementRow('fdtd-tmm as stepped', fdtd, stepped, target));
    rows.push(agreementRow('stepped media-tmm', stepped, tmm));
  }
  return rows;
}

const sci = (x: number): string => x.toExponential(1);
const ghz = (x: number): string => String(Number(x.toPrecision(4)));

/**
 * A warning when the pulse run misses its target against the tables (row "fdtd-tmm") while the engine's own error
 * (row "fdtd-tmm as stepped") meets it: the miss is the material model's share (row "stepped media-tmm"), alone or
 * added to the engine's. Without a "fdtd-tmm" row, when the share alone passes the target. Null otherwise.
 */
export function modelShareWarning(rows: readonly AgreementRow[], target: number): string | null {
  const share = rows.find((r) => r.pair === 'stepped media-tmm');
  if (!share) return null;
  const total = rows.find((r) => r.pair === 'fdtd-tmm');
  const engine = rows.find((r) => r.pair === 'fdtd-tmm as stepped');
  const missed = total ? Math.max(total.R_max, total.T_max) > target : Math.max(share.R_max, share.T_max) > target;
  if (!missed || (engine && Math.max(engine.R_max, engine.T_max) > target)) return null;
  const own = engine ? `, while the engine's own error is ${sci(Math.max(engine.R_max, engine.T_max))}` : '';
  const parts = [`max|dR| ${sci(share.R_max)} at ${ghz(share.R_worst_f_GHz)} GHz`];
  if (share.T_max > 0) parts.push(`max|dT| ${sci(share.T_max)} at ${ghz(share.T_worst_f_GHz)} GHz`);
  return `the pulse run misses its target (${target}) against the stack's tables by the material model's share: the media it ` +
    `stepped differ from the tables by ${parts.join(', ')} (the stepped media's exact solution against the tables${own}). ` +
    'A power law or a measured table is not exactly causal, so a time-domain model follows it only this closely over this band and ' +
    'this depth; compare the methods on the fitted media with --media stepped, or narrow the band.';
}
