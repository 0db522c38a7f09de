// What a tuning will cost, before it starts: every evaluation parses the stack with the free values set and solves
// it exactly at the goal's frequencies (the band's points for each case, or the measured rows), at the exact
// solver's nominal rates (report/rates.ts); tune.csv holds a row per evaluation. The command line refuses a tuning
// over its --max-seconds or --max-output-MB from these figures, as solve and run do from theirs.

import { RATES } from '../report/rates.ts';
import type { Stack } from '../stack/types.ts';
import type { Goal } from './goals.ts';
import { FINER_FACTOR } from './tune.ts';

/** Parsing and validating the stack with the free values set, per evaluation (measured on small stacks, rounded up). */
export const PARSE_PER_EVALUATION_s = 60e-6;
/** Characters of a tune.csv row: the number, the stage, and 13 per number. */
const ROW_FIXED_CHARS = 16, CHARS_PER_NUMBER = 14;

export interface TuneEstimate { seconds: number; csv_bytes: number; evaluations: number; frequencies: number }

export function estimateTune(stack: Stack, goal: Goal, budget: number, freeCount: number): TuneEstimate {
  const regions = stack.layers.filter((l) => l.kind === 'bulk').length + 2;
  const perFrequency = RATES.tmmPerFrequency_s + regions * RATES.tmmPerRegionFrequency_s;
  const frequencies = goal.name === 'match' ? goal.measured.f_Hz.length : stack.points * goal.cases.length;
  const evaluations = budget + (goal.name === 'match' ? 2 * freeCount : 0);
  const checks = goal.name === 'match' ? frequencies : FINER_FACTOR * frequencies * 2; // the finer worst case, the FEM's share (rough)
  return {
    seconds: evaluations * (PARSE_PER_EVALUATION_s + frequencies * perFrequency) + checks * perFrequency,
    csv_bytes: evaluations * (ROW_FIXED_CHARS + CHARS_PER_NUMBER * (freeCount + 1)),
    evaluations,
    frequencies,
  };
}
