// The frequency-domain pipeline behind `slabecho solve` and the workbench: run the methods on a stack,
// assemble the spectrum and profile tables and a summary. DOM-free; the caller writes the files.
//
// To add a method: run it after the exact solution, append its column groups (`R_<method>_re` …) with
// `complexColumns`, push an entry to `methods`, and add its warnings. Keep the tmm columns first.

import { dbFromAmplitude, degFromRad, ghzFromHz, mmFromM } from '../units.ts';
import { permeability } from '../materials/permeability.ts';
import { permittivity, effectiveConductivity } from '../materials/permittivity.ts';
import type { Material } from '../materials/types.ts';
import { bandFrequencies, emptySpectrum, type Profile, type Spectrum } from '../results.ts';
import { stackThickness_m, type Stack } from '../stack/types.ts';
import { stackWarnings } from '../stack/warnings.ts';
import { absorption, solveTmm } from '../tmm/solve.ts';
import { profilePositions, profileTmm } from '../tmm/profile.ts';
import { SLABECHO_VERSION } from '../version.ts';
import { assertFiniteValues, assertTable, complexColumns, scaledColumn, type Column } from './table.ts';
import type { FemOptions } from '../fem/types.ts';
import { femProfileColumns, femSpectrumPart, profileGridWithFem } from './fem-part.ts';
import { profileColumns, profileHasH } from './profile-columns.ts';
import { agreementRow, roundedRow, type AgreementRow } from './format-agreement.ts';
import { steppedStack } from '../fdtd/stepped-stack.ts';
import { PlanError } from '../fdtd/errors.ts';
import type { WorkBudget } from './budget.ts';
import { estimateSolve, WorkRefused, type JobEstimate } from './estimate.ts';
import { quantitiesOf, quantitiesUnavailable, frontIsLossless } from '../studies/quantities.ts';
import { quantitiesInBrief, quantityColumns } from '../studies/extremes.ts';

export interface Report {
  /** f_GHz, then R_tmm_re, R_tmm_im, T_tmm_re, T_tmm_im (later methods append their groups). */
  spectrum: Column[];
  /** x_mm, E_tmm_re, E_tmm_im (in TM also H_tmm_re, H_tmm_im), then the other methods' groups: tangential fields
   *  along the normal line at the profile frequency, at any incidence. */
  profile: Column[];
  /** The stack as understood, the methods run with timings, results in brief, warnings. JSON-safe. */
  summary: Record<string, unknown>;
  warnings: string[];
  /** Method-pair agreement rows (fem-tmm, …), also in summary.agreement. */
  agreement: AgreementRow[];
}

export interface SolveOptions {
  /** Called with 0 … 1 as the work advances. */
  onProgress?: (fraction: number) => void;
  /** Warnings from reading the input (parse warnings), listed first in the report. */
  inputWarnings?: readonly string[];
  /** FEM order / density / tolerance (defaults: chosen from its a-priori error estimate). */
  fem?: FemOptions;
  /** Output, time and memory limits (default DEFAULT_BUDGET); ignored when `job` is given. */
  budget?: WorkBudget;
  /** The job's estimate (estimate.ts), when the caller has made it; otherwise solveReport makes its own. */
  job?: JobEstimate;
  /**
   * 'tables' (default): every method solves the media as the stack names them. 'stepped': the exact solver and
   * the FEM solve the media the pulse engine steps (fitted causal models for power laws, conductors as walls
   * or sheets), so every agreement row is at the methods' own precision; the row "stepped media-tmm" then
   * keeps the model's share against the tables.
   */
  media?: Media;
}

export type Media = 'tables' | 'stepped';

/** The note a report carries when its methods solve the stepped media. */
export const STEPPED_MEDIA_NOTE = 'media: the exact solver and the FEM solve the media as the pulse engine steps them (fitted causal models in place of power laws, conductors as walls or sheets); the row "stepped media-tmm" compares those with the tables';

export interface MethodRun { name: string; description: string; time_ms: number }

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/**
 * Solve `stack` with the exact method (and, as they land, the others) and assemble the report. Follows the job's
 * estimate: throws WorkRefused (before any heavy work) when it refuses the job, skips the FEM when it says so,
 * and samples the profile as densely as the output limit allows.
 */
export function solveReport(stack: Stack, options: SolveOptions = {}): Report {
  const progress = options.onProgress ?? (() => {});
  const job = options.job ?? estimateSolve(stack, { fem: options.fem, budget: options.budget });
  if (job.refusal !== undefined) throw new WorkRefused(job.refusal);
  const warnings: string[] = [];
  const warn = (w: string) => { if (!warnings.includes(w)) warnings.push(w); };
  for (const w of options.inputWarnings ?? []) warn(w);
  for (const w of stackWarnings(stack)) warn(w);
  for (const w of job.outputs.notes) warn(w);
  const methods: MethodRun[] = [];
  progress(0);

  // Exact transfer-matrix spectrum, in chunks so progress means something on long sweeps.
  const f_Hz = bandFrequencies(stack);
  let media = options.media ?? 'tables';
  const tables = stack;
  if (media === 'stepped') {
    try { stack = steppedStack(stack); warn(STEPPED_MEDIA_NOTE); } catch (e) {
      // A stack the pulse engine does not step (e.g. a magnetic material) has no stepped media: solve the tables.
      if (!(e instanceof PlanError && e.code === 'unsupported')) throw e;
      warn(`media: the pulse engine does not step this stack (${e.message}), so the methods solve the media as the stack names them`);
      media = 'tables';
    }
  }
  let t0 = now();
  const tmm = solveInChunks(stack, f_Hz, (done) => progress(0.9 * done));
  const spectrum: Column[] = [
    scaledColumn('f_GHz', f_Hz, 1e-9),
    ...complexColumns('R_tmm', tmm.R_re, tmm.R_im),
    ...complexColumns('T_tmm', tmm.T_re, tmm.T_im),
  ];
  let tmm_ms = now() - t0;

  // FEM cross-check on the same frequencies, with its agreement against the exact solution.
  const femOptions = options.fem ?? {};
  if (job.femSkip !== undefined) warn(job.femSkip);
  const fem = job.femSkip === undefined ? femSpectrumPart(stack, tmm, femOptions, warn) : null;
  const agreement: AgreementRow[] = [];
  if (fem) { spectrum.push(...fem.spectrum); agreement.push(fem.agreement); }
  if (media === 'stepped' && stack !== tables) agreement.push(agreementRow('stepped media-tmm', tmm, solveTmm(tables, f_Hz)));
  // Engineering quantities of the exact solution (of the media it solved), after every method's columns
  // (runReport keeps them last).
  const unavailable = quantitiesUnavailable(stack);
  const quantities = unavailable === null ? quantitiesOf(stack, tmm) : null;
  if (quantities) spectrum.push(...quantityColumns(quantities));
  else warn(`${unavailable}; spectrum.csv leaves them out`);
  progress(0.95);

  // Standing-wave profile: tangential E along the normal line (and in TM the tangential H), at any incidence.
  const angle_deg = roundDeg(degFromRad(stack.incidence.angle_rad));
  const withH = profileHasH(stack);
  const level = job.outputs.profile?.level;
  let profile: Column[] = [];
  let prof: Profile | undefined;
  if (level !== undefined) {
    t0 = now();
    // The exact solver's grid, refined to ≥ 10 samples in every FEM element (when the output limit allows).
    const base = profilePositions(stack, stack.profile_Hz, level.pointsPerWavelength);
    const x_m = fem && level.femSamples ? profileGridWithFem(stack, stack.profile_Hz, base, femOptions, withH) : base;
    prof = profileTmm(stack, stack.profile_Hz, x_m);
    profile = [scaledColumn('x_mm', prof.x_m, 1e3), ...profileColumns('tmm', prof, withH)];
    tmm_ms += now() - t0;
    if (fem) {
      t0 = now();
      profile.push(...femProfileColumns(stack, stack.profile_Hz, x_m, femOptions, withH));
      fem.time_ms += now() - t0;
    }
  }
  methods.push({ name: 'tmm', description: 'exact transfer-matrix solution', time_ms: round3(tmm_ms) });
  if (fem) methods.push({ name: 'fem', description: `frequency-domain FEM, Lagrange p = ${fem.mesh.order}`, time_ms: round3(fem.time_ms) });

  // Never hand out a NaN: a non-finite value here is a solver bug, reported as such.
  assertTable(spectrum);
  if (profile.length > 0) assertTable(profile);

  const described = tables; // the summary describes the stack as written
  const summary: Record<string, unknown> = {
    slabecho_version: SLABECHO_VERSION,
    title: stack.title,
    media,
    band_GHz: [ghzFromHz(stack.band_Hz[0]), ghzFromHz(stack.band_Hz[1])],
    points: stack.points,
    incidence: { angle_deg, polarization: stack.incidence.polarization },
    profile_GHz: prof ? ghzFromHz(stack.profile_Hz) : null,
    front: materialSummary(described.front, described),
    layers: described.layers.map((l, index) => ({
      index,
      ...materialSummary(l.material, described),
      thickness_mm: l.kind === 'bulk' ? mmFromM(l.thickness_m) : 0,
    })),
    back: described.back === 'pec' ? { name: 'pec', model: 'perfect conductor' } : materialSummary(described.back, described),
    total_thickness_mm: mmFromM(stackThickness_m(described)),
    methods,
    results: { ...resultsInBrief(stack, tmm), ...(quantities ? quantitiesInBrief(tmm.f_Hz, quantities) : {}) },
    ...(fem ? { fem: fem.mesh } : {}),
    agreement: agreement.map(roundedRow),
    warnings,
  };
  assertFiniteValues(summary);
  progress(1);
  return { spectrum, profile, summary, warnings, agreement };
}

function solveInChunks(stack: Stack, f_Hz: Float64Array, onDone: (fraction: number) => void): Spectrum {
  const n = f_Hz.length, out = emptySpectrum(f_Hz);
  const chunk = Math.max(64, Math.ceil(n / 20));
  for (let i = 0; i < n; i += chunk) {
    const part = solveTmm(stack, f_Hz.subarray(i, Math.min(n, i + chunk)));
    out.R_re.set(part.R_re, i); out.R_im.set(part.R_im, i);
    out.T_re.set(part.T_re, i); out.T_im.set(part.T_im, i);
    onDone(Math.min(n, i + chunk) / n);
  }
  return out;
}

/** A material as understood: model, parameters, provenance, and ε_r (and μ_r where set) at the band centre. */
export function materialSummary(m: Material, stack: Stack): Record<string, unknown> {
  const { model, ...parameters } = m.spec;
  const out: Record<string, unknown> = { name: m.name, model, parameters, source: m.source, valid_GHz: m.valid_GHz };
  if (m.note !== undefined) out.note = m.note;
  if (m.spec.model !== 'sheet') {
    const fc = (stack.band_Hz[0] + stack.band_Hz[1]) / 2;
    const e = permittivity(m.spec, fc);
    out.eps_r_at_centre = { re: e.re, im: e.im === 0 ? 0 : e.im }; // no −0 in JSON
    out.sigma_S_per_m_at_centre = effectiveConductivity(m.spec, fc);
    if (m.spec.magnetic !== undefined) {
      const mu = permeability(m.spec, fc);
      out.mu_r_at_centre = { re: mu.re, im: mu.im === 0 ? 0 : mu.im };
    }
  }
  return out;
}

/** |R|, |T| ranges in dB and the absorbed fraction (when the front medium is lossless). */
function resultsInBrief(stack: Stack, sp: Spectrum): Record<string, unknown> {
  const n = sp.f_Hz.length;
  let rMin = Infinity, rMax = -Infinity, tMin = Infinity, tMax = -Infinity;
  for (let i = 0; i < n; i++) {
    const r = dbFromAmplitude(Math.hypot(sp.R_re[i], sp.R_im[i]));
    const t = dbFromAmplitude(Math.hypot(sp.T_re[i], sp.T_im[i]));
    rMin = Math.min(rMin, r); rMax = Math.max(rMax, r); tMin = Math.min(tMin, t); tMax = Math.max(tMax, t);
  }
  const out: Record<string, unknown> = {
    R_dB_min: round3(rMin), R_dB_max: round3(rMax),
    T_dB_min: stack.back === 'pec' ? null : round3(tMin), T_dB_max: stack.back === 'pec' ? null : round3(tMax),
  };
  // Incident and reflected powers separate only in a lossless front medium.
  if (frontIsLossless(stack)) {
    const A = absorption(stack, sp);
    let iMax = 0, aMin = Infinity;
    for (let i = 0; i < n; i++) { if (A[i] > A[iMax]) iMax = i; aMin = Math.min(aMin, A[i]); }
    if (A.every(Number.isFinite)) {
      out.absorbed_fraction_max = round6(A[iMax]);
      out.absorbed_fraction_max_at_GHz = ghzFromHz(sp.f_Hz[iMax]);
      out.absorbed_fraction_min = round6(aMin);
    }
  }
  return out;
}

// `+ 0` turns −0 into 0: JSON has no −0, so a summary read back would differ from the one written.
const round3 = (x: number): number => Math.round(x * 1e3) / 1e3 + 0;
const round6 = (x: number): number => Math.round(x * 1e6) / 1e6 + 0;
const roundDeg = (x: number): number => Number(x.toPrecision(10));
