// Grid planning: cell size, time step, layout, step limit, cost, all before anything is allocated, and fast
// (a few milliseconds once the power-law fits are made; fits are cached per stack).
//
// Cell size (plan-cells.ts): the coarsest grid whose predicted engine error (the exact response of the grid
// itself against that of the stepped media) is within GRID_SHARE of the accuracy target.
// Time step: S = c0 Δt/Δx = 1 (exact propagation in an air front medium), or √(min ε∞) when a medium's
// high-frequency permittivity is below 1 (oblique TE lowers it). Every pole is stepped with the trapezoidal
// rule, which keeps the scheme stable for S ≤ √ε∞ whatever the poles (kernel.ts), so no pole ever demands a
// smaller step. Steps (plan-steps.ts): source, the transits the probes can see, ring-down, slowest relaxation.
// Refusals (PlanError) say in words what is too big, by how much, and what to change.

import { C0_m_per_s } from '../units.ts';
import type { Stack } from '../stack/types.ts';
import { PlanError } from './errors.ts';
import { resolveStack } from './effective.ts';
import { atIncidence } from './oblique.ts';
import { discreteWave } from './discrete.ts';
import { type LineMedium, lineIndex } from './media.ts';
import { chooseCells } from './plan-cells.ts';
import { SHEET_ALIGN_TOL } from './grid-response.ts';
import { estimateSteps } from './plan-steps.ts';
import { pulseForBand } from './pulse.ts';
import type { EffectiveStack, GridNodes, GridPlan, LayerGridFigures, PulseOptions } from './types.ts';

export { MIN_CELLS_PER_WAVELENGTH } from './plan-cells.ts';
export { SHEET_ALIGN_TOL } from './grid-response.ts';
export const DEFAULT_ACCURACY = 0.01;
/** Targets below this are accepted but not promised (the stepped media and round-off set a floor). */
export const FINEST_ACCURACY = 1e-4;
export const DEFAULT_PML_CELLS = 24;
export const DEFAULT_DECAY_dB = 60;
export const DEFAULT_MAX_CELLS = 2e7;
export const DEFAULT_MAX_WORK = 3e10;
/** Share of the accuracy target the grid's predicted error may use (the rest: interfaces inside cells,
 *  truncation of the records, boundaries), so the engine's measured error stays within 0.3 × target. */
export const GRID_SHARE = 0.2;
/** The front gap is at most this many wavelengths (at the profile frequency) when the stack is thicker. */
const FRONT_GAP_WAVELENGTHS = 6;
/** Cells between the front PML and the TF/SF plane (the scattered-field probe sits in the middle). */
const SF_CELLS = 4;
/** The auxiliary grid's CPML begins this many cells behind the front face (unless it must span the grid). */
const AUX_TAIL = 10;
/** Cells of uniform medium between the TF/SF plane and the front face, and behind the back face, at least. */
const MIN_GAP = 10;
/** Prediction frequencies: at least this many, and this many per resonance of the stack's longest round trip. */
const MIN_BUDGET_FREQUENCIES = 33;
const MAX_BUDGET_FREQUENCIES = 257;
const SAMPLES_PER_RESONANCE = 6;

interface CheckedOptions {
  accuracy: number; pmlCells: number; decay_dB: number; maxCells: number; maxWork: number;
  courant?: number; cellsPerWavelength?: number; maxSteps?: number;
}

function checkedOptions(o: PulseOptions): CheckedOptions {
  const positive = (v: number | undefined, name: string, what: string): void => {
    if (v !== undefined && !(v > 0 && Number.isFinite(v))) throw new PlanError(`${name}: must be ${what} (got ${v})`, 'bad-input');
  };
  positive(o.accuracy, 'accuracy', 'a number > 0, e.g. 0.01');
  positive(o.decay_dB, 'decay_dB', 'a number of dB > 0, e.g. 60');
  positive(o.courant, 'courant', 'a number in (0, 1]');
  if (o.cellsPerWavelength !== undefined && !(o.cellsPerWavelength >= 4 && Number.isFinite(o.cellsPerWavelength))) {
    throw new PlanError(`cellsPerWavelength: must be a number ≥ 4 (got ${o.cellsPerWavelength})`, 'bad-input');
  }
  const pmlCells = Math.round(o.pmlCells ?? DEFAULT_PML_CELLS);
  if (!(pmlCells >= 4)) throw new PlanError(`pmlCells: must be ≥ 4 (got ${o.pmlCells})`, 'bad-input');
  return {
    accuracy: o.accuracy ?? DEFAULT_ACCURACY, pmlCells, decay_dB: o.decay_dB ?? DEFAULT_DECAY_dB,
    maxCells: o.maxCells ?? DEFAULT_MAX_CELLS, maxWork: o.maxWork ?? DEFAULT_MAX_WORK,
    courant: o.courant, cellsPerWavelength: o.cellsPerWavelength, maxSteps: o.maxSteps,
  };
}

const mediaOf = (e: EffectiveStack): LineMedium[] =>
  [e.front, ...e.segments.map((s) => s.model), ...(e.back === 'pec' ? [] : [e.back])];

/**
 * The largest stable Courant number for these media: √(min ε∞ · min μ∞) over the stepped shunt and series
 * models, at most 1 (kernel.ts, stability). Every E node's ε∞ and H node's μ∞ is a subcell average, so at least
 * those minima, and the scaled curl-curl operator's rows then sum to at most 4/S² (Gershgorin's bound).
 */
export function courantLimit(media: LineMedium[]): number {
  return Math.min(1, Math.sqrt(minInf(media, 'shunt') * minInf(media, 'series')));
}
const minInf = (media: LineMedium[], side: keyof LineMedium): number => Math.min(...media.map((m) => m[side].epsInf));

function chooseCourant(media: LineMedium[], asked?: number): number {
  const limit = courantLimit(media);
  if (asked === undefined) return limit;
  if (asked > 1 + 1e-12 || asked > limit + 1e-12) {
    const minEps = minInf(media, 'shunt'), minMu = minInf(media, 'series');
    const why = limit < 1 ? `the smallest high-frequency permittivity and permeability of the stepped media are ε∞ = ${minEps.toPrecision(4)} and μ∞ = ${minMu.toPrecision(4)}, and stability needs S ≤ √(ε∞μ∞)` : 'the 1D leapfrog scheme needs S ≤ 1';
    throw new PlanError(`courant: ${asked} is above the stability limit ${limit.toPrecision(4)} (${why}); use at most ${limit.toPrecision(4)}, or leave it unset`, 'bad-input', { courant: asked, max: limit });
  }
  return asked;
}

/** Band frequencies for the prediction: both ends, and enough points to follow the stack's resonances. */
function budgetFrequencies(band: [number, number], eff: EffectiveStack): number[] {
  let trip = 0;
  for (const s of eff.segments) {
    const r = lineIndex(s.model, band[1]);
    trip += (2 * (s.x1_m - s.x0_m) * Math.hypot(r.re, r.im)) / C0_m_per_s;
  }
  const n = Math.min(MAX_BUDGET_FREQUENCIES, Math.max(MIN_BUDGET_FREQUENCIES, Math.ceil(SAMPLES_PER_RESONANCE * (band[1] - band[0]) * trip) + 1));
  return Array.from({ length: n }, (_, i) => band[0] + ((band[1] - band[0]) * i) / (n - 1));
}

const fmt = (x: number): string => (x >= 1e5 ? x.toExponential(2) : String(Math.round(x)));

/** What to change when a run is too big; at a grazing angle the small time step is the cause. */
function remedy(stack: Stack, courant: number): string {
  const base = 'narrow the band or lower its top frequency, ask for a coarser accuracy, or make the stack thinner';
  if (stack.incidence.angle_rad === 0 || courant >= 0.5) return base;
  const deg = (stack.incidence.angle_rad * 180) / Math.PI;
  return `${base}; at ${deg.toFixed(1)}° the time step is ${courant.toPrecision(2)} of normal incidence's (each medium's ε∞μ∞ is lowered by ε_front μ_front sin²θ), so a smaller angle shortens the run`;
}
const times = (a: number, b: number): string => `${(a / b).toPrecision(2)}×`;

export function planGrid(stack: Stack, options: PulseOptions = {}): GridPlan {
  const band = stack.band_Hz;
  if (!(band[0] > 0 && band[1] > band[0])) throw new PlanError('band: must satisfy 0 < min < max', 'bad-input');
  const o = checkedOptions(options);
  const resolved = resolveStack(stack);
  const warnings = [...resolved.warnings];
  const effective = atIncidence(resolved.effective, stack.incidence, band);
  const media = mediaOf(effective);
  const courant = chooseCourant(media, o.courant);
  const freqs = budgetFrequencies(band, effective);
  const cells = chooseCells({
    effective, freqs, courant, budget: GRID_SHARE * o.accuracy, accuracy: o.accuracy,
    cellsPerWavelength: o.cellsPerWavelength, maxCells: o.maxCells,
  });
  const { dx_m: dx, stackCells } = cells;
  const dt = (courant * dx) / C0_m_per_s;
  const nodes = layout(stack, effective, dx, stackCells, o.pmlCells, options.forView === true);
  if (cells.overLimit || nodes.total > o.maxCells) {
    const need = cells.overLimit ? Math.max(nodes.total, stackCells) : nodes.total;
    throw new PlanError(
      `the grid would need more than ${fmt(need)} cells of ${(dx * 1e3).toPrecision(3)} mm (the limit is ${fmt(o.maxCells)}, ${times(need, o.maxCells)} over) ` +
      `to keep the engine's error within ${o.accuracy}: ${remedy(stack, courant)}`,
      'too-many-cells', { cells: need, limit: o.maxCells, dx_m: dx, cellsPerWavelength: cells.N },
    );
  }

  const pulse = pulseForBand(band, dt);
  const steps = estimateSteps({
    effective, band_Hz: band, pulse, accuracy: o.accuracy, decay_dB: o.decay_dB,
    frontGap_m: (nodes.front - nodes.tfsf + SF_CELLS) * dx,
    backGap_m: effective.back === 'pec' ? 0 : (nodes.pmlBackStart - nodes.back) * dx,
    lambdaMin_m: cells.lambdaMin_m,
  });
  const perStep = nodes.total + nodes.auxTotal;
  const minSteps = Math.ceil(steps.minimum_s / dt);
  if (perStep * minSteps > o.maxWork) {
    const work = perStep * minSteps;
    throw new PlanError(
      `the run would need at least ${work.toExponential(2)} cell-updates (${nodes.total} cells × ${minSteps} steps; the limit is ${o.maxWork.toExponential(1)}, ${times(work, o.maxWork)} over): ` +
      remedy(stack, courant),
      'too-much-work', { cells: nodes.total, steps: minSteps, work, limit: o.maxWork },
    );
  }
  const expectedSteps = Math.ceil(steps.expected_s / dt) + 100;
  let stepsLimit = o.maxSteps ?? Math.ceil(steps.limit_s / dt) + 500;
  if (perStep * stepsLimit > o.maxWork) {
    stepsLimit = Math.floor(o.maxWork / perStep);
    warnings.push(`the step limit was capped at ${stepsLimit} steps by the work budget; a slowly ringing stack may be cut short (see the run's warnings).`);
  }

  if (innerSheetWarning(effective, cells.sheetMisalignment)) {
    warnings.push(
      `a resistive sheet lies ${cells.sheetMisalignment.toFixed(2)} of a cell off the nearest grid node (no grid up to 3× finer puts every sheet on a node); its current is shared between two nodes, which may cost accuracy for low-resistance sheets.`,
    );
  }
  if (cells.lumped) {
    warnings.push(
      `the stack is ${(effective.thickness_m * 1e6).toPrecision(3)} µm thick, much less than a cell (${(dx * 1e6).toPrecision(3)} µm): the pulse engine steps it within the cell at x = 0 and reads T there (error of order 2 k d = ${cells.lumpedError.toPrecision(2)}).`,
    );
  }
  if (cells.predicted > o.accuracy) {
    warnings.push(`predicted engine error ${cells.predicted.toPrecision(2)} exceeds the accuracy target ${o.accuracy} at ${cells.N.toFixed(1)} cells per wavelength; raise the cells per wavelength or leave the grid to the accuracy target.`);
  }
  if (o.accuracy < FINEST_ACCURACY) {
    warnings.push(`accuracy ${o.accuracy} is below ${FINEST_ACCURACY}: the grid is planned for it, but round-off and the boundaries may leave a larger error.`);
  }

  return {
    dx_m: dx, dt_s: dt, courant, cells: nodes.total, stepsLimit, expectedSteps,
    cellsPerWavelength: cells.lambdaMin_m / dx,
    layers: layerFigures(effective, band, dx, dt, courant),
    predictedError: cells.predicted, accuracyTarget: o.accuracy, pmlCells: o.pmlCells, decay_dB: o.decay_dB,
    memory_bytes: memoryBytes(effective, nodes, dx), work_cell_updates: perStep * stepsLimit,
    slowestRelaxation_s: steps.slowestRelaxation_s,
    nodes, pulse, fits: resolved.fits, effective, profile_Hz: stack.profile_Hz, warnings,
  };
}

const innerSheetWarning = (eff: EffectiveStack, mis: number): boolean =>
  eff.sheets.some((s) => s.x_m > 0 && s.x_m < eff.thickness_m) && mis > 0.05 && mis > SHEET_ALIGN_TOL;

/** [wall | CPML | SF cells (probe) | TF/SF plane | front gap | stack | back gap | CPML | wall]. */
function layout(stack: Stack, eff: EffectiveStack, dx: number, stackCells: number, P: number, forView: boolean): GridNodes {
  const lambdaAt = (m: LineMedium, f: number): number => C0_m_per_s / (f * Math.max(lineIndex(m, f).re, 1e-6));
  // In front, for the field view: 1.5 wavelengths at the profile frequency, or the stack's thickness (the view
  // shows the reflected pulse beside the stack) up to FRONT_GAP_WAVELENGTHS of them. The answers need none of
  // it (the probe sits on the front face; in front of it the medium is uniform), so a run for them has
  // MIN_GAP cells there.
  const lambdaFront = lambdaAt(eff.front, stack.profile_Hz);
  const gapFront = !forView ? MIN_GAP : Math.max(MIN_GAP, Math.ceil(Math.max(1.5 * lambdaFront, Math.min(eff.thickness_m, FRONT_GAP_WAVELENGTHS * lambdaFront)) / dx) + 2);
  const gapBack = eff.back === 'pec' ? 0 : Math.max(MIN_GAP, Math.ceil((0.5 * lambdaAt(eff.back, stack.profile_Hz)) / dx) + 2);
  return layoutNodes({ P, gapFront, stackCells, gapBack, pec: eff.back === 'pec', fullIncident: forView });
}

export interface LayoutCells {
  /** CPML cells at each open end; front gap, stack and back gap in cells (gapBack 0 before a conductor). */
  P: number; gapFront: number; stackCells: number; gapBack: number;
  pec: boolean;
  /** Step the incident wave across the whole grid (the field view draws it), not only up to the front face. */
  fullIncident: boolean;
}

/**
 * Node indices of a layout. The auxiliary grid carries the incident wave from its source to the TF/SF plane
 * and the front probe; unless the whole incident field is asked for, it ends AUX_TAIL cells behind the front
 * face in its CPML, so it costs a few dozen cells whatever the stack. Its CPML's echo (about 1e-6 of the pulse)
 * then reaches the incident record; a full-length incident grid ends where the main grid's CPML begins, so that
 * with nothing to scatter the two echoes cancel (TF/SF exact to rounding).
 */
export function layoutNodes(c: LayoutCells): GridNodes {
  const { P, gapFront, stackCells, gapBack, pec } = c;
  const tfsf = P + SF_CELLS;
  const front = tfsf + gapFront;
  const back = front + stackCells;
  const pmlBackStart = pec ? back + 1 : back + gapBack;
  const total = pec ? back + 1 : pmlBackStart + P + 1;
  const auxOffset = tfsf - 2;
  const auxFace = !c.fullIncident ? front + AUX_TAIL : pec ? back + 10 : pmlBackStart;
  const auxEnd = auxFace - auxOffset; // aux PML face
  return { total, pmlFrontEnd: P + 1, sfProbe: P + SF_CELLS / 2, tfsf, front, back, pmlBackStart, auxOffset, auxTotal: auxEnd + P + 1 };
}

function layerFigures(eff: EffectiveStack, band: [number, number], dx: number, dt: number, courant: number): LayerGridFigures[] {
  const fTop = band[1];
  return eff.segments.map((s) => {
    const r = lineIndex(s.model, fTop);
    const nTop = Math.hypot(r.re, r.im);
    const d = s.x1_m - s.x0_m;
    let worst = 0;
    for (const f of [band[0], (band[0] + band[1]) / 2, fTop]) {
      const k = discreteWave(s.model, f, dx, dt, courant).k;
      const root = lineIndex(s.model, f), k0 = (2 * Math.PI * f) / C0_m_per_s;
      worst = Math.max(worst, 2 * d * Math.hypot(k.re - k0 * root.re, k.im - k0 * root.im));
    }
    return { index: s.layer, name: s.name, n_top: nTop, cellsPerWavelength: C0_m_per_s / (fTop * nTop) / dx, cells: d / dx, phaseError_rad: worst };
  });
}

function memoryBytes(eff: EffectiveStack, nodes: GridNodes, dx: number): number {
  const arrays = (m: LineMedium | 'pec'): number => (m === 'pec' ? 0 : 2 * (m.shunt.debye.length + m.series.debye.length) + 3 * (m.shunt.osc.length + m.series.osc.length));
  let poleCells = 0;
  for (const s of eff.segments) poleCells += arrays(s.model) * ((s.x1_m - s.x0_m) / dx + 2);
  poleCells += arrays(eff.front) * (nodes.front + nodes.auxTotal) + arrays(eff.back) * (nodes.total - nodes.back);
  return 8 * (7 * nodes.total + 6 * nodes.auxTotal + 2 * (nodes.total - nodes.tfsf) + poleCells + 3 * nodes.total);
}
