// Options the study commands share: --methods, --shard, --threads, --touchstone/--deembed-mm, and the progress
// line per finished case.

import { STUDY_METHODS, type StudyMethod } from '../../studies/case.ts';
import { parseShard, type Shard } from '../../studies/grid.ts';
import type { PlaneShift } from '../../studies/sparams.ts';
import { readDecimal } from '../../studies/values.ts';
import { InputError, numberOption, UsageError, type Io, type ParsedArgs } from '../command.ts';

export const STUDY_ARG_OPTIONS = {
  shard: { type: 'string' },
  threads: { type: 'string' },
  'max-output-MB': { type: 'string' },
} as const;

/** The files a study writes may total this many bytes unless --max-output-MB says otherwise. */
export const DEFAULT_OUTPUT_CAP_bytes = 50e6;

export const STUDY_ARG_USAGE = `  --shard K/N                run only the K-th of N equal slices of the cases (K from 0 to N - 1);
                             "slabecho merge" joins the shards' folders
  --threads N                worker threads (default: every core; small studies run in one)
  --max-output-MB M          the files written may total at most M megabytes (10^6 bytes; default ${DEFAULT_OUTPUT_CAP_bytes / 1e6}):
                             a study estimated above it is refused before any work`;

/** --max-output-MB in bytes. */
export function outputCapFromArgs(values: ParsedArgs['values']): number {
  const mb = numberOption(values, 'max-output-MB', 'must be a number of megabytes > 0, e.g. 500', (x) => x > 0 && x <= 1e7);
  return mb === undefined ? DEFAULT_OUTPUT_CAP_bytes : mb * 1e6;
}

/**
 * Refuses a study whose files are estimated above the cap, before any work (InputError, exit 2), naming the
 * biggest file and what to change.
 */
export function checkOutputEstimate(command: string, parts: { name: string; bytes: number }[], cap: number): void {
  const total = parts.reduce((s, p) => s + p.bytes, 0);
  if (total <= cap) return;
  const list = parts.filter((p) => p.bytes > 0).map((p) => `${p.name} ${sizeText(p.bytes)}`).join(', ');
  throw new InputError(`${command}: the output would be about ${sizeText(total)} (${list}), over the limit of ${sizeText(cap)} ` +
    `(--max-output-MB ${cap / 1e6}); raise the limit, use fewer cases, samples or points, or split the study with --shard K/N ` +
    '(each shard writes its own part); nothing was computed or written');
}

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

/** "12 MB", "340 kB": an output size for a message. */
export function sizeText(bytes: number): string {
  if (bytes >= 1e9) return `${(bytes / 1e9).toFixed(1)} GB`;
  if (bytes >= 1e6) return `${(bytes / 1e6).toFixed(1)} MB`;
  return `${Math.max(1, Math.round(bytes / 1e3))} kB`;
}
