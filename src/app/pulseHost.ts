// Worker side of the pulse run: holds the steppable run the field view animates, builds its frames
// (total, incident, reflected, transmitted at every node) into buffers the page hands back, and
// runs the full pulse-run report.

import type { Stack } from '../stack/types.ts';
import type { PulseOptions, PulseRun } from '../fdtd/types.ts';
import { leadInSteps } from '../fdtd/pulse.ts';
import { createPulseRun } from '../fdtd/run.ts';
import type { EchoColumns } from '../report/echo-table.ts';
import { runReport } from '../report/run.ts';
import { copyTable } from './tables.ts';
import type { FieldFrame, PulseGeometry, RunSettings, WireColumn, WireReport } from './protocol.ts';
import { scoutClip, type ClipTiming } from './clip/scout.ts';
import { SpacetimeRecorder } from './spacetime/recorder.ts';

let run: PulseRun | null = null;
let runStack: Stack | null = null;
let runSettings: RunSettings = { accuracy: null };
let incident = new Float64Array(0);

export const pulseOptions = (settings: RunSettings): PulseOptions =>
  (settings.accuracy !== null ? { accuracy: settings.accuracy } : {});

/** A fresh animated run, advanced through the quiet lead-in so play shows the pulse at once. */
function create(stack: Stack, settings: RunSettings): PulseRun {
  const r = createPulseRun(stack, pulseOptions(settings));
  r.step(leadInSteps(r.plan.pulse, r.plan.dt_s));
  return r;
}

export function startPulse(stack: Stack, settings: RunSettings): PulseGeometry {
  run = null;
  run = create(stack, settings);
  runStack = stack;
  runSettings = settings;
  return geometryOf(run, stack);
}

function geometryOf(r: PulseRun, stack: Stack): PulseGeometry {
  const p = r.plan, n = p.nodes;
  const x = r.x_m();
  const at = (i: number): number => x[Math.max(0, Math.min(x.length - 1, i))];
  const absorbers: Array<[number, number]> = [];
  if (n.pmlFrontEnd > 0) absorbers.push([at(0), at(n.pmlFrontEnd - 1)]);
  if (n.pmlBackStart < n.total) absorbers.push([at(n.pmlBackStart), at(n.total - 1)]);
  const probes: PulseGeometry['probes'] = [
    { label: 'source (TF/SF)', x_m: (at(n.tfsf - 1) + at(n.tfsf)) / 2, kind: 'source' },
    { label: 'R probe', x_m: at(n.front), kind: 'probe' },
  ];
  if (stack.back !== 'pec') probes.push({ label: 'T probe', x_m: at(n.back), kind: 'probe' });
  return { cells: n.total, courant: p.courant, x_m: x, absorbers, probes };
}

function buffers(recycle: FieldFrame | null, n: number): FieldFrame {
  if (recycle !== null && recycle.total.length === n) return recycle;
  return {
    step: 0, time_s: 0, done: false,
    total: new Float64Array(n), incident: new Float64Array(n), reflected: new Float64Array(n), transmitted: new Float64Array(n),
  };
}

function frameOf(r: PulseRun, recycle: FieldFrame | null): FieldFrame {
  const nodes = r.plan.nodes, n = nodes.total;
  const f = buffers(recycle, n);
  if (incident.length !== n) incident = new Float64Array(n);
  const grid = r.totalField();
  r.incidentField(incident);
  const pec = runStack?.back === 'pec';
  for (let i = 0; i < n; i++) {
    const g = grid[i], inc = incident[i];
    // In front of the TF/SF plane the grid holds the scattered (reflected) field only; the incident
    // wave is born at the source node, so in front of that there is no total field to show.
    const total = i < nodes.tfsf ? g + inc : g;
    f.total[i] = i < nodes.auxOffset ? NaN : total;
    f.incident[i] = inc;
    f.reflected[i] = i <= nodes.front ? total - inc : NaN;
    f.transmitted[i] = !pec && i >= nodes.back ? total : NaN;
  }
  f.step = r.stepIndex;
  f.time_s = r.time_s;
  f.done = r.done;
  return f;
}

export function advancePulse(steps: number, recycle: FieldFrame | null): FieldFrame {
  if (run === null) throw new Error('no pulse run');
  if (steps > 0 && !run.done) run.step(steps);
  return frameOf(run, recycle);
}

export function rewindPulse(): FieldFrame {
  if (runStack === null) throw new Error('no pulse run');
  run = create(runStack, runSettings);
  return frameOf(run, null);
}

/** An echo table on the wire: its numeric columns, then its text columns. */
const echoWire = (e: EchoColumns): WireColumn[] => [
  ...copyTable(e.columns),
  { name: 'path', data: [...e.path] }, { name: 'nearest_path', data: [...e.nearest_path] }, { name: 'resolved', data: [...e.resolved] },
];

/** A fresh run of the animated stack stepped to `step` (or as far as it goes). */
export function seekPulse(step: number, recycle: FieldFrame | null): FieldFrame {
  if (runStack === null) throw new Error('no pulse run');
  run = create(runStack, runSettings);
  if (step > run.stepIndex) run.step(step - run.stepIndex);
  return frameOf(run, recycle);
}

/** When a clip of the view [x0, x1] (metres) should start and end: a scout run of the same grid. */
export function clipTiming(window_m: [number, number]): ClipTiming {
  if (runStack === null) throw new Error('no pulse run');
  const scout = create(runStack, runSettings);
  return scoutClip(scout, window_m, scout.stepIndex);
}

/** The full pulse-run report (the one `slabecho run` writes), as wire tables. */
export async function fullReport(
  stack: Stack, inputWarnings: string[], settings: RunSettings, progress: (fraction: number, note: string) => void,
): Promise<Omit<WireReport, 'ms'>> {
  let last = -1;
  const recorder = new SpacetimeRecorder(stack);
  const rep = await runReport(stack, {
    inputWarnings,
    pulse: pulseOptions(settings),
    observe: recorder,
    onProgress: (f) => {
      const t = performance.now();
      if (t - last < 100 && f < 1) return;
      last = t;
      progress(f, f < 0.1 ? 'exact and FEM' : f < 0.95 ? `FDTD ${Math.round(((f - 0.1) / 0.85) * 100)} %` : 'spectra and echoes');
    },
  });
  return {
    spectrum: copyTable(rep.spectrum),
    profile: copyTable(rep.profile),
    echoes: echoWire(rep.echoes),
    echoesT: echoWire(rep.echoesT),
    envelope: copyTable(rep.envelope),
    trace: copyTable(rep.trace),
    summary: rep.summary,
    warnings: [...rep.warnings],
    spacetime: rep.skipped === undefined ? recorder.map() : null,
    rays: rep.rays,
    ...(rep.skipped !== undefined ? { skipped: rep.skipped } : {}),
  };
}
