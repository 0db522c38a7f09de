// Pulse engine on walls: engine error (FDTD against the exact solution of the stepped media), model share
// (stepped media against the stack's own exact solution), grid size, steps, cell-updates and time.
// A benchmark, not a test: run it under nice on a quiet machine.
//   nice npx tsx bench/walls.ts [--only TEXT] [--accuracy X] [--set none|walls|all] [--json]
// --set none: the presets and the stacks that once crashed; walls (default): plus a representative set of
// ITU-R P.2040-3 walls (20–300 mm, 1–6 to 1–40 GHz, air or a conductor behind); all: every catalog wall
// material × 20/100/300 mm × 1–6/1–20/1–40 GHz × air/conductor (hours). Planning times (first and cached)
// of an absurd stack come first.
import { readdirSync, readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { planGrid } from '../src/fdtd/plan.ts';
import { createPulseRun, runToEndSync } from '../src/fdtd/run.ts';
import { solveEffective } from '../src/fdtd/stepped-exact.ts';
import { compareSpectra } from '../src/report/agreement.ts';
import { spectrumFromRecords } from '../src/spectra/spectrum.ts';
import { parseStackObject } from '../src/stack/parse.ts';
import type { Stack } from '../src/stack/types.ts';
import { solveTmm } from '../src/tmm/solve.ts';
import { linspace } from '../src/units.ts';
import { useWasmStep } from '../test/support/wasm.ts';

// The runs step with the WebAssembly kernel, as the CLI's do (the TypeScript one gives the same figures, slower).
await useWasmStep();

const { values } = parseArgs({ options: { only: { type: 'string' }, accuracy: { type: 'string' }, set: { type: 'string' }, json: { type: 'boolean' } } });
const accuracy = values.accuracy ? Number(values.accuracy) : undefined;

function stackFrom(obj: unknown): Stack {
  const r = parseStackObject(obj);
  if (!r.ok) throw new Error(r.errors.join('\n'));
  return r.stack;
}

interface Case { name: string; stack: Stack }
const cases: Case[] = [];
for (const f of readdirSync('presets').filter((x) => x.endsWith('.stack.json')).sort()) {
  cases.push({ name: `preset ${f.replace('.stack.json', '')}`, stack: stackFrom(JSON.parse(readFileSync(`presets/${f}`, 'utf8'))) });
}
const wall = (material: string, mm: number, band: [number, number], back: string): Case => ({
  name: `${mm} mm ${material} ${band[0]}–${band[1]} GHz on ${back}`,
  stack: stackFrom({ title: 'wall', band_GHz: band, layers: [{ material, thickness_mm: mm }], back, points: 201 }),
});
const set = values.set ?? 'walls';
if (set === 'walls' || set === 'all') {
  for (const [m, mm, band, back] of [
    ['concrete', 20, [1, 40], 'air'], ['concrete', 150, [1, 6], 'pec'], ['concrete', 200, [24, 40], 'air'],
    ['concrete', 200, [1, 6], 'pec'], ['concrete', 300, [1, 6], 'air'], ['concrete', 300, [1, 40], 'pec'],
    ['brick', 100, [1, 6], 'air'], ['brick', 20, [1, 40], 'pec'], ['glass', 20, [1, 40], 'pec'],
    ['plasterboard', 300, [1, 20], 'air'], ['wood', 50, [1, 40], 'pec'], ['concrete', 150, [1, 40], 'pec'],
    ['marble', 100, [1, 20], 'air'], ['chipboard', 20, [1, 40], 'air'],
  ] as [string, number, [number, number], string][]) cases.push(wall(m, mm, band, back));
}
if (set === 'all') {
  for (const m of ['concrete', 'brick', 'plasterboard', 'wood', 'glass', 'marble', 'chipboard']) {
    for (const mm of [20, 100, 300]) for (const band of [[1, 6], [1, 20], [1, 40]] as [number, number][]) {
      for (const back of ['air', 'pec']) cases.push(wall(m, mm, band, back));
    }
  }
}
// Stacks that once crashed the engine.
cases.push({ name: 'Lorentz pole far above the band', stack: stackFrom({
  title: 'lorentz above', band_GHz: [1, 2.2], layers: [{ material: 'lor', thickness_mm: 30 }], back: 'air', points: 101,
  materials: { lor: { model: 'lorentz', eps_inf: 2.5, poles: [{ delta_eps: 3.56, f0_GHz: 46.5, gamma_GHz: 0.55 }], sigma_S_per_m: 0 } },
}) });
cases.push({ name: 'lossless Drude below its plasma frequency', stack: stackFrom({
  title: 'drude', band_GHz: [1, 5], layers: [{ material: 'pl', thickness_mm: 10 }], back: 'air', points: 101,
  materials: { pl: { model: 'drude', eps_inf: 1, plasma_GHz: 8, collision_GHz: 0, sigma_S_per_m: 0 } },
}) });

// Planning an absurd stack (10 m of concrete over 1–100 GHz): refused, in milliseconds.
{
  const absurd = stackFrom({ title: 'absurd', band_GHz: [1, 100], layers: [{ material: 'concrete', thickness_mm: 10000 }], back: 'air', points: 11 });
  for (const round of ['first', 'cached']) {
    const t0 = performance.now();
    let what = 'planned';
    try { planGrid(absurd); } catch (e) { what = `refused (${(e as Error).message.slice(0, 60)}…)`; }
    if (!values.json) console.log(`plan 10 m concrete 1–100 GHz, ${round}: ${(performance.now() - t0).toFixed(1)} ms, ${what}`);
  }
}

const rows: Record<string, unknown>[] = [];
for (const c of cases) {
  if (values.only && !c.name.includes(values.only)) continue;
  const opts = accuracy !== undefined ? { accuracy } : {};
  const t0 = performance.now();
  let plan;
  try { plan = planGrid(c.stack, opts); } catch (e) { console.log(`${c.name}: refused: ${(e as Error).message}`); continue; }
  const plan_ms = performance.now() - t0;
  const t1 = performance.now();
  let run;
  try { run = runToEndSync(createPulseRun(c.stack, opts)); } catch (e) { console.log(`${c.name}: failed: ${(e as Error).message}`); continue; }
  const run_ms = performance.now() - t1;
  const f = linspace(c.stack.band_Hz[0], c.stack.band_Hz[1], 201);
  const fdtd = spectrumFromRecords(run.records(), f);
  const stepped = solveEffective(run.plan.effective, f);
  const exact = solveTmm(c.stack, f);
  const engine = compareSpectra(fdtd, stepped), model = compareSpectra(stepped, exact);
  const row = {
    case: c.name, target: run.plan.accuracyTarget,
    engine_R: engine.R_max, engine_T: engine.T_max, worst_GHz: engine.R_max >= engine.T_max ? engine.R_worst_f_GHz : engine.T_worst_f_GHz,
    predicted: plan.predictedError, model_R: model.R_max, model_T: model.T_max,
    cells: run.plan.cells, steps: run.stepIndex, cell_updates: run.stepIndex * (run.plan.nodes.total + run.plan.nodes.auxTotal),
    end: run.doneReason, plan_ms, run_ms,
  };
  rows.push(row);
  if (!values.json) {
    const e = (x: number) => x.toExponential(1);
    console.log(`${c.name.padEnd(48)} engine ${e(engine.R_max)}/${e(engine.T_max)} @${row.worst_GHz.toFixed(2)} pred ${e(plan.predictedError)} model ${e(model.R_max)}/${e(model.T_max)} ` +
      `${row.cells} cells × ${row.steps} steps = ${e(row.cell_updates)} ${row.end} plan ${plan_ms.toFixed(0)} ms run ${(run_ms / 1000).toFixed(2)} s`);
  }
}
if (values.json) console.log(JSON.stringify(rows, null, 2));
