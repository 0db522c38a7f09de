// When a pulse run has its answer: the running spectra of the probe records at a set of band frequencies
// (both ends included) have stopped changing, and the energy still stored on the grid (fields and pole
// states) has decayed. The spectra are accumulated from the records (no work inside the time-stepping
// kernel), a stretch at a time; every check compares them with their values one window earlier.

/** Check frequencies across the band (ends included). */
const CHECK_FREQUENCIES = 24;
/** The window over which the spectra must have settled: this many periods of the band's bottom … */
const WINDOW_PERIODS = 2;
/** … and at least this many steps; checks come WINDOW_CHECKS times per window. */
const MIN_WINDOW_STEPS = 64;
const WINDOW_CHECKS = 4;
/** Settled: the change over the window is below this fraction of the accuracy target, at two checks running. */
export const SETTLED_FRACTION = 0.03;
const SETTLED_CHECKS = 2;
/** Phasors are re-seeded from the exact angle this often (samples). */
const RESEED = 256;

export class SpectraWatch {
  /** Steps between checks. */
  readonly every: number;
  private readonly w: Float64Array;
  private readonly acc: Float64Array; // per frequency: inc re, im, ref re, im, tra re, im
  private readonly history: Float64Array[]; // snapshots of acc, one per check, WINDOW_CHECKS deep
  private checks = 0;
  private settledRuns = 0;
  private fed = 0;
  /** Largest change of R or T over the last window, at the last check (Infinity until a window has passed). */
  lastChange = Infinity;

  constructor(band_Hz: [number, number], private readonly dt_s: number, private readonly threshold: number) {
    const n = CHECK_FREQUENCIES;
    this.w = Float64Array.from({ length: n }, (_, i) => 2 * Math.PI * (band_Hz[0] + ((band_Hz[1] - band_Hz[0]) * i) / (n - 1)));
    const window = Math.max(MIN_WINDOW_STEPS, Math.ceil(WINDOW_PERIODS / (band_Hz[0] * dt_s)));
    this.every = Math.max(1, Math.ceil(window / WINDOW_CHECKS));
    this.acc = new Float64Array(6 * n);
    this.history = Array.from({ length: WINDOW_CHECKS }, () => new Float64Array(6 * n));
  }

  /** Add samples [fed, to) of the records (sample k at t = k dt). */
  feed(inc: Float64Array, ref: Float64Array, tra: Float64Array, to: number): void {
    const acc = this.acc, w = this.w, dt = this.dt_s;
    for (let q = 0; q < w.length; q++) {
      const step = w[q] * dt, cs = Math.cos(step), sn = Math.sin(step);
      let c = 0, s = 0, a0 = 0, a1 = 0, a2 = 0, a3 = 0, a4 = 0, a5 = 0;
      for (let k = this.fed; k < to; k++) {
        if (k === this.fed || k % RESEED === 0) { c = Math.cos(step * k); s = Math.sin(step * k); }
        // e^{−jωt} kernel: x (c − j s).
        const xi = inc[k], xr = ref[k], xt = tra[k];
        a0 += xi * c; a1 -= xi * s; a2 += xr * c; a3 -= xr * s; a4 += xt * c; a5 -= xt * s;
        const c2 = c * cs - s * sn; s = s * cs + c * sn; c = c2;
      }
      const b = 6 * q;
      acc[b] += a0; acc[b + 1] += a1; acc[b + 2] += a2; acc[b + 3] += a3; acc[b + 4] += a4; acc[b + 5] += a5;
    }
    this.fed = to;
  }

  /**
   * A check (call every `every` steps, after feeding): true when R and T at every check frequency changed by
   * less than the threshold over the last window, at SETTLED_CHECKS checks in a row.
   */
  check(): boolean {
    const old = this.history[this.checks % WINDOW_CHECKS];
    let worst = 0;
    if (this.checks >= WINDOW_CHECKS) {
      for (let b = 0; b < this.acc.length; b += 6) {
        const inc = Math.hypot(this.acc[b], this.acc[b + 1]);
        if (!(inc > 0)) { worst = Infinity; break; }
        const dR = Math.hypot(this.acc[b + 2] - old[b + 2], this.acc[b + 3] - old[b + 3]);
        const dT = Math.hypot(this.acc[b + 4] - old[b + 4], this.acc[b + 5] - old[b + 5]);
        const dI = Math.hypot(this.acc[b] - old[b], this.acc[b + 1] - old[b + 1]);
        worst = Math.max(worst, (dR + dT + dI) / inc);
      }
    } else worst = Infinity;
    old.set(this.acc);
    this.checks++;
    this.lastChange = worst;
    this.settledRuns = worst <= this.threshold ? this.settledRuns + 1 : 0;
    return this.settledRuns >= SETTLED_CHECKS;
  }
}
