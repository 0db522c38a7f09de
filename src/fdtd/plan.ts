// Grid planning: cell size, time step, layout, step limit, cost, all before anything is allocated.
//
// Cell size. The slowest medium (largest Re √ε over the band, layers and half-spaces) sets the
// shortest wavelength λ_min at the band top; Δx = λ_min / N. Unless the caller fixes N
// (cellsPerWavelength), N is the smallest value (≥ MIN_CELLS_PER_WAVELENGTH) whose predicted error
// stays within half the accuracy target, where the predicted error is
//   Σ_layers  2 d |k̃ − k| · bounce factor · attenuation in front of the layer
// with k̃ from the 1D Yee dispersion relation (dispersion.ts): a phase error of δ radians on an
// echo of amplitude a moves R by about a·δ. Δx is then trimmed down so the stack's thickness is a
// whole number of cells: the front face (x = 0) and the back face fall exactly on E nodes. A stack of
// a few microns (a film) is instead stepped within the cell at x = 0, when that errs by less than half
// the accuracy target (`lumped` below).
//
// Time step: S = c0 Δt / Δx, default 1 (exact propagation in an air front medium), lowered to
// √(min ε∞) when a medium has ε∞ < 1.

import { C0_m_per_s, ETA0_ohm } from '../units.ts';
import type { Stack } from '../stack/types.ts';
import { PlanError } from './errors.ts';
import { resolveStack } from './effective.ts';
import { atIncidence } from './oblique.ts';
import { yeePhaseErrorPerMetre } from './dispersion.ts';
import { type StepModel, extinctionIndex, refractiveIndex, stepModelPermittivity } from './media.ts';
import { pulseForBand } from './pulse.ts';
import type { GridNodes, GridPlan, LayerGridFigures, PulseOptions } from './types.ts';

export const DEFAULT_ACCURACY = 0.01;
export const MIN_CELLS_PER_WAVELENGTH = 20;
export const DEFAULT_PML_CELLS = 24;
export const DEFAULT_DECAY_dB = 60;
export const DEFAULT_MAX_CELLS = 2e7;
export const DEFAULT_MAX_WORK = 3e10;
/** Fraction of the accuracy target the grid-dispersion error may use (the rest: interfaces, fits, truncation). */
const DISPERSION_SHARE = 0.5;
/** Cells between the front PML and the TF/SF plane (the scattered-field probe sits in the middle). */
const SF_CELLS = 4;
/** Sheets are put within this fraction of a cell of a node when a grid up to SHEET_ALIGN_RANGE× finer allows;
 *  the builder then steps such a sheet on that node (build.ts). */
export const SHEET_ALIGN_TOL = 0.02;
const SHEET_ALIGN_RANGE = 3;
/** For the bounce estimate, a sheet this close to a face (in shortest wavelengths) acts at that face. */
const SHEET_NEAR_FACE = 0.01;
/** Frequencies sampled across the band for the slowest medium and the worst phase error. */
const BAND_SAMPLES = 33;
/** Per-round-trip amplitude retention is capped here when estimating bounces (keeps factors finite). */
const MAX_RETENTION = 0.98;

const sampleBand = ([f1, f2]: [number, number]): number[] =>
  Array.from({ length: BAND_SAMPLES }, (_, i) => f1 + ((f2 - f1) * i) / (BAND_SAMPLES - 1));

/** Complex refractive index n − jκ of a model at f (e^{+jωt}). */
function index(m: StepModel, f: number): { n: number; k: number } {
  const e = stepModelPermittivity(m, f);
  return { n: refractiveIndex(e), k: extinctionIndex(e) };
}

/** |r| looking from medium a into admittance Y (normalized to free space), both complex. */
function reflectionMagnitude(a: { n: number; k: number }, yRe: number, yIm: number): number {
  const nr = a.n - yRe, ni = -a.k - yIm, dr = a.n + yRe, di = -a.k + yIm;
  return Math.hypot(nr, ni) / Math.hypot(dr, di);
}

/** Largest stable S for the media on a grid of cell dx (a 0.5 % margin below the von Neumann bound); `courant` is not needed (kept for callers). */
export function stabilityCap(media: StepModel[], dx: number, courant: number): number {
  let cap = Math.sqrt(Math.min(1, ...media.map((m) => m.epsInf)));
  for (const m of media) {
    if (m.osc.length === 0) continue;
    // ε_Nyq depends on Δt = S Δx / c0 and falls as S grows (and an oscillator needs ω0 Δt < 2 at all), so the
    // stable S form an interval [0, S*]: find S* by bisection (a fixed-point iteration can oscillate between 0
    // and 1 when ω0 Δt passes 2, and so end on an unstable S).
    const stable = (S: number): boolean => {
      const dt = (S * dx) / C0_m_per_s;
      let epsNyq = m.epsInf;
      for (const o of m.osc) {
        const w = o.w0sq * dt * dt;
        if (w >= 4) return false;
        epsNyq -= (o.c * dt * dt) / (4 - w);
      }
      return epsNyq > 0 && S <= 0.995 * Math.sqrt(epsNyq);
    };
    let lo = 0, hi = 1;
    if (stable(hi)) lo = hi;
    else for (let it = 0; it < 60; it++) { const mid = (lo + hi) / 2; if (stable(mid)) lo = mid; else hi = mid; }
    cap = Math.min(cap, lo);
  }
  return cap;
}

export function planGrid(stack: Stack, options: PulseOptions = {}): GridPlan {
  const band = stack.band_Hz;
  if (!(band[0] > 0 && band[1] > band[0])) throw new PlanError('band: must satisfy 0 < min < max', 'bad-input');
  const accuracy = options.accuracy ?? DEFAULT_ACCURACY;
  if (!(accuracy > 0)) throw new PlanError('accuracy: must be > 0', 'bad-input');
  const pmlCells = Math.round(options.pmlCells ?? DEFAULT_PML_CELLS);
  if (!(pmlCells >= 4)) throw new PlanError('pmlCells: must be ≥ 4', 'bad-input');
  const decay_dB = options.decay_dB ?? DEFAULT_DECAY_dB;
  if (!(decay_dB > 0)) throw new PlanError('decay_dB: must be > 0', 'bad-input');
  const maxCells = options.maxCells ?? DEFAULT_MAX_CELLS;
  const maxWork = options.maxWork ?? DEFAULT_MAX_WORK;

  const resolved = resolveStack(stack);
  const { fits, warnings } = resolved;
  const effective = atIncidence(resolved.effective, stack.incidence);
  const freqs = sampleBand(band);
  const fTop = band[1], fMid = (band[0] + band[1]) / 2;
  const media: StepModel[] = [effective.front, ...effective.segments.map((s) => s.model)];
  if (effective.back !== 'pec') media.push(effective.back);

  // Courant number.
  let minEpsInf = Infinity;
  for (const m of media) minEpsInf = Math.min(minEpsInf, m.epsInf);
  const sMax = Math.min(1, Math.sqrt(Math.max(minEpsInf, 1e-12)));
  let courant = options.courant ?? sMax;
  if (!(courant > 0 && courant <= sMax + 1e-12)) {
    throw new PlanError(`courant: must be in (0, ${sMax.toPrecision(4)}] for these media (1D Yee stability)`, 'bad-input', { courant, max: sMax });
  }

  // A stack of a few microns is stepped inside the cell of the node at x = 0 (subcell averaging; its sheets on
  // that node) and T is read there, when that costs at most half the accuracy target: moving T's reference
  // plane by d errs by about k d in the media around it, a conductor behind moved to x = 0 by 2 k d, and
  // lumping the stack by about (k d)² inside it. Forcing Δx down to its thickness would ask for millions of cells.
  const thickness = effective.thickness_m;
  const maxWavenumber = (m: StepModel): number => {
    let k = 0;
    for (const f of freqs) k = Math.max(k, (2 * Math.PI * f * index(m, f).n) / C0_m_per_s);
    return k;
  };
  const kOut = Math.max(maxWavenumber(effective.front), effective.back === 'pec' ? 0 : maxWavenumber(effective.back));
  const kIn = Math.max(0, ...effective.segments.map((s) => maxWavenumber(s.model)));
  const lumped = thickness > 0 && 2 * kOut * thickness <= accuracy / 2 && (kIn * thickness) ** 2 <= accuracy / 2;
  // Shortest wavelength over the band in any medium the grid resolves.
  const lambdaMin = (2 * Math.PI) / (lumped ? kOut : Math.max(kOut, kIn));

  // Per-layer reflection environment (for the bounce factors), at band centre.
  const segs = effective.segments;
  const admittanceAt = (j: number, f: number): { re: number; im: number } | 'pec' => {
    if (j < 0) { const a = index(effective.front, f); return { re: a.n, im: -a.k }; }
    if (j >= segs.length) {
      if (effective.back === 'pec') return 'pec';
      const a = index(effective.back, f); return { re: a.n, im: -a.k };
    }
    const a = index(segs[j].model, f); return { re: a.n, im: -a.k };
  };
  // Normalized conductance of the sheets just outside a face (dir −1: in front of x, +1: behind it). Sheets
  // within a hundredth of the shortest wavelength count: a conductor film's sheet sits at the film's centre,
  // microns behind the face of the layer in front, and still closes that layer.
  const sheetAdmittance = (x: number, dir: -1 | 1): number => {
    let g = 0;
    for (const s of effective.sheets) {
      const beyond = dir * (s.x_m - x); // ≥ 0 on the outer side of the face
      if (beyond >= -1e-12 && beyond <= SHEET_NEAR_FACE * lambdaMin) g += s.conductance_S * ETA0_ohm;
    }
    return g;
  };
  const k0Mid = (2 * Math.PI * fMid) / C0_m_per_s;
  const bounce: number[] = [], atten: number[] = [];
  let attAcc = 1;
  for (let i = 0; i < segs.length; i++) {
    const s = segs[i], me = index(s.model, fMid);
    const side = (j: number, x: number, dir: -1 | 1): number => {
      const y = admittanceAt(j, fMid);
      if (y === 'pec') return 1;
      return reflectionMagnitude(me, y.re + sheetAdmittance(x, dir), y.im);
    };
    const d = s.x1_m - s.x0_m;
    const loss = Math.exp(-2 * me.k * k0Mid * d);
    const rho = Math.min(MAX_RETENTION, side(i - 1, s.x0_m, -1) * side(i + 1, s.x1_m, 1) * loss);
    bounce.push((1 + rho) / (1 - rho));
    atten.push(attAcc);
    attAcc *= loss;
  }

  // Sheets inside the stack: a resistive sheet is exact on an E node and only approximate between
  // two (its current is shared), so among slightly finer grids pick one that puts them on nodes.
  const innerSheets = effective.sheets.map((sh) => sh.x_m).filter((x) => x > 0 && x < thickness);
  const misalignment = (cells: number): number => {
    let worst = 0;
    for (const x of innerSheets) { const u = (x / thickness) * cells; worst = Math.max(worst, Math.abs(u - Math.round(u))); }
    return worst;
  };
  const cellsFor = (N: number): { dx: number; stackCells: number } => {
    const target = lambdaMin / N;
    if (thickness <= 0 || lumped) return { dx: target, stackCells: 0 };
    let stackCells = Math.max(1, Math.ceil(thickness / target - 1e-9));
    if (innerSheets.length > 0) {
      let best = stackCells, bestMis = misalignment(stackCells);
      for (let c = stackCells + 1; c <= Math.ceil(stackCells * SHEET_ALIGN_RANGE) && bestMis > SHEET_ALIGN_TOL; c++) {
        const m = misalignment(c);
        if (m < bestMis - 1e-12) { best = c; bestMis = m; }
      }
      stackCells = best;
    }
    return { dx: thickness / stackCells, stackCells };
  };
  const phaseErrors = (dx: number): number[] => {
    const dt = (courant * dx) / C0_m_per_s;
    if (lumped) return segs.map(() => 0); // no wave crosses a lumped stack on the grid
    return segs.map((s) => {
      let worst = 0;
      for (const f of freqs) worst = Math.max(worst, 2 * (s.x1_m - s.x0_m) * yeePhaseErrorPerMetre(f, index(s.model, f).n, dx, dt));
      return worst;
    });
  };
  const predicted = (pe: number[]): number => pe.reduce((acc, p, i) => acc + p * bounce[i] * atten[i], 0);

  let N: number;
  if (options.cellsPerWavelength !== undefined) {
    N = options.cellsPerWavelength;
    if (!(N >= 4)) throw new PlanError('cellsPerWavelength: must be ≥ 4', 'bad-input');
  } else {
    N = MIN_CELLS_PER_WAVELENGTH;
    for (;;) {
      const { dx } = cellsFor(N);
      if (predicted(phaseErrors(dx)) <= DISPERSION_SHARE * accuracy) break;
      if (cellsFor(N).stackCells > maxCells || N > 1e7) break; // refused below
      N *= 1.05;
    }
  }
  const { dx, stackCells } = cellsFor(N);
  // Second-order poles are stepped explicitly: they lower the permittivity the grid sees near the
  // Nyquist frequency, ε_Nyq = ε∞ − Σ c Δt² / (4 − ω0² Δt²); stability needs S² ≤ ε_Nyq
  // (von Neumann analysis of the coupled update; for Drude it is S² ≤ ε∞ − (ωp Δt / 2)²).
  const cap = stabilityCap(media, dx, courant);
  if (courant > cap) {
    if (options.courant !== undefined) {
      throw new PlanError(
        `courant: ${courant} is unstable with these dispersive media at Δx = ${(dx * 1e3).toPrecision(3)} mm; use at most ${cap.toPrecision(4)}`,
        'bad-input', { courant, max: cap },
      );
    }
    courant = cap;
  }
  const dt = (courant * dx) / C0_m_per_s;
  const pe = phaseErrors(dx);
  const predictedError = predicted(pe);

  // Layout.
  const lambdaAt = (m: StepModel | 'pec', f: number): number => (m === 'pec' ? 0 : C0_m_per_s / (f * Math.max(index(m, f).n, 1e-6)));
  const gapFront = Math.max(10, Math.ceil(Math.max(1.5 * lambdaAt(effective.front, stack.profile_Hz), thickness) / dx) + 2);
  const gapBack = effective.back === 'pec' ? 0 : Math.max(10, Math.ceil((0.5 * lambdaAt(effective.back, stack.profile_Hz)) / dx) + 2);
  const P = pmlCells;
  const tfsf = P + SF_CELLS;
  const front = tfsf + gapFront;
  const back = front + stackCells;
  const pmlBackStart = effective.back === 'pec' ? back + 1 : back + gapBack;
  const total = effective.back === 'pec' ? back + 1 : pmlBackStart + P + 1;
  const auxOffset = tfsf - 2;
  const auxEnd = (effective.back === 'pec' ? back + 10 : pmlBackStart) - auxOffset; // aux PML face
  const auxTotal = auxEnd + P + 1;
  const nodes: GridNodes = { total, pmlFrontEnd: P + 1, sfProbe: P + SF_CELLS / 2, tfsf, front, back, pmlBackStart, auxOffset, auxTotal };

  if (total > maxCells) {
    throw new PlanError(
      `the grid would need ${total.toExponential(2)} cells (limit ${maxCells.toExponential(1)}) at Δx = ${(dx * 1e3).toPrecision(3)} mm; narrow the band, lower its top frequency, or ask for a coarser accuracy`,
      'too-many-cells',
      { cells: total, limit: maxCells, dx_m: dx, cellsPerWavelength: N },
    );
  }

  // Step limit from the source, transits and ring-down.
  const pulse = pulseForBand(band, dt);
  const frontN = index(effective.front, fMid).n;
  let transit = ((gapFront + SF_CELLS) * dx * frontN) / C0_m_per_s;
  let stackTrip = 0, ring = 0, worstRho = 0;
  segs.forEach((s, i) => {
    const t = ((s.x1_m - s.x0_m) * index(s.model, fMid).n) / C0_m_per_s;
    stackTrip += 2 * t;
    const rho = (bounce[i] - 1) / (bounce[i] + 1);
    worstRho = Math.max(worstRho, rho);
    if (rho > 0) ring = Math.max(ring, ((decay_dB + 10) / (-20 * Math.log10(rho))) * 2 * t);
  });
  if (worstRho > 0) ring = Math.max(ring, ((decay_dB + 10) / (-20 * Math.log10(worstRho))) * stackTrip);
  transit += stackTrip / 2;
  if (effective.back !== 'pec') transit += (gapBack * dx * index(effective.back, fMid).n) / C0_m_per_s;
  const expectedTime = pulse.end_s + 2 * transit + ring;
  const expectedSteps = Math.ceil(expectedTime / dt) + 100;
  let stepsLimit = options.maxSteps ?? 3 * expectedSteps + 500;
  const perStep = total + auxTotal;
  const minSteps = Math.ceil((pulse.end_s + 2 * transit) / dt);
  if (perStep * minSteps > maxWork) {
    throw new PlanError(
      `the run would need at least ${(perStep * minSteps).toExponential(2)} cell-updates (limit ${maxWork.toExponential(1)}): ${total} cells × ${minSteps} steps; narrow the band or ask for a coarser accuracy`,
      'too-much-work',
      { cells: total, steps: minSteps, work: perStep * minSteps, limit: maxWork },
    );
  }
  if (perStep * stepsLimit > maxWork) {
    stepsLimit = Math.floor(maxWork / perStep);
    warnings.push(`the step limit was capped at ${stepsLimit} by the work budget; a slowly ringing stack may be cut short (see the run's warnings).`);
  }

  const layers: LayerGridFigures[] = segs.map((s, i) => {
    const nTop = index(s.model, fTop).n;
    return {
      index: s.layer, name: s.name,
      n_top: nTop,
      cellsPerWavelength: C0_m_per_s / (fTop * nTop) / dx,
      cells: (s.x1_m - s.x0_m) / dx,
      phaseError_rad: pe[i],
      bounceFactor: bounce[i],
    };
  });
  if (innerSheets.length > 0 && misalignment(stackCells) > 0.05) {
    warnings.push(
      `a resistive sheet lies ${misalignment(stackCells).toFixed(2)} of a cell off the nearest grid node (no grid up to ${SHEET_ALIGN_RANGE}× finer puts every sheet on a node); its current is shared between two nodes, which may cost accuracy for low-resistance sheets.`,
    );
  }
  if (lumped) {
    warnings.push(
      `the stack is ${(thickness * 1e6).toPrecision(3)} µm thick, much less than a cell (${(dx * 1e6).toPrecision(3)} µm): the pulse engine steps it within the cell at x = 0 and reads T there (error of order 2 k d = ${(2 * kOut * thickness).toPrecision(2)}).`,
    );
  }
  if (predictedError > accuracy) {
    warnings.push(
      `predicted grid-dispersion error ${predictedError.toPrecision(2)} exceeds the accuracy target ${accuracy} at ${N.toFixed(1)} cells per wavelength; raise the cells per wavelength.`,
    );
  }

  let poleCells = 0;
  for (const s of segs) poleCells += (s.model.debye.length * 2 + s.model.osc.length * 3) * ((s.x1_m - s.x0_m) / dx + 2);
  const halfPoles = (m: StepModel | 'pec'): number => (m === 'pec' ? 0 : m.debye.length * 2 + m.osc.length * 3);
  poleCells += halfPoles(effective.front) * (front + auxTotal) + halfPoles(effective.back) * (total - back);
  const memory_bytes = 8 * (6 * total + 5 * auxTotal + 2 * (total - tfsf) + poleCells + 3 * total);

  return {
    dx_m: dx, dt_s: dt, courant, cells: total, stepsLimit, expectedSteps,
    cellsPerWavelength: lambdaMin / dx,
    layers, predictedError, accuracyTarget: accuracy, pmlCells: P, decay_dB,
    memory_bytes, work_cell_updates: perStep * stepsLimit,
    nodes, pulse, fits, effective, profile_Hz: stack.profile_Hz, warnings,
  };
}
