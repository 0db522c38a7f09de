// A sweep: the grid of cases over any stack-file paths (the incidence angle and polarization among them), each
// solved exactly with its engineering quantities and cross-checked by the methods asked for. DOM-free: the CLI
// (and later the workbench) hands cases to threads, writes the rows in case order and assembles sweep.json with
// sweepDocument, which a merge of shards calls the same way.
//
// sweep.csv: case,angle_deg,polarization,<one column per --set path>,f_GHz,R_re,R_im,T_re,T_im,R_power,T_power,
//            absorbed,IL_dB,RL_dB,IPD_deg — one row per case and frequency, cases in order.

import type { PulseOptions } from '../fdtd/types.ts';
import type { FemOptions } from '../fem/types.ts';
import { roundedRow, type AgreementRow } from '../report/format-agreement.ts';
import { formatNumber } from '../report/table.ts';
import type { StackFile } from '../stack/file.ts';
import type { Stack } from '../stack/types.ts';
import { SLABECHO_VERSION } from '../version.ts';
import { solveCase, type StudyMethod } from './case.ts';
import type { ExactWithQuantities } from './exact.ts';
import { csvField } from './csv.ts';
import { bandExtremes, type BandExtremes } from './extremes.ts';
import { caseCount, caseSettings, caseValues, type Axis, type Shard } from './grid.ts';
import type { PathValue } from './paths.ts';
import { withSettings } from './paths.ts';
import { QUANTITY_NAMES, quantitiesUnavailable } from './quantities.ts';
import { SParameterError, sParameters, type PlaneShift } from './sparams.ts';
import { touchstoneExtension, touchstoneText } from './touchstone.ts';
import type { TalliedWarning } from './warning-tally.ts';

/** Columns after the case's own (its number, angle, polarization and --set values). */
export const SWEEP_RESULT_COLUMNS = ['f_GHz', 'R_re', 'R_im', 'T_re', 'T_im', ...QUANTITY_NAMES] as const;

/** The column names of the angle and polarization, always present. */
export const ANGLE_COLUMN = 'angle_deg', POLARIZATION_COLUMN = 'polarization';

export interface SweepPlan {
  /** The stack file with its defaults filled in (parse's `file`). */
  base: StackFile;
  /** Every axis: the angle and polarization first when swept, then the --set paths in order. */
  axes: Axis[];
  methods: StudyMethod[];
  fem: FemOptions;
  pulse: PulseOptions;
  /** Write a Touchstone file per case with these reference-plane shifts, or not (null). */
  touchstone: PlaneShift | null;
}

/** The --set axes (the columns after angle_deg and polarization). */
const setAxes = (plan: SweepPlan): Axis[] => plan.axes.filter((a) => a.column !== ANGLE_COLUMN && a.column !== POLARIZATION_COLUMN);

/** The column names of sweep.csv. */
export const sweepColumns = (plan: SweepPlan): string[] =>
  ['case', ANGLE_COLUMN, POLARIZATION_COLUMN, ...setAxes(plan).map((a) => a.column), ...SWEEP_RESULT_COLUMNS];

/** The header line of sweep.csv (without the line end). */
export const sweepHeader = (plan: SweepPlan): string => sweepColumns(plan).map(csvField).join(',');

/** A case's stack, validated like a stack file; errors carry the case number and its values. */
export function caseStack(plan: SweepPlan, index: number):
  { ok: true; stack: Stack; file: StackFile; warnings: string[] } | { ok: false; errors: string[] } {
  const r = withSettings(plan.base, caseSettings(plan.axes, index));
  const what = () => `case ${index} (${describeValues(plan.axes, caseValues(plan.axes, index))})`;
  if (!r.ok) return { ok: false, errors: r.errors.map((e) => `${what()}: ${e}`) };
  const lossy = quantitiesUnavailable(r.stack);
  if (lossy !== null) return { ok: false, errors: [`${what()}: ${lossy}`] };
  return r;
}

const describeValues = (axes: readonly Axis[], values: readonly PathValue[]): string =>
  axes.length === 0 ? 'the stack as given' : axes.map((a, k) => `${a.path.text} = ${values[k]}`).join(', ');

/** The Touchstone file of case `index`: touchstone/case-<n>.s2p, n zero-padded to the case count's width. */
export function touchstoneName(plan: SweepPlan, index: number, extension: string): string {
  const width = String(Math.max(0, caseCount(plan.axes) - 1)).length;
  return `touchstone/case-${String(index).padStart(width, '0')}${extension}`;
}

/** What sweep.json records of one case. */
export interface SweepCaseRecord extends BandExtremes {
  case: number;
  /** One value per axis, in the axes' order. */
  values: PathValue[];
  points: number;
  agreement: AgreementRow[];
  /** Why a requested cross-check or the Touchstone file was not made, by name. */
  declined?: Record<string, string>;
  /** The Touchstone file's name in the output folder. */
  touchstone?: string;
}

/** Everything one case gives: its rows of sweep.csv (text, line ends included), its record, its files. */
export interface SweepCaseOutput {
  index: number;
  /** Text, or its UTF-8 bytes when it crossed from a worker thread. */
  rows: string | Uint8Array;
  record: SweepCaseRecord;
  warnings: string[];
  files: { name: string; text: string }[];
}

/** Solve case `index` of the plan and format its rows. Throws for an invalid case (validate first). */
export async function runSweepCase(plan: SweepPlan, index: number, shouldStop?: () => boolean): Promise<SweepCaseOutput> {
  const c = caseStack(plan, index);
  if (!c.ok) throw new Error(c.errors[0]);
  const solution = await solveCase(c.stack, { methods: plan.methods, fem: plan.fem, pulse: plan.pulse, shouldStop });
  const { spectrum, quantities } = solution.exact;
  const values = caseValues(plan.axes, index);
  const declined: Record<string, string> = { ...solution.declined };
  const files: SweepCaseOutput['files'] = [];
  if (plan.touchstone !== null) {
    try {
      const s = sParameters(c.stack, spectrum, plan.touchstone);
      files.push({ name: touchstoneName(plan, index, touchstoneExtension(s)), text: touchstoneText(c.stack, s, plan.touchstone, SLABECHO_VERSION) });
    } catch (e) {
      if (!(e instanceof SParameterError)) throw e;
      declined.touchstone = e.message;
    }
  }
  const record: SweepCaseRecord = {
    case: index, values, points: spectrum.f_Hz.length, ...bandExtremes(spectrum.f_Hz, quantities),
    agreement: solution.agreement.map(roundedRow),
    ...(Object.keys(declined).length ? { declined } : {}),
    ...(files.length ? { touchstone: files[0].name } : {}),
  };
  const warnings = [...c.warnings, ...solution.warnings];
  if (declined.touchstone) warnings.push(`no Touchstone file: ${declined.touchstone}`);
  return { index, rows: caseRows(plan, index, c.file, solution.exact), record, warnings, files };
}

/** The case's rows: its own columns, then f_GHz, R, T and the quantities at each frequency. */
function caseRows(plan: SweepPlan, index: number, file: StackFile, exact: ExactWithQuantities): string {
  const values = caseValues(plan.axes, index);
  const own = [String(index), formatNumber(file.incidence.angle_deg), file.incidence.polarization,
    ...setAxes(plan).map((a) => valueText(values[plan.axes.indexOf(a)]))].join(',');
  const { spectrum: s, quantities: q } = exact;
  const cols = [s.R_re, s.R_im, s.T_re, s.T_im, ...QUANTITY_NAMES.map((n) => q[n])];
  const lines = new Array<string>(s.f_Hz.length + 1);
  for (let i = 0; i < s.f_Hz.length; i++) {
    let line = `${own},${formatNumber(s.f_Hz[i] * 1e-9)}`; // f_GHz as spectrum.csv writes it
    for (let j = 0; j < cols.length; j++) line += `,${formatNumber(cols[j][i])}`;
    lines[i] = line;
  }
  lines[s.f_Hz.length] = '';
  return lines.join('\n');
}

const valueText = (v: PathValue): string => (typeof v === 'number' ? formatNumber(v) : csvField(v));

/** The part of sweep.json that does not depend on which cases a run did (shards must agree on it). */
export function sweepHead(plan: SweepPlan): Record<string, unknown> {
  return {
    slabecho_version: SLABECHO_VERSION,
    kind: 'sweep',
    title: plan.base.title,
    columns: sweepColumns(plan),
    axes: plan.axes.map((a) => ({ column: a.column, path: a.path.text, spec: a.spec, values: a.values })),
    case_count: caseCount(plan.axes),
    order: 'cases numbered from 0, the last axis varying fastest; rows in case order, then frequency',
    methods: plan.methods,
    touchstone: plan.touchstone === null ? null
      : { deembed_mm: [plan.touchstone.front_m * 1e3, plan.touchstone.back_m * 1e3], reference: "each half-space's wave impedance" },
    stack: plan.base,
  };
}

/** sweep.json: the head, the shard (when one), the cases, the worst over them and the tallied warnings. */
export function sweepDocument(head: Record<string, unknown>, cases: readonly SweepCaseRecord[],
  warnings: readonly TalliedWarning[], shard: (Shard & { cases: [number, number] }) | null): Record<string, unknown> {
  return {
    ...head,
    ...(shard ? { shard: { index: shard.index, count: shard.count, first_case: shard.cases[0], end_case: shard.cases[1] } } : {}),
    worst: worstOver(cases),
    agreement_worst: agreementWorst(cases),
    warnings,
    cases,
  };
}

/** The case with the worst R_power and the one with the worst IL_dB (the first on a tie). */
function worstOver(cases: readonly SweepCaseRecord[]): Record<string, unknown> | null {
  if (cases.length === 0) return null;
  let r = cases[0], t = cases[0];
  for (const c of cases) {
    if (c.worst_R_power > r.worst_R_power) r = c;
    if (c.worst_IL_dB > t.worst_IL_dB) t = c;
  }
  return {
    R_power: { case: r.case, value: r.worst_R_power, f_GHz: r.worst_R_power_f_GHz },
    IL_dB: { case: t.case, value: t.worst_IL_dB, f_GHz: t.worst_IL_dB_f_GHz },
  };
}

/** Per method pair, the largest |ΔR| and |ΔT| over every case, the cases where they occur, and how many miss the target. */
function agreementWorst(cases: readonly SweepCaseRecord[]): Record<string, unknown>[] {
  const byPair = new Map<string, { pair: string; R_max: number; R_case: number; T_max: number; T_case: number; cases: number; not_met: number }>();
  for (const c of cases) {
    for (const a of c.agreement) {
      let w = byPair.get(a.pair);
      if (!w) { w = { pair: a.pair, R_max: -1, R_case: c.case, T_max: -1, T_case: c.case, cases: 0, not_met: 0 }; byPair.set(a.pair, w); }
      w.cases++;
      if (a.within_target === false) w.not_met++;
      if (a.R_max > w.R_max) { w.R_max = a.R_max; w.R_case = c.case; }
      if (a.T_max > w.T_max) { w.T_max = a.T_max; w.T_case = c.case; }
    }
  }
  return [...byPair.values()];
}
