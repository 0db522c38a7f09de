// Collecting validation problems with field paths (`layers[1].thickness_mm: must be a number > 0`),
// and small readers for JSON values that never look beyond an object's own keys. Text from the file that a
// message quotes is escaped (text.ts), so a message never carries a raw control character to the terminal.

import { escapeUnsafe } from './text.ts';

/** Keys refused anywhere in a stack file: they could reach an object's prototype. */
export const FORBIDDEN_KEYS: ReadonlySet<string> = new Set(['__proto__', 'constructor', 'prototype']);

const MAX_ERRORS = 100;

export class Problems {
  readonly errors: string[] = [];
  readonly warnings: string[] = [];
  private dropped = 0;

  error(path: string, message: string): void {
    if (this.errors.length < MAX_ERRORS) this.errors.push(`${path}: ${message}`);
    else this.dropped++;
  }

  warn(path: string, message: string): void {
    const line = `${path}: ${message}`;
    if (!this.warnings.includes(line)) this.warnings.push(line);
  }

  get count(): number { return this.errors.length + this.dropped; }

  /** The error lines, with a last line counting any left out. */
  errorLines(): string[] {
    return this.dropped > 0 ? [...this.errors, `(and ${this.dropped} more problems)`] : [...this.errors];
  }
}

/** `path.key`, or `path["odd key"]` for keys that are not plain identifiers. */
export function joinKey(path: string, key: string): string {
  if (/^[A-Za-z_][A-Za-z0-9_-]*$/.test(key)) return path === '' ? key : `${path}.${key}`;
  return `${path}[${quoteText(key)}]`;
}

export const joinIndex = (path: string, i: number): string => `${path}[${i}]`;

/** A plain object (from JSON.parse or an object literal), not an array or a class instance. */
export function isRecord(v: unknown): v is Record<string, unknown> {
  if (v === null || typeof v !== 'object' || Array.isArray(v)) return false;
  const proto = Object.getPrototypeOf(v);
  return proto === Object.prototype || proto === null;
}

/** The object's own property `key`, never an inherited one. */
export const own = (o: Record<string, unknown>, key: string): unknown =>
  Object.hasOwn(o, key) ? o[key] : undefined;

export const has = (o: Record<string, unknown>, key: string): boolean => Object.hasOwn(o, key);

/** Text in double quotes for a message, with JSON's escapes and every other unsafe character as \u{XXXX}. */
export const quoteText = (s: string): string => escapeUnsafe(JSON.stringify(s));

/** The first 40 characters of `s` (whole code points), quoted for a message. */
export const quoteShort = (s: string): string => {
  const chars = [...s];
  return quoteText(chars.length > 40 ? `${chars.slice(0, 40).join('')}…` : s);
};

/** A short description of a value for messages: `the string "12"`, `null`, `a list`, `NaN`. */
export function describe(v: unknown): string {
  if (v === null) return 'null';
  if (typeof v === 'string') return `the string ${quoteShort(v)}`;
  if (typeof v === 'number') return String(v);
  if (typeof v === 'boolean') return String(v);
  if (Array.isArray(v)) return v.length === 0 ? 'an empty list' : `a list of ${v.length}`;
  if (typeof v === 'object') return 'an object';
  return typeof v;
}

/**
 * Read a number that must satisfy `ok`; `need` says what is expected ("a number > 0").
 * Reports wrong types ("12"), NaN and ±Infinity. Returns undefined after reporting a problem.
 */
export function readNumber(p: Problems, v: unknown, path: string, need: string,
  ok: (x: number) => boolean): number | undefined {
  // JSON has no Infinity: a number that becomes one (1e400) was too large for a double.
  if (v === Infinity || v === -Infinity) {
    p.error(path, `${v > 0 ? 'too large' : 'too large a negative number'} (beyond ±1.8e308, the range of a double-precision number); must be ${need}`);
    return undefined;
  }
  if (typeof v !== 'number' || !Number.isFinite(v) || !ok(v)) {
    p.error(path, `must be ${need} (got ${describe(v)})`);
    return undefined;
  }
  return v;
}

/** Refuse own keys of `o` that are not in `allowed` (typos), suggesting the nearest allowed key. */
export function refuseUnknownKeys(p: Problems, o: Record<string, unknown>, path: string,
  allowed: readonly string[]): void {
  for (const k of Object.keys(o)) {
    if (allowed.includes(k) || FORBIDDEN_KEYS.has(k)) continue; // forbidden keys are reported once, elsewhere
    const near = suggest(k, allowed);
    p.error(joinKey(path, k), `unknown key${near ? ` (did you mean "${near}"?)` : ''}; allowed here: ${allowed.join(', ')}`);
  }
}

/** Levenshtein distance, for "did you mean" hints. */
function distance(a: string, b: string): number {
  const row = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    let prev = row[0];
    row[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const cur = row[j];
      row[j] = Math.min(row[j] + 1, row[j - 1] + 1, prev + (a[i - 1] === b[j - 1] ? 0 : 1));
      prev = cur;
    }
  }
  return row[b.length];
}

/** The candidate a typo most likely meant, or undefined. */
export function suggest(word: string, candidates: readonly string[]): string | undefined {
  const w = word.toLowerCase();
  let best: string | undefined, bestD = Infinity;
  for (const c of candidates) {
    const lc = c.toLowerCase();
    if (lc === w) return c;
    if (w.length >= 3 && (lc.startsWith(w) || w.startsWith(lc))) return c;
    const d = distance(w, lc);
    if (d < bestD) { bestD = d; best = c; }
  }
  return bestD <= Math.max(w.length <= 3 ? 1 : 2, Math.floor(w.length / 3)) ? best : undefined;
}

/**
 * Walk a parsed JSON value (without recursion, so deep nesting cannot overflow the call stack)
 * and report every forbidden key and nesting deeper than `maxDepth`.
 */
export function refuseForbiddenKeys(p: Problems, root: unknown, maxDepth = 32): void {
  const todo: { v: unknown; path: string; depth: number }[] = [{ v: root, path: '', depth: 0 }];
  const seen = new Set<object>();
  while (todo.length > 0) {
    const { v, path, depth } = todo.pop()!;
    if (v === null || typeof v !== 'object' || seen.has(v)) continue;
    seen.add(v);
    if (depth > maxDepth) { p.error(path || '(top level)', `nested deeper than ${maxDepth} levels`); continue; }
    if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) todo.push({ v: v[i], path: joinIndex(path, i), depth: depth + 1 });
      continue;
    }
    const keys = Object.keys(v);
    for (let i = keys.length - 1; i >= 0; i--) {
      const k = keys[i];
      if (FORBIDDEN_KEYS.has(k)) {
        p.error(joinKey(path, k), `the key "${k}" is not allowed anywhere in a stack file`);
        continue;
      }
      todo.push({ v: (v as Record<string, unknown>)[k], path: joinKey(path, k), depth: depth + 1 });
    }
  }
}
