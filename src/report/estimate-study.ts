// Estimates for the refinement studies behind `slabecho converge` (report/converge.ts) and for the kernel
// benchmark: the same nominal rates as estimate.ts, summed over every mesh or grid the study will make.

import { PlanError } from '../fdtd/errors.ts';
import { planGrid } from '../fdtd/plan.ts';
import type { FemOrder } from '../fem/basis.ts';
import { sizeMesh } from '../fem/mesh.ts';
import { MAX_ELEMENTS } from '../fem/types.ts';
import type { Stack } from '../stack/types.ts';
import { DEFAULT_BUDGET, plainBytes, plainCount, plainDuration, type WorkBudget } from './budget.ts';
import { FDTD_CELLS_PER_WAVELENGTH, FEM_DENSITIES, MAX_STUDY_ELEMENTS } from './converge.ts';
import { FEM_BYTES_PER_ELEMENT, RATES, RECORD_BYTES_PER_STEP } from './rates.ts';

export interface StudyEstimate { seconds: number; memory_bytes: number; refusal?: string }

const within = (e: StudyEstimate, budget: WorkBudget, limitSeconds: string, what: string, change: string): StudyEstimate => {
  if (e.refusal !== undefined) return e;
  if (e.seconds > budget.maxSeconds) {
    return { ...e, refusal: `${what} would take ${plainDuration(e.seconds)} (limit ${limitSeconds}); ${change}` };
  }
  if (e.memory_bytes > budget.maxMemory_bytes) {
    return { ...e, refusal: `${what} would need ${plainBytes(e.memory_bytes)} of memory (limit ${plainBytes(budget.maxMemory_bytes)}); ${change}` };
  }
  return e;
};

/** The FEM study at `f_Hz` for `orders`: every density it may try (it stops early at round-off). */
export function estimateFemStudy(stack: Stack, f_Hz: Float64Array, orders: readonly FemOrder[],
  budget: WorkBudget = DEFAULT_BUDGET, limitSeconds = `${budget.maxSeconds} s`): StudyEstimate {
  const regions = stack.layers.filter((l) => l.kind === 'bulk').length;
  let seconds = 0, memory = 0;
  for (const p of orders) {
    for (const density of FEM_DENSITIES[p]) {
      const el = sizeMesh(stack, f_Hz, { order: p, density }).elements;
      if (el > MAX_ELEMENTS) {
        return {
          seconds, memory_bytes: memory,
          refusal: `the FEM study's mesh for p = ${p} at ${density} elements per wavelength would need ${plainCount(el)} elements ` +
            `(limit ${plainCount(MAX_ELEMENTS)}); the stack is too many wavelengths thick for a refinement study: ` +
            'lower the band top or study a thinner stack',
        };
      }
      seconds += f_Hz.length * (RATES.femPerFrequency_s + el * RATES.femPerElementFrequency_s + regions * RATES.femPerRegionFrequency_s)
        + el * RATES.femMeshPerElement_s;
      memory = Math.max(memory, el * FEM_BYTES_PER_ELEMENT);
      if (el * 2 > MAX_STUDY_ELEMENTS) break;
    }
  }
  return within({ seconds, memory_bytes: memory }, budget, limitSeconds, 'the FEM refinement study',
    'lower the band top, study one order (--fem-order), or study a thinner stack');
}

/** The FDTD study: one pulse run at each cells-per-wavelength figure. */
export function estimateFdtdStudy(stack: Stack, points: number, budget: WorkBudget = DEFAULT_BUDGET,
  limitSeconds = `${budget.maxSeconds} s`, cells: readonly number[] = FDTD_CELLS_PER_WAVELENGTH): StudyEstimate {
  let seconds = 0, memory = 0;
  for (const c of cells) {
    let p;
    try { p = planGrid(stack, { cellsPerWavelength: c }); } catch (e) {
      if (e instanceof PlanError) return { seconds, memory_bytes: memory, refusal: `at ${c} cells per wavelength: ${e.message}` };
      throw e;
    }
    const n = p.cells + p.nodes.auxTotal, steps = p.expectedSteps;
    seconds += steps * (RATES.fdtdPerStep_s + n * RATES.fdtdPerCellUpdate_s) + 3 * steps * points * RATES.dtftPerSampleFrequency_s;
    memory = Math.max(memory, p.memory_bytes + p.stepsLimit * RECORD_BYTES_PER_STEP);
  }
  return within({ seconds, memory_bytes: memory }, budget, limitSeconds, `the FDTD refinement study (${cells.length} pulse runs up to ${cells[cells.length - 1]} cells per wavelength)`,
    'narrow the band or lower its top frequency, or use --method fem');
}

/** Bytes of the benchmark grid per cell: five kernel arrays (emptyKernelState) and the media placed while filling them, with room. */
const BENCH_BYTES_PER_CELL = 12 * 8;

/** `slabecho bench --cells N --steps T`. */
export function estimateBench(cells: number, steps: number, budget: WorkBudget = DEFAULT_BUDGET, limitSeconds = `${budget.maxSeconds} s`): StudyEstimate {
  const e = {
    seconds: (steps + 50) * (RATES.fdtdPerStep_s + cells * RATES.fdtdPerCellUpdate_s),
    memory_bytes: cells * BENCH_BYTES_PER_CELL,
  };
  return within(e, budget, limitSeconds, `the benchmark (${plainCount(cells)} cells × ${plainCount(steps)} steps)`, 'use fewer --cells or --steps');
}

