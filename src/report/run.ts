// The pulse pipeline behind `slabecho run`: everything solveReport gives, plus the FDTD run's spectra,
// standing-wave profile, echoes and time traces, with the grid, the run and the agreement between
// methods in the summary. DOM-free; the caller writes the files.

import { type Complex, exp, mul, add } from '../complex.ts';
import { analyseEchoes, type EchoAnalysis, type EchoEnvelopes, type EchoOptions } from '../echoes/table.ts';
import { echoRays, type EchoRays } from '../echoes/rays.ts';
import { PlanError } from '../fdtd/errors.ts';
import { createPulseRun, createRunOfPlan, runProgress, runToEnd } from '../fdtd/run.ts';
import type { GridPlan, PulseOptions, PulseRun, PulseRunRecords } from '../fdtd/types.ts';
import type { Profile, Spectrum } from '../results.ts';
import { spectrumFromRecords, type PulseSpectrum } from '../spectra/spectrum.ts';
import { stackThickness_m, type Stack } from '../stack/types.ts';
import { stackAtFrequency } from '../tmm/media.ts';
import { roundedRow } from './format-agreement.ts';
import { fdtdAgreementRows, modelShareWarning } from './fdtd-agreement.ts';
import { QUANTITY_NAMES } from '../studies/quantities.ts';
import { echoColumns, echoSummary, emptyEchoColumns, type EchoColumns, latticeWarning } from './echo-table.ts';
import { fdtdDescription, fitSummaries, gridSummary, pulseSummary, runSummary } from './run-summary.ts';
import { solveReport, type Report, type SolveOptions } from './solve.ts';
import { assertFiniteValues, assertTable, complexColumns, findColumn, ordinal, scaledColumn, type Column } from './table.ts';
import { estimateRun, WorkRefused } from './estimate.ts';
import { decimationStride } from './output-plan.ts';

export interface RunOptions extends SolveOptions {
  pulse?: PulseOptions;
  /** Polled between chunks of steps; true stops the run (the report is then marked stopped). */
  shouldStop?: () => boolean;
  /** Echo floor, dB relative to the incident pulse's envelope peak (default −40). */
  echoFloor_dB?: number;
  /**
   * Watches the run as it steps (the workbench records its space–time map so): `sample` sees the run at step 0
   * and after every `every_steps(plan)` steps. It may read the run's fields, never step it.
   */
  observe?: RunObserver;
  /** Where the parts that do not need the pulse run in this thread may run instead (the CLI's worker threads). */
  parallel?: RunParallel;
}

export interface RunObserver {
  every_steps(plan: GridPlan): number;
  sample(run: PulseRun): void;
}

/** The independent parts of a run report, done elsewhere; each must give what the in-thread call gives. */
export interface RunParallel {
  /** solveReport(stack, options) (its progress is not reported). */
  solve(stack: Stack, options: Omit<SolveOptions, 'onProgress'>): Promise<Report>;
  /** analyseEchoes(stack, records, options). */
  echoes(stack: Stack, records: PulseRunRecords, options: EchoOptions): Promise<EchoAnalysis>;
}

export interface RunReport extends Report {
  /** Echoes of the reflected record (echoes.csv) and of the transmitted one (echoes_T.csv; no rows behind a conductor). */
  echoes: EchoColumns;
  echoesT: EchoColumns;
  /** t_ns, incident_dB, reflected_dB, transmitted_dB: the band-limited envelopes the echoes are read from, for display. */
  envelope: Column[];
  /** t_ns, E_incident, E_reflected, E_transmitted at the reference planes, every time step. */
  trace: Column[];
  /** True when shouldStop ended the run early: every table is complete but the run is cut short. */
  stopped: boolean;
  /** Set when the pulse engine declined this stack (e.g. a lossy front medium at an angle): solve's results only. */
  skipped?: string;
  /** The echo rows' bounce paths as rays in x and t, for drawing (not written to any file); null when skipped. */
  rays: EchoRays | null;
}

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());
const r6 = (x: number): number => Number(x.toPrecision(6));

/**
 * Run the exact solution (and whatever else solveReport runs) and the FDTD pulse, and assemble the report.
 * Throws PlanError when the grid is refused as too large, FdtdInstabilityError when the run blows up.
 * A stack the engine does not model (PlanError 'unsupported': a lossy front medium at an angle, a medium
 * evanescent up to any frequency) gives solve's
 * report with empty pulse tables, `skipped` set and a warning.
 */
export async function runReport(stack: Stack, options: RunOptions = {}): Promise<RunReport> {
  const progress = options.onProgress ?? (() => {});
  // The estimate (pulse plan, FEM, outputs) before any heavy work; a job it refuses throws WorkRefused here.
  const job = options.job ?? estimateRun(stack, { fem: options.fem, pulse: options.pulse, budget: options.budget });
  if (job.refusal !== undefined) throw new WorkRefused(job.refusal);
  // The exact and FEM solves need nothing of the pulse run: elsewhere, they run beside it.
  const solving = options.parallel?.solve(stack, { inputWarnings: options.inputWarnings, fem: options.fem, media: options.media, budget: options.budget, job });
  solving?.catch(() => {}); // awaited below; a failure must not go unhandled while the pulse runs
  const solved = solving ?? Promise.resolve(solveReport(stack, { ...options, job, onProgress: (f) => progress(0.1 * f) }));
  const stepped = (options.media ?? 'tables') === 'stepped';
  let run: PulseRun;
  try {
    // The estimate planned the grid with the same options: step that plan rather than plan again.
    run = job.grid !== null ? createRunOfPlan(stack.band_Hz, job.grid, { engine: options.pulse?.engine }) : createPulseRun(stack, options.pulse);
  } catch (e) {
    if (e instanceof PlanError && e.code === 'unsupported') {
      const report = skippedReport(await solved, e.message);
      progress(1);
      return report;
    }
    throw e;
  }
  const t0 = now();
  const stepping = { onProgress: (f: number) => progress(0.1 + 0.85 * f), shouldStop: options.shouldStop };
  await (options.observe ? runObserved(run, options.observe, stepping) : runToEnd(run, stepping));
  const run_ms = now() - t0;
  const stopped = run.doneReason === 'stopped';
  const rec = run.records();
  // The echo analysis needs only the records: elsewhere, it runs beside the spectra.
  let t1 = now();
  const echoOptions: EchoOptions = { floor_dB: options.echoFloor_dB };
  const analysing = options.parallel?.echoes(stack, rec, echoOptions);
  analysing?.catch(() => {});
  const base = await solved;
  const warnings = [...base.warnings];
  const warn = (w: string) => { if (!warnings.includes(w)) warnings.push(w); };
  const summary: Record<string, unknown> = { ...base.summary };
  const methods = [...((summary.methods as unknown[]) ?? [])];
  for (const w of run.warnings) warn(w);
  if (stopped) warn('the pulse run was stopped before the field had decayed: R, T and the echoes come from truncated records');

  // Spectra at the exact solution's frequencies.
  const tSpectra = now();
  const fCol = findColumn(base.spectrum, 'f_GHz');
  if (!fCol) throw new Error('runReport: the solve report has no f_GHz column');
  const f_Hz = Float64Array.from(fCol.data, (f) => f * 1e9);
  const fdtd = spectrumFromRecords(rec, f_Hz);
  for (const w of fdtd.warnings) warn(w);
  const spectrum_ms = now() - tSpectra;
  const spectrum = withPulseSpectrum(base.spectrum, fdtd);
  const profile = withPulseProfile(stack, run, base.profile);

  // Echoes (from t1 on: beside the rest when elsewhere).
  if (!analysing) t1 = now();
  const echoes: EchoAnalysis = analysing ? await analysing : analyseEchoes(stack, rec, echoOptions);
  const echoes_ms = now() - t1;
  for (const [which, t] of [['reflected', echoes.reflected], ['transmitted', echoes.transmitted]] as const) {
    const w = t ? latticeWarning(which, t, echoes.floor_dB) : null;
    if (w) warn(w);
  }

  // The traces, every stride-th step when all of them would pass the output limit.
  const stride = decimationStride(rec.count, job.outputs.traceRowsCap ?? Infinity);
  const trace = traceColumns(rec, stride);
  if (stride > 1) {
    warn(`trace.csv holds every ${ordinal(stride)} time step (${r6(stride * rec.dt_s * 1e12)} ps apart, ${trace[0].data.length} of ${rec.count} samples) ` +
      `to stay within the output limit (${job.outputs.limitName}); the spectra and echoes use every step`);
  }

  // Agreement rows: fdtd against the exact solution, against the FEM when its columns are there and, when the
  // engine stepped other media than the tables (and the tmm columns are the tables'), the stepped-media split.
  const agreement = fdtdAgreementRows(run, fdtd, spectrumFromColumns(spectrum, 'tmm', f_Hz), spectrumFromColumns(spectrum, 'fem', f_Hz), !stepped);
  const allAgreement = [...base.agreement, ...agreement];
  const shareWarning = modelShareWarning(agreement, run.plan.accuracyTarget);
  if (shareWarning) warn(shareWarning);
  summary.agreement = allAgreement.map(roundedRow);

  methods.push({ name: 'fdtd', description: fdtdDescription(stack), time_ms: Math.round(run_ms * 1e3) / 1e3 });
  summary.methods = methods;
  summary.grid = gridSummary(run.plan);
  summary.run = runSummary(run, fdtd.weak.reduce((a, v) => a + v, 0), stride);
  Object.assign(summary, fitSummaries(run.plan.fits));
  summary.pulse = pulseSummary(run.plan);
  summary.echoes = { ...echoAnalysisSummary(echoes), ...echoSummary(echoes.reflected) };
  summary.transmitted = echoes.transmitted ? echoSummary(echoes.transmitted) : null;
  summary.timings_ms = { fdtd: Math.round(run_ms), spectra: Math.round(spectrum_ms), echoes: Math.round(echoes_ms) };
  summary.warnings = warnings;

  const tables = echoTables(echoes);
  for (const t of [spectrum, trace, tables.envelope]) assertTable(t);
  if (profile.length > 0) assertTable(profile);
  assertFiniteValues(summary);
  progress(1);
  return { spectrum, profile, summary, warnings, ...tables, trace, agreement: allAgreement, stopped, rays: echoRays(stack, echoes) };
}

/** The echo analysis as the report's tables (echoes.csv, echoes_T.csv, the envelopes), each checked. */
function echoTables(e: EchoAnalysis): { echoes: EchoColumns; echoesT: EchoColumns; envelope: Column[] } {
  const echoes = echoColumns(e.reflected), echoesT = e.transmitted ? echoColumns(e.transmitted) : emptyEchoColumns();
  for (const t of [echoes, echoesT]) if (t.path.length > 0) assertTable(t.columns);
  return { echoes, echoesT, envelope: envelopeColumns(e.envelopes) };
}

/** The pulse columns after the other methods' and before the engineering quantities, which stay last. */
function withPulseSpectrum(columns: Column[], fdtd: PulseSpectrum): Column[] {
  const isQuantity = (c: Column) => (QUANTITY_NAMES as readonly string[]).includes(c.name);
  return [...columns.filter((c) => !isQuantity(c)),
    ...complexColumns('R_fdtd', fdtd.R_re, fdtd.R_im), ...complexColumns('T_fdtd', fdtd.T_re, fdtd.T_im),
    ...columns.filter(isQuantity)];
}

/** The profile with the FDTD phasor interpolated onto its x grid (unchanged when it has none). */
function withPulseProfile(stack: Stack, run: PulseRun, columns: Column[]): Column[] {
  const xCol = findColumn(columns, 'x_mm');
  if (!xCol) return columns;
  const p = profileOnGrid(stack, run, Float64Array.from(xCol.data, (x) => x * 1e-3));
  return [...columns, ...complexColumns('E_fdtd', p.re, p.im)];
}

/** Solve's report with empty pulse tables, when the engine declines the stack (`why`). */
function skippedReport(base: Report, why: string): RunReport {
  const warnings = [...base.warnings];
  const text = `FDTD skipped: ${why}`;
  if (!warnings.includes(text)) warnings.push(text);
  const summary: Record<string, unknown> = { ...base.summary, fdtd: { skipped: why }, warnings };
  return { ...base, summary, warnings, echoes: emptyEchoColumns(), echoesT: emptyEchoColumns(), envelope: envelopeColumns(null), trace: emptyTrace(), stopped: false, skipped: why, rays: null };
}

/** runToEnd with an observer: chunks of whole strides, `sample` after each stride, a turn of the event loop per chunk. */
async function runObserved(run: PulseRun, o: RunObserver, opts: { onProgress(f: number): void; shouldStop?: () => boolean }): Promise<void> {
  const stride = Math.max(1, Math.round(o.every_steps(run.plan)));
  const strides = Math.max(1, Math.round(2e6 / ((run.plan.nodes.total + run.plan.nodes.auxTotal) * stride)));
  o.sample(run);
  while (!run.done) {
    for (let k = 0; k < strides && !run.done; k++) {
      if (run.step(stride) > 0) o.sample(run);
    }
    opts.onProgress(runProgress(run));
    if (!run.done && opts.shouldStop?.()) run.stop();
    if (!run.done) await new Promise<void>((resolve) => setTimeout(resolve, 0));
  }
}

/** How the echoes were read, for summary.json. */
function echoAnalysisSummary(e: EchoAnalysis): Record<string, unknown> {
  return {
    window: 'Kaiser, β = 12, over the band',
    pulse_width_ns: r6(e.pulse.width_s * 1e9),
    floor_dB: e.floor_dB,
    delay_zero_ns: r6(e.incidentAt_s * 1e9),
  };
}

/** Lowest level written for an envelope (dB): the nulls between sidelobes would be −∞. */
const ENVELOPE_FLOOR_dB = -200;
const dB = (x: Float64Array): Float64Array => x.map((v) => (v > 0 ? Math.max(ENVELOPE_FLOOR_dB, 20 * Math.log10(v)) : ENVELOPE_FLOOR_dB));

function envelopeColumns(e: EchoEnvelopes | null): Column[] {
  const none = new Float64Array(0);
  return [
    scaledColumn('t_ns', e?.t_s ?? none, 1e9),
    { name: 'incident_dB', data: e ? dB(e.incident) : none },
    { name: 'reflected_dB', data: e ? dB(e.reflected) : none },
    { name: 'transmitted_dB', data: e?.transmitted ? dB(e.transmitted) : e ? new Float64Array(e.t_s.length).fill(ENVELOPE_FLOOR_dB) : none },
  ];
}

/** t_ns and the three records at every `stride`-th step (the first included). */
function traceColumns(rec: { count: number; dt_s: number; incident: Float64Array; reflected: Float64Array; transmitted: Float64Array }, stride: number): Column[] {
  const n = Math.ceil(rec.count / stride);
  const pick = (x: Float64Array) => { const out = new Float64Array(n); for (let i = 0; i < n; i++) out[i] = x[i * stride]; return out; };
  return [
    scaledColumn('t_ns', Float64Array.from({ length: n }, (_, k) => k * stride * rec.dt_s), 1e9),
    { name: 'E_incident', data: pick(rec.incident) },
    { name: 'E_reflected', data: pick(rec.reflected) },
    { name: 'E_transmitted', data: pick(rec.transmitted) },
  ];
}

function emptyTrace(): Column[] {
  return ['t_ns', 'E_incident', 'E_reflected', 'E_transmitted'].map((name) => ({ name, data: new Float64Array(0) }));
}

/** A Spectrum from the report's `R_<tag>_re…` columns, or null when they are absent. */
function spectrumFromColumns(cols: readonly Column[], tag: string, f_Hz: Float64Array): Spectrum | null {
  const g = (n: string) => findColumn(cols, n)?.data;
  const R_re = g(`R_${tag}_re`), R_im = g(`R_${tag}_im`), T_re = g(`T_${tag}_re`), T_im = g(`T_${tag}_im`);
  if (!R_re || !R_im || !T_re || !T_im) return null;
  return { f_Hz, R_re, R_im, T_re, T_im };
}

/** What the pulse engine stepped, in words (the phase-matched line at an angle, fdtd/oblique.ts). */
/**
 * The FDTD standing wave at the report's positions: linear interpolation of the run's phasor
 * between grid nodes; outside the run's span, the front medium's incident + reflected waves
 * (with the run's own R at the profile frequency) and the back medium's transmitted wave (its own T).
 */
export function profileOnGrid(stack: Stack, run: PulseRun, x_m: Float64Array): { re: Float64Array; im: Float64Array } {
  const p: Profile = run.profile();
  const at = spectrumFromRecords(run.records(), Float64Array.of(p.f_Hz));
  const R: Complex = { re: at.R_re[0], im: at.R_im[0] }, T: Complex = { re: at.T_re[0], im: at.T_im[0] };
  const s = stackAtFrequency(stack, p.f_Hz);
  const d = stackThickness_m(stack);
  const pecBack = run.plan.effective.back === 'pec';
  const n = x_m.length, re = new Float64Array(n), im = new Float64Array(n);
  const x0 = p.x_m[0], x1 = p.x_m[p.x_m.length - 1], dx = run.plan.dx_m;
  for (let i = 0; i < n; i++) {
    const x = x_m[i];
    let v: Complex;
    if (x < x0) {
      // e^{−jkx} + R e^{+jkx} in the front medium
      const k = s.front.kx;
      v = add(exp({ re: k.im * x, im: -k.re * x }), mul(R, exp({ re: -k.im * x, im: k.re * x })));
    } else if (x > x1) {
      if (pecBack || !s.back) v = { re: 0, im: 0 };
      else { const k = s.back.kx, u = x - d; v = mul(T, exp({ re: k.im * u, im: -k.re * u })); }
    } else {
      const u = (x - x0) / dx, j = Math.min(Math.floor(u), p.x_m.length - 2), a = u - j;
      v = { re: (1 - a) * p.E_re[j] + a * p.E_re[j + 1], im: (1 - a) * p.E_im[j] + a * p.E_im[j + 1] };
    }
    re[i] = Number.isFinite(v.re) ? v.re : 0;
    im[i] = Number.isFinite(v.im) ? v.im : 0;
  }
  return { re, im };
}

export type { PulseSpectrum };
