// What a pulse run steps with: the TypeScript reference kernel (kernel.ts) or the WebAssembly one
// (wasm/engine.ts), behind one interface. An engine owns both grids and advances them a batch of steps at a
// time: TF/SF coupling, the hard source, the probes (into a table the run copies into its records) and the
// profile's running DFT. The run (run.ts) does everything between batches: records, energy watch, the end.
//
// Step n → n + 1, identical in both engines (see run.ts for the physics):
//   injH = −E_inc(a)ⁿ; H of both grids (main with injH at node a − 1);
//   injE = −H_inc(a − 1)ⁿ⁺¹ᐟ²; E of both grids (main with injE at node a);
//   aux node 0 ← src[n + 1]; probes; on every stride-th step one DFT term with the batch's phasors.

import type { BuiltGrids } from './build.ts';
import type { SpectraState } from './convergence.ts';
import { BATCH_STEPS } from './wasm/slots.ts';

export type EngineKind = 'wasm-simd' | 'js';

/** Run-level constants an engine needs besides the grids. */
export interface EngineSetup {
  /** First total-field node, and the auxiliary grid's offset. */
  tfsf: number; auxOffset: number;
  /** Probe nodes of the main grid (back: −1 behind a conductor). */
  front: number; back: number; sfProbe: number;
  /** Value driven into aux node 0 after step n: source[n] for n < source.length, else 0. */
  source: Float64Array;
  /** Running DFT over main nodes [dftLo, dftLo + dftLength), a term at every step n with n % stride = 0. */
  dftLo: number; dftLength: number; stride: number;
  dt_s: number;
  /** Check frequencies of the running spectra. */
  spectraFrequencies: number;
}

export interface StepEngine {
  readonly kind: EngineKind;
  /** E of the main and the auxiliary grid (live views). */
  readonly mainE: Float64Array;
  readonly auxE: Float64Array;
  /** H of the main grid (live view). */
  readonly mainH: Float64Array;
  /** The profile's DFT accumulators over the DFT span (live views). */
  readonly dftRe: Float64Array;
  readonly dftIm: Float64Array;
  /** cos, sin of the DFT phase for row j of a batch (the run fills the rows of DFT steps before advance). */
  readonly phasors: Float64Array;
  /** Row j of a batch: incident, reflected, transmitted and scattered-probe samples of its step. */
  readonly probes: Float64Array;
  /** Steps n + 1 … n + k (k ≤ BATCH_STEPS). */
  advance(n: number, k: number): void;
  /** The DFT of the incident record at the profile frequency (re, im). */
  incidentDft(): [number, number];
  /** Stored energy of the main grid now (fields and pole states, normalized as EnergyReading). */
  energy(): number;
  /**
   * When the engine accumulates the running spectra of its probe samples itself (every step), their arrays and
   * the table of exact phasors the run fills before a batch that holds a step of index k·RESEED; else null (the
   * run feeds them from its records).
   */
  readonly spectra: (SpectraState & { seeds: Float64Array }) | null;
}

export { BATCH_STEPS };

/** A fresh batch table: phasor rows (2 per step) or probe rows (4 per step). */
export const batchTable = (perStep: number): Float64Array => new Float64Array(perStep * BATCH_STEPS);

/** Both grids, as built, with the run's constants: what an engine is made from. */
export interface EngineInput { grids: BuiltGrids; setup: EngineSetup }
