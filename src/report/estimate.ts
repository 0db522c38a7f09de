// Estimate before work: what a solve or a pulse run will cost (cells, steps, elements, rows, bytes, seconds,
// memory), computed in milliseconds from the plans alone (nothing per cell or per element is allocated), and the
// decisions that follow: refuse the job (with the figure and what to change), skip the FEM cross-check when it
// alone would break the budget, and how densely the profile and traces are written. solveReport and runReport
// follow these decisions, so what the estimate says is what the run does.

import { PlanError } from '../fdtd/errors.ts';
import { planGrid } from '../fdtd/plan.ts';
import type { GridPlan, PulseOptions } from '../fdtd/types.ts';
import type { LineMedium } from '../fdtd/media.ts';
import { profileMeshElements } from '../fem/profile.ts';
import { meshTooLarge, sizeMesh } from '../fem/mesh.ts';
import type { FemOptions } from '../fem/types.ts';
import { MAX_ELEMENTS } from '../fem/types.ts';
import type { Stack } from '../stack/types.ts';
import { profilePointCount, profileRange } from '../tmm/profile.ts';
import { linspace } from '../units.ts';
import { DEFAULT_BUDGET, plainBytes, plainCount, plainDuration, type WorkBudget } from './budget.ts';
import { planOutputs, type OutputPlan, type ProfileLevel } from './output-plan.ts';
import { profileHasH } from './profile-columns.ts';
import { QUANTITY_NAMES, quantitiesUnavailable } from '../studies/quantities.ts';
import { bandBins, binSpacing } from '../echoes/band-response.ts';
import { ECHO_BYTES_PER_BIN, FEM_BYTES_PER_ELEMENT, fdtdRates, PROFILE_BYTES_PER_ROW, RATES, RECORD_BYTES_PER_STEP } from './rates.ts';

/** A job refused by its estimate, before anything heavy was allocated; the message says why and what to change. */
export class WorkRefused extends Error {
  override name = 'WorkRefused';
}

export interface StageEstimate {
  stage: string;
  seconds: number;
  memory_bytes: number;
  /** The figures behind it, in plain words ("9.7 million time steps × 673 cells"). */
  detail: string;
}

export interface JobEstimate {
  stages: StageEstimate[];
  /** Typical total (the pulse run ending when its field has decayed) and the worst (at its step limit). */
  seconds: number;
  seconds_worst: number;
  memory_bytes: number;
  outputs: OutputPlan;
  /** Set when the FEM cross-check is to be skipped; the reason, for a warning. */
  femSkip?: string;
  /** The pulse engine's plan (run only); null when it declines the stack ('unsupported'). */
  grid: GridPlan | null;
  /** The engine's reason for declining, when it does. */
  pulseSkip?: string;
  refusal?: string;
}

export interface EstimateOptions {
  fem?: FemOptions;
  pulse?: PulseOptions;
  budget?: WorkBudget;
  /** How the user sets the output limit and the time limit, for messages (default: plain figures). */
  limitNames?: { output?: string; seconds?: string };
  /** A Touchstone file is written beside the spectrum (solve --touchstone). */
  touchstone?: boolean;
}

/** Numbers per row of a Touchstone file (frequency and four complex S-parameters; a one-port needs fewer). */
const TOUCHSTONE_COLUMNS = 9;

/** Frequencies the estimate sizes meshes on: the stack's own, or this many spread over the band (ends included). */
const SIZING_SAMPLES = 257;

const sizingFrequencies = (stack: Stack): Float64Array =>
  linspace(stack.band_Hz[0], stack.band_Hz[1], Math.min(stack.points, SIZING_SAMPLES));

const bulkCount = (stack: Stack): number => stack.layers.filter((l) => l.kind === 'bulk').length;

function tmmStage(stack: Stack, points: number): StageEstimate {
  const regions = bulkCount(stack) + 2;
  return {
    stage: 'exact solution', memory_bytes: points * 5 * 8,
    seconds: points * (RATES.tmmPerFrequency_s + regions * RATES.tmmPerRegionFrequency_s),
    detail: `${plainCount(points)} frequencies × ${regions} regions`,
  };
}

interface FemStage extends StageEstimate { elements: number }

function femStage(stack: Stack, fem: FemOptions): FemStage {
  const size = sizeMesh(stack, sizingFrequencies(stack), fem);
  const regions = bulkCount(stack), points = stack.points;
  return {
    stage: 'FEM cross-check', elements: size.elements,
    seconds: points * (RATES.femPerFrequency_s + size.elements * RATES.femPerElementFrequency_s + regions * RATES.femPerRegionFrequency_s)
      + size.elements * RATES.femMeshPerElement_s,
    memory_bytes: size.elements * FEM_BYTES_PER_ELEMENT + points * 9 * 8,
    detail: `${plainCount(size.elements)} elements × ${plainCount(points)} frequencies`,
  };
}

/** Rows of the profile at a sampling level: the exact solver's positions plus, optionally, the FEM's own. */
function profileRows(stack: Stack, fem: FemOptions | null, level: ProfileLevel): number {
  let rows = profilePointCount(stack, stack.profile_Hz, level.pointsPerWavelength);
  if (fem && level.femSamples) rows += 10 * profileElements(stack, fem) + 1;
  return rows;
}

/** Elements of the FEM's profile mesh (capped where the FEM would refuse it). */
function profileElements(stack: Stack, fem: FemOptions): number {
  const [lo, hi] = profileRange(stack, stack.profile_Hz);
  return Math.min(MAX_ELEMENTS, profileMeshElements(stack, stack.profile_Hz, lo, hi, fem, profileHasH(stack)));
}

function profileStage(stack: Stack, fem: FemOptions | null, rows: number): StageEstimate {
  const elements = fem ? profileElements(stack, fem) : 0;
  return {
    stage: 'profile',
    seconds: rows * (RATES.tmmProfilePerRow_s + (fem ? RATES.femProfilePerRow_s : 0)) + elements * RATES.femMeshPerElement_s,
    memory_bytes: rows * PROFILE_BYTES_PER_ROW + elements * FEM_BYTES_PER_ELEMENT,
    detail: `${plainCount(rows)} positions`,
  };
}

/** Pole terms stepped per time step, summed over the grid's nodes and both sides (Debye 2 arrays, second-order 3). */
export function poleTermUpdates(p: GridPlan): number {
  const side = (m: { debye: unknown[]; osc: unknown[] }) => 2 * m.debye.length + 3 * m.osc.length;
  const terms = (m: LineMedium | 'pec') => (m === 'pec' ? 0 : side(m.shunt) + side(m.series));
  let n = 0;
  for (const s of p.effective.segments) n += terms(s.model) * ((s.x1_m - s.x0_m) / p.dx_m + 2);
  n += terms(p.effective.front) * (p.nodes.front + p.nodes.auxTotal) + terms(p.effective.back) * (p.nodes.total - p.nodes.back);
  return n;
}

/** The pulse run, its spectra and its echoes at `steps` time steps (`worst`: echoes at their capped worst). */
/**
 * The echo analysis: the three records' transforms at the band's bins (as the spectra's DTFT), then work
 * on those bins and the bounce paths that does not grow with the record (`worst`: the lattice at its cap).
 */
function echoStage(p: GridPlan, band_Hz: readonly [number, number], steps: number, worst: boolean): StageEstimate {
  const bins = bandBins(band_Hz, binSpacing(steps, p.dt_s, band_Hz)).count;
  return {
    stage: 'echo extraction', memory_bytes: ECHO_BYTES_PER_BIN * 32 * Math.max(bins, 1),
    seconds: RATES.echoesFixed_s + 3 * steps * bins * RATES.dtftPerSampleFrequency_s + (worst ? RATES.echoesLatticeCap_s : 0),
    detail: `${plainCount(steps)} samples × ${plainCount(bins)} band bins`,
  };
}

function pulseStages(p: GridPlan, band_Hz: readonly [number, number], points: number, steps: number, worst = false): StageEstimate[] {
  const cells = p.cells + p.nodes.auxTotal, fdtd = fdtdRates();
  return [
    {
      stage: 'pulse run',
      seconds: steps * (fdtd.perStep_s + cells * fdtd.perCellUpdate_s + poleTermUpdates(p) * fdtd.perPoleTermUpdate_s),
      memory_bytes: p.memory_bytes + steps * RECORD_BYTES_PER_STEP,
      detail: `${plainCount(steps)} time steps × ${plainCount(cells)} cells`,
    },
    {
      stage: 'spectra of the records', memory_bytes: points * 6 * 8,
      seconds: 3 * steps * (points + 1) * RATES.dtftPerSampleFrequency_s,
      detail: `${plainCount(steps)} samples × ${plainCount(points)} frequencies`,
    },
    echoStage(p, band_Hz, steps, worst),
  ];
}

const sum = (stages: readonly StageEstimate[], key: 'seconds' | 'memory_bytes'): number => stages.reduce((a, s) => a + s[key], 0);

/** Estimate `slabecho solve` (withPulse false) or `slabecho run` (true) on `stack`. Never throws for a valid stack. */
export function estimateJob(stack: Stack, options: EstimateOptions & { withPulse: boolean }): JobEstimate {
  const budget = options.budget ?? DEFAULT_BUDGET;
  const femOptions = options.fem ?? {};
  const limitOut = options.limitNames?.output ?? plainBytes(budget.maxOutput_bytes);
  const limitSeconds = options.limitNames?.seconds ?? `${budget.maxSeconds} s`;

  // The pulse engine's plan first: it costs milliseconds and may refuse the stack outright.
  let grid: GridPlan | null = null, pulseSkip: string | undefined, refusal: string | undefined;
  if (options.withPulse) {
    try { grid = planGrid(stack, options.pulse); } catch (e) {
      if (!(e instanceof PlanError)) throw e;
      if (e.code === 'unsupported') pulseSkip = e.message; else refusal = e.message;
    }
  }

  const tmm = tmmStage(stack, stack.points);
  let fem: FemStage | null = femStage(stack, femOptions);
  let femSkip: string | undefined;
  if (fem.elements > MAX_ELEMENTS) { femSkip = `FEM skipped: ${meshTooLarge(fem.elements)}`; fem = null; }

  const steps = grid ? grid.expectedSteps : 0, stepsWorst = grid ? grid.stepsLimit : 0;
  const pulse = grid ? pulseStages(grid, stack.band_Hz, stack.points, steps) : [];
  const pulseWorst = grid ? pulseStages(grid, stack.band_Hz, stack.points, stepsWorst, true) : [];

  // Outputs (with or without the FEM's columns), the profile stage, the writing.
  const plan = (withFem: boolean): { outputs: OutputPlan; stages: StageEstimate[] } => {
    const methods = 1 + (withFem ? 1 : 0) + (grid ? 1 : 0);
    const femForProfile = withFem ? femOptions : null;
    // Profile columns: x, then E (and H in TM) of the exact solution and the FEM, then E of the pulse run.
    const perMethod = profileHasH(stack) ? 4 : 2;
    // Spectrum columns: f, R and T of every method, then the engineering quantities when they are defined.
    const quantities = quantitiesUnavailable(stack) === null ? QUANTITY_NAMES.length : 0;
    const outputs = planOutputs({
      points: stack.points, spectrumColumns: 1 + 4 * methods + quantities,
      extraTables: options.touchstone ? [{ rows: stack.points, columns: TOUCHSTONE_COLUMNS }] : [],
      profile: { rowsAt: (level) => profileRows(stack, femForProfile, level), columns: 1 + perMethod * (1 + (withFem ? 1 : 0)) + (grid ? 2 : 0) },
      trace: options.withPulse ? { rows: stepsWorst + 1, columns: 4 } : null,
      layers: stack.layers.length, maxBytes: budget.maxOutput_bytes, limitName: limitOut,
    });
    const stages: StageEstimate[] = [tmm];
    if (withFem && fem) stages.push(fem);
    if (outputs.profile) stages.push(profileStage(stack, femForProfile, outputs.profile.rows));
    const bytes = outputs.spectrum_bytes + outputs.reserve_bytes + (outputs.profile?.bytes ?? 0)
      + (outputs.traceRowsCap !== null ? Math.min(outputs.traceRowsCap, stepsWorst + 1) * 4 * 20 : 0);
    stages.push({ stage: 'writing the files', seconds: bytes * RATES.csvPerByte_s, memory_bytes: 0, detail: `up to ${plainBytes(bytes)}` });
    return { outputs, stages };
  };

  let chosen = plan(fem !== null);
  const over = (stages: StageEstimate[]) =>
    sum([...stages, ...pulse], 'seconds') > budget.maxSeconds || sum([...stages, ...pulseWorst], 'memory_bytes') > budget.maxMemory_bytes;
  if (fem && over(chosen.stages)) {
    // The cross-check is what gives way first; if the job is still too large without it, the refusal below names
    // what else makes it so.
    femSkip = `FEM skipped: the cross-check (${fem.detail}) would take ${plainDuration(fem.seconds)} and ${plainBytes(fem.memory_bytes)} ` +
      `of memory, and with it the job would pass its limits (${limitSeconds}; memory ${plainBytes(budget.maxMemory_bytes)}); ` +
      'fewer points or a lower --fem-density bring it within';
    chosen = plan(false);
  }
  const stages = [...chosen.stages, ...pulse];
  const seconds = sum(stages, 'seconds');
  const seconds_worst = sum([...chosen.stages, ...pulseWorst], 'seconds');
  const memory_bytes = sum([...chosen.stages, ...pulseWorst], 'memory_bytes');
  refusal ??= chosen.outputs.refusal;
  if (refusal === undefined && seconds > budget.maxSeconds) refusal = tooLong(stack, stages, seconds, budget.maxSeconds, limitSeconds, grid);
  if (refusal === undefined && memory_bytes > budget.maxMemory_bytes) {
    refusal = tooBig(stack, [...chosen.stages, ...pulseWorst], memory_bytes, budget.maxMemory_bytes, grid);
  }
  return { stages, seconds, seconds_worst, memory_bytes, outputs: chosen.outputs, femSkip, grid, pulseSkip, refusal };
}

export const estimateSolve = (stack: Stack, options: EstimateOptions = {}): JobEstimate => estimateJob(stack, { ...options, withPulse: false });
export const estimateRun = (stack: Stack, options: EstimateOptions = {}): JobEstimate => estimateJob(stack, { ...options, withPulse: true });

const largest = (stages: readonly StageEstimate[], key: 'seconds' | 'memory_bytes'): StageEstimate =>
  stages.reduce((a, s) => (s[key] > a[key] ? s : a));

const GHz = (f: number): string => `${Number((f / 1e9).toPrecision(6))} GHz`;
const MHz = (f: number): string => (f >= 1e9 ? GHz(f) : `${Number((f / 1e6).toPrecision(3))} MHz`);

/** What to change when the pulse's length (set by the band's width) or the grid makes the run too long. */
function pulseAdvice(stack: Stack, grid: GridPlan, factor: number): string {
  const [f1, f2] = stack.band_Hz, width = f2 - f1;
  if (width < 0.2 * f2) {
    // The pulse lasts about 1/width; the steps, and so the time, scale with it.
    const wider = roundUp(width * factor * 1.2);
    return `the band is only ${MHz(width)} wide, so the pulse lasts about ${plainTime(grid.pulse.end_s)}: widen the band ` +
      `to at least ${MHz(wider)}, or use "slabecho solve", which needs no pulse`;
  }
  return 'narrow the band or lower its top frequency, ask for a coarser --accuracy, or use "slabecho solve"';
}

/** Up to the next 1, 2 or 5 × 10^k. */
function roundUp(x: number): number {
  const e = 10 ** Math.floor(Math.log10(x));
  return ([1, 2, 5, 10].find((m) => m * e >= x) ?? 10) * e;
}

function plainTime(s: number): string {
  if (s >= 1e-3) return `${Number((s * 1e3).toPrecision(2))} ms`;
  if (s >= 1e-6) return `${Number((s * 1e6).toPrecision(2))} µs`;
  return `${Number((s * 1e9).toPrecision(2))} ns`;
}

function tooLong(stack: Stack, stages: StageEstimate[], seconds: number, max: number, limitName: string, grid: GridPlan | null): string {
  const top = largest(stages, 'seconds');
  const head = `this job would take ${plainDuration(seconds)} of computing (limit ${limitName}); most of it is the ${top.stage}, ${top.detail}`;
  if (grid && ['pulse run', 'spectra of the records', 'echo extraction'].includes(top.stage)) return `${head}; ${pulseAdvice(stack, grid, seconds / max)}`;
  if (top.stage === 'exact solution') return `${head}; use fewer points (at most ${plainCount(Math.floor(stack.points * max / seconds))} fit)`;
  if (top.stage === 'profile') return `${head}; choose a lower profile_GHz (fewer wavelengths across the stack)`;
  return `${head}; use fewer points or a narrower band, or raise the limit`;
}

function tooBig(stack: Stack, stages: StageEstimate[], bytes: number, max: number, grid: GridPlan | null): string {
  const top = largest(stages, 'memory_bytes');
  const head = `this job would need ${plainBytes(bytes)} of memory (limit ${plainBytes(max)}); most of it is for the ${top.stage}, ${top.detail}`;
  if (grid && ['pulse run', 'echo extraction'].includes(top.stage)) return `${head}; ${pulseAdvice(stack, grid, bytes / max)}`;
  return `${head}; use fewer points or a narrower band`;
}
