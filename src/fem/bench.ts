// The FEM figure for `slabecho bench`: a 501-frequency FEM solve of a stack at default settings, timed after
// a warm-up. DOM-free; the caller supplies the clock (performance.now in node and browsers).

import { linspace } from '../units.ts';
import type { Stack } from '../stack/types.ts';
import { solveFem } from './solve.ts';
import type { FemMeshInfo, FemOptions } from './types.ts';

export interface FemBench {
  frequencies: number;
  /** Median wall time of one full solve, milliseconds. */
  ms_per_solve: number;
  /** Per frequency, microseconds. */
  us_per_frequency: number;
  mesh: FemMeshInfo;
}

export function benchFem(stack: Stack, now: () => number, options: FemOptions = {}, frequencies = 501, repeats = 7): FemBench {
  const f = linspace(stack.band_Hz[0], stack.band_Hz[1], frequencies);
  let mesh = solveFem(stack, f, options).mesh; // warm-up
  const times: number[] = [];
  for (let r = 0; r < repeats; r++) {
    const t0 = now();
    mesh = solveFem(stack, f, options).mesh;
    times.push(now() - t0);
  }
  times.sort((a, b) => a - b);
  const ms = times[Math.floor(times.length / 2)];
  return { frequencies, ms_per_solve: ms, us_per_frequency: (ms * 1000) / frequencies, mesh };
}
