// When a pulse run has its answer: the running spectra of the probe records at a set of band frequencies
// (both ends included) have stopped changing, and the energy still stored on the grid (fields and pole
// states) has decayed. The spectra are accumulated from the records, sample by sample (by the run from its
// records between batches of steps, or by the WebAssembly engine inside its step: the same sums to the bit);
// every check compares them with their values one window earlier.

/** Check frequencies across the band (ends included; even, for the engine's two lanes). */
export const CHECK_FREQUENCIES = 24;
/** The window over which the spectra must have settled: this many periods of the band's bottom … */
const WINDOW_PERIODS = 2;
/** … and at least this many steps; checks come WINDOW_CHECKS times per window. */
const MIN_WINDOW_STEPS = 64;
const WINDOW_CHECKS = 4;
/** Settled: the change over the window is below this fraction of the accuracy target, at two checks running. */
export const SETTLED_FRACTION = 0.03;
const SETTLED_CHECKS = 2;
/** Phasors are re-seeded from the exact angle at every sample index that is a multiple of this. */
export const RESEED = 256;

/**
 * The running spectra's arrays, N check frequencies: accumulators `acc` (six runs of N: incident re, im,
 * reflected re, im, transmitted re, im), the phasor cos, sin at the next sample to feed (`phasor`, two runs of N)
 * and the per-sample rotation cos, sin of ωΔt (`rotation`). An engine may hold them (the WebAssembly one feeds
 * every step's samples itself); otherwise the watch makes its own.
 */
export interface SpectraState { acc: Float64Array; phasor: Float64Array; rotation: Float64Array }

export const spectraState = (n = CHECK_FREQUENCIES): SpectraState =>
  ({ acc: new Float64Array(6 * n), phasor: new Float64Array(2 * n), rotation: new Float64Array(2 * n) });

export class SpectraWatch {
  /** Steps between checks. */
  readonly every: number;
  readonly frequencies = CHECK_FREQUENCIES;
  private readonly w: Float64Array;
  private readonly state: SpectraState;
  private readonly history: Float64Array[]; // snapshots of acc, one per check, WINDOW_CHECKS deep
  private checks = 0;
  private settledRuns = 0;
  private fed = 0;
  /** Largest change of R or T over the last window, at the last check (Infinity until a window has passed). */
  lastChange = Infinity;

  constructor(band_Hz: [number, number], private readonly dt_s: number, private readonly threshold: number, state?: SpectraState) {
    const n = CHECK_FREQUENCIES;
    this.w = Float64Array.from({ length: n }, (_, i) => 2 * Math.PI * (band_Hz[0] + ((band_Hz[1] - band_Hz[0]) * i) / (n - 1)));
    const window = Math.max(MIN_WINDOW_STEPS, Math.ceil(WINDOW_PERIODS / (band_Hz[0] * dt_s)));
    this.every = Math.max(1, Math.ceil(window / WINDOW_CHECKS));
    this.state = state ?? spectraState(n);
    for (let q = 0; q < n; q++) {
      this.state.rotation[q] = Math.cos(this.w[q] * dt_s);
      this.state.rotation[n + q] = Math.sin(this.w[q] * dt_s);
    }
    this.history = Array.from({ length: WINDOW_CHECKS }, () => new Float64Array(6 * n));
  }

  /** The exact phasors at sample k (a multiple of RESEED), into out (cos at q, sin at N + q). */
  seeds(k: number, out: Float64Array): void {
    const n = CHECK_FREQUENCIES;
    for (let q = 0; q < n; q++) { out[q] = Math.cos(this.w[q] * this.dt_s * k); out[n + q] = Math.sin(this.w[q] * this.dt_s * k); }
  }

  /**
   * Add samples [fed, to) of the records (sample k at t = k dt), e^{−jωt} kernel: x (c − j s), the phasor
   * rotated sample by sample and re-seeded at every multiple of RESEED (so any feeding order gives the same sums).
   */
  feed(inc: Float64Array, ref: Float64Array, tra: Float64Array, to: number): void {
    const n = CHECK_FREQUENCIES, { acc, phasor, rotation } = this.state;
    for (let k = this.fed; k < to; k++) {
      if (k % RESEED === 0) this.seeds(k, phasor);
      const xi = inc[k], xr = ref[k], xt = tra[k];
      for (let q = 0; q < n; q++) {
        const c = phasor[q], s = phasor[n + q], cs = rotation[q], sn = rotation[n + q];
        acc[q] += xi * c; acc[n + q] -= xi * s;
        acc[2 * n + q] += xr * c; acc[3 * n + q] -= xr * s;
        acc[4 * n + q] += xt * c; acc[5 * n + q] -= xt * s;
        phasor[q] = c * cs - s * sn;
        phasor[n + q] = s * cs + c * sn;
      }
    }
    this.fed = Math.max(this.fed, to);
  }

  /** Samples [fed, to) were fed by the engine holding the state. */
  markFed(to: number): void { this.fed = Math.max(this.fed, to); }

  /**
   * A check (call every `every` steps, after feeding): true when R and T at every check frequency changed by
   * less than the threshold over the last window, at SETTLED_CHECKS checks in a row.
   */
  check(): boolean {
    const n = CHECK_FREQUENCIES, acc = this.state.acc;
    const old = this.history[this.checks % WINDOW_CHECKS];
    const at = (a: Float64Array, part: number, q: number) => a[part * n + q];
    let worst = 0;
    if (this.checks >= WINDOW_CHECKS) {
      for (let q = 0; q < n; q++) {
        const inc = Math.hypot(at(acc, 0, q), at(acc, 1, q));
        if (!(inc > 0)) { worst = Infinity; break; }
        const dR = Math.hypot(at(acc, 2, q) - at(old, 2, q), at(acc, 3, q) - at(old, 3, q));
        const dT = Math.hypot(at(acc, 4, q) - at(old, 4, q), at(acc, 5, q) - at(old, 5, q));
        const dI = Math.hypot(at(acc, 0, q) - at(old, 0, q), at(acc, 1, q) - at(old, 1, q));
        worst = Math.max(worst, (dR + dT + dI) / inc);
      }
    } else worst = Infinity;
    old.set(acc);
    this.checks++;
    this.lastChange = worst;
    this.settledRuns = worst <= this.threshold ? this.settledRuns + 1 : 0;
    return this.settledRuns >= SETTLED_CHECKS;
  }
}
