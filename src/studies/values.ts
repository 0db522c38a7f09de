// The values a study gives one path, as typed: a range `A:B:STEP` (A, A + STEP, … up to B, both ends when B
// falls on a step), a list `v1,v2,…`, or one value. Numbers are plain decimals; a path that holds a text (a
// material name, a polarization) takes texts.

import type { PathValue } from './paths.ts';

/** A value text that cannot be read; the caller adds the option or path it came from. */
export class ValueSpecError extends Error {
  override name = 'ValueSpecError';
}

/** Most values one axis may have. */
export const MAX_AXIS_VALUES = 100_000;

/** A plain decimal number as typed: 12, -0.5, .5, 1e-3 (no hex, no blanks, no "Infinity"). */
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

/** A decimal text as a finite number, or undefined. */
export function readDecimal(text: string): number | undefined {
  const t = text.trim();
  if (!DECIMAL.test(t)) return undefined;
  const x = Number(t);
  return Number.isFinite(x) ? x : undefined;
}

/** Rounds away binary noise from A + i·STEP (0.30000000000000004 → 0.3) at 12 significant digits. */
const clean = (x: number): number => Number(x.toPrecision(12)) + 0;

/** The values of `A:B:STEP`: STEP ≠ 0 and pointing from A towards B; B included when it falls on a step. */
export function rangeValues(a: number, b: number, step: number): number[] {
  if (step === 0) throw new ValueSpecError('the step of A:B:STEP must not be 0');
  if (a !== b && Math.sign(b - a) !== Math.sign(step)) {
    throw new ValueSpecError(`the step ${step} leads away from ${b}; use ${-step} to go from ${a} to ${b}`);
  }
  const n = Math.floor((b - a) / step + 1e-9) + 1;
  if (n > MAX_AXIS_VALUES) throw new ValueSpecError(`${n} values is more than the ${MAX_AXIS_VALUES} one range may give`);
  return Array.from({ length: n }, (_, i) => clean(a + i * step));
}

/**
 * The values of one spec. `kind` is the kind of value the path holds ('number', 'string', or null when the
 * key is not set: then numbers if every item reads as one, else texts).
 */
export function parseValueSpec(spec: string, kind: 'number' | 'string' | null): PathValue[] {
  const text = spec.trim();
  if (text === '') throw new ValueSpecError('no value given (write A:B:STEP, v1,v2,… or one value)');
  if (kind !== 'string' && text.includes(':')) {
    const parts = text.split(':');
    const nums = parts.map(readDecimal);
    if (parts.length !== 3 || nums.some((x) => x === undefined)) {
      throw new ValueSpecError(`"${text}" is not a range A:B:STEP of three numbers`);
    }
    return rangeValues(nums[0]!, nums[1]!, nums[2]!);
  }
  const items = text.split(',').map((s) => s.trim());
  if (items.some((s) => s === '')) throw new ValueSpecError(`"${text}" has an empty item in its list`);
  if (items.length > MAX_AXIS_VALUES) throw new ValueSpecError(`${items.length} values is more than the ${MAX_AXIS_VALUES} one list may give`);
  const nums = items.map(readDecimal);
  if (kind === 'string' || (kind === null && nums.some((x) => x === undefined))) return items;
  const bad = items.find((_, i) => nums[i] === undefined);
  if (bad !== undefined) throw new ValueSpecError(`"${bad}" is not a number`);
  return nums as number[];
}
