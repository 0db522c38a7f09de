// The steppable pulse run: main grid + auxiliary incident grid, TF/SF coupling, probes, running
// DFT for the profile, convergence watch (running probe spectra, stored energy with pole states; blow-up
// detection). See types.ts for the contract.
//
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
import { type EnergyWeights, buildGrids } from './build.ts';
import { SETTLED_FRACTION, SpectraWatch } from './convergence.ts';
import { FdtdInstabilityError } from './errors.ts';
import { type DispersiveSpan, type KernelState, updateE, updateH } from './kernel.ts';
import { planGrid } from './plan.ts';
import { type PulseShape, pulseSpectrumRelative, pulseValue } from './pulse.ts';
import type { DoneReason, EnergyReading, GridPlan, PulseOptions, PulseRun, PulseRunRecords } from './types.ts';

/** The stored energy is summed every this many steps (blow-up watch; convergence checks fall on these steps). */
const ENERGY_EVERY = 32;
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

/**
 * Energy held by the poles of one field (normalized like the field energy): P̃²/Δε for a Debye pole,
 * (P̃'² + ω0²P̃²)/c for a Lorentz or Drude one (their stored energies, dropping ε0/2 as the field energy does).
 * The terms of a partial fraction (inverse.ts) may have negative strengths or an s-term; for them the same forms
 * with the kernel's positive scales (|Δ|, |c| + ω0|d|) measure a state that falls to zero with it. `e` is the
 * field of the same step, which completes the state (kernel.ts).
 */
export function poleEnergy(d: DispersiveSpan | null, e: Float64Array, dt: number): number {
  if (d === null) return 0;
  let W = 0;
  for (const g of d.groups) {
    for (let k = 0; k < g.hi - g.lo; k++) {
      const f = g.fill[k], E = e[g.lo + k];
      if (!(f > 0)) continue;
      for (let q = 0; q < g.nd; q++) {
        const P = g.dState[k * g.nd + q] + g.db[q] * f * E;
        W += (P * P) / (f * g.dEps[q]);
      }
      for (let q = 0; q < g.no; q++) {
        const j = 2 * (k * g.no + q);
        const P = g.oState[j] + g.oz[q] * f * E, Pold = g.oState[j + 1];
        const rate = (P - Pold) / dt, mean = (P + Pold) / 2;
        W += (rate * rate + g.ow0sq[q] * mean * mean) / (f * g.oc[q]);
      }
    }
  }
  return W;
}

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

class Run implements PulseRun {
  readonly plan: GridPlan;
  readonly warnings: string[];
  private readonly main: KernelState;
  private readonly aux: KernelState;
  private readonly weights: EnergyWeights;
  private n = 0;
  private finished: DoneReason | null = null;
  private readonly recInc: Recorder;
  private readonly recRef: Recorder;
  private readonly recTra: Recorder;
  private readonly recSf: Recorder;
  private count = 1;
  private readonly dftLo: number;
  private readonly dftRe: Float64Array;
  private readonly dftIm: Float64Array;
  private incRe = 0;
  private incIm = 0;
  private readonly omegaDt: number;
  private readonly stride: number;
  private readonly watch: SpectraWatch;
  /** Steps between convergence checks (a multiple of ENERGY_EVERY). */
  private readonly checkEvery: number;
  private energyNow = 0;
  private energyPeak = 0;
  private sourcePeak = 0;

  constructor(stack: Stack, plan: GridPlan) {
    this.plan = plan;
    this.warnings = [...plan.warnings];
    const built = buildGrids(plan, stack.band_Hz);
    this.main = built.main;
    this.aux = built.aux;
    this.weights = built.weights;
    const cap = Math.min(plan.expectedSteps + 1, plan.stepsLimit + 1);
    this.recInc = new Recorder(cap);
    this.recRef = new Recorder(cap);
    this.recTra = new Recorder(cap);
    this.recSf = new Recorder(cap);
    const nodes = plan.nodes;
    this.dftLo = nodes.tfsf;
    const dftHi = plan.effective.back === 'pec' ? nodes.back + 1 : nodes.pmlBackStart;
    this.dftRe = new Float64Array(dftHi - this.dftLo);
    this.dftIm = new Float64Array(dftHi - this.dftLo);
    this.omegaDt = 2 * Math.PI * plan.profile_Hz * plan.dt_s;
    this.stride = profileStride(plan.pulse, plan.profile_Hz, plan.dt_s);
    this.watch = new SpectraWatch(stack.band_Hz, plan.dt_s, SETTLED_FRACTION * plan.accuracyTarget);
    this.checkEvery = ENERGY_EVERY * Math.max(1, Math.round(this.watch.every / ENERGY_EVERY));
    this.main.injH = nodes.tfsf - 1;
    this.main.injE = nodes.tfsf;
  }

  get stepIndex(): number { return this.n; }
  get time_s(): number { return this.n * this.plan.dt_s; }
  get done(): boolean { return this.finished !== null; }
  get doneReason(): DoneReason | null { return this.finished; }

  stop(): void { if (this.finished === null) this.finished = 'stopped'; }

  step(count: number): number {
    let taken = 0;
    const main = this.main, aux = this.aux, nodes = this.plan.nodes;
    const off = nodes.auxOffset, a = nodes.tfsf;
    const dt = this.plan.dt_s, pulse = this.plan.pulse, limit = this.plan.stepsLimit;
    const last = count > 0 ? Math.min(this.n + Math.ceil(count), limit) : this.n; // NaN/Infinity: limit or none
    for (const r of [this.recInc, this.recRef, this.recTra, this.recSf]) r.reserve(last);
    while (taken < count && this.finished === null) {
      if (this.n >= limit) { this.finish('step-limit'); break; }
      // H half step (TF/SF: the scattered H in front of the plane must not see the incident E).
      main.injHValue = -aux.e[a - off];
      updateH(aux);
      updateH(main);
      // E step (TF/SF: the first total E node needs the incident H of the node in front).
      main.injEValue = -aux.h[a - 1 - off];
      updateE(main);
      updateE(aux);
      this.n++;
      const t = this.n * dt;
      aux.e[0] = t <= pulse.end_s ? pulseValue(pulse, t) : 0;
      this.sample();
      taken++;
      if (this.n % ENERGY_EVERY === 0) this.watchEnergy(t);
    }
    return taken;
  }

  private sample(): void {
    const nodes = this.plan.nodes, e = this.main.e, k = this.n;
    const inc = this.aux.e[nodes.front - nodes.auxOffset];
    const tot = e[nodes.front];
    this.recInc.data[k] = inc;
    this.recRef.data[k] = tot - inc;
    this.recTra.data[k] = this.plan.effective.back === 'pec' ? 0 : e[nodes.back];
    this.recSf.data[k] = e[nodes.sfProbe];
    this.count = k + 1;
    if (k % this.stride !== 0) return;
    // Running DFT, e^{−jωt} kernel (e^{+jωt} phasors), one term every `stride` steps.
    const ph = this.omegaDt * k, c = Math.cos(ph), s = Math.sin(ph);
    const re = this.dftRe, im = this.dftIm, lo = this.dftLo, len = re.length;
    for (let i = 0; i < len; i++) { const v = e[lo + i]; re[i] += v * c; im[i] -= v * s; }
    this.incRe += inc * c;
    this.incIm -= inc * s;
  }

  /** Stored energy now: fields and pole states of both sides (normalized units, see EnergyReading). */
  private storedEnergy(): number {
    const e = this.main.e, h = this.main.h, we = this.weights.epsInf, wh = this.weights.muInf;
    let W = 0;
    for (let i = 0; i < e.length; i++) W += we[i] * e[i] * e[i];
    for (let i = 0; i < h.length; i++) W += wh[i] * h[i] * h[i];
    return W + poleEnergy(this.main.disp, e, this.plan.dt_s) + poleEnergy(this.main.mdisp, h, this.plan.dt_s);
  }

  private watchEnergy(t: number): void {
    const W = this.storedEnergy();
    this.energyNow = W;
    if (!Number.isFinite(W)) this.blowUp('a field became NaN or infinite');
    if (W > this.energyPeak) this.energyPeak = W;
    const sourceOn = t <= this.plan.pulse.end_s;
    if (sourceOn) this.sourcePeak = this.energyPeak;
    else if (W > BLOWUP_FACTOR * this.sourcePeak) this.blowUp(`the stored energy grew ${BLOWUP_FACTOR}× above its peak after the source stopped`);
    if (this.n % this.checkEvery !== 0) return;
    this.watch.feed(this.recInc.data, this.recRef.data, this.recTra.data, this.n + 1);
    const settled = this.watch.check();
    if (!sourceOn && settled && W <= this.energyPeak * Math.pow(10, -this.plan.decay_dB / 10)) this.finish('converged');
  }

  private blowUp(what: string): never {
    const e = this.main.e;
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

  totalField(): Float64Array { return this.main.e; }

  incidentField(out: Float64Array): Float64Array {
    const off = this.plan.nodes.auxOffset, ae = this.aux.e;
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
    const len = this.dftRe.length, dx = this.plan.dx_m, i0 = this.plan.nodes.front;
    const x_m = new Float64Array(len), E_re = new Float64Array(len), E_im = new Float64Array(len);
    const d = this.incRe * this.incRe + this.incIm * this.incIm;
    for (let i = 0; i < len; i++) {
      x_m[i] = (this.dftLo + i - i0) * dx;
      const a = this.dftRe[i], b = this.dftIm[i];
      E_re[i] = d > 0 ? (a * this.incRe + b * this.incIm) / d : 0;
      E_im[i] = d > 0 ? (b * this.incRe - a * this.incIm) / d : 0;
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
  return new Run(stack, planGrid(stack, options));
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
