// The steppable pulse run: main grid + auxiliary incident grid, TF/SF coupling, probes, running
// DFT for the profile, convergence watch (running probe spectra, stored energy with pole states; blow-up
// detection). See types.ts for the contract.
//
// The steps themselves are an engine's (engine.ts: the TypeScript kernel or the WebAssembly one), a batch of at
// most BATCH_STEPS at a time; the run copies each batch's probe table into its records.
// One step n → n+1 (all allocation-free):
//   1. TF/SF: the H node just in front of the TF/SF plane is corrected by −S·E_inc(tfsf)ⁿ
//      (taken from the auxiliary grid before its own E update); both grids' H are advanced.
//   2. The first total-field E node is corrected by −cb·H_inc ⁿ⁺¹ᐟ²; both grids' E are advanced,
//      and the auxiliary grid's node 0 is driven with the pulse at tⁿ⁺¹ (hard source).
//   3. Probes record; the profile's DFT accumulates every `profileStride` steps (exact: the fields carry
//      nothing above the pulse's content, so the sparser sum aliases nothing onto the profile frequency).
//   Every `watch.every` steps (outside the loop's hot path): the probe spectra are brought up to date from
//   the records and the stored energy is summed; the run ends when both have settled (convergence.ts).
// The auxiliary grid has the same Δx, Δt and medium as the front of the main grid, so with the
// stack absent the two agree to rounding and total − incident is exactly the scattered field.

import type { Profile } from '../results.ts';
import type { Stack } from '../stack/types.ts';
import { buildGrids } from './build.ts';
import { CHECK_FREQUENCIES, RESEED, SETTLED_FRACTION, SpectraWatch } from './convergence.ts';
import { FdtdInstabilityError } from './errors.ts';
import { BATCH_STEPS, type EngineKind, type EngineSetup, type StepEngine } from './engine.ts';
import { chooseEngine } from './engine-choice.ts';
import { planGrid } from './plan.ts';
import { type PulseShape, pulseSpectrumRelative, pulseValue } from './pulse.ts';
import type { DoneReason, EnergyReading, GridPlan, PulseOptions, PulseRun, PulseRunRecords } from './types.ts';

/** The stored energy is summed every this many steps (blow-up watch; convergence checks fall on these steps). */
const ENERGY_EVERY = BATCH_STEPS;
/** Energy above this multiple of the peak seen while the source was on means a blow-up. */
const BLOWUP_FACTOR = 100;
/** The profile's DFT ignores field content below this fraction of the pulse's spectral peak. */
const PROFILE_ALIAS_LEVEL = 1e-9;

/** Steps between terms of the profile's DFT: as sparse as aliasing of the pulse's content allows. */
export function profileStride(pulse: PulseShape, profile_Hz: number, dt_s: number): number {
  let fMax = pulse.f0_Hz;
  while (pulseSpectrumRelative(pulse, fMax) > PROFILE_ALIAS_LEVEL) fMax += 0.01 * pulse.f0_Hz + 1 / (100 * pulse.tau_s);
  // Content at f' lands on f_p when f' = k/(m Δt) ± f_p: the first alias must lie above fMax.
  return Math.max(1, Math.floor(1 / (dt_s * (fMax + profile_Hz))));
}

export { poleEnergy } from './engine-js.ts';

/** A probe's time record; room is made before a batch of steps, so stepping itself allocates nothing. */
class Recorder {
  data: Float64Array;
  constructor(capacity: number) { this.data = new Float64Array(Math.max(16, capacity)); }
  /** Make room for samples 0 … k (doubling, so a long run reallocates only a few times). */
  reserve(k: number): void {
    if (k < this.data.length) return;
    const grown = new Float64Array(Math.max(k + 1, this.data.length * 2));
    grown.set(this.data);
    this.data = grown;
  }
}

/** The source, sampled: the value driven into the auxiliary grid's node 0 after step n (zero once it is over). */
export function sourceSamples(pulse: PulseShape, dt_s: number): Float64Array {
  const count = Math.floor(pulse.end_s / dt_s) + 2;
  const out = new Float64Array(count);
  for (let n = 0; n < count; n++) { const t = n * dt_s; out[n] = t <= pulse.end_s ? pulseValue(pulse, t) : 0; }
  return out;
}

/** How a run is made besides its plan (internal: the benchmark steps a run past its convergence). */
export interface RunMaking {
  engine?: EngineKind;
  /** Never end on convergence (the checks still run): a benchmark steps the production step for as long as it likes. */
  endless?: boolean;
  /** Steps between the profile DFT's terms in place of profileStride's (tests: the sparse sum against every step's). */
  profileStride?: number;
}

class Run implements PulseRun {
  readonly plan: GridPlan;
  readonly warnings: string[];
  readonly engine: EngineKind;
  readonly engineFallback: string | null;
  private readonly kernel: StepEngine;
  private n = 0;
  private finished: DoneReason | null = null;
  private readonly recInc: Recorder;
  private readonly recRef: Recorder;
  private readonly recTra: Recorder;
  private readonly recSf: Recorder;
  private count = 1;
  private readonly dftLo: number;
  private readonly omegaDt: number;
  private readonly stride: number;
  private readonly watch: SpectraWatch;
  /** Steps between convergence checks (a multiple of ENERGY_EVERY). */
  private readonly checkEvery: number;
  private readonly endless: boolean;
  private energyNow = 0;
  private energyPeak = 0;
  private sourcePeak = 0;

  constructor(band_Hz: [number, number], plan: GridPlan, making: RunMaking = {}) {
    this.plan = plan;
    this.warnings = [...plan.warnings];
    this.endless = making.endless === true;
    const cap = Math.min(plan.expectedSteps + 1, plan.stepsLimit + 1);
    this.recInc = new Recorder(cap);
    this.recRef = new Recorder(cap);
    this.recTra = new Recorder(cap);
    this.recSf = new Recorder(cap);
    const nodes = plan.nodes;
    this.dftLo = nodes.tfsf;
    const dftHi = plan.effective.back === 'pec' ? nodes.back + 1 : nodes.pmlBackStart;
    this.omegaDt = 2 * Math.PI * plan.profile_Hz * plan.dt_s;
    this.stride = making.profileStride ?? profileStride(plan.pulse, plan.profile_Hz, plan.dt_s);
    const setup: EngineSetup = {
      tfsf: nodes.tfsf, auxOffset: nodes.auxOffset,
      front: nodes.front, back: plan.effective.back === 'pec' ? -1 : nodes.back, sfProbe: nodes.sfProbe,
      source: sourceSamples(plan.pulse, plan.dt_s),
      dftLo: this.dftLo, dftLength: dftHi - this.dftLo, stride: this.stride, dt_s: plan.dt_s,
      spectraFrequencies: CHECK_FREQUENCIES,
    };
    const chosen = chooseEngine({ grids: buildGrids(plan, band_Hz), setup }, making.engine);
    this.kernel = chosen.engine;
    this.engine = chosen.engine.kind;
    this.engineFallback = chosen.fallback;
    // The running spectra live in the engine when it feeds them itself (every step); sample 0 is fed here.
    this.watch = new SpectraWatch(band_Hz, plan.dt_s, SETTLED_FRACTION * plan.accuracyTarget, this.kernel.spectra ?? undefined);
    if (this.kernel.spectra !== null) this.watch.feed(this.recInc.data, this.recRef.data, this.recTra.data, 1);
    this.checkEvery = ENERGY_EVERY * Math.max(1, Math.round(this.watch.every / ENERGY_EVERY));
  }

  get stepIndex(): number { return this.n; }
  get time_s(): number { return this.n * this.plan.dt_s; }
  get done(): boolean { return this.finished !== null; }
  get doneReason(): DoneReason | null { return this.finished; }

  stop(): void { if (this.finished === null) this.finished = 'stopped'; }

  step(count: number): number {
    let taken = 0;
    const limit = this.plan.stepsLimit;
    const last = count > 0 ? Math.min(this.n + Math.ceil(count), limit) : this.n; // NaN/Infinity: limit or none
    for (const r of [this.recInc, this.recRef, this.recTra, this.recSf]) r.reserve(last);
    while (taken < count && this.finished === null) {
      if (this.n >= limit) { this.finish('step-limit'); break; }
      // A batch ends at the next energy step, the step limit or the count asked for.
      const k = Math.min(Math.ceil(count - taken), limit - this.n, ENERGY_EVERY - (this.n % ENERGY_EVERY));
      this.fillPhasors(k);
      this.fillSeeds(k);
      this.kernel.advance(this.n, k);
      this.record(k);
      this.n += k;
      taken += k;
      if (this.n % ENERGY_EVERY === 0) this.watchEnergy(this.n * this.plan.dt_s);
    }
    return taken;
  }

  /** cos, sin of the DFT phase (e^{−jωt} kernel, e^{+jωt} phasors) for the DFT steps of the next k. */
  private fillPhasors(k: number): void {
    const ph = this.kernel.phasors;
    for (let j = 0; j < k; j++) {
      const t = this.n + j + 1;
      if (t % this.stride !== 0) continue;
      const a = this.omegaDt * t;
      ph[2 * j] = Math.cos(a);
      ph[2 * j + 1] = Math.sin(a);
    }
  }

  /** For an engine that feeds the running spectra: the exact phasors of a step in the next k whose index is a multiple of RESEED. */
  private fillSeeds(k: number): void {
    const sp = this.kernel.spectra;
    if (sp === null) return;
    const t = Math.ceil((this.n + 1) / RESEED) * RESEED;
    if (t <= this.n + k) this.watch.seeds(t, sp.seeds);
  }

  /** The probe table of the last k steps into the records. */
  private record(k: number): void {
    const p = this.kernel.probes;
    const inc = this.recInc.data, ref = this.recRef.data, tra = this.recTra.data, sf = this.recSf.data;
    for (let j = 0; j < k; j++) {
      const t = this.n + j + 1;
      inc[t] = p[4 * j]; ref[t] = p[4 * j + 1]; tra[t] = p[4 * j + 2]; sf[t] = p[4 * j + 3];
    }
    this.count = this.n + k + 1;
  }

  private watchEnergy(t: number): void {
    const W = this.kernel.energy();
    this.energyNow = W;
    if (!Number.isFinite(W)) this.blowUp('a field became NaN or infinite');
    if (W > this.energyPeak) this.energyPeak = W;
    const sourceOn = t <= this.plan.pulse.end_s;
    if (sourceOn) this.sourcePeak = this.energyPeak;
    else if (W > BLOWUP_FACTOR * this.sourcePeak) this.blowUp(`the stored energy grew ${BLOWUP_FACTOR}× above its peak after the source stopped`);
    if (this.n % this.checkEvery !== 0) return;
    if (this.kernel.spectra === null) this.watch.feed(this.recInc.data, this.recRef.data, this.recTra.data, this.n + 1);
    else this.watch.markFed(this.n + 1);
    const settled = this.watch.check();
    if (!sourceOn && settled && !this.endless && W <= this.energyPeak * Math.pow(10, -this.plan.decay_dB / 10)) this.finish('converged');
  }

  private blowUp(what: string): never {
    const e = this.kernel.mainE;
    let node = 0, worst = -1;
    for (let i = 0; i < e.length; i++) {
      const v = Math.abs(e[i]);
      if (!Number.isFinite(v)) { node = i; break; }
      if (v > worst) { worst = v; node = i; }
    }
    const x = (node - this.plan.nodes.front) * this.plan.dx_m;
    this.finished = 'stopped';
    throw new FdtdInstabilityError(
      `FDTD instability at step ${this.n}: ${what}; largest field at node ${node} (x = ${(x * 1e3).toFixed(3)} mm). Lower the Courant number (courant) or check the material poles.`,
      this.n, node, x,
    );
  }

  private finish(reason: DoneReason): void {
    this.finished = reason;
    if (reason === 'step-limit') {
      const level = this.energy().level_dB;
      const change = this.watch.lastChange;
      this.warnings.push(
        `the run stopped at its step limit (${this.plan.stepsLimit} steps, ${(this.time_s * 1e9).toFixed(2)} ns) before it had converged: the stored energy was at ${Number.isFinite(level) ? level.toFixed(1) : '−∞'} dB of its peak (target −${this.plan.decay_dB} dB) and ` +
        `R and T were still moving by ${Number.isFinite(change) ? change.toPrecision(2) : 'an unknown amount'} over the last check window; the records are truncated, so R and T carry ripple of that order and sharp resonances are smoothed.`,
      );
    }
  }

  x_m(): Float64Array {
    const n = this.plan.nodes.total, out = new Float64Array(n), i0 = this.plan.nodes.front, dx = this.plan.dx_m;
    for (let i = 0; i < n; i++) out[i] = (i - i0) * dx;
    return out;
  }

  totalField(): Float64Array { return this.kernel.mainE; }

  incidentField(out: Float64Array): Float64Array {
    const off = this.plan.nodes.auxOffset, ae = this.kernel.auxE;
    for (let i = 0; i < out.length; i++) {
      const j = i - off;
      out[i] = j >= 0 && j < ae.length ? ae[j] : 0;
    }
    return out;
  }

  records(): PulseRunRecords {
    const c = this.count;
    return {
      dt_s: this.plan.dt_s, count: c,
      incident: this.recInc.data.subarray(0, c),
      reflected: this.recRef.data.subarray(0, c),
      transmitted: this.recTra.data.subarray(0, c),
      scatteredProbe: this.recSf.data.subarray(0, c),
    };
  }

  profile(): Profile {
    const re = this.kernel.dftRe, im = this.kernel.dftIm, [incRe, incIm] = this.kernel.incidentDft();
    const len = re.length, dx = this.plan.dx_m, i0 = this.plan.nodes.front;
    const x_m = new Float64Array(len), E_re = new Float64Array(len), E_im = new Float64Array(len);
    const d = incRe * incRe + incIm * incIm;
    for (let i = 0; i < len; i++) {
      x_m[i] = (this.dftLo + i - i0) * dx;
      const a = re[i], b = im[i];
      E_re[i] = d > 0 ? (a * incRe + b * incIm) / d : 0;
      E_im[i] = d > 0 ? (b * incRe - a * incIm) / d : 0;
    }
    return { f_Hz: this.plan.profile_Hz, x_m, E_re, E_im };
  }

  energy(): EnergyReading {
    const cur = this.energyNow, peak = this.energyPeak;
    return { current: cur, peak, level_dB: peak > 0 && cur > 0 ? 10 * Math.log10(cur / peak) : -Infinity };
  }
}

/** Plan and allocate a pulse run (throws PlanError before allocating when the run is refused). */
export function createPulseRun(stack: Stack, options: PulseOptions = {}): PulseRun {
  return new Run(stack.band_Hz, planGrid(stack, options), { engine: options.engine });
}

/** A run of a given plan for a band (the benchmark's grids; `endless` keeps it stepping past convergence). */
export function createRunOfPlan(band_Hz: [number, number], plan: GridPlan, making: RunMaking = {}): PulseRun {
  return new Run(band_Hz, plan, making);
}

export interface RunToEndOptions {
  /** Called after every chunk with a fraction in [0, 1]. */
  onProgress?(fraction: number): void;
  /** Polled after every chunk; true stops the run ('stopped'). */
  shouldStop?(): boolean;
  /** Steps per chunk (default about 1e6 cell-updates' worth). */
  chunk?: number;
}

/** Progress estimate: the larger of step/limit and how far the energy has decayed toward the target. */
export function runProgress(run: PulseRun): number {
  if (run.done) return 1;
  const bySteps = run.stepIndex / run.plan.stepsLimit;
  const byExpected = Math.min(0.95, run.stepIndex / run.plan.expectedSteps);
  const lvl = run.energy().level_dB;
  const byDecay = run.time_s > run.plan.pulse.end_s && Number.isFinite(lvl) ? Math.min(0.99, -lvl / run.plan.decay_dB) : 0;
  return Math.max(bySteps, byExpected * 0.9, byDecay);
}

function chunkOf(run: PulseRun, chunk?: number): number {
  return Math.max(1, Math.round(chunk ?? 2e6 / (run.plan.nodes.total + run.plan.nodes.auxTotal)));
}

/** Step to the end in chunks, yielding to the event loop between chunks (progress, cancel). */
export async function runToEnd(run: PulseRun, opts: RunToEndOptions = {}): Promise<PulseRun> {
  const chunk = chunkOf(run, opts.chunk);
  while (!run.done) {
    run.step(chunk);
    opts.onProgress?.(runProgress(run));
    if (!run.done && opts.shouldStop?.()) run.stop();
    if (!run.done) await new Promise<void>((resolve) => setTimeout(resolve, 0));
  }
  return run;
}

/** The same without yielding (tests, workers that own their thread). */
export function runToEndSync(run: PulseRun, opts: RunToEndOptions = {}): PulseRun {
  const chunk = chunkOf(run, opts.chunk);
  while (!run.done) {
    run.step(chunk);
    opts.onProgress?.(runProgress(run));
    if (!run.done && opts.shouldStop?.()) run.stop();
  }
  return run;
}
