// Stack-file paths: naming one value of a stack file the way the parser's messages name it
// (`layers[1].thickness_mm`, `materials.coat.ohm_per_sq`, `materials["wet foam"].eps_r`, `band_GHz[0]`,
// `incidence.angle_deg`), reading it, and setting it on a copy of the file form. A changed file is validated by
// the normal parser, so a bad value gets the parser's own message under the same path.
//
//   const path = parsePath('layers[1].thickness_mm');
//   const r = withSettings(file, [{ path, value: 12 }]);   // ParseResult: { ok, stack, file } or { ok: false, errors }
//
// Grammar: a key, then any of `.key`, `[index]` or `["any key"]` (a JSON string); a key is a letter or "_" then
// letters, digits, "_" or "-". `formatPath` writes the canonical form (the one the parser's messages use).

import type { StackFile } from '../stack/file.ts';
import { parseStackObject, type ParseResult } from '../stack/parse.ts';
import { describe, FORBIDDEN_KEYS, isRecord, joinIndex, joinKey } from '../stack/problems.ts';

/** One step of a path: a key of an object or an index into a list. */
export type PathStep = string | number;

/** A parsed path: its steps and its canonical text. */
export interface StackPath { readonly text: string; readonly steps: readonly PathStep[] }

/** A path that cannot be read or set; the message starts with the path. */
export class PathError extends Error {
  override name = 'PathError';
  constructor(readonly path: string, detail: string) { super(`${path}: ${detail}`); }
}

/** A value a study may give a path: a number or a text (a material name, a polarization). */
export type PathValue = number | string;

/** One assignment of a case. */
export interface Setting { readonly path: StackPath; readonly value: PathValue }

const KEY_START = /[A-Za-z_]/;
const KEY_CHAR = /[A-Za-z0-9_-]/;

/** The canonical text of a path (as the parser's messages write it). */
export function formatPath(steps: readonly PathStep[]): string {
  let out = '';
  for (const s of steps) out = typeof s === 'number' ? joinIndex(out, s) : joinKey(out, s);
  return out;
}

/**
 * Reads a path at the start of `text` and returns it with the rest of the text (for `PATH=VALUES` and
 * `PATH:normal:SD`). Throws PathError for a malformed path.
 */
export function parsePathPrefix(text: string): { path: StackPath; rest: string } {
  const steps: PathStep[] = [];
  let i = 0;
  const fail = (why: string): never => {
    throw new PathError(text === '' ? '(empty path)' : text.length > 60 ? `${text.slice(0, 60)}…` : text, `${why} (at character ${i + 1})`);
  };
  const readKey = (): string => {
    const start = i;
    if (i >= text.length || !KEY_START.test(text[i])) fail('expected a key (a letter or "_" first), as in layers[1].thickness_mm');
    while (i < text.length && KEY_CHAR.test(text[i])) i++;
    return text.slice(start, i);
  };
  steps.push(readKey());
  for (;;) {
    if (text[i] === '.') { i++; steps.push(readKey()); continue; }
    if (text[i] !== '[') break;
    i++;
    if (text[i] === '"') steps.push(readQuotedKey(text, i, (end) => { i = end; }, fail));
    else {
      const start = i;
      while (i < text.length && text[i] >= '0' && text[i] <= '9') i++;
      if (i === start || (text[start] === '0' && i - start > 1)) fail('expected a list index (0, 1, 2 …) or a quoted key inside [ ]');
      steps.push(Number(text.slice(start, i)));
    }
    if (text[i] !== ']') fail('expected "]"');
    i++;
  }
  for (const s of steps) {
    if (typeof s === 'string' && FORBIDDEN_KEYS.has(s)) throw new PathError(formatPath(steps), `the key "${s}" is not allowed in a path`);
  }
  return { path: { text: formatPath(steps), steps }, rest: text.slice(i) };
}

function readQuotedKey(text: string, at: number, moveTo: (end: number) => void, fail: (why: string) => never): string {
  let j = at + 1;
  while (j < text.length && text[j] !== '"') j += text[j] === '\\' ? 2 : 1;
  if (j >= text.length) fail('a quoted key has no closing quote');
  let key: unknown;
  try { key = JSON.parse(text.slice(at, j + 1)); } catch { fail('a quoted key must be a JSON string, e.g. ["wet foam"]'); }
  moveTo(j + 1);
  return key as string;
}

/** A whole text as a path; PathError if anything follows it. */
export function parsePath(text: string): StackPath {
  const { path, rest } = parsePathPrefix(text.trim());
  if (rest !== '') throw new PathError(path.text, `unexpected "${rest.slice(0, 20)}" after the path`);
  return path;
}

/** Where a path leads in a file: the container of its last step, and whether the value is there. */
interface Place { parent: Record<string, unknown> | unknown[]; last: PathStep; present: boolean }

function locate(root: unknown, path: StackPath): Place {
  let node: unknown = root;
  const steps = path.steps;
  for (let k = 0; k < steps.length; k++) {
    const step = steps[k], here = formatPath(steps.slice(0, k + 1)), isLast = k === steps.length - 1;
    if (typeof step === 'number') {
      if (!Array.isArray(node)) throw new PathError(here, `${formatPath(steps.slice(0, k)) || 'the stack'} is not a list`);
      if (step >= node.length) {
        throw new PathError(here, `no such entry (${formatPath(steps.slice(0, k))} has ${node.length} ${node.length === 1 ? 'entry' : 'entries'}${node.length ? `, 0 … ${node.length - 1}` : ''})`);
      }
      if (isLast) return { parent: node, last: step, present: true };
      node = node[step];
      continue;
    }
    if (!isRecord(node)) {
      throw new PathError(here, `${formatPath(steps.slice(0, k)) || 'the stack'} is ${describe(node)}, not an object with keys`);
    }
    const present = Object.hasOwn(node, step);
    if (isLast) return { parent: node, last: step, present };
    if (!present) throw new PathError(here, missingKey(steps.slice(0, k), step, node));
    node = node[step];
  }
  throw new PathError('(empty path)', 'a path needs at least one key');
}

function missingKey(before: readonly PathStep[], key: string, node: Record<string, unknown>): string {
  const keys = Object.keys(node);
  if (before.length === 1 && before[0] === 'materials') {
    const defined = keys.length ? `this stack defines ${keys.map((k) => `"${k}"`).join(', ')}` : 'this stack defines none';
    return `no such user material (${defined}); to vary a catalog material, print it as a user material with ` +
      `"slabecho materials --export ${key}", add it under "materials" with a new name and use that name`;
  }
  return `no such key${keys.length ? ` (here: ${keys.join(', ')})` : ''}`;
}

/** The value at `path` in a stack file (a number, a text …); PathError when the path leads nowhere. */
export function readAt(file: StackFile | Record<string, unknown>, path: StackPath): unknown {
  const place = locate(file, path);
  if (!place.present) throw new PathError(path.text, 'not set in this stack file');
  return (place.parent as Record<string | number, unknown>)[place.last];
}

/** What kind of value a path takes: the kind it holds now, or null for an optional key not set. */
export function valueKindAt(file: StackFile, path: StackPath): 'number' | 'string' | null {
  const place = locate(file, path);
  if (!place.present) return null;
  const v = (place.parent as Record<string | number, unknown>)[place.last];
  if (typeof v === 'number') return 'number';
  if (typeof v === 'string') return 'string';
  const what = Array.isArray(v) ? 'a list' : 'an object';
  const example = Array.isArray(v) ? `${path.text}[0]` : `${path.text}.<key>`;
  throw new PathError(path.text, `holds ${what}; name one number or text in it, e.g. ${example}`);
}

/** A copy of `file` with each setting applied (not validated: see withSettings). */
export function applySettings(file: StackFile, settings: readonly Setting[]): Record<string, unknown> {
  const copy = structuredClone(file) as unknown as Record<string, unknown>;
  for (const s of settings) {
    valueKindAt(file, s.path); // refuses a path to a list or object
    const place = locate(copy, s.path);
    (place.parent as Record<string | number, unknown>)[place.last] = s.value;
  }
  return copy;
}

const touchesBand = (s: Setting): boolean => s.path.steps[0] === 'band_GHz';
const centre = (band: readonly number[]): number => (band[0] + band[1]) / 2;

/**
 * The stack file with the settings applied, validated by the normal parser: `{ok: true, stack, file, warnings}`
 * or `{ok: false, errors}` with the parser's messages (a bad value is named by its path). A path that leads
 * nowhere is one error line too. When a setting moves the band and the profile frequency sat at the old band's
 * centre (its default), it moves to the new centre.
 */
export function withSettings(file: StackFile, settings: readonly Setting[]): ParseResult {
  let changed: Record<string, unknown>;
  try {
    changed = applySettings(file, settings);
  } catch (e) {
    if (e instanceof PathError) return { ok: false, errors: [e.message] };
    throw e;
  }
  const band = changed.band_GHz;
  if (settings.some(touchesBand) && file.profile_GHz === centre(file.band_GHz) && Array.isArray(band)
    && typeof band[0] === 'number' && typeof band[1] === 'number') {
    changed.profile_GHz = centre(band);
  }
  return parseStackObject(changed);
}
