// A fixed workload for measuring the production kernel: a uniform lossy dielectric grid with CPML at
// both ends and a pulse driven at its centre. The caller times benchStep (the CLI's `bench`).

import { C0_m_per_s } from '../units.ts';
import { uniformGrid } from './build.ts';
import { type KernelState, updateE, updateH } from './kernel.ts';
import { lineMedium, stepModelFixed } from './media.ts';
import { DEFAULT_PML_CELLS } from './plan.ts';
import { type PulseShape, pulseForBand, pulseValue } from './pulse.ts';

export interface BenchGrid { state: KernelState; pulse: PulseShape; dt_s: number; source: number; step: number }

const BAND: [number, number] = [1e9, 10e9];

/** A grid of `cells` E nodes (ε_r = 4, σ = 0.01 S/m, 20 cells per wavelength at 10 GHz). */
export function benchGrid(cells: number): BenchGrid {
  const n = Math.max(cells, 2 * DEFAULT_PML_CELLS + 8);
  const dx = C0_m_per_s / BAND[1] / 2 / 20, courant = 1, dt = (courant * dx) / C0_m_per_s;
  const state = uniformGrid(n, lineMedium(stepModelFixed(4, 0.01)), {
    courant, dt_s: dt, band_Hz: BAND, pmlFront: DEFAULT_PML_CELLS, pmlBack: DEFAULT_PML_CELLS,
  });
  return { state, pulse: pulseForBand(BAND, dt), dt_s: dt, source: n >> 1, step: 0 };
}

/** Advance the bench grid by `steps` steps. Returns a checksum (keeps the work observable). */
export function benchSteps(g: BenchGrid, steps: number): number {
  const s = g.state;
  for (let k = 0; k < steps; k++) {
    updateH(s);
    updateE(s);
    g.step++;
    s.e[g.source] += pulseValue(g.pulse, g.step * g.dt_s);
  }
  let sum = 0;
  for (let i = 0; i < s.n; i++) sum += Math.abs(s.e[i]);
  return sum;
}
