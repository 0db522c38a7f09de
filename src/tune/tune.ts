// `tune` as one call: a stack file, its free parameters and a goal in; the best stack file, the log of every
// evaluation (tune.csv) and the summary (tune.json) out. DOM-free (the workbench's worker can call it as the CLI
// does), with progress and cancellation from search.ts; the exact solver evaluates, the FEM checks the best.

import { solveFem } from '../fem/solve.ts';
import { DEFAULT_TOLERANCE } from '../fem/types.ts';
import { agreementRow, roundedRow, type AgreementRow } from '../report/format-agreement.ts';
import { formatNumber } from '../report/table.ts';
import { bandFrequencies } from '../results.ts';
import type { StackFile } from '../stack/file.ts';
import type { Stack } from '../stack/types.ts';
import { csvField } from '../studies/csv.ts';
import { solveTmm } from '../tmm/solve.ts';
import { radFromDeg } from '../units.ts';
import { checkGoal, evaluateGoal, worstPower, type Case, type Goal } from './goals.ts';
import { inferParameters } from './inference.ts';
import { RefusedPoint, search, STAGES, type SearchProgress, type SearchResult } from './search.ts';
import { fileWith, type FreeParameter } from './stack-access.ts';

export interface TuneSetup {
  /** The stack file in its parsed form (defaults filled in, tables inline). */
  file: StackFile;
  free: readonly FreeParameter[];
  goal: Goal;
  /** The goal as typed (`min-worst-R`, `match=meas.csv`), for the summary. */
  goalText: string;
  seed: number;
  budget: number;
}

export interface TuneOutcome {
  stopped: boolean;
  /** The stack file at the best values (null when stopped before any evaluation). */
  tunedFile: StackFile | null;
  /** tune.csv, one row per evaluation, in chunks of text (a long search streams rather than builds one string). */
  csv: () => Iterable<string>;
  /** tune.json. */
  summary: Record<string, unknown>;
}

/** Frequencies of the finer check of a worst case at the best point: this many times the stack's points. */
export const FINER_FACTOR = 8;
const MAX_FINER_POINTS = 20_001;

const valuesOf = (free: readonly FreeParameter[], u: Float64Array): number[] => free.map((p, k) => p.lo + u[k] * (p.hi - p.lo));
const unitOf = (p: FreeParameter): number => Math.min(1, Math.max(0, (p.start - p.lo) / (p.hi - p.lo)));

function stackAt(setup: TuneSetup, u: Float64Array): { stack: Stack; file: StackFile } {
  const r = fileWith(setup.file, setup.free, valuesOf(setup.free, u));
  if (!r.ok) throw new RefusedPoint(r.errors[0]);
  return { stack: r.stack, file: r.file };
}

/** Run the search and assemble its results. */
export async function runTune(setup: TuneSetup, hooks: { onProgress?: (p: SearchProgress) => void; shouldStop?: () => boolean } = {}): Promise<TuneOutcome> {
  const first = stackAt(setup, new Float64Array(setup.free.map(unitOf)));
  checkGoal(setup.goal, first.stack);
  const result = await search({
    dims: setup.free.length,
    leastSquares: setup.goal.name === 'match',
    starts: [new Float64Array(setup.free.map(unitOf))],
    evaluate: (u) => evaluateGoal(setup.goal, stackAt(setup, u).stack),
  }, { seed: setup.seed, budget: setup.budget, ...hooks });
  const csv = () => evaluationCsv(setup.free, result);
  if (result.stopped || result.best === null) return { stopped: result.stopped, tunedFile: null, csv, summary: {} };
  const best = stackAt(setup, result.best.u);
  return { stopped: false, tunedFile: best.file, csv, summary: summaryOf(setup, result, best.stack) };
}

/** Rows of tune.csv per chunk. */
const CSV_CHUNK_ROWS = 1000;

/** tune.csv: evaluation number, stage, each free value (columns named by their paths), the goal's figure. */
export function* evaluationCsv(free: readonly FreeParameter[], result: SearchResult): Generator<string> {
  yield `${['evaluation', 'stage', ...free.map((p) => csvField(p.name)), 'objective'].join(',')}\n`;
  for (let at = 0; at < result.records.length; at += CSV_CHUNK_ROWS) {
    let chunk = '';
    for (let i = at; i < Math.min(result.records.length, at + CSV_CHUNK_ROWS); i++) {
      const r = result.records[i];
      chunk += `${[String(i + 1), r.stage, ...valuesOf(free, r.u).map(formatNumber), formatNumber(r.objective)].join(',')}\n`;
    }
    yield chunk;
  }
}

const r6 = (x: number): number => Number(x.toPrecision(6));
const dB = (p: number): number | null => (p > 0 ? r6(10 * Math.log10(p)) : null);

function summaryOf(setup: TuneSetup, result: SearchResult, stack: Stack): Record<string, unknown> {
  const bestValues = valuesOf(setup.free, result.best!.u);
  const warnings: string[] = [];
  setup.free.forEach((p, k) => {
    const u = result.best!.u[k];
    if (u <= 1e-6 || u >= 1 - 1e-6) {
      warnings.push(`${p.name} ended at the ${u < 0.5 ? 'lower' : 'upper'} end of its range (${formatNumber(u < 0.5 ? p.lo : p.hi)}): the best may lie beyond it; widen the range to see`);
    }
  });
  if (result.refused > 0) warnings.push(`${result.refused} evaluations were refused by the stack parser (the first: ${result.firstRefusal}); they are not in tune.csv`);
  if (!result.converged) warnings.push('the budget ran out before a local search converged; a larger --budget may find a better point');
  const counts = Object.fromEntries(STAGES.map((s) => [s, result.counts[s]]));
  const out: Record<string, unknown> = {
    goal: setup.goalText,
    method: 'exact solution (transfer matrices) for every evaluation; the FEM checks the best stack',
    seed: setup.seed,
    budget: setup.budget,
    evaluations: { total: result.records.length, ...counts, refused: result.refused },
    converged: result.converged,
    free: setup.free.map((p, k) => ({ path: p.name, range: [p.lo, p.hi], start: p.start, best: bestValues[k] })),
    best: Object.fromEntries(setup.free.map((p, k) => [p.name, bestValues[k]])),
  };
  if (setup.goal.name === 'match') Object.assign(out, matchSummary(setup, result, bestValues, warnings));
  else Object.assign(out, worstSummary(setup.goal.name, setup.goal.cases, stack, result.best!.evaluation.objective, warnings));
  out.fem_check = femCheck(setup.goal, stack);
  out.warnings = warnings;
  return out;
}

function worstSummary(name: 'min-worst-R' | 'max-worst-T', cases: readonly Case[], stack: Stack, objective: number, warnings: string[]): Record<string, unknown> {
  const which = name === 'min-worst-R' ? 'R' : 'T';
  const at = worstPower(stack, which, cases);
  const n = Math.min(MAX_FINER_POINTS, (stack.points - 1) * FINER_FACTOR + 1);
  const finer = worstPower(stack, which, cases, bandFrequencies({ ...stack, points: n }));
  if (Math.abs(finer.value - objective) > 1e-3) {
    warnings.push(`between the band's ${stack.points} points the worst ${which}_power reaches ${r6(finer.value)} (against ${r6(objective)} at the points); raise "points" in the stack file`);
  }
  const key = `worst_${which}_power`;
  return {
    cases,
    objective: {
      name: key, value: objective, dB: dB(objective),
      at: { f_GHz: r6(at.f_Hz / 1e9), angle_deg: at.case.angle_deg, polarization: at.case.polarization },
      [`on_${n}_points`]: { value: finer.value, dB: dB(finer.value), f_GHz: r6(finer.f_Hz / 1e9) },
    },
  };
}

function matchSummary(setup: TuneSetup, result: SearchResult, best: number[], warnings: string[]): Record<string, unknown> {
  const measured = (setup.goal as Extract<Goal, { name: 'match' }>).measured;
  const r = result.best!.evaluation.residuals!;
  const ss = result.best!.evaluation.cost;
  const residual = { sum_of_squares: ss, rms: Math.sqrt(ss / r.length), values: r.length, columns: measured.columns, file: measured.name };
  if (result.jacobian === null) {
    warnings.push('the Jacobian at the best point could not be evaluated, so no intervals are given');
    return { objective: { name: 'sum_of_squares', value: ss }, residual };
  }
  if (r.length <= setup.free.length) {
    warnings.push(`only ${r.length} measured values for ${setup.free.length} free parameters: no intervals (more values than parameters are needed)`);
    return { objective: { name: 'sum_of_squares', value: ss }, residual };
  }
  const inf = inferParameters(result.jacobian, r, best, setup.free.map((p) => ({ name: p.name, lo: p.lo, hi: p.hi })));
  warnings.push(...inf.warnings);
  const n = setup.free.length;
  return {
    objective: { name: 'sum_of_squares', value: ss },
    residual: { ...residual, dof: inf.dof, noise_estimate: inf.s, t_975: inf.t },
    interval_95: Object.fromEntries(setup.free.map((p, k) => [p.name, inf.interval95[k]])),
    standard_error: Object.fromEntries(setup.free.map((p, k) => [p.name, inf.standardError[k]])),
    correlation: Array.from({ length: n }, (_, a) => Array.from({ length: n }, (_, b) => r6(inf.correlation[a * n + b]))),
    condition_ratio: inf.conditionRatio,
  };
}

/** The FEM against the exact solution at the best stack (each case, or the measured frequencies). */
function femCheck(goal: Goal, stack: Stack): { rows: AgreementRow[] } | { skipped: string } {
  const runs: { stack: Stack; f: Float64Array; label: string }[] = goal.name === 'match'
    ? [{ stack, f: goal.measured.f_Hz, label: 'fem-tmm' }]
    : goal.cases.map((c) => ({
      stack: { ...stack, incidence: { angle_rad: radFromDeg(c.angle_deg), polarization: c.polarization } },
      f: bandFrequencies(stack), label: `fem-tmm ${c.polarization} ${c.angle_deg}°`,
    }));
  try {
    return { rows: runs.map((x) => roundedRow(agreementRow(x.label, solveFem(x.stack, x.f).spectrum, solveTmm(x.stack, x.f), DEFAULT_TOLERANCE))) };
  } catch (e) {
    return { skipped: e instanceof Error ? e.message : String(e) };
  }
}
