// What every CLI command looks like, how it reads its arguments, and the errors it may throw.

import { parseArgs, type ParseArgsConfig } from 'node:util';

/** Where a command writes: one call per line (no trailing newline needed). Tests capture it. */
export interface Io {
  out(line: string): void;
  err(line: string): void;
}

let pipeGuard = false;

/** stdout/stderr of this process. A closed pipe (`slabecho materials | head`) ends the run quietly. */
export function processIo(): Io {
  if (!pipeGuard) {
    pipeGuard = true;
    for (const s of [process.stdout, process.stderr]) {
      s.on('error', (e: NodeJS.ErrnoException) => {
        if (e.code === 'EPIPE') process.exit(typeof process.exitCode === 'number' ? process.exitCode : 0);
        throw e;
      });
    }
  }
  return {
    out: (line) => { process.stdout.write(`${line}\n`); },
    err: (line) => { process.stderr.write(`${line}\n`); },
  };
}

export interface Command {
  /** As typed after `slabecho`. */
  name: string;
  /** One line for `slabecho --help`. */
  summary: string;
  /** The full text for `slabecho NAME --help`. */
  usage: string;
  /** Exit code: 0 done, 1 internal error, 2 bad input or usage. May throw CliError. */
  run(args: string[], io: Io): Promise<number>;
}

/** An error the user can fix; main prints its message (one line) and exits with `exitCode`. */
export class CliError extends Error {
  override name = 'CliError';
  constructor(message: string, readonly exitCode: 1 | 2 = 2) { super(message); }
}

/** Wrong command-line use (unknown option, missing FILE): exit 2. */
export class UsageError extends CliError {
  override name = 'UsageError';
}

/** Bad input (a missing file, an invalid stack): exit 2. */
export class InputError extends CliError {
  override name = 'InputError';
}

type Options = NonNullable<ParseArgsConfig['options']>;

/**
 * node's util.parseArgs, strict, with `--help`/`-h` added. Returns null when help was printed.
 * Positional counts are checked against `positionals` ([min, max]).
 */
export function readArgs(cmd: Pick<Command, 'name' | 'usage'>, args: string[], io: Io,
  options: Options, positionals: [number, number]): ParsedArgs | null {
  let parsed: ParsedArgs;
  try {
    parsed = parseArgs({
      args, options: { ...options, help: { type: 'boolean', short: 'h' } }, allowPositionals: true, strict: true,
    }) as ParsedArgs;
  } catch (e) {
    throw new UsageError(`${describeArgError(e)} (see slabecho ${cmd.name} --help)`);
  }
  if (parsed.values.help === true) { io.out(cmd.usage); return null; }
  const n = parsed.positionals.length;
  if (n < positionals[0]) throw new UsageError(`missing argument (see slabecho ${cmd.name} --help)`);
  if (n > positionals[1]) throw new UsageError(`unexpected argument "${parsed.positionals[positionals[1]]}" (see slabecho ${cmd.name} --help)`);
  return parsed;
}

export interface ParsedArgs {
  values: Record<string, string | boolean | (string | boolean)[] | undefined>;
  positionals: string[];
}

/** A plain decimal number as typed on a command line: 12, -0.5, .5, 1e-3 (no hex, no blanks, no "Infinity"). */
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

/**
 * The value of a numeric option, or undefined when it was not given. A text that is not a finite decimal
 * number, or one `ok` refuses, is a UsageError naming the option: `--courant: must be a number in (0, 1] (got "2")`.
 */
export function numberOption(values: ParsedArgs['values'], name: string, rule: string,
  ok: (x: number) => boolean = () => true): number | undefined {
  const text = values[name];
  if (typeof text !== 'string') return undefined;
  const x = DECIMAL.test(text.trim()) ? Number(text) : Number.NaN;
  if (!Number.isFinite(x) || !ok(x)) throw new UsageError(`--${name}: ${rule} (got "${text}")`);
  return x;
}

/** The required --out DIR of `command`; UsageError pointing to its help when it is missing or empty. */
export function outDirFromArgs(values: ParsedArgs['values'], command: string): string {
  const out = values.out;
  if (typeof out !== 'string' || out === '') throw new UsageError(`--out DIR is required (see slabecho ${command} --help)`);
  return out;
}

/** --seed: a whole number from 0 to 2³² − 1 (default 1). */
export function seedFromArgs(values: ParsedArgs['values']): number {
  return numberOption(values, 'seed', 'must be a whole number from 0 to 4294967295', (x) => Number.isInteger(x) && x >= 0 && x <= 0xffffffff) ?? 1;
}

/** node's parseArgs messages are long; keep the part a user needs. */
function describeArgError(e: unknown): string {
  const msg = e instanceof Error ? e.message : String(e);
  const code = (e as { code?: string }).code;
  const opt = (/'(-[^' ]*)/.exec(msg)?.[1]) ?? '';
  if (code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION') return `unknown option ${opt}`;
  if (code === 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE') {
    if (/argument missing/.test(msg)) return `option ${opt} needs a value`;
    if (/does not take an argument/.test(msg)) return `option ${opt} takes no value`;
    if (/ambiguous/.test(msg)) return `option ${opt} needs a value (to pass one starting with "-", write ${opt}=VALUE)`;
  }
  return msg.split(/\.\s|\n/)[0];
}
