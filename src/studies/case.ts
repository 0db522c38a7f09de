// One case of a study: the exact solution with its engineering quantities, and the cross-checks the study asks
// for (the FEM at the same frequencies, a pulse run), reduced to their agreement rows. A method that declines the
// case (the FEM refusing its mesh, the pulse engine declining a medium it cannot step at that angle) leaves the
// other methods' results and says why.

import { FdtdInstabilityError, PlanError } from '../fdtd/errors.ts';
import { createPulseRun, runToEnd } from '../fdtd/run.ts';
import type { PulseOptions } from '../fdtd/types.ts';
import type { FemOptions } from '../fem/types.ts';
import { fdtdAgreementRows } from '../report/fdtd-agreement.ts';
import { femSpectrumPart } from '../report/fem-part.ts';
import type { AgreementRow } from '../report/format-agreement.ts';
import { bandFrequencies, type Spectrum } from '../results.ts';
import { spectrumFromRecords } from '../spectra/spectrum.ts';
import type { Stack } from '../stack/types.ts';
import { solveExactWithQuantities, type ExactWithQuantities } from './exact.ts';

export type StudyMethod = 'tmm' | 'fem' | 'fdtd';
export const STUDY_METHODS: readonly StudyMethod[] = ['tmm', 'fem', 'fdtd'];

export interface CaseOptions {
  /** Always includes 'tmm' (the tables hold the exact solution). */
  methods: readonly StudyMethod[];
  fem?: FemOptions;
  pulse?: PulseOptions;
  /** Polled between chunks of a pulse run; true stops it. */
  shouldStop?: () => boolean;
}

export interface CaseSolution {
  exact: ExactWithQuantities;
  /** fem-tmm, fdtd-tmm, fdtd-fem … as the methods ran. */
  agreement: AgreementRow[];
  /** Why a requested cross-check did not run, by method. */
  declined: Partial<Record<'fem' | 'fdtd', string>>;
  warnings: string[];
}

/** Solve one case's stack with the requested methods. */
export async function solveCase(stack: Stack, options: CaseOptions): Promise<CaseSolution> {
  const warnings: string[] = [];
  const warn = (w: string) => { if (!warnings.includes(w)) warnings.push(w); };
  const exact = solveExactWithQuantities(stack, bandFrequencies(stack));
  const agreement: AgreementRow[] = [];
  const declined: CaseSolution['declined'] = {};
  let fem: Spectrum | null = null;
  if (options.methods.includes('fem')) {
    let why: string | undefined;
    const part = femSpectrumPart(stack, exact.spectrum, options.fem ?? {}, (w) => { why = w; warn(w); });
    if (part) {
      agreement.push(part.agreement);
      fem = femSpectrumOf(part.spectrum, exact.spectrum.f_Hz);
    } else declined.fem = why ?? 'FEM skipped';
  }
  if (options.methods.includes('fdtd')) {
    const pulse = await pulseAgreement(stack, exact.spectrum, fem, options);
    if (typeof pulse === 'string') { declined.fdtd = pulse; warn(`FDTD skipped: ${pulse}`); } else {
      agreement.push(...pulse.rows);
      for (const w of pulse.warnings) warn(w);
    }
  }
  return { exact, agreement, declined, warnings };
}

/** The FEM part's columns back as a Spectrum. */
function femSpectrumOf(cols: { name: string; data: Float64Array }[], f_Hz: Float64Array): Spectrum {
  const get = (name: string) => cols.find((c) => c.name === name)!.data;
  return { f_Hz, R_re: get('R_fem_re'), R_im: get('R_fem_im'), T_re: get('T_fem_re'), T_im: get('T_fem_im') };
}

/** A pulse run's agreement rows and warnings, or the reason it did not run. */
async function pulseAgreement(stack: Stack, tmm: Spectrum, fem: Spectrum | null, options: CaseOptions):
  Promise<{ rows: AgreementRow[]; warnings: string[] } | string> {
  try {
    const run = createPulseRun(stack, options.pulse);
    await runToEnd(run, { shouldStop: options.shouldStop });
    if (run.doneReason === 'stopped') return 'stopped before the field had decayed';
    const fdtd = spectrumFromRecords(run.records(), tmm.f_Hz);
    return { rows: fdtdAgreementRows(run, fdtd, tmm, fem), warnings: [...run.warnings, ...fdtd.warnings] };
  } catch (e) {
    if (e instanceof PlanError || e instanceof FdtdInstabilityError) return e.message;
    throw e;
  }
}
