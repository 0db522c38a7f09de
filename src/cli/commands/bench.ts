// slabecho bench [--cells N] [--steps T] [--json]: speed of the production FDTD kernel.

import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { benchGrid, benchSteps } from '../../fdtd/bench.ts';
import { benchFem, type FemBench } from '../../fem/bench.ts';
import { solveFem } from '../../fem/solve.ts';
import type { Stack } from '../../stack/types.ts';
import { loadStackFile } from '../io.ts';
import type { Command } from '../command.ts';
import { InputError, numberOption, readArgs, type ParsedArgs } from '../command.ts';
import { estimateBench } from '../../report/estimate-study.ts';
import { budgetFromArgs } from '../budget-args.ts';

const DEFAULT_CELLS = 200_000;
const DEFAULT_STEPS = 5_000;

/** A whole-number option from 1 to max, or `fallback` when not given. */
function countOption(values: ParsedArgs['values'], name: string, fallback: number, max: number): number {
  return numberOption(values, name, `must be a whole number from 1 to ${max}`, (v) => Number.isInteger(v) && v >= 1 && v <= max) ?? fallback;
}

const PRESETS_DIR = fileURLToPath(new URL('../../../presets/', import.meta.url));

/** The preset whose FEM mesh at default settings has the most unknowns (the largest FEM problem we ship). */
function largestPreset(): { name: string; stack: Stack } | null {
  let best: { name: string; stack: Stack; unknowns: number } | null = null;
  for (const name of readdirSync(PRESETS_DIR).filter((f) => f.endsWith('.stack.json')).sort()) {
    const parsed = loadStackFile(join(PRESETS_DIR, name));
    if (!parsed.ok) continue;
    const { unknowns } = solveFem(parsed.stack, Float64Array.of(parsed.stack.band_Hz[1])).mesh;
    if (!best || unknowns > best.unknowns) best = { name, stack: parsed.stack, unknowns };
  }
  return best;
}

export const bench: Command = {
  name: 'bench',
  summary: 'measure the FDTD kernel speed (Mcell/s) on a uniform lossy grid',
  usage: `Usage: slabecho bench [--cells N] [--steps T] [--json]

Run the production FDTD kernel (the one pulse runs use) on a uniform lossy dielectric grid of N cells
with absorbing ends for T time steps, and print the cells, steps, seconds and million cell-updates per
second. Defaults: N = ${DEFAULT_CELLS}, T = ${DEFAULT_STEPS} (a few seconds). Beside it, the time of a
501-frequency FEM solve (default order and density) of the preset with the largest FEM mesh.

Options:
  --cells N   grid size (1 to 20000000)
  --steps T   time steps (1 to 10000000)
  --max-seconds S  refuse a benchmark estimated to take longer than S seconds (default 30)
  --json      print one JSON object {"cells","steps","seconds","mcells_per_s","fem"}`,
  async run(args, io) {
    const parsed = readArgs(bench, args, io, {
      cells: { type: 'string' }, steps: { type: 'string' }, json: { type: 'boolean' }, 'max-seconds': { type: 'string' },
    }, [0, 0]);
    if (parsed === null) return 0;
    const cells = countOption(parsed.values, 'cells', DEFAULT_CELLS, 20_000_000);
    const steps = countOption(parsed.values, 'steps', DEFAULT_STEPS, 10_000_000);
    const { budget, limitNames } = budgetFromArgs(parsed.values);
    const est = estimateBench(cells, steps, budget, limitNames.seconds);
    if (est.refusal !== undefined) throw new InputError(est.refusal);
    const grid = benchGrid(cells);
    benchSteps(grid, Math.min(50, steps)); // warm-up (JIT), not timed
    const t0 = performance.now();
    const checksum = benchSteps(grid, steps);
    const seconds = (performance.now() - t0) / 1000;
    if (!Number.isFinite(checksum)) { io.err('bench: the fields blew up (internal error)'); return 1; }
    const n = grid.state.n;
    const mcells = (n * steps) / seconds / 1e6;
    const preset = largestPreset();
    const fem: (FemBench & { preset: string }) | null = preset
      ? { preset: preset.name, ...benchFem(preset.stack, () => performance.now()) }
      : null;
    if (parsed.values.json === true) {
      io.out(JSON.stringify({
        cells: n, steps, seconds: Number(seconds.toFixed(4)), mcells_per_s: Number(mcells.toFixed(2)),
        fem: fem && {
          preset: fem.preset, frequencies: fem.frequencies, ms_per_solve: Number(fem.ms_per_solve.toFixed(3)),
          us_per_frequency: Number(fem.us_per_frequency.toFixed(3)), order: fem.mesh.order, unknowns: fem.mesh.unknowns,
        },
      }));
    } else {
      io.out(`cells          ${n}`);
      io.out(`steps          ${steps}`);
      io.out(`seconds        ${seconds.toFixed(3)}`);
      io.out(`Mcell/s        ${mcells.toFixed(1)}`);
      if (fem) {
        io.out(`fem            ${fem.frequencies} frequencies of ${fem.preset} in ${fem.ms_per_solve.toFixed(2)} ms ` +
          `(${fem.us_per_frequency.toFixed(1)} µs per frequency, p = ${fem.mesh.order}, ${fem.mesh.unknowns} unknowns)`);
      }
    }
    return 0;
  },
};
