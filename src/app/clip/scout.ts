// Worker side of a clip: when does the interesting part happen? A scout run (the same grid as the
// animation) is stepped until the view is quiet again, and its incident record says when the pulse
// reaches the front face. Nothing here is physics of its own: the engine's run and records are read.

import type { PulseRun } from '../../fdtd/types.ts';
import { envelope } from '../../echoes/envelope.ts';

export interface ClipTiming {
  dt_s: number;
  /** The incident pulse's envelope peak at the front face, s. */
  arrival_s: number;
  /** First step of the clip: the incident envelope at the front face has risen to 10 % of its peak. */
  startStep: number;
  /** Last step: reflected and transmitted pulses have left the view (or the run ended). */
  endStep: number;
  /** Why it ends there: 'quiet' (the view emptied) or 'run-end'. */
  ends: 'quiet' | 'run-end';
}

/** The view counts as quiet when its largest |E| is below this share of the largest it has held. */
export const QUIET = 0.02;
/** The clip starts when the incident envelope at the front face reaches this share of its peak. */
export const START_LEVEL = 0.1;

/**
 * Step `run` (fresh, not yet past the pulse) until the field inside [x0_m, x1_m] and inside the stack
 * is below QUIET of its running peak, after the incident pulse has passed the front face (three
 * envelope widths τ after its largest sample there).
 */
export function scoutClip(run: PulseRun, window_m: [number, number], firstStep: number): ClipTiming {
  const plan = run.plan, nodes = plan.nodes;
  const x = run.x_m();
  let i0 = 0, i1 = x.length - 1;
  while (i0 < x.length - 1 && x[i0] < window_m[0]) i0++;
  while (i1 > 0 && x[i1] > window_m[1]) i1--;
  // The stack is always watched too: a zoomed view may not show all of it, and it may still ring.
  const lo = Math.min(i0, nodes.front), hi = Math.max(i1, nodes.back);
  const tail = Math.ceil((3 * plan.pulse.tau_s) / plan.dt_s);
  const chunk = Math.max(1, Math.round(plan.cells / 600));
  let peak = 0, incPeak = 0, incPeakAt = 0, seen = 0;
  let ends: ClipTiming['ends'] = 'run-end';
  while (!run.done) {
    run.step(chunk);
    const rec = run.records();
    for (let k = seen; k < rec.count; k++) {
      const a = Math.abs(rec.incident[k]);
      if (a > incPeak) { incPeak = a; incPeakAt = k; }
    }
    seen = rec.count;
    const e = run.totalField();
    let m = 0;
    for (let i = lo; i <= hi; i++) { const a = Math.abs(e[i]); if (a > m) m = a; }
    if (m > peak) peak = m;
    if (incPeak > 0 && rec.count - 1 - incPeakAt > tail && m < QUIET * peak) { ends = 'quiet'; break; }
  }
  const rec = run.records();
  const env = envelope(Float64Array.from(rec.incident));
  let kPeak = 0;
  for (let k = 1; k < env.length; k++) if (env[k] > env[kPeak]) kPeak = k;
  let kStart = kPeak;
  while (kStart > 0 && env[kStart - 1] >= START_LEVEL * env[kPeak]) kStart--;
  const startStep = Math.max(firstStep, kStart);
  return { dt_s: plan.dt_s, arrival_s: kPeak * plan.dt_s, startStep, endStep: Math.max(startStep + 1, run.stepIndex), ends };
}
