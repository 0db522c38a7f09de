// Everything `tune` needs of stack-file paths and incidence lists, in one place, over the studies' path API
// (src/studies/paths.ts: the parser's own field paths, set on a copy of the file form and re-validated by the
// parser) and its value specs (src/studies/values.ts). A free parameter is `PATH=LO:HI`; its bounds are checked
// by the parser when it is read, so a bound the stack cannot take is refused before any search, in the parser's
// words under the user's path. Angles and polarizations are read as `sweep` reads them (src/studies/sweep-axes.ts).

import type { StackFile } from '../stack/file.ts';
import type { ParseResult } from '../stack/parse.ts';
import type { Polarization } from '../stack/types.ts';
import { parsePathPrefix, PathError, readAt, valueKindAt, withSettings, type StackPath } from '../studies/paths.ts';
import { ANGLE_PATH, angleAxis, POLARIZATION_PATH, polarizationAxis } from '../studies/sweep-axes.ts';
import { readDecimal, ValueSpecError } from '../studies/values.ts';

/** A problem with what the user asked for (a --free, --angle or --polarization value); the message names it. */
export class TuneSetupError extends Error {
  override name = 'TuneSetupError';
}

export interface FreeParameter {
  readonly path: StackPath;
  /** The path as the parser writes it (`layers[1].thickness_mm`). */
  readonly name: string;
  readonly lo: number;
  readonly hi: number;
  /** The stack file's own value. */
  readonly start: number;
}

/** `PATH=LO:HI` against the stack file: a number the file holds, LO < HI, and both bounds acceptable to the parser. */
export function parseFree(text: string, file: StackFile): FreeParameter {
  let path: StackPath, rest: string;
  try {
    ({ path, rest } = parsePathPrefix(text.trim()));
    if (valueKindAt(file, path) !== 'number') {
      throw new PathError(path.text, valueKindAt(file, path) === null ? 'not set in this stack file; write its value there first' : 'holds a text; only a number can be tuned');
    }
  } catch (e) {
    if (e instanceof PathError) throw new TuneSetupError(`--free ${text}: ${e.message}`);
    throw e;
  }
  const m = /^=([^:]*):([^:]*)$/.exec(rest);
  const lo = m ? readDecimal(m[1]) : undefined, hi = m ? readDecimal(m[2]) : undefined;
  if (lo === undefined || hi === undefined) throw new TuneSetupError(`--free ${text}: write ${path.text}=LO:HI with two numbers, e.g. ${path.text}=2:12`);
  if (!(lo < hi)) throw new TuneSetupError(`--free ${text}: LO must be below HI (got ${lo} and ${hi})`);
  for (const bound of [lo, hi]) {
    const r = withSettings(file, [{ path, value: bound }]);
    if (!r.ok) throw new TuneSetupError(`--free ${text}: the stack is refused at ${path.text} = ${bound}: ${r.errors[0]}`);
  }
  return { path, name: path.text, lo, hi, start: readAt(file, path) as number };
}

/** The stack file with the free parameters at `values` (same order), validated by the parser. */
export const fileWith = (file: StackFile, free: readonly FreeParameter[], values: readonly number[]): ParseResult =>
  withSettings(file, free.map((p, k) => ({ path: p.path, value: values[k] })));

/** Free parameters given twice, or one that --angle / --polarization also sets: refused. */
export function refuseClashes(free: readonly FreeParameter[], angles: boolean, polarizations: boolean): void {
  const seen = new Set<string>();
  for (const p of free) {
    if (seen.has(p.name)) throw new TuneSetupError(`--free ${p.name}: given twice; give each path once`);
    seen.add(p.name);
    if (angles && p.name === ANGLE_PATH.text) throw new TuneSetupError(`--free ${p.name}: --angle sets it too; give one of them`);
  }
  if (polarizations && seen.has(POLARIZATION_PATH.text)) throw new TuneSetupError('--polarization: the polarization is not a number to tune');
}

/** `--angle A:B:STEP` (or a list), each angle one the parser accepts for this stack (0 ≤ angle < 90). */
export function parseAngles(spec: string, file: StackFile): number[] {
  let values: number[];
  try { values = angleAxis(spec).values as number[]; } catch (e) {
    if (e instanceof ValueSpecError) throw new TuneSetupError(`--angle: ${e.message}`);
    throw e;
  }
  for (const a of values) {
    const r = withSettings(file, [{ path: ANGLE_PATH, value: a }]);
    if (!r.ok) throw new TuneSetupError(`--angle: ${r.errors[0]}`);
  }
  return values;
}

/** `--polarization TE,TM` (either or both). */
export function parsePolarizations(spec: string): Polarization[] {
  try { return polarizationAxis(spec).values as Polarization[]; } catch (e) {
    if (e instanceof ValueSpecError) throw new TuneSetupError(`--polarization: ${e.message}`);
    throw e;
  }
}
