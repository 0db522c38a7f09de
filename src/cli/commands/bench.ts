// slabecho bench [--cells N] [--steps T] [--debye-poles P] [--lorentz-poles L] [--stack FILE] [--engine E] [--json]:
// speed of the production FDTD step (both grids, CPML, TF/SF, probes, the profile's DFT, the energy watch).

import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { BENCH_MIN_CELLS, cellsPerStep, stackBenchRun, uniformBenchRun } from '../../fdtd/bench.ts';
import type { EngineKind } from '../../fdtd/engine.ts';
import type { PulseRun } from '../../fdtd/types.ts';
import { benchFem, type FemBench } from '../../fem/bench.ts';
import { solveFem } from '../../fem/solve.ts';
import type { Stack } from '../../stack/types.ts';
import { loadStackFile } from '../io.ts';
import type { Command } from '../command.ts';
import { InputError, numberOption, readArgs, UsageError, type ParsedArgs } from '../command.ts';
import { loadOrExplain } from './solve.ts';
import { estimateBench } from '../../report/estimate-study.ts';
import { budgetFromArgs } from '../budget-args.ts';

const DEFAULT_CELLS = 200_000;
const DEFAULT_STEPS = 5_000;
const MAX_POLES = 32;

/** A whole-number option from 1 to max, or `fallback` when not given. */
function countOption(values: ParsedArgs['values'], name: string, fallback: number, max: number): number {
  return numberOption(values, name, `must be a whole number from 1 to ${max}`, (v) => Number.isInteger(v) && v >= 1 && v <= max) ?? fallback;
}

/** The presets folder: beside build/ for the compiled CLI (build/cli.mjs), three levels up from this source file. */
const PRESETS_DIR = [new URL('../presets/', import.meta.url), new URL('../../../presets/', import.meta.url)]
  .map((u) => fileURLToPath(u)).find((d) => existsSync(join(d, 'default.stack.json'))) ?? '';

/** The preset whose FEM mesh at default settings has the most unknowns (the largest FEM problem we ship). */
function largestPreset(): { name: string; stack: Stack } | null {
  if (PRESETS_DIR === '') return null;
  let best: { name: string; stack: Stack; unknowns: number } | null = null;
  for (const name of readdirSync(PRESETS_DIR).filter((f) => f.endsWith('.stack.json')).sort()) {
    const parsed = loadStackFile(join(PRESETS_DIR, name));
    if (!parsed.ok) continue;
    const { unknowns } = solveFem(parsed.stack, Float64Array.of(parsed.stack.band_Hz[1])).mesh;
    if (!best || unknowns > best.unknowns) best = { name, stack: parsed.stack, unknowns };
  }
  return best;
}

/** Whole-number pole counts from 0 to MAX_POLES. */
function poleOption(values: ParsedArgs['values'], name: string): number {
  return numberOption(values, name, `must be a whole number from 0 to ${MAX_POLES}`, (v) => Number.isInteger(v) && v >= 0 && v <= MAX_POLES) ?? 0;
}

function engineOption(values: ParsedArgs['values']): EngineKind | undefined {
  const e = values.engine;
  if (e === undefined) return undefined;
  if (e !== 'js' && e !== 'wasm-simd') throw new UsageError(`--engine: must be js or wasm-simd (got ${String(e)})`);
  return e;
}

/**
 * Refuse (exit 2) a benchmark estimated to pass the time limit; poles are counted as about half a cell-update
 * each (a second-order one as two), which is what they cost the TypeScript kernel.
 */
function refuseLongBench(values: ParsedArgs['values'], cells: number, steps: number, debye: number, lorentz: number): void {
  const { budget, limitNames } = budgetFromArgs(values);
  const est = estimateBench(Math.ceil(cells * (1 + 0.5 * (debye + 2 * lorentz))), steps, budget, limitNames.seconds);
  if (est.refusal !== undefined) throw new InputError(est.refusal);
}

interface Timing { run: PulseRun; steps: number; seconds: number }

/** Warm the engine up (JIT, WebAssembly tier-up; not timed), then time `steps` production steps. */
function timeSteps(run: PulseRun, steps: number): Timing {
  run.step(Math.min(500, Math.max(50, Math.ceil(steps / 20))));
  const t0 = performance.now();
  run.step(steps);
  return { run, steps, seconds: (performance.now() - t0) / 1000 };
}

function femFigure(): (FemBench & { preset: string }) | null {
  const preset = largestPreset();
  return preset ? { preset: preset.name, ...benchFem(preset.stack, () => performance.now()) } : null;
}

export const bench: Command = {
  name: 'bench',
  summary: 'measure the speed of the production FDTD step (Mcell/s) and of an FEM solve',
  usage: `Usage: slabecho bench [--cells N] [--steps T] [--debye-poles P] [--lorentz-poles L] [--json]
       slabecho bench --stack FILE [--steps T] [--json]

Step a pulse run exactly as \`run\` does (both grids, CPML, TF/SF, probes, the profile's DFT, the energy and
convergence watch) for T steps, after a short warm-up, and print the cells stepped per step, the steps, the
seconds and million cell-updates per second, and the engine (wasm-simd: WebAssembly SIMD; js: the
TypeScript kernel). The grid is uniform, of an invented lossy medium with P first-order (Debye) and L
second-order (Lorentz) poles per node, or with --stack the grid the stack in FILE is planned on. Defaults:
N = ${DEFAULT_CELLS}, T = ${DEFAULT_STEPS}, P = L = 0. Beside it, the time of a 501-frequency FEM solve
(default order and density) of the preset with the largest FEM mesh.

Options:
  --cells N            E nodes stepped per step, both grids together (${BENCH_MIN_CELLS} to 20000000)
  --steps T            time steps (1 to 10000000)
  --debye-poles P      first-order poles per node (0 to ${MAX_POLES})
  --lorentz-poles L    second-order poles per node (0 to ${MAX_POLES})
  --stack FILE         time the planned grid of this stack instead
  --engine E           js or wasm-simd (default: wasm-simd where WebAssembly SIMD runs)
  --max-seconds S      refuse a benchmark estimated to take longer than S seconds (default 30)
  --json               print one JSON object {"cells","steps","seconds","mcells_per_s","engine",...,"fem"}`,
  async run(args, io) {
    const parsed = readArgs(bench, args, io, {
      cells: { type: 'string' }, steps: { type: 'string' }, json: { type: 'boolean' },
      'debye-poles': { type: 'string' }, 'lorentz-poles': { type: 'string' }, stack: { type: 'string' }, engine: { type: 'string' },
      'max-seconds': { type: 'string' },
    }, [0, 0]);
    if (parsed === null) return 0;
    const v = parsed.values;
    const steps = countOption(v, 'steps', DEFAULT_STEPS, 10_000_000);
    const engine = engineOption(v);
    const file = typeof v.stack === 'string' ? v.stack : null;
    let debye = 0, lorentz = 0, run: PulseRun;
    if (file !== null) {
      if (v.cells !== undefined || v['debye-poles'] !== undefined || v['lorentz-poles'] !== undefined) {
        throw new UsageError('--stack FILE sets the grid: leave out --cells, --debye-poles and --lorentz-poles');
      }
      run = stackBenchRun(loadOrExplain(file, io).stack, steps, engine);
      refuseLongBench(v, cellsPerStep(run), steps, 0, 0);
    } else {
      const cells = countOption(v, 'cells', DEFAULT_CELLS, 20_000_000);
      if (cells < BENCH_MIN_CELLS) throw new UsageError(`--cells: must be a whole number from ${BENCH_MIN_CELLS} to 20000000`);
      debye = poleOption(v, 'debye-poles');
      lorentz = poleOption(v, 'lorentz-poles');
      refuseLongBench(v, cells, steps, debye, lorentz);
      run = uniformBenchRun(cells, debye, lorentz, steps, engine);
    }
    const t = timeSteps(run, steps);
    const field = run.totalField();
    if (!field.every(Number.isFinite)) { io.err('bench: the fields blew up (internal error)'); return 1; }
    const cells = cellsPerStep(run);
    const mcells = (cells * steps) / t.seconds / 1e6;
    const fem = femFigure();
    if (v.json === true) {
      io.out(JSON.stringify({
        cells, steps, seconds: Number(t.seconds.toFixed(4)), mcells_per_s: Number(mcells.toFixed(2)), engine: run.engine,
        ...(file !== null ? { stack: file } : { debye_poles: debye, lorentz_poles: lorentz }),
        fem: fem && {
          preset: fem.preset, frequencies: fem.frequencies, ms_per_solve: Number(fem.ms_per_solve.toFixed(3)),
          us_per_frequency: Number(fem.us_per_frequency.toFixed(3)), order: fem.mesh.order, unknowns: fem.mesh.unknowns,
        },
      }));
      return 0;
    }
    io.out(`grid           ${file !== null ? `${file} as planned` : `uniform, ${debye} Debye + ${lorentz} Lorentz poles per node`}`);
    io.out(`cells          ${cells} (main grid ${run.plan.nodes.total}, incident grid ${run.plan.nodes.auxTotal})`);
    io.out(`steps          ${steps}`);
    io.out(`seconds        ${t.seconds.toFixed(3)}`);
    io.out(`Mcell/s        ${mcells.toFixed(1)}`);
    io.out(`engine         ${run.engine}${run.engineFallback ? ` (${run.engineFallback})` : ''}`);
    if (fem) {
      io.out(`fem            ${fem.frequencies} frequencies of ${fem.preset} in ${fem.ms_per_solve.toFixed(2)} ms ` +
        `(${fem.us_per_frequency.toFixed(1)} µs per frequency, p = ${fem.mesh.order}, ${fem.mesh.unknowns} unknowns)`);
    }
    return 0;
  },
};
