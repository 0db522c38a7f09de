// A measured response to match: a CSV with a header (stack/numeric-csv.ts), the column f_GHz and any of
//   R_re,R_im  T_re,T_im   complex R and T (both parts together), as slabecho defines them (README, Conventions)
//   R_dB  T_dB             20 log10 |R| and 20 log10 |T| (|T| of the tangential E; 10 log10 of the transmitted
//                          power fraction when the front and back media are alike)
// and optionally `weight` (≥ 0, default 1) multiplying every residual of its row. Each row gives one residual per
// quantity (two for a complex one): model − measured, times the weight.

import type { Spectrum } from '../results.ts';
import { readNumericCsv } from '../stack/numeric-csv.ts';
import type { Stack } from '../stack/types.ts';
import { fmtGHz } from '../stack/warnings.ts';
import { GHz } from '../units.ts';

export const MEASURED_COLUMNS = ['R_re', 'R_im', 'T_re', 'T_im', 'R_dB', 'T_dB'] as const;
export type MeasuredColumn = typeof MEASURED_COLUMNS[number];
export const MAX_MEASURED_ROWS = 100_000;
/** A model magnitude of zero is taken as this many dB (never −∞ in a residual). */
export const DB_FLOOR = -400;

export interface Measured {
  /** File name, for messages and the summary. */
  name: string;
  f_Hz: Float64Array;
  weight: Float64Array;
  /** The quantity columns given, in MEASURED_COLUMNS order. */
  columns: readonly MeasuredColumn[];
  values: ReadonlyMap<MeasuredColumn, Float64Array>;
  /** Residuals per evaluation: rows × columns. */
  residualCount: number;
}

export type MeasuredResult = { ok: true; measured: Measured } | { ok: false; errors: string[] };

/** Read and check a measured file against the stack it is to match. */
export function readMeasured(text: string, name: string, stack: Stack): MeasuredResult {
  const read = readNumericCsv(text, name, { required: ['f_GHz'], optional: [...MEASURED_COLUMNS, 'weight'], maxRows: MAX_MEASURED_ROWS });
  if (!read.ok) return read;
  const { csv } = read;
  const errors: string[] = [];
  const columns = MEASURED_COLUMNS.filter((c) => csv.columns.has(c));
  if (columns.length === 0) errors.push(`${name}: no measured quantity; give any of R_re,R_im, T_re,T_im, R_dB, T_dB besides f_GHz`);
  for (const [a, b] of [['R_re', 'R_im'], ['T_re', 'T_im']] as const) {
    if (csv.columns.has(a) !== csv.columns.has(b)) errors.push(`${name}: give ${a} and ${b} together (a complex value has both parts)`);
  }
  if (stack.back === 'pec' && columns.some((c) => c.startsWith('T'))) {
    errors.push(`${name}: the stack ends in a conductor ("back": "pec"), so nothing is transmitted; drop the T columns`);
  }
  if (csv.rows === 0) errors.push(`${name}: no rows of numbers`);
  const f = csv.columns.get('f_GHz')!, [lo, hi] = [stack.band_Hz[0] / GHz, stack.band_Hz[1] / GHz];
  for (let i = 0; i < csv.rows && errors.length < 20; i++) {
    if (!(f[i] >= lo * (1 - 1e-12) && f[i] <= hi * (1 + 1e-12))) {
      errors.push(`${name} line ${csv.lines[i]}, f_GHz: ${f[i]} GHz is outside the stack's band ${fmtGHz(lo)}–${fmtGHz(hi)} GHz (band_GHz); widen the band or drop the row`);
    }
  }
  const weight = csv.columns.get('weight') ?? new Float64Array(csv.rows).fill(1);
  for (let i = 0; i < csv.rows && errors.length < 20; i++) {
    if (!(weight[i] >= 0)) errors.push(`${name} line ${csv.lines[i]}, weight: must be a number ≥ 0 (got ${weight[i]})`);
  }
  if (csv.rows > 0 && weight.every((w) => w === 0)) errors.push(`${name}: every weight is 0, so nothing would be matched`);
  if (errors.length > 0) return { ok: false, errors };
  const values = new Map(columns.map((c) => [c, csv.columns.get(c)!] as const));
  return {
    ok: true,
    measured: { name, f_Hz: f.map((x) => x * GHz), weight, columns, values, residualCount: csv.rows * columns.length },
  };
}

const dB = (re: number, im: number): number => {
  const m = Math.hypot(re, im);
  return m > 0 ? Math.max(DB_FLOOR, 20 * Math.log10(m)) : DB_FLOOR;
};

/** Weighted residuals, model − measured, row by row and column by column, into `out`. */
export function measuredResiduals(m: Measured, model: Spectrum, out: Float64Array): Float64Array {
  let k = 0;
  for (let i = 0; i < m.f_Hz.length; i++) {
    const w = m.weight[i];
    for (const c of m.columns) {
      const meas = m.values.get(c)![i];
      let v: number;
      switch (c) {
        case 'R_re': v = model.R_re[i]; break;
        case 'R_im': v = model.R_im[i]; break;
        case 'T_re': v = model.T_re[i]; break;
        case 'T_im': v = model.T_im[i]; break;
        case 'R_dB': v = dB(model.R_re[i], model.R_im[i]); break;
        case 'T_dB': v = dB(model.T_re[i], model.T_im[i]); break;
      }
      out[k++] = w * (v - meas);
    }
  }
  return out;
}
