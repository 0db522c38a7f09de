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
