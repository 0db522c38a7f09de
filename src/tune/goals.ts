// What `tune` aims at, evaluated by the exact solver (src/tmm):
//   min-worst-R   the largest reflected power fraction R_power = |R|² over the band's frequencies and every case
//                 (angle × polarization), to be made as small as possible;
//   max-worst-T   the smallest transmitted power fraction T_power = |T|² Re(Y_back)/Re(Y_front) over the same, to
//                 be made as large as possible;
//   match=FILE    the weighted sum of squared residuals against a measured response (measured.ts), at the
//                 stack's own incidence.
// A worst case is a maximum over many smooth curves, with corners where the worst frequency changes; the power
// mean (Σ vᵢ^64 / n)^{1/64} of the same values is a smooth stand-in a little below it, which the local search
// descends first (search.ts).
// The power fractions are the studies' quantities (src/studies/quantities.ts); they need a lossless front medium.

import { bandFrequencies } from '../results.ts';
import type { Polarization, Stack } from '../stack/types.ts';
import { emptyQuantities, quantitiesUnavailable, writeQuantities } from '../studies/quantities.ts';
import { stackAtFrequency } from '../tmm/media.ts';
import { solveAt } from '../tmm/recursion.ts';
import { solveTmm } from '../tmm/solve.ts';
import { radFromDeg } from '../units.ts';
import { measuredResiduals, type Measured } from './measured.ts';
import type { Evaluation } from './search.ts';
import { TuneSetupError } from './stack-access.ts';

export type GoalName = 'min-worst-R' | 'max-worst-T' | 'match';
export const GOAL_NAMES: readonly string[] = ['min-worst-R', 'max-worst-T', 'match=MEASURED.csv'];

/** The goal as typed: a name, and for match the measured file's name. */
export function parseGoal(text: string): { name: GoalName; file?: string } {
  if (text === 'min-worst-R' || text === 'max-worst-T') return { name: text };
  const m = /^match=(.+)$/.exec(text);
  if (m) return { name: 'match', file: m[1] };
  throw new TuneSetupError(`--goal: "${text}" is not a goal; one of ${GOAL_NAMES.join(', ')}`);
}

/** One incidence the worst case runs over. */
export interface Case { angle_deg: number; polarization: Polarization }

/** Where the worst value occurred. */
export interface Worst { value: number; f_Hz: number; case: Case }

export type Goal =
  | { name: 'min-worst-R' | 'max-worst-T'; cases: readonly Case[] }
  | { name: 'match'; measured: Measured };

/** Refuse a goal the stack cannot have (the power fractions need a lossless front medium; T needs a back). */
export function checkGoal(goal: Goal, stack: Stack): void {
  if (goal.name === 'match') return;
  const why = quantitiesUnavailable(stack);
  if (why !== null) throw new TuneSetupError(`--goal ${goal.name}: ${why}`);
  if (goal.name === 'max-worst-T' && stack.back === 'pec') {
    throw new TuneSetupError('--goal max-worst-T: the stack ends in a conductor ("back": "pec"), so nothing is transmitted');
  }
}

const withCase = (stack: Stack, c: Case): Stack =>
  ({ ...stack, incidence: { angle_rad: radFromDeg(c.angle_deg), polarization: c.polarization } });

/** Exponent of the power mean that stands in, smoothly, for the worst case in the local search. */
export const SMOOTH_POWER = 64;

/** R_power (which = 'R') or 1 − T_power ('T': the shortfall), case by case and frequency by frequency. */
function shortfalls(stack: Stack, which: 'R' | 'T', cases: readonly Case[], f_Hz: Float64Array): Float64Array {
  const q = emptyQuantities(1), out = new Float64Array(cases.length * f_Hz.length);
  let k = 0;
  for (const c of cases) {
    const s = withCase(stack, c);
    for (const f of f_Hz) {
      const saf = stackAtFrequency(s, f);
      const { R, T } = solveAt(saf);
      writeQuantities(q, 0, saf, R, T);
      out[k++] = which === 'R' ? q.R_power[0] : 1 - q.T_power[0];
    }
  }
  return out;
}

/** The worst R_power (largest) or T_power (smallest) over `f_Hz` (default: the band's points) and the cases. */
export function worstPower(stack: Stack, which: 'R' | 'T', cases: readonly Case[], f_Hz: Float64Array = bandFrequencies(stack)): Worst {
  const v = shortfalls(stack, which, cases, f_Hz);
  let k = 0;
  for (let i = 1; i < v.length; i++) if (v[i] > v[k]) k = i;
  const value = which === 'R' ? v[k] : 1 - v[k];
  return { value, f_Hz: f_Hz[k % f_Hz.length], case: cases[Math.floor(k / f_Hz.length)] };
}

/** The largest value and the power mean (Σ vᵢᵖ / n)^{1/p} of non-negative values (scaled by the largest, no overflow). */
function maxAndPowerMean(v: Float64Array, p: number): { max: number; mean: number } {
  let max = 0;
  for (const x of v) max = Math.max(max, x);
  if (max === 0) return { max, mean: 0 };
  let acc = 0;
  for (const x of v) acc += (Math.max(x, 0) / max) ** p;
  return { max, mean: max * Math.pow(acc / v.length, 1 / p) };
}

/** Cost (minimized), objective (the goal's own figure) and the smooth stand-in of a stack; residuals for match. */
export function evaluateGoal(goal: Goal, stack: Stack): Evaluation {
  if (goal.name === 'match') {
    const r = measuredResiduals(goal.measured, solveTmm(stack, goal.measured.f_Hz), new Float64Array(goal.measured.residualCount));
    let ss = 0;
    for (const x of r) ss += x * x;
    return { cost: ss, objective: ss, residuals: r };
  }
  const which = goal.name === 'min-worst-R' ? 'R' : 'T';
  const { max, mean } = maxAndPowerMean(shortfalls(stack, which, goal.cases, bandFrequencies(stack)), SMOOTH_POWER);
  return { cost: max, objective: which === 'R' ? max : 1 - max, smooth: mean };
}
