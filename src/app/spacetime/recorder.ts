// Worker side of the space–time map: watches the full pulse run as it steps (report/run.ts `observe`) and keeps
// the field at the nodes of the field view's default framing, a row every eighth of a period of the band's top
// frequency. The field is read as the field view reads it (total = grid + incident in front of the TF/SF plane;
// nothing in front of the source), the scattered field is total − incident. Rows are thinned by two whenever the store fills, so a long ring-down
// still fits; at the end the quiet tail (the field in the window below QUIET of its largest) is cut.

import type { GridPlan, PulseRun } from '../../fdtd/types.ts';
import type { RunObserver } from '../../report/run.ts';
import type { Stack } from '../../stack/types.ts';
import { defaultSpan, gridSpan, minSpanWidth } from '../field/framing.ts';
import { sketchStack } from '../sketch.ts';

/** The recorded map: rows of time, columns of position, values row-major (row · nx + column). */
export interface SpacetimeMap {
  x_mm: Float64Array;
  t_ns: Float64Array;
  total: Float32Array;
  scattered: Float32Array;
  /** Steps of the run between rows, and the run's time step. */
  stepsPerRow: number;
  dt_ns: number;
  /** Largest |total| in the map (the colour scale's reference). */
  peak: number;
}

/** Most columns (nodes in the window, thinned evenly beyond). */
export const MAX_COLUMNS = 480;
/** Rows a map holds; when full, every other one is dropped (and from then on every other sample). */
export const MAX_ROWS = 1200;
/** Rows per period of the band's top frequency (the carrier resolved at every frequency of the band). */
const ROWS_PER_PERIOD = 8;
/** The map ends where the field in the window stays below this share of its largest value (plus a margin). */
const QUIET = 0.003;

export class SpacetimeRecorder implements RunObserver {
  private columns = new Int32Array(0);
  private x_mm = new Float64Array(0);
  private incident = new Float64Array(0);
  private total: Float32Array = new Float32Array(0);
  private scattered: Float32Array = new Float32Array(0);
  private times: number[] = [];
  private rows = 0;
  private every = 1;
  private keep = 1;
  private calls = 0;
  private dt_s = 0;

  private readonly maxRows: number;

  /** `maxRows` (even) is the store's size in rows. */
  constructor(private readonly stack: Stack, maxRows = MAX_ROWS) {
    this.maxRows = 2 * Math.max(2, Math.floor(maxRows / 2));
  }

  every_steps(plan: GridPlan): number {
    this.every = Math.max(1, Math.floor(1 / (ROWS_PER_PERIOD * this.stack.band_Hz[1] * plan.dt_s)));
    this.dt_s = plan.dt_s;
    return this.every;
  }

  sample(run: PulseRun): void {
    if (this.columns.length === 0) this.start(run);
    if (this.calls++ % this.keep !== 0) return;
    if (this.rows === this.maxRows) this.thin();
    const nodes = run.plan.nodes, g = run.totalField(), inc = run.incidentField(this.incident);
    const nx = this.columns.length, base = this.rows * nx;
    for (let c = 0; c < nx; c++) {
      const i = this.columns[c];
      const total = i < nodes.auxOffset ? Number.NaN : i < nodes.tfsf ? g[i] + inc[i] : g[i];
      this.total[base + c] = total;
      this.scattered[base + c] = total - inc[i];
    }
    this.times[this.rows++] = run.time_s * 1e9;
  }

  /** The nodes inside the default framing, from the source on (every one, or every k-th: at most MAX_COLUMNS). */
  private start(run: PulseRun): void {
    const x = run.x_m(), sk = sketchStack(this.stack);
    const full = gridSpan(x, sk.pec);
    const span = defaultSpan({ thickness_m: sk.thickness_m, pulseLength_m: sk.pulseLength_m, pec: sk.pec, full }, minSpanWidth(x, full));
    // In front of the source there is no total field (the incident wave is born there): the map starts at it.
    let lo = Math.max(0, run.plan.nodes.auxOffset), hi = x.length - 1;
    while (lo < hi && x[lo] < span.x0_m) lo++;
    while (hi > lo && x[hi] > span.x1_m) hi--;
    // Every k-th node, the front face's among them, so the columns are evenly spaced and x = 0 is one.
    const k = Math.max(1, Math.ceil((hi - lo + 1) / MAX_COLUMNS)), front = Math.min(hi, Math.max(lo, run.plan.nodes.front));
    const first = front - Math.floor((front - lo) / k) * k;
    this.columns = Int32Array.from({ length: Math.floor((hi - first) / k) + 1 }, (_, c) => first + c * k);
    const nx = this.columns.length;
    this.x_mm = Float64Array.from(this.columns, (i) => x[i] * 1e3);
    this.incident = new Float64Array(x.length);
    this.total = new Float32Array(this.maxRows * nx);
    this.scattered = new Float32Array(this.maxRows * nx);
  }

  /** Keep every other row; from now on record every other sample. */
  private thin(): void {
    const nx = this.columns.length;
    for (let r = 0; r < this.rows / 2; r++) {
      this.total.copyWithin(r * nx, 2 * r * nx, (2 * r + 1) * nx);
      this.scattered.copyWithin(r * nx, 2 * r * nx, (2 * r + 1) * nx);
      this.times[r] = this.times[2 * r];
    }
    this.rows /= 2;
    this.keep *= 2;
    this.calls = 1; // the sample being taken now is the first of the next pair
  }

  /** The map, its quiet tail cut; null when nothing was recorded. */
  map(): SpacetimeMap | null {
    const nx = this.columns.length;
    if (nx === 0 || this.rows < 2) return null;
    let peak = 0;
    const rowPeak = new Float64Array(this.rows);
    for (let r = 0; r < this.rows; r++) {
      let m = 0;
      for (let c = 0; c < nx; c++) { const v = Math.abs(this.total[r * nx + c]); if (v > m) m = v; }
      rowPeak[r] = m;
      if (m > peak) peak = m;
    }
    let last = this.rows - 1;
    while (last > 1 && !(rowPeak[last] > QUIET * peak)) last--;
    const rows = Math.min(this.rows, Math.ceil(last * 1.1) + 2);
    return {
      x_mm: this.x_mm,
      t_ns: Float64Array.from(this.times.slice(0, rows)),
      total: this.total.slice(0, rows * nx),
      scattered: this.scattered.slice(0, rows * nx),
      stepsPerRow: this.every * this.keep,
      dt_ns: this.dt_s * 1e9,
      peak,
    };
  }
}
