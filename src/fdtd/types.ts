// Public types of the FDTD pulse engine (see run.ts for the steppable run, plan.ts for the grid).
//
// Contract (kept stable for the spectra/echo modules, the report pipeline and the browser worker):
//   planGrid(stack, options) -> GridPlan          (no allocation of the grid; throws PlanError)
//   createPulseRun(stack, options) -> PulseRun    (allocates, ready to step)
//   runToEnd(run, {onProgress, shouldStop, chunk}) (async, chunked, cancellable)
// Positions are metres with x = 0 at the front face of the stack; times are seconds from the run's start.

import type { Profile } from '../results.ts';
import type { PulseShape } from './pulse.ts';
import type { LineMedium } from './media.ts';
import type { PowerLawFit } from './causal-fit.ts';
import type { EngineKind } from './engine.ts';

/** Knobs of a pulse run; every one optional. */
export interface PulseOptions {
  /** Cells per wavelength at the band top in the slowest medium; overrides the accuracy-driven choice. */
  cellsPerWavelength?: number;
  /**
   * Target for the engine's error, max |R_fdtd − R| and |T_fdtd − T| over the band against the exact solution
   * of the stepped media (default 0.01; honoured down to 1e-4). The planner keeps its predicted grid error
   * within a fifth of it and the run stops when its spectra have settled to a small fraction of it.
   */
  accuracy?: number;
  /** Courant number S = c0 Δt / Δx (default 1 when every medium has ε∞ ≥ 1, i.e. exact in air; at most √(min ε∞)). */
  courant?: number;
  /** CPML thickness in cells at each open end (default 24). */
  pmlCells?: number;
  /** The stored energy (fields and pole states) must fall this many dB below its peak before the run may stop (default 60). */
  decay_dB?: number;
  /** Hard cap on time steps (default derived from round-trip times and losses). */
  maxSteps?: number;
  /** Refuse grids with more E nodes than this (default 2e7). */
  maxCells?: number;
  /** Refuse runs needing more cell-updates than this (default 3e10, a few minutes of work). */
  maxWork?: number;
  /**
   * What steps the run: 'wasm-simd' (the WebAssembly SIMD kernel; an Error when the host has provided none or it
   * cannot run), 'js' (the TypeScript reference kernel). Default: WebAssembly when provided, else TypeScript.
   */
  engine?: EngineKind;
  /**
   * Lay the grid out for the field view: a front gap that shows the reflected pulse beside the stack (up to six
   * wavelengths), and the incident wave stepped across the whole grid so that `incidentField` holds it at every
   * node. By default the grid holds what the answers need: ten cells in front of the stack, and an incident grid
   * that ends a few cells behind the front face. The answers agree to the CPML's echo (a few parts in a million).
   */
  forView?: boolean;
}

/** One bulk layer's figures on the chosen grid. */
export interface LayerGridFigures {
  /** Index into stack.layers. */
  index: number;
  name: string;
  /** |√(εμ)| of the stepped line at the band top (sets the wavenumber the grid must resolve, evanescent media included). */
  n_top: number;
  /** Cells per wavelength inside the layer at the band top. */
  cellsPerWavelength: number;
  /** Cells across the layer (fractional: interfaces need not fall on nodes). */
  cells: number;
  /** Largest |k̃ − k|·2d over the band (one round trip through the layer, the grid's wavenumber against the medium's). */
  phaseError_rad: number;
}

/** Where things sit on the main grid (E-node indices). */
export interface GridNodes {
  /** E nodes of the main grid (indices 0 … total − 1); nodes 0 and total − 1 are conductor walls. */
  total: number;
  /** Front CPML covers nodes [0, pmlFrontEnd). */
  pmlFrontEnd: number;
  /** Scattered-field probe node (in front of the TF/SF plane). */
  sfProbe: number;
  /** First total-field node; the TF/SF plane lies half a cell in front of it. */
  tfsf: number;
  /** Node at x = 0 (front face). */
  front: number;
  /** Node at the back face (the conductor wall when the back is a perfect conductor). */
  back: number;
  /** Back CPML covers nodes [pmlBackStart, total) (equal to total when the back is a conductor). */
  pmlBackStart: number;
  /** Auxiliary (incident) grid: its node j is main node j + auxOffset; its node 0 is the hard source. */
  auxOffset: number;
  /** E nodes of the auxiliary grid. */
  auxTotal: number;
}

/** A bulk region of the effective stack, in metres from the front face. */
export interface GridSegment {
  x0_m: number; x1_m: number; model: LineMedium;
  /** Index into stack.layers, and the name the grid figures give it. */
  layer: number; name: string;
  /** `layers[i] name`, for messages. */
  label: string;
}
/** A zero-thickness resistive sheet. */
export interface GridSheet { x_m: number; conductance_S: number; label: string }

/**
 * The stack as the engine steps it (conductor layers turned into a wall or sheet, power laws and lossy fixed
 * permeabilities fitted), every medium a line medium: at normal incidence its ε and μ, at an angle the
 * phase-matched line's shunt and series models (oblique.ts).
 */
export interface EffectiveStack {
  front: LineMedium;
  segments: GridSegment[];
  sheets: GridSheet[];
  back: LineMedium | 'pec';
  /** Back face of the gridded stack (the conductor's face when a metal layer ends it). */
  thickness_m: number;
  /** Media the engine steps in place of what the stack names (fitted power laws, conductors as walls or sheets). */
  substitutions: number;
}

export interface GridPlan {
  dx_m: number;
  dt_s: number;
  courant: number;
  /** E nodes of the main grid. */
  cells: number;
  /** Step limit of the run (it usually stops earlier, when it has converged). */
  stepsLimit: number;
  /** Steps the run is expected to need (source, visible transits, ring-down, slowest relaxation). */
  expectedSteps: number;
  /** Slowest amplitude time constant of any pole of the stepped media, s (Infinity for a lossless pole). */
  slowestRelaxation_s: number;
  /** Cells per wavelength at the band top in the slowest medium. */
  cellsPerWavelength: number;
  /** Per bulk layer figures. */
  layers: LayerGridFigures[];
  /** Predicted engine error: max |ΔR|, |ΔT| over the band between the grid's exact response and the stepped media's. */
  predictedError: number;
  accuracyTarget: number;
  pmlCells: number;
  decay_dB: number;
  /** Bytes the run will allocate (grids, coefficient arrays, DFT; records excluded). */
  memory_bytes: number;
  /** Cell-updates at the step limit (main + auxiliary grid). */
  work_cell_updates: number;
  nodes: GridNodes;
  pulse: PulseShape;
  /** Power-law materials replaced by a fitted causal model. */
  fits: PowerLawFit[];
  effective: EffectiveStack;
  /** Profile frequency (the stack's profile_Hz). */
  profile_Hz: number;
  warnings: string[];
}

/**
 * Why a run ended: 'converged' (the running spectra settled at every check frequency and the stored energy,
 * pole states included, decayed), 'step-limit', or 'stopped' (by the caller).
 */
export type DoneReason = 'converged' | 'step-limit' | 'stopped';

/** Probe records, sampled every dt_s from t = 0 (sample k at t = k dt_s); views of length count. */
export interface PulseRunRecords {
  dt_s: number;
  count: number;
  /** Incident E at x = 0 (auxiliary grid). */
  incident: Float64Array;
  /** Reflected E at x = 0: total − incident. */
  reflected: Float64Array;
  /** Total E at the back face (all zero behind a perfect conductor). */
  transmitted: Float64Array;
  /** Scattered field in front of the TF/SF plane (the reflected wave a few cells earlier; a leakage check). */
  scatteredProbe: Float64Array;
}

export interface EnergyReading {
  /** Stored energy now (normalized units: Σ ε∞ E² + μ∞ (η0 H)² over the main grid, plus the pole states' energy). */
  current: number;
  peak: number;
  /** 10 log10(current / peak), −Infinity at zero. */
  level_dB: number;
}

export interface PulseRun {
  readonly plan: GridPlan;
  /** The kernel stepping this run (both give the same fields to the last bit, test/fdtd/engines.test.ts). */
  readonly engine: EngineKind;
  /** Why WebAssembly was not used though not refused (the host provided no module, it failed to compile…), or null. */
  readonly engineFallback: string | null;
  /** Advance up to n steps; returns the steps taken (fewer when the run finishes). */
  step(n: number): number;
  readonly stepIndex: number;
  readonly time_s: number;
  readonly done: boolean;
  readonly doneReason: DoneReason | null;
  /** Stop now (doneReason 'stopped'). */
  stop(): void;
  /** Position of every E node of the main grid, metres from the front face (a fresh array). */
  x_m(): Float64Array;
  /**
   * E at every node of the main grid (a live view, no copy). In front of the TF/SF plane
   * (nodes < plan.nodes.tfsf) the grid holds the scattered (reflected) field only.
   */
  totalField(): Float64Array;
  /** The incident field at every node now (zero outside the auxiliary grid's span: see PulseOptions.forView), written into out. */
  incidentField(out: Float64Array): Float64Array;
  records(): PulseRunRecords;
  /** Standing wave at stack.profile_Hz over the total-field region, incident amplitude 1 at x = 0. */
  profile(): Profile;
  energy(): EnergyReading;
  readonly warnings: string[];
}
