// A measured table as a function of frequency: the real part and the loss each interpolated by PCHIP
// (pchip.ts) in ln f, since dielectric spectra vary on a logarithmic frequency scale (a Debye relaxation is a
// function of ln ωτ). PCHIP keeps ε' and ε'' between neighbouring samples, so a table with ε'' ≥ 0 stays passive
// between its rows. Outside the table's frequencies there is no value: the parser refuses a band or profile
// frequency the table does not cover, and anything else asking is told the range (TableRangeError).

import type { Complex } from '../complex.ts';
import { GHz } from '../units.ts';
import { pchip, pchipAt, type Pchip } from './pchip.ts';
import type { TablePoint } from './types.ts';

export interface TableInterpolant {
  /** First and last frequency of the table, Hz. */
  readonly range_Hz: readonly [number, number];
  readonly re: Pchip;
  readonly loss: Pchip;
}

/** A frequency outside a table's rows. */
export class TableRangeError extends RangeError {
  override name = 'TableRangeError';
}

/** Relative slack at the ends (a band edge typed as the table's first frequency is inside it). */
const END_SLACK = 1e-12;

const cache = new WeakMap<readonly TablePoint[], TableInterpolant>();

/** The interpolant of a table's rows (built once per rows array; the arrays of a parsed stack are not mutated). */
export function tableInterpolant(points: readonly TablePoint[]): TableInterpolant {
  let hit = cache.get(points);
  if (hit === undefined) {
    const n = points.length;
    const x = new Float64Array(n), re = new Float64Array(n), loss = new Float64Array(n);
    points.forEach(([f_GHz, r, l], i) => { x[i] = Math.log(f_GHz * GHz); re[i] = r; loss[i] = l; });
    hit = { range_Hz: [points[0][0] * GHz, points[n - 1][0] * GHz], re: pchip(x, re), loss: pchip(x, loss) };
    cache.set(points, hit);
  }
  return hit;
}

/** The table's first and last frequency in GHz. */
export const tableRange_GHz = (points: readonly TablePoint[]): [number, number] => [points[0][0], points[points.length - 1][0]];

/** Does the table cover [lo, hi] GHz (ends included, to rounding)? */
export function tableCovers(points: readonly TablePoint[], lo_GHz: number, hi_GHz: number): boolean {
  const [a, b] = tableRange_GHz(points);
  return lo_GHz >= a * (1 - END_SLACK) && hi_GHz <= b * (1 + END_SLACK);
}

/** The tabulated quantity at f_Hz as {re: real part, im: −loss} (the e^{+jωt} convention). */
export function tableValue(points: readonly TablePoint[], f_Hz: number): Complex {
  const t = tableInterpolant(points);
  const [lo, hi] = t.range_Hz;
  if (!(f_Hz >= lo * (1 - END_SLACK) && f_Hz <= hi * (1 + END_SLACK))) {
    throw new TableRangeError(`${fmt(f_Hz / GHz)} GHz is outside the table's range ${fmt(lo / GHz)}–${fmt(hi / GHz)} GHz`);
  }
  const x = Math.log(Math.min(hi, Math.max(lo, f_Hz)));
  return { re: pchipAt(t.re, x), im: 0 - pchipAt(t.loss, x) }; // 0 − : no −0
}

const fmt = (x: number): string => String(Number(x.toPrecision(6)));
