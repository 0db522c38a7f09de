// Workloads for measuring the production step (the CLI's `bench`, bench/yardstick.ts): a pulse run exactly as
// a real one steps it — both grids, CPML, TF/SF, probes, the profile's DFT, the energy and convergence watch —
// on a uniform grid of an invented dispersive medium with a chosen number of first- and second-order poles per
// node, or on a stack's planned grid. The runs never end on convergence, so any number of steps can be timed.

import { C0_m_per_s } from '../units.ts';
import type { Stack } from '../stack/types.ts';
import { type LineMedium, type StepModel, lineIndex, lineMedium } from './media.ts';
import { courantLimit, DEFAULT_PML_CELLS, layoutNodes, planGrid } from './plan.ts';
import { pulseForBand } from './pulse.ts';
import { createRunOfPlan } from './run.ts';
import type { EngineKind } from './engine.ts';
import type { GridPlan, PulseRun } from './types.ts';

export const BENCH_BAND_Hz: [number, number] = [1e9, 10e9];
const CELLS_PER_WAVELENGTH = 20;
/** Cells a uniform bench grid needs besides its medium (CPML, gaps, the incident grid). */
export const BENCH_MIN_CELLS = 2 * DEFAULT_PML_CELLS + 80;

/**
 * An invented lossy medium (ε∞ = 4, σ = 0.01 S/m) with `debye` relaxations (Δε 1.5/(q + 1), τ from 10 ps,
 * ×3 each) and `lorentz` resonances (Δε 0.3, f0 from 15 GHz, γ 2 GHz), all passive.
 */
export function benchMedium(debye: number, lorentz: number): StepModel {
  return {
    epsInf: 4, sigma: 0.01,
    debye: Array.from({ length: debye }, (_, q) => ({ deps: 1.5 / (q + 1), tau_s: 10e-12 * 3 ** q })),
    osc: Array.from({ length: lorentz }, (_, q) => {
      const w0 = 2 * Math.PI * 15e9 * (q + 1);
      return { c: 0.3 * w0 * w0, w0sq: w0 * w0, gamma: 2 * Math.PI * 2e9 };
    }),
  };
}

/**
 * The plan of a uniform grid of `medium` (a shunt model alone, or both sides of a line) whose two grids together
 * hold `cells` E nodes (20 cells per wavelength at the band top).
 */
export function uniformBenchPlan(cells: number, medium: StepModel | LineMedium, steps: number): GridPlan {
  const band = BENCH_BAND_Hz, P = DEFAULT_PML_CELLS;
  const model: LineMedium = 'shunt' in medium ? medium : lineMedium(medium);
  const n = Math.max(...[band[0], band[1]].map((f) => lineIndex(model, f).re));
  const dx = C0_m_per_s / (band[1] * n) / CELLS_PER_WAVELENGTH;
  const courant = courantLimit([model]), dt = (courant * dx) / C0_m_per_s;
  const probe = layoutNodes({ P, gapFront: 10, stackCells: 0, gapBack: 10, pec: false, fullIncident: false });
  const stackCells = Math.max(2, cells - probe.total - probe.auxTotal);
  const nodes = layoutNodes({ P, gapFront: 10, stackCells, gapBack: 10, pec: false, fullIncident: false });
  const thickness_m = stackCells * dx;
  return {
    dx_m: dx, dt_s: dt, courant, cells: nodes.total, stepsLimit: 2 ** 31 - 1, expectedSteps: steps,
    slowestRelaxation_s: 0, cellsPerWavelength: CELLS_PER_WAVELENGTH, layers: [], predictedError: 0,
    accuracyTarget: 0.01, pmlCells: P, decay_dB: 60, memory_bytes: 0, work_cell_updates: (nodes.total + nodes.auxTotal) * steps,
    nodes, pulse: pulseForBand(band, dt), fits: [], profile_Hz: (band[0] + band[1]) / 2, warnings: [],
    effective: {
      front: model, back: model, sheets: [], thickness_m, substitutions: 0,
      segments: [{ x0_m: 0, x1_m: thickness_m, model, layer: 0, name: 'bench medium', label: 'layers[0] bench medium' }],
    },
  };
}

/** A never-ending run of a uniform grid of a line medium (poles on either side). */
export function lineBenchRun(cells: number, medium: LineMedium, steps: number, engine?: EngineKind): PulseRun {
  return createRunOfPlan(BENCH_BAND_Hz, uniformBenchPlan(cells, medium, steps), { engine, endless: true });
}

/** A never-ending run of the uniform bench grid. */
export function uniformBenchRun(cells: number, debye: number, lorentz: number, steps: number, engine?: EngineKind): PulseRun {
  return createRunOfPlan(BENCH_BAND_Hz, uniformBenchPlan(cells, benchMedium(debye, lorentz), steps), { engine, endless: true });
}

/** A never-ending run of a stack's planned grid (its step limit raised to `steps` when lower). */
export function stackBenchRun(stack: Stack, steps: number, engine?: EngineKind): PulseRun {
  const plan = planGrid(stack);
  return createRunOfPlan(stack.band_Hz, { ...plan, stepsLimit: Math.max(plan.stepsLimit, steps), expectedSteps: steps }, { engine, endless: true });
}

/** E nodes a run steps each step (its main grid and the incident wave's grid). */
export const cellsPerStep = (run: PulseRun): number => run.plan.nodes.total + run.plan.nodes.auxTotal;
