// A tolerance study: Monte Carlo over numeric stack-file paths, each drawn around its nominal value (normal with a
// standard deviation, or uniform within ± a half-width), every sample solved exactly, and the 5th, 50th and 95th
// percentiles of the engineering quantities at each frequency. Deterministic for a seed: the values of every
// sample are drawn up front in sample order (random.ts), so a run split into shards draws the same samples.
//
// tolerance.csv: f_GHz, then <quantity>_p05,_p50,_p95 for R_power, T_power, absorbed, IL_dB, IPD_deg.
// (RL_dB is −10 log10 R_power: its percentiles are R_power's, read the other way round.)

import { formatNumber, type Column } from '../report/table.ts';
import { bandFrequencies } from '../results.ts';
import type { StackFile } from '../stack/file.ts';
import type { Stack } from '../stack/types.ts';
import { solveExactWithQuantities } from './exact.ts';
import { bandExtremes, type BandExtremes } from './extremes.ts';
import { parsePathPrefix, PathError, readAt, valueKindAt, withSettings, type Setting, type StackPath } from './paths.ts';
import { quantileSorted } from './percentile.ts';
import { quantitiesUnavailable, type Quantities } from './quantities.ts';
import { Mt19937 } from './random.ts';
import { readDecimal } from './values.ts';

export type Distribution = 'normal' | 'uniform';

export interface Vary {
  readonly path: StackPath;
  readonly distribution: Distribution;
  /** The standard deviation (normal) or the half-width (uniform), in the path's own unit. */
  readonly width: number;
  readonly nominal: number;
  /** As typed. */
  readonly spec: string;
}

export interface TolerancePlan {
  base: StackFile;
  varies: Vary[];
  samples: number;
  seed: number;
}

/** The quantities whose percentiles tolerance.csv gives, in its order. */
export const TOLERANCE_QUANTITIES = ['R_power', 'T_power', 'absorbed', 'IL_dB', 'IPD_deg'] as const;
export type ToleranceQuantity = typeof TOLERANCE_QUANTITIES[number];
export const PERCENTILES = [{ label: 'p05', p: 0.05 }, { label: 'p50', p: 0.5 }, { label: 'p95', p: 0.95 }] as const;

export const MAX_SAMPLES = 1_000_000;
/** Samples × frequencies a run may hold (five quantities each, 8 bytes a value). */
export const MAX_SAMPLE_VALUES = 20_000_000;

/** The header of tolerance.csv. */
export const toleranceColumns = (): string[] =>
  ['f_GHz', ...TOLERANCE_QUANTITIES.flatMap((q) => PERCENTILES.map((p) => `${q}_${p.label}`))];

/**
 * `PATH:normal:SD` or `PATH:uniform:HALF` against the stack file: the path must hold a number that every sample
 * shares the frequencies with (band_GHz and points cannot vary). Throws PathError or Error with the rule.
 */
export function parseVary(text: string, base: StackFile): Vary {
  const { path, rest } = parsePathPrefix(text.trim());
  const m = /^:(normal|uniform):(.+)$/.exec(rest);
  if (!m) throw new PathError(path.text, `write ${path.text}:normal:SD or ${path.text}:uniform:HALF (got "${text}")`);
  const width = readDecimal(m[2]);
  if (width === undefined || width < 0) throw new PathError(path.text, `the ${m[1] === 'normal' ? 'standard deviation' : 'half-width'} must be a number ≥ 0 (got "${m[2]}")`);
  if (path.steps[0] === 'band_GHz' || path.steps[0] === 'points') {
    throw new PathError(path.text, 'every sample must share the frequencies, so band_GHz and points cannot vary (sweep them instead)');
  }
  const kind = valueKindAt(base, path);
  if (kind !== 'number') throw new PathError(path.text, kind === null ? 'not set in this stack file; a tolerance varies a number the file holds' : 'holds a text; a tolerance varies a number');
  return { path, distribution: m[1] as Distribution, width, nominal: readAt(base, path) as number, spec: text };
}

/** Every sample's values, sample-major: values[s · V + v] for vary v of sample s. */
export function drawSamples(plan: TolerancePlan): Float64Array {
  const V = plan.varies.length, out = new Float64Array(plan.samples * V);
  const rng = new Mt19937(plan.seed);
  for (let s = 0; s < plan.samples; s++) {
    for (let v = 0; v < V; v++) {
      const x = plan.varies[v];
      out[s * V + v] = x.nominal + (x.distribution === 'normal' ? x.width * rng.normal() : x.width * (2 * rng.uniform() - 1));
    }
  }
  return out;
}

export const sampleSettings = (plan: TolerancePlan, values: Float64Array, s: number): Setting[] =>
  plan.varies.map((v, k) => ({ path: v.path, value: values[s * plan.varies.length + k] }));

/** The stack of sample s, validated; errors carry the sample number and its values. */
export function sampleStack(plan: TolerancePlan, values: Float64Array, s: number):
  { ok: true; stack: Stack; file: StackFile; warnings: string[] } | { ok: false; errors: string[] } {
  const settings = sampleSettings(plan, values, s);
  const r = withSettings(plan.base, settings);
  const what = () => `sample ${s} (${settings.map((x) => `${x.path.text} = ${formatNumber(x.value as number)}`).join(', ')})`;
  if (!r.ok) return { ok: false, errors: r.errors.map((e) => `${what()}: ${e}`) };
  const lossy = quantitiesUnavailable(r.stack);
  return lossy === null ? r : { ok: false, errors: [`${what()}: ${lossy}`] };
}

/** One sample's quantities (the tolerance columns) and band extremes. */
export interface SampleOutput {
  index: number;
  quantities: Record<ToleranceQuantity, Float64Array>;
  extremes: BandExtremes;
  warnings: string[];
}

/** Solve sample s. Throws for an invalid sample (validate first). */
export function runToleranceSample(plan: TolerancePlan, values: Float64Array, s: number): SampleOutput {
  const c = sampleStack(plan, values, s);
  if (!c.ok) throw new Error(c.errors[0]);
  const { spectrum, quantities } = solveExactWithQuantities(c.stack, bandFrequencies(c.stack));
  return { index: s, quantities: pick(quantities), extremes: bandExtremes(spectrum.f_Hz, quantities), warnings: c.warnings };
}

const pick = (q: Quantities): Record<ToleranceQuantity, Float64Array> =>
  Object.fromEntries(TOLERANCE_QUANTITIES.map((n) => [n, q[n]])) as Record<ToleranceQuantity, Float64Array>;

/** Samples' quantities gathered frequency-major ([quantity][f · S + s]) for the percentiles. */
export class SampleTable {
  readonly data: Record<ToleranceQuantity, Float64Array>;
  readonly extremes: (BandExtremes | undefined)[];

  constructor(readonly points: number, readonly samples: number, readonly first = 0) {
    this.data = Object.fromEntries(TOLERANCE_QUANTITIES.map((n) => [n, new Float64Array(points * samples)])) as Record<ToleranceQuantity, Float64Array>;
    this.extremes = new Array(samples);
  }

  /** Sample `index` (from `first`): its quantities at every frequency. */
  add(index: number, quantities: Record<ToleranceQuantity, Float64Array>, extremes: BandExtremes): void {
    const s = index - this.first;
    for (const n of TOLERANCE_QUANTITIES) {
      const src = quantities[n], dst = this.data[n];
      for (let f = 0; f < this.points; f++) dst[f * this.samples + s] = src[f];
    }
    this.extremes[s] = extremes;
  }

  /** tolerance.csv's columns at the frequencies (f_GHz = f_Hz · 1e-9, as every table writes it). */
  percentileColumns(f_Hz: Float64Array): Column[] {
    const cols: Column[] = [{ name: 'f_GHz', data: Float64Array.from(f_Hz, (f) => f * 1e-9) }];
    const scratch = new Float64Array(this.samples);
    for (const n of TOLERANCE_QUANTITIES) {
      const out = PERCENTILES.map(() => new Float64Array(this.points));
      for (let f = 0; f < this.points; f++) {
        scratch.set(this.data[n].subarray(f * this.samples, (f + 1) * this.samples));
        scratch.sort();
        PERCENTILES.forEach((p, k) => { out[k][f] = quantileSorted(scratch, p.p); });
      }
      PERCENTILES.forEach((p, k) => cols.push({ name: `${n}_${p.label}`, data: out[k] }));
    }
    return cols;
  }
}
