// A study's cases: the grid of every combination of its axes' values, numbered from 0 with the last axis
// varying fastest (so the cases come sorted by the first column, then the second …), and the slices a sharded
// run takes of them.

import type { PathValue, Setting, StackPath } from './paths.ts';

/** One axis: the column that names it in the tables, the path it sets, its values and the spec as typed. */
export interface Axis {
  readonly column: string;
  readonly path: StackPath;
  readonly values: readonly PathValue[];
  readonly spec: string;
}

/** Most cases one study may have. */
export const MAX_CASES = 10_000_000;

/** Number of cases (1 when there are no axes: the stack itself). */
export function caseCount(axes: readonly Axis[]): number {
  let n = 1;
  for (const a of axes) n *= a.values.length;
  return n;
}

/** The value index on each axis of case `index` (mixed radix, last axis fastest). */
export function caseIndices(axes: readonly Axis[], index: number): number[] {
  const out = new Array<number>(axes.length);
  let rest = index;
  for (let k = axes.length - 1; k >= 0; k--) {
    const n = axes[k].values.length;
    out[k] = rest % n;
    rest = Math.floor(rest / n);
  }
  return out;
}

/** The values of case `index`, one per axis. */
export const caseValues = (axes: readonly Axis[], index: number): PathValue[] =>
  caseIndices(axes, index).map((j, k) => axes[k].values[j]);

/** The settings of case `index`. */
export const caseSettings = (axes: readonly Axis[], index: number): Setting[] =>
  caseValues(axes, index).map((value, k) => ({ path: axes[k].path, value }));

/** Shard K of N (K from 0). */
export interface Shard { readonly index: number; readonly count: number }

/** The cases [from, to) shard K of N runs: contiguous, sizes differing by at most one. */
export function shardRange(total: number, shard: Shard | null): [number, number] {
  if (shard === null) return [0, total];
  return [Math.floor((shard.index * total) / shard.count), Math.floor(((shard.index + 1) * total) / shard.count)];
}

/** `K/N` as typed (0 ≤ K < N); throws with the rule when it is not. */
export function parseShard(text: string): Shard {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  const index = m ? Number(m[1]) : NaN, count = m ? Number(m[2]) : NaN;
  if (!m || !Number.isSafeInteger(index) || !Number.isSafeInteger(count) || count < 1 || index >= count) {
    throw new Error(`must be K/N with N ≥ 1 and K counting from 0 to N − 1, e.g. 0/4 … 3/4 (got "${text}")`);
  }
  return { index, count };
}
