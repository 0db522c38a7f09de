// slabecho bench [--cells N] [--steps T] [--json]: speed of the production FDTD kernel.

import { benchGrid, benchSteps } from '../../fdtd/bench.ts';
import type { Command } from '../command.ts';
import { readArgs, UsageError } from '../command.ts';

const DEFAULT_CELLS = 200_000;
const DEFAULT_STEPS = 5_000;

function positiveInt(name: string, text: string | undefined, fallback: number, max: number): number {
  if (text === undefined) return fallback;
  const v = Number(text);
  if (!Number.isInteger(v) || v < 1 || v > max) throw new UsageError(`--${name}: must be a whole number from 1 to ${max} (got ${text})`);
  return v;
}

export const bench: Command = {
  name: 'bench',
  summary: 'measure the FDTD kernel speed (Mcell/s) on a uniform lossy grid',
  usage: `Usage: slabecho bench [--cells N] [--steps T] [--json]

Run the production FDTD kernel (the one pulse runs use) on a uniform lossy dielectric grid of N cells
with absorbing ends for T time steps, and print the cells, steps, seconds and million cell-updates per
second. Defaults: N = ${DEFAULT_CELLS}, T = ${DEFAULT_STEPS} (a few seconds).

Options:
  --cells N   grid size (1 to 20000000)
  --steps T   time steps (1 to 10000000)
  --json      print one JSON object {"cells","steps","seconds","mcells_per_s"}`,
  async run(args, io) {
    const parsed = readArgs(bench, args, io, {
      cells: { type: 'string' }, steps: { type: 'string' }, json: { type: 'boolean' },
    }, [0, 0]);
    if (parsed === null) return 0;
    const cells = positiveInt('cells', parsed.values.cells as string | undefined, DEFAULT_CELLS, 20_000_000);
    const steps = positiveInt('steps', parsed.values.steps as string | undefined, DEFAULT_STEPS, 10_000_000);
    const grid = benchGrid(cells);
    benchSteps(grid, Math.min(50, steps)); // warm-up (JIT), not timed
    const t0 = performance.now();
    const checksum = benchSteps(grid, steps);
    const seconds = (performance.now() - t0) / 1000;
    if (!Number.isFinite(checksum)) { io.err('bench: the fields blew up (internal error)'); return 1; }
    const n = grid.state.n;
    const mcells = (n * steps) / seconds / 1e6;
    if (parsed.values.json === true) {
      io.out(JSON.stringify({ cells: n, steps, seconds: Number(seconds.toFixed(4)), mcells_per_s: Number(mcells.toFixed(2)) }));
    } else {
      io.out(`cells          ${n}`);
      io.out(`steps          ${steps}`);
      io.out(`seconds        ${seconds.toFixed(3)}`);
      io.out(`Mcell/s        ${mcells.toFixed(1)}`);
    }
    return 0;
  },
};
