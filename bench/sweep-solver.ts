// The exact solver with its quantities over the 10 000 cases of bench/sweep.ts, in one thread (the cases parsed
// first, not timed). bench/sweep.ts bundles and runs this file, so it is measured as the CLI runs it (tsx would add
// its module accessors to every call). Prints one JSON line.

import { bandFrequencies } from '../src/results.ts';
import { parseStackObject } from '../src/stack/parse.ts';
import { solveExactWithQuantities } from '../src/studies/exact.ts';
import { caseCount } from '../src/studies/grid.ts';
import { angleAxis, polarizationAxis, setAxis, sweepAxes } from '../src/studies/sweep-axes.ts';
import { caseStack, type SweepPlan } from '../src/studies/sweep.ts';

export const AXES = { angle: '0:49:1', polarization: 'TE,TM', set: 'layers[1].thickness_mm=4:8.95:0.05' };

export const panel = (points: number) => ({
  title: 'Sandwich panel (invented)', band_GHz: [8, 12], points,
  materials: { skin: { model: 'fixed', eps_r: 4.2, sigma_S_per_m: 0.02 }, core: { model: 'fixed', eps_r: 1.1 } },
  layers: [{ material: 'skin', thickness_mm: 0.8 }, { material: 'core', thickness_mm: 6 }, { material: 'skin', thickness_mm: 0.8 }],
});

function planFor(points: number): SweepPlan {
  const r = parseStackObject(panel(points));
  if (!r.ok) throw new Error(r.errors.join('\n'));
  const axes = sweepAxes(angleAxis(AXES.angle), polarizationAxis(AXES.polarization), [setAxis(AXES.set, r.file)]);
  return { base: r.file, axes, methods: ['tmm'], fem: {}, pulse: {}, touchstone: null };
}

export function solverOnly(points: number): { cases: number; parse_seconds: number; seconds: number } {
  const plan = planFor(points);
  const n = caseCount(plan.axes);
  const t0 = performance.now();
  const stacks = Array.from({ length: n }, (_, k) => { const c = caseStack(plan, k); if (!c.ok) throw new Error(c.errors[0]); return c.stack; });
  const t1 = performance.now();
  for (const s of stacks) solveExactWithQuantities(s, bandFrequencies(s));
  return { cases: n, parse_seconds: (t1 - t0) / 1e3, seconds: (performance.now() - t1) / 1e3 };
}

const points = Number(process.argv[2]);
if (Number.isInteger(points) && points > 1) console.log(JSON.stringify(solverOnly(points)));
