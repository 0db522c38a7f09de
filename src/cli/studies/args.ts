// Options the study commands share: --methods, --shard, --threads, --touchstone/--deembed-mm (--max-output-MB is
// budget-args.ts's), the check of every case before any work, and the progress line per finished case.

import { STUDY_METHODS, type StudyMethod } from '../../studies/case.ts';
import { parseShard, type Shard } from '../../studies/grid.ts';
import type { PlaneShift } from '../../studies/sparams.ts';
import { readDecimal } from '../../studies/values.ts';
import { DEFAULT_BUDGET } from '../../report/budget.ts';
import { BUDGET_ARG_OPTIONS } from '../budget-args.ts';
import { InputError, numberOption, UsageError, type Io, type ParsedArgs } from '../command.ts';

export const STUDY_ARG_OPTIONS = {
  shard: { type: 'string' },
  threads: { type: 'string' },
  'max-output-MB': BUDGET_ARG_OPTIONS['max-output-MB'],
} as const;

export const STUDY_ARG_USAGE = `  --shard K/N                run only the K-th of N equal slices of the cases (K from 0 to N - 1);
                             "slabecho merge" joins the shards' folders
  --threads N                worker threads (default: every core; small studies run in one)
  --max-output-MB M          the files written may total at most M megabytes (10^6 bytes; default ${DEFAULT_BUDGET.maxOutput_bytes / 1e6}):
                             a study estimated above it is refused before any work`;

/** --methods tmm,fem,fdtd: the exact solution always, the others as listed (default tmm,fem). */
export function methodsFromArgs(values: ParsedArgs['values']): StudyMethod[] {
  const text = values.methods;
  if (typeof text !== 'string') return ['tmm', 'fem'];
  const items = text.split(',').map((s) => s.trim().toLowerCase()).filter((s) => s !== '');
  const bad = items.find((m) => !(STUDY_METHODS as readonly string[]).includes(m));
  if (bad !== undefined) throw new UsageError(`--methods: "${bad}" is not a method; choose from ${STUDY_METHODS.join(', ')} (got "${text}")`);
  return STUDY_METHODS.filter((m) => m === 'tmm' || items.includes(m));
}

export function shardFromArgs(values: ParsedArgs['values']): Shard | null {
  const text = values.shard;
  if (typeof text !== 'string') return null;
  try { return parseShard(text); } catch (e) { throw new UsageError(`--shard: ${(e as Error).message}`); }
}

export function threadsFromArgs(values: ParsedArgs['values']): number | undefined {
  return numberOption(values, 'threads', 'must be a whole number ≥ 1', (x) => Number.isInteger(x) && x >= 1 && x <= 1024);
}

export const TOUCHSTONE_ARG_OPTIONS = {
  touchstone: { type: 'boolean' },
  'deembed-mm': { type: 'string' },
} as const;

export const TOUCHSTONE_ARG_USAGE = `  --touchstone              also write Touchstone 2.0 S-parameters (.s2p, or .s1p behind a conductor),
                             referenced to each half-space's wave impedance at the case's angle and polarization
  --deembed-mm FRONT,BACK    move the reference planes FRONT mm into the front half-space and BACK mm into the
                             back one (default 0,0: the stack's faces; negative values move them into the stack)`;

/** The Touchstone reference-plane shifts, or null without --touchstone. */
export function touchstoneFromArgs(values: ParsedArgs['values']): PlaneShift | null {
  const text = values['deembed-mm'];
  if (values.touchstone !== true) {
    if (typeof text === 'string') throw new UsageError('--deembed-mm moves the Touchstone reference planes: give --touchstone too');
    return null;
  }
  if (typeof text !== 'string') return { front_m: 0, back_m: 0 };
  const parts = text.split(',').map(readDecimal);
  if (parts.length !== 2 || parts.some((x) => x === undefined || Math.abs(x) > 1e6)) {
    throw new UsageError(`--deembed-mm: must be two numbers of millimetres FRONT,BACK, e.g. 10,10 (got "${text}")`);
  }
  return { front_m: parts[0]! * 1e-3, back_m: parts[1]! * 1e-3 };
}

/**
 * A line on stderr per finished case once the study has run for a second, at most four a second (each line says
 * how many are done, so a skipped line loses nothing): `sweep: case 17 of 400 done (4 %), 12.3 s`.
 */
export function caseProgress(io: Io, command: string, noun: string, total: number): (done: number, index: number) => void {
  const start = Date.now();
  let last = 0;
  return (done, index) => {
    const t = Date.now();
    if (t - start < 1000 || (t - last < 250 && done < total)) return;
    last = t;
    io.err(`${command}: ${noun} ${index} done, ${done} of ${total} (${Math.floor((100 * done) / total)} %), ${((t - start) / 1000).toFixed(1)} s`);
  };
}

/** At most this many problems are listed when cases or samples are invalid. */
const MAX_LISTED = 10;

/**
 * Every task of [from, to) checked like a stack file before any work: InputError counting the invalid ones
 * (`noun`: "case" or "sample"), after listing the first problems on stderr against the stack file's `path`.
 */
export function refuseInvalidTasks(from: number, to: number, check: (k: number) => { ok: boolean; errors?: readonly string[] },
  noun: string, io: Io, path: string): void {
  const problems: string[] = [];
  let bad = 0;
  for (let k = from; k < to; k++) {
    const c = check(k);
    if (c.ok) continue;
    bad++;
    for (const e of c.errors ?? []) if (problems.length < MAX_LISTED) problems.push(e);
  }
  if (bad === 0) return;
  for (const p of problems) io.err(`${path}: ${p}`);
  throw new InputError(`${bad} of ${to - from} ${noun}s ${bad === 1 ? 'is' : 'are'} invalid; nothing was computed or written`);
}
