// slabecho tune FILE --free PATH=LO:HI … --goal GOAL --out DIR: search the free values of a stack file for a goal
// (the lowest worst-case reflection, the highest worst-case transmission, or the best match to a measured
// response) and write the best stack file, the log of every evaluation and a summary. The work is in src/tune;
// this file reads the options, prints progress and writes the files. Ctrl-C: nothing is written, exit 130.

import { studyJson } from '../../studies/json-layout.ts';
import { fmtGHz } from '../../stack/warnings.ts';
import type { StackFile } from '../../stack/file.ts';
import type { Stack } from '../../stack/types.ts';
import { parseGoal, type Case, type Goal } from '../../tune/goals.ts';
import { MAX_MEASURED_ROWS, readMeasured } from '../../tune/measured.ts';
import type { SearchProgress } from '../../tune/search.ts';
import { HALTON_MAX_DIMENSIONS } from '../../tune/halton.ts';
import {
  parseAngles, parseFree, parsePolarizations, refuseClashes, TuneSetupError, type FreeParameter,
} from '../../tune/stack-access.ts';
import { runTune, type TuneSetup } from '../../tune/tune.ts';
import { DEFAULT_BUDGET, plainBytes, plainDuration, type WorkBudget } from '../../report/budget.ts';
import { estimateTune } from '../../tune/estimate.ts';
import { BUDGET_ARG_OPTIONS, budgetFromArgs } from '../budget-args.ts';
import { InputError, numberOption, outDirFromArgs, readArgs, seedFromArgs, UsageError, type Command, type Io, type ParsedArgs } from '../command.ts';
import { ensureDir, readTextFile, textFile, writeFilesAtomic } from '../io.ts';
import { reportStopped, watchInterrupt } from '../signals.ts';
import { loadOrExplain } from './solve.ts';

/** Default budget: evaluations per free parameter (the global and local stages together). */
const BUDGET_PER_PARAMETER = { search: 300, match: 100 };
const MAX_BUDGET = 1_000_000;
const PROGRESS_EVERY_MS = 500;

const USAGE = `Usage: slabecho tune FILE --free PATH=LO:HI [--free PATH=LO:HI]... --goal GOAL --out DIR [options]

Search the values of the free paths of the stack in FILE, each within LO..HI, for GOAL, solving every candidate
with the exact solution, and write into DIR (created if needed), all files together when the search is done:
  tuned.stack.json   the stack file at the best values found
  tune.csv           evaluation,stage,<one column per free path>,objective: one row per evaluation
  tune.json          the best values and objective, where the worst case lies, how far the FEM agrees on the best
                     stack, warnings; for match also the residual, interval_95 (a 95 % confidence interval per
                     free path from the Jacobian), standard errors, correlations, and a warning for any path the
                     data cannot fix

GOAL:
  min-worst-R        make the largest reflected power fraction R_power over the band (and every case) smallest
  max-worst-T        make the smallest transmitted power fraction T_power over the band (and every case) largest
  match=MEASURED.csv least squares against a measured response: columns f_GHz and any of R_re,R_im  T_re,T_im
                     R_dB  T_dB (20 log10 of |R| and |T|), and an optional weight column (≥ 0, default 1)

The search is bounded and deterministic: the stack file's own values and a quasi-random (Halton) set of starts,
then Nelder-Mead (Levenberg-Marquardt for match) from the best few. PATH is a stack-file path as error messages
name it: layers[1].thickness_mm, materials.coat.ohm_per_sq, materials["wet foam"].eps_r.

Options:
  --out DIR              output directory (required)
  --angle A:B:STEP       min-worst-R and max-worst-T: the worst case over these angles (degrees; or a list)
  --polarization TE,TM   … and these polarizations (default: the stack's own incidence)
  --seed N               seed of the start set (a whole number, default 1): the same seed, the same search
  --budget N             evaluations for the search (default ${BUDGET_PER_PARAMETER.search} per free path, ${BUDGET_PER_PARAMETER.match} for match; the
                         final Jacobian of match adds up to 2 per free path)
  --max-seconds S        refuse a tuning estimated (before any work, from the exact solver's nominal speed) to
                         take longer than S seconds (default ${DEFAULT_BUDGET.maxSeconds})
  --max-output-MB M      the files written may total at most M megabytes (default ${DEFAULT_BUDGET.maxOutput_bytes / 1e6})
  -h, --help             show this help

Progress goes to stderr. Ctrl-C stops the search: nothing is written (DIR keeps its previous files), exit 130.
Exit: 0 done, 2 invalid stack, measurement or usage (nothing written), 1 internal error.
A design found here is a model's optimum: build and measure it before relying on it, above all where shielding
or exposure limits matter (see the README's cautions).`;

export const tune: Command = {
  name: 'tune',
  summary: 'search free values of a stack for the lowest worst reflection, highest worst transmission, or a measured response',
  usage: USAGE,
  async run(args, io) {
    const a = readArgs(tune, args, io, {
      out: { type: 'string' }, free: { type: 'string', multiple: true }, goal: { type: 'string' },
      angle: { type: 'string' }, polarization: { type: 'string' }, seed: { type: 'string' }, budget: { type: 'string' },
      ...BUDGET_ARG_OPTIONS,
    }, [1, 1]);
    if (a === null) return 0;
    const out = outDirFromArgs(a.values, 'tune');
    if (typeof a.values.goal !== 'string') throw new UsageError('--goal is required: min-worst-R, max-worst-T or match=MEASURED.csv (see slabecho tune --help)');
    const freeTexts = (a.values.free as string[] | undefined) ?? [];
    if (freeTexts.length === 0) throw new UsageError('--free PATH=LO:HI is required, at least once (see slabecho tune --help)');
    const path = a.positionals[0];
    const { file, stack } = loadOrExplain(path, io);
    const setup = asUsage(() => setupFromArgs(a.values, file, stack, freeTexts, io));
    const limits = budgetFromArgs(a.values);
    refuseOversized(setup, stack, limits.budget, limits.limitNames, io);
    return runAndWrite(setup, out, io, limits);
  },
};

/** A TuneSetupError is the user's to fix: exit 2 with its message. */
function asUsage<T>(work: () => T): T {
  try { return work(); } catch (e) {
    if (e instanceof TuneSetupError) throw new UsageError(e.message);
    throw e;
  }
}

function setupFromArgs(values: ParsedArgs['values'], file: StackFile, stack: Stack, freeTexts: string[], io: Io): TuneSetup {
  if (freeTexts.length > HALTON_MAX_DIMENSIONS) throw new TuneSetupError(`--free: at most ${HALTON_MAX_DIMENSIONS} free paths (got ${freeTexts.length})`);
  const free: FreeParameter[] = freeTexts.map((t) => parseFree(t, file));
  const angleSpec = values.angle, polSpec = values.polarization;
  refuseClashes(free, typeof angleSpec === 'string', typeof polSpec === 'string');
  const goalText = values.goal as string;
  const parsed = parseGoal(goalText);
  let goal: Goal;
  if (parsed.name === 'match') {
    if (typeof angleSpec === 'string' || typeof polSpec === 'string') {
      throw new TuneSetupError('--angle and --polarization go with min-worst-R and max-worst-T; match uses the stack\'s own incidence');
    }
    const r = readMeasured(readTextFile(parsed.file!, '--goal match:', MAX_MEASURED_ROWS * 200), parsed.file!, stack);
    if (!r.ok) {
      for (const line of r.errors) io.err(`--goal match: ${line}`);
      throw new InputError(`--goal match: ${parsed.file}: ${r.errors.length} problem${r.errors.length === 1 ? '' : 's'}; nothing was computed or written`);
    }
    goal = { name: 'match', measured: r.measured };
  } else {
    const angles = typeof angleSpec === 'string' ? parseAngles(angleSpec, file) : [file.incidence.angle_deg];
    const pols = typeof polSpec === 'string' ? parsePolarizations(polSpec) : [file.incidence.polarization];
    const cases: Case[] = angles.flatMap((angle_deg) => pols.map((polarization) => ({ angle_deg, polarization })));
    goal = { name: parsed.name, cases };
  }
  const perParameter = parsed.name === 'match' ? BUDGET_PER_PARAMETER.match : BUDGET_PER_PARAMETER.search;
  const seed = seedFromArgs(values);
  const budget = numberOption(values, 'budget', `must be a whole number from ${free.length + 2} to ${MAX_BUDGET}`,
    (x) => Number.isInteger(x) && x >= free.length + 2 && x <= MAX_BUDGET) ?? perParameter * free.length;
  return { file, free, goal, goalText, seed, budget };
}

/** A tuning estimated over --max-seconds or --max-output-MB is refused before it starts, saying what to change. */
function refuseOversized(setup: TuneSetup, stack: Stack, budget: WorkBudget, names: { output?: string; seconds?: string }, io: Io): void {
  const e = estimateTune(stack, setup.goal, setup.budget, setup.free.length);
  const what = `${e.evaluations} evaluations × ${e.frequencies} frequencies`;
  io.err(`tune: ${what}, estimated ${plainDuration(e.seconds)}`);
  if (e.seconds > budget.maxSeconds) {
    throw new InputError(`this tuning would take ${plainDuration(e.seconds)} of computing (${what}; limit ${names.seconds}): ` +
      'lower --budget, the stack\'s "points" or the number of angles and polarizations, or raise --max-seconds; nothing was computed or written');
  }
  if (e.csv_bytes > budget.maxOutput_bytes) {
    throw new InputError(`tune.csv would hold about ${plainBytes(e.csv_bytes)} (a row per evaluation; limit ${names.output}): ` +
      'lower --budget or raise --max-output-MB; nothing was computed or written');
  }
}

/** Progress on stderr, at most one line per PROGRESS_EVERY_MS. */
function progressPrinter(io: Io, setup: TuneSetup): (p: SearchProgress) => void {
  let last = 0;
  const figure = setup.goal.name === 'match' ? 'sum of squares' : setup.goal.name === 'min-worst-R' ? 'worst R_power' : 'worst T_power';
  return (p) => {
    const t = Date.now();
    if (t - last < PROGRESS_EVERY_MS) return;
    last = t;
    io.err(`tune: ${p.evaluations}/${p.budget} evaluations (${p.stage}), best ${figure} ${Number.isFinite(p.bestObjective) ? p.bestObjective.toPrecision(4) : '–'}`);
  };
}

async function runAndWrite(setup: TuneSetup, out: string, io: Io, limits: ReturnType<typeof budgetFromArgs>): Promise<number> {
  const cases = setup.goal.name === 'match' ? 1 : setup.goal.cases.length;
  io.err(`tune: ${setup.free.length} free path${setup.free.length === 1 ? '' : 's'}, goal ${setup.goalText}, ${cases} case${cases === 1 ? '' : 's'}, budget ${setup.budget}, seed ${setup.seed}`);
  const interrupt = watchInterrupt();
  let outcome;
  try {
    outcome = await runTune(setup, { onProgress: progressPrinter(io, setup), shouldStop: interrupt.interrupted });
  } catch (e) {
    if (e instanceof TuneSetupError) throw new UsageError(e.message);
    throw e;
  } finally {
    interrupt.dispose();
  }
  if (outcome.stopped || interrupt.interrupted()) return reportStopped(io, 'tune');
  ensureDir(out);
  const written = writeFilesAtomic(out, [
    textFile('tuned.stack.json', studyJson(outcome.tunedFile)),
    { name: 'tune.csv', chunks: outcome.csv() },
    textFile('tune.json', studyJson(outcome.summary)),
  ], { maxBytes: limits.budget.maxOutput_bytes, limitName: limits.limitNames.output });
  printResult(io, setup, outcome.summary);
  io.out(`wrote ${written.join(', ')}`);
  return 0;
}

function printResult(io: Io, setup: TuneSetup, s: Record<string, unknown>): void {
  const best = s.best as Record<string, number>;
  const iv = s.interval_95 as Record<string, [number, number] | null> | undefined;
  for (const p of setup.free) {
    const i = iv?.[p.name];
    io.out(`${p.name} = ${best[p.name].toPrecision(7)}${i ? ` (95 %: ${i[0].toPrecision(6)} to ${i[1].toPrecision(6)})` : iv ? ' (not identifiable)' : ''}`);
  }
  const o = s.objective as { name: string; value: number; dB?: number | null; at?: { f_GHz: number; angle_deg: number; polarization: string } };
  io.out(`${o.name.replace(/_/g, ' ')} ${o.value.toPrecision(5)}${o.dB != null ? ` (${o.dB.toFixed(2)} dB)` : ''}` +
    (o.at ? ` at ${fmtGHz(o.at.f_GHz)} GHz, ${o.at.polarization} ${o.at.angle_deg}°` : ''));
  for (const w of s.warnings as string[]) io.err(`warning: ${w}`);
}
