// What `tune` aims at, evaluated by the exact solver (src/tmm):
//   min-worst-R   the largest reflected power fraction R_power = |R|² over the band's frequencies and every case
//                 (angle × polarization), to be made as small as possible;
//   max-worst-T   the smallest transmitted power fraction T_power = |T|² Re(Y_back)/Re(Y_front) over the same, to
//                 be made as large as possible;
//   match=FILE    the weighted sum of squared residuals against a measured response (measured.ts), at the
//                 stack's own incidence.
// The power fractions are the studies' quantities (src/studies/quantities.ts); they need a lossless front medium.

import { bandFrequencies } from '../results.ts';
import type { Polarization, Stack } from '../stack/types.ts';
import { emptyQuantities, quantitiesUnavailable, writeQuantities } from '../studies/quantities.ts';
import { stackAtFrequency } from '../tmm/media.ts';
import { solveAt } from '../tmm/recursion.ts';
import { solveTmm } from '../tmm/solve.ts';
import { radFromDeg } from '../units.ts';
import { measuredResiduals, type Measured } from './measured.ts';
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

/** The worst R_power (largest) or T_power (smallest) over `f_Hz` (default: the band's points) and the cases. */
export function worstPower(stack: Stack, which: 'R' | 'T', cases: readonly Case[], f_Hz: Float64Array = bandFrequencies(stack)): Worst {
  const q = emptyQuantities(1);
  let worst: Worst | null = null;
  for (const c of cases) {
    const s = withCase(stack, c);
    for (const f of f_Hz) {
      const saf = stackAtFrequency(s, f);
      const { R, T } = solveAt(saf);
      writeQuantities(q, 0, saf, R, T);
      const v = which === 'R' ? q.R_power[0] : q.T_power[0];
      if (worst === null || (which === 'R' ? v > worst.value : v < worst.value)) worst = { value: v, f_Hz: f, case: c };
    }
  }
  return worst!;
}

/** Cost (minimized) and objective (the goal's own figure) of a stack; residuals for match. */
export function evaluateGoal(goal: Goal, stack: Stack): { cost: number; objective: number; residuals?: Float64Array } {
  if (goal.name === 'match') {
    const r = measuredResiduals(goal.measured, solveTmm(stack, goal.measured.f_Hz), new Float64Array(goal.measured.residualCount));
    let ss = 0;
    for (const x of r) ss += x * x;
    return { cost: ss, objective: ss, residuals: r };
  }
  const w = worstPower(stack, goal.name === 'min-worst-R' ? 'R' : 'T', goal.cases);
  return { cost: goal.name === 'min-worst-R' ? w.value : 1 - w.value, objective: w.value };
}
