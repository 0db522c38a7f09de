// The measuring loop shared by the pulse-engine benchmarks (bench/walls.ts, bench/oblique.ts): per case the
// engine error (FDTD against the exact solution of the stepped media, 201 frequencies, band ends included),
// the planner's prediction, the model share (stepped media against the stack's own exact solution), grid
// size, steps, cell-updates, planning and run times.
import { planGrid } from '../src/fdtd/plan.ts';
import { createPulseRun, runToEndSync } from '../src/fdtd/run.ts';
import { solveEffective } from '../src/fdtd/stepped-exact.ts';
import type { PulseOptions } from '../src/fdtd/types.ts';
import { compareSpectra } from '../src/report/agreement.ts';
import { spectrumFromRecords } from '../src/spectra/spectrum.ts';
import { parseStackObject } from '../src/stack/parse.ts';
import type { Stack } from '../src/stack/types.ts';
import { solveTmm } from '../src/tmm/solve.ts';
import { linspace } from '../src/units.ts';
import { useWasmStep } from '../test/support/wasm.ts';

// The runs step with the WebAssembly kernel, as the CLI's do (the TypeScript one gives the same figures, slower).
await useWasmStep();

export interface Case { name: string; stack: Stack }

export function stackFrom(obj: unknown): Stack {
  const r = parseStackObject(obj);
  if (!r.ok) throw new Error(r.errors.join('\n'));
  return r.stack;
}

export interface MeasureOptions { only?: string; accuracy?: number; json?: boolean }

/** Runs every case, prints a line each (or JSON at the end), and returns the rows. */
export function measureCases(cases: Case[], o: MeasureOptions): Record<string, unknown>[] {
  const rows: Record<string, unknown>[] = [];
  for (const c of cases) {
    if (o.only && !c.name.includes(o.only)) continue;
    const opts: PulseOptions = o.accuracy !== undefined ? { accuracy: o.accuracy } : {};
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
      courant: run.plan.courant, end: run.doneReason, plan_ms, run_ms,
    };
    rows.push(row);
    if (!o.json) {
      const e = (x: number) => x.toExponential(1);
      console.log(`${c.name.padEnd(48)} engine ${e(engine.R_max)}/${e(engine.T_max)} @${row.worst_GHz.toFixed(2)} pred ${e(plan.predictedError)} model ${e(model.R_max)}/${e(model.T_max)} ` +
        `${row.cells} cells × ${row.steps} steps = ${e(row.cell_updates)} S ${row.courant.toFixed(3)} ${row.end} plan ${plan_ms.toFixed(0)} ms run ${(run_ms / 1000).toFixed(2)} s`);
    }
  }
  if (o.json) console.log(JSON.stringify(rows, null, 2));
  return rows;
}
