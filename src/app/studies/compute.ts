// The workbench's design studies, run in a worker with the studies and tuning cores unchanged: a sweep over one
// stack-file path (src/studies: setAxis, caseStack, solveExactWithQuantities, as `slabecho sweep` runs each case),
// a tolerance study (drawSamples, runToleranceSample, SampleTable, as `slabecho tolerance`), and a tuning
// (src/tune runTune, as `slabecho tune`). DOM-free; every problem comes back as the core's own message.

import type { StackFile } from '../../stack/file.ts';
import { parseStackObject, type ParseResult } from '../../stack/parse.ts';
import { bandFrequencies } from '../../results.ts';
import type { Stack } from '../../stack/types.ts';
import { solveExactWithQuantities } from '../../studies/exact.ts';
import { caseCount, type Axis } from '../../studies/grid.ts';
import { PathError } from '../../studies/paths.ts';
import { QUANTITY_NAMES, type QuantityName } from '../../studies/quantities.ts';
import { setAxis } from '../../studies/sweep-axes.ts';
import { caseStack, type SweepPlan } from '../../studies/sweep.ts';
import { drawSamples, parseVary, SampleTable, runToleranceSample, sampleStack, type TolerancePlan } from '../../studies/tolerance.ts';
import { ValueSpecError } from '../../studies/values.ts';
import type { Column } from '../../report/table.ts';
import { readMeasured } from '../../tune/measured.ts';
import { parseAngles, parseFree, parsePolarizations, refuseClashes, TuneSetupError } from '../../tune/stack-access.ts';
import { runTune, type TuneSetup } from '../../tune/tune.ts';
import type { Case, Goal } from '../../tune/goals.ts';
import type { SearchProgress } from '../../tune/search.ts';

/** A problem the user can fix: its lines are shown as they are. */
export class StudyInputError extends Error {
  constructor(readonly lines: string[]) { super(lines[0] ?? 'invalid study'); }
}

/** Most frequency evaluations one workbench study may take (the command line has no such limit). */
export const MAX_EVALUATIONS = 2_000_000;

export type Progress = (fraction: number, note: string) => void;

function parsed(file: unknown): Extract<ParseResult, { ok: true }> {
  const r = parseStackObject(file);
  if (!r.ok) throw new StudyInputError(r.errors);
  return r;
}

/**
 * Core errors about what was typed become input errors: a path or value spec under `field`; a tuning setup's as
 * the tuning core words it (it names the option, `--free layers[9].thickness_mm=1:2`, as the command line has it).
 */
function asInput<T>(field: string, work: () => T): T {
  try { return work(); } catch (e) {
    if (e instanceof PathError || e instanceof ValueSpecError) throw new StudyInputError([`${field}: ${e.message}`]);
    if (e instanceof TuneSetupError) throw new StudyInputError([e.message]);
    throw e;
  }
}

function refuseLarge(what: string, evaluations: number, change: string): void {
  if (evaluations > MAX_EVALUATIONS) {
    throw new StudyInputError([`${what}: ${evaluations.toLocaleString('en')} frequency evaluations is more than the workbench runs (${MAX_EVALUATIONS.toLocaleString('en')}); ${change}, or run it with the command line`]);
  }
}

// ---- sweep -------------------------------------------------------------------------------------

export interface SweepResult {
  /** The swept path and its values (numbers: the map's y axis). */
  path: string;
  values: number[];
  f_GHz: Float64Array;
  /** Each quantity, case-major: [case · points + frequency]. */
  quantities: Record<QuantityName, Float64Array>;
  warnings: string[];
}

/** A sweep of `axisText` (PATH=VALUES, as --set takes it) over the stack, every case solved exactly with its quantities. */
export function runSweep(file: unknown, axisText: string, progress: Progress): SweepResult {
  const r = parsed(file);
  const axis: Axis = asInput('sweep over', () => setAxis(axisText, r.file));
  if (axis.values.some((v) => typeof v !== 'number')) throw new StudyInputError([`sweep over: ${axis.path.text} takes texts; the map needs numbers (sweep texts with the command line)`]);
  const plan: SweepPlan = { base: r.file, axes: [axis], methods: ['tmm'], fem: {}, pulse: {}, touchstone: null };
  const cases = caseCount(plan.axes), points = r.stack.points;
  refuseLarge('sweep', cases * points, 'use fewer values or fewer "points" in the stack');
  const stacks = validCases(plan, cases);
  const quantities = Object.fromEntries(QUANTITY_NAMES.map((q) => [q, new Float64Array(cases * points)])) as Record<QuantityName, Float64Array>;
  const warnings = new Set<string>();
  let f_GHz = new Float64Array(0);
  stacks.forEach((c, i) => {
    const f_Hz = bandFrequencies(c.stack);
    const exact = solveExactWithQuantities(c.stack, f_Hz);
    for (const q of QUANTITY_NAMES) quantities[q].set(exact.quantities[q], i * points);
    if (i === 0) f_GHz = Float64Array.from(f_Hz, (f) => f * 1e-9);
    for (const w of c.warnings) warnings.add(w);
    progress((i + 1) / cases, `case ${i + 1} of ${cases}`);
  });
  return { path: axis.path.text, values: axis.values as number[], f_GHz, quantities, warnings: [...warnings] };
}

/** Every case's stack, validated like a stack file before any work (the first problems listed). */
function validCases(plan: SweepPlan, cases: number): Array<{ stack: Stack; warnings: string[] }> {
  const out: Array<{ stack: Stack; warnings: string[] }> = [], errors: string[] = [];
  for (let i = 0; i < cases; i++) {
    const c = caseStack(plan, i);
    if (c.ok) out.push(c); else errors.push(...c.errors);
  }
  if (errors.length > 0) throw new StudyInputError(errors.slice(0, 10));
  return out;
}

// ---- tolerance ---------------------------------------------------------------------------------

export interface ToleranceResult {
  /** tolerance.csv's columns: f_GHz, then <quantity>_p05, _p50, _p95. */
  columns: Column[];
  samples: number;
  seed: number;
  varies: string[];
  warnings: string[];
}

/** A tolerance study: `varySpecs` (PATH:normal:SD or PATH:uniform:HALF, as --vary takes them), `samples` drawn with `seed`. */
export function runTolerance(file: unknown, varySpecs: string[], samples: number, seed: number, progress: Progress): ToleranceResult {
  const r = parsed(file);
  if (varySpecs.length === 0) throw new StudyInputError(['vary: give at least one PATH:normal:SD or PATH:uniform:HALF']);
  const varies = varySpecs.map((s) => asInput(`vary ${s}`, () => parseVary(s, r.file)));
  const plan: TolerancePlan = { base: r.file, varies, samples, seed };
  refuseLarge('tolerance', samples * r.stack.points, 'use fewer samples or fewer "points" in the stack');
  const values = drawSamples(plan);
  const errors: string[] = [];
  for (let s = 0; s < samples && errors.length < 10; s++) {
    const c = sampleStack(plan, values, s);
    if (!c.ok) errors.push(...c.errors);
  }
  if (errors.length > 0) throw new StudyInputError(errors.slice(0, 10));
  const f_Hz = bandFrequencies(r.stack);
  const table = new SampleTable(f_Hz.length, samples);
  const warnings = new Set<string>();
  for (let s = 0; s < samples; s++) {
    const out = runToleranceSample(plan, values, s);
    table.add(s, out.quantities, out.extremes);
    for (const w of out.warnings) warnings.add(w);
    if (s % 16 === 15 || s === samples - 1) progress((s + 1) / samples, `sample ${s + 1} of ${samples}`);
  }
  return { columns: table.percentileColumns(f_Hz), samples, seed, varies: varySpecs, warnings: [...warnings] };
}

// ---- tuning ------------------------------------------------------------------------------------

export interface TuneRequest {
  free: string[];
  goal: 'min-worst-R' | 'max-worst-T' | 'match';
  /** For the worst-case goals: angles (A:B:STEP or a list) and polarizations (TE, TM or TE,TM); empty: the stack's own. */
  angles: string;
  polarizations: string;
  /** For match: the measured CSV's name and text. */
  measured: { name: string; text: string } | null;
  seed: number;
  budget: number;
}

export interface TuneResult {
  tunedFile: StackFile | null;
  summary: Record<string, unknown>;
  stopped: boolean;
}

/** The tuning `slabecho tune` would run for these settings. */
export function tuneSetup(file: StackFile, stack: Stack, q: TuneRequest): TuneSetup {
  if (q.free.length === 0) throw new StudyInputError(['free: give at least one PATH=LO:HI']);
  const free = q.free.map((t) => asInput('free', () => parseFree(t, file)));
  const angles = q.angles.trim(), pols = q.polarizations.trim();
  asInput('free', () => refuseClashes(free, angles !== '', pols !== ''));
  let goal: Goal;
  if (q.goal === 'match') {
    if (q.measured === null) throw new StudyInputError(['goal match: load a measured CSV first (columns f_GHz and any of R_re,R_im, T_re,T_im, R_dB, T_dB)']);
    const m = readMeasured(q.measured.text, q.measured.name, stack);
    if (!m.ok) throw new StudyInputError(m.errors);
    goal = { name: 'match', measured: m.measured };
  } else {
    const a = angles !== '' ? asInput('angles', () => parseAngles(angles, file)) : [file.incidence.angle_deg];
    const p = pols !== '' ? asInput('polarizations', () => parsePolarizations(pols)) : [file.incidence.polarization];
    const cases: Case[] = a.flatMap((angle_deg) => p.map((polarization) => ({ angle_deg, polarization })));
    goal = { name: q.goal, cases };
  }
  const goalText = q.goal === 'match' ? `match=${q.measured!.name}` : q.goal;
  if (!(Number.isInteger(q.budget) && q.budget >= free.length + 2)) throw new StudyInputError([`budget: must be a whole number of at least ${free.length + 2} (got ${q.budget})`]);
  return { file, free, goal, goalText, seed: q.seed, budget: q.budget };
}

/** Run the tuning; progress as the search reports it. */
export async function runTuning(file: unknown, q: TuneRequest, progress: Progress): Promise<TuneResult> {
  const r = parsed(file);
  const setup = tuneSetup(r.file, r.stack, q);
  const cases = setup.goal.name === 'match' ? 1 : setup.goal.cases.length;
  refuseLarge('tuning', setup.budget * cases * (setup.goal.name === 'match' ? setup.goal.measured.f_Hz.length : r.stack.points), 'lower the budget or the stack\'s "points"');
  const onProgress = (p: SearchProgress): void => progress(Math.min(1, p.evaluations / p.budget), `${p.stage}: ${p.evaluations} of ${p.budget} evaluations, best ${p.bestObjective.toPrecision(5)}`);
  const out = await asyncInput(() => runTune(setup, { onProgress }));
  return { tunedFile: out.tunedFile, summary: out.summary, stopped: out.stopped };
}

async function asyncInput<T>(work: () => Promise<T>): Promise<T> {
  try { return await work(); } catch (e) {
    if (e instanceof TuneSetupError) throw new StudyInputError([e.message]);
    throw e;
  }
}
