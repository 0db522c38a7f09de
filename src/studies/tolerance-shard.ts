// A tolerance shard's raw results: percentiles cannot be joined, so a shard writes each sample's quantities
// (tolerance-samples.csv: sample,f_GHz,R_power,T_power,absorbed,IL_dB,IPD_deg) with every digit a double holds
// (JavaScript's shortest round-trip text), and the merge computes the percentiles from exactly the numbers one run
// would have used. The plan is rebuilt from the shard's tolerance.json.

import type { StackFile } from '../stack/file.ts';
import { parsePath } from './paths.ts';
import { TOLERANCE_QUANTITIES, type Distribution, type SampleOutput, type TolerancePlan, type ToleranceQuantity } from './tolerance.ts';

export const SAMPLES_FILE = 'tolerance-samples.csv';
export const SAMPLES_HEADER = ['sample', 'f_GHz', ...TOLERANCE_QUANTITIES].join(',');

/** One sample's rows (line ends included), numbers exact. */
export function sampleRows(out: SampleOutput, f_Hz: Float64Array): string {
  let text = '';
  const cols = TOLERANCE_QUANTITIES.map((n) => out.quantities[n]);
  for (let i = 0; i < f_Hz.length; i++) {
    text += `${out.index},${String(f_Hz[i] * 1e-9)}`;
    for (const c of cols) text += `,${String(c[i] + 0)}`;
    text += '\n';
  }
  return text;
}

/** A malformed shard file; the message names the file's line. */
export class ShardFormatError extends Error {
  override name = 'ShardFormatError';
}

/**
 * Reads a shard's samples: calls `sample(index, quantities)` once per sample, in the file's order, each with
 * `points` values per quantity. Checks the header, the row widths and that every sample is whole.
 */
export function readSampleRows(text: string, points: number,
  sample: (index: number, q: Record<ToleranceQuantity, Float64Array>) => void): void {
  const lines = text.split('\n');
  if (lines[0] !== SAMPLES_HEADER) throw new ShardFormatError(`line 1: the header is not "${SAMPLES_HEADER}"`);
  let current = -1, row = 0;
  let q = newQuantities(points);
  const flush = (line: number) => {
    if (current < 0) return;
    if (row !== points) throw new ShardFormatError(`line ${line}: sample ${current} has ${row} rows, the stack has ${points} frequencies`);
    sample(current, q);
    q = newQuantities(points);
  };
  for (let k = 1; k < lines.length; k++) {
    if (lines[k] === '') { if (k === lines.length - 1) break; throw new ShardFormatError(`line ${k + 1}: empty`); }
    const f = lines[k].split(',');
    if (f.length !== TOLERANCE_QUANTITIES.length + 2) throw new ShardFormatError(`line ${k + 1}: ${f.length} fields, expected ${TOLERANCE_QUANTITIES.length + 2}`);
    const index = Number(f[0]);
    if (index !== current) { flush(k + 1); current = index; row = 0; }
    if (row >= points) throw new ShardFormatError(`line ${k + 1}: sample ${index} has more rows than the ${points} frequencies`);
    TOLERANCE_QUANTITIES.forEach((n, j) => {
      const x = Number(f[j + 2]);
      if (!Number.isFinite(x)) throw new ShardFormatError(`line ${k + 1}: ${n} is not a number`);
      q[n][row] = x;
    });
    row++;
  }
  flush(lines.length);
}

const newQuantities = (n: number): Record<ToleranceQuantity, Float64Array> =>
  Object.fromEntries(TOLERANCE_QUANTITIES.map((name) => [name, new Float64Array(n)])) as Record<ToleranceQuantity, Float64Array>;

interface VaryEntry { path: string; distribution: Distribution; nominal: number; sd?: number; half_width?: number; spec: string }

/** The plan a tolerance.json records (its stack, varies, samples and seed). */
export function tolerancePlanOf(head: Record<string, unknown>): TolerancePlan {
  const varies = (head.varies as VaryEntry[]).map((v) => ({
    path: parsePath(v.path), distribution: v.distribution, nominal: v.nominal,
    width: (v.distribution === 'normal' ? v.sd : v.half_width) as number, spec: v.spec,
  }));
  return { base: head.stack as StackFile, varies, samples: head.samples as number, seed: head.seed as number };
}
