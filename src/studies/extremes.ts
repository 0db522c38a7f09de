// The engineering quantities as table columns, and their band extremes: the worst reflection and the worst
// insertion loss over the band and where they occur (the first frequency on a tie).

import { QUANTITY_NAMES, type Quantities } from './quantities.ts';
import type { Column } from '../report/table.ts';

/** R_power, T_power, absorbed, IL_dB, RL_dB, IPD_deg as columns, in that order. */
export const quantityColumns = (q: Quantities): Column[] => QUANTITY_NAMES.map((name) => ({ name, data: q[name] }));

/** Index of the largest value (the first on a tie). */
function argMax(x: Float64Array): number {
  let k = 0;
  for (let i = 1; i < x.length; i++) if (x[i] > x[k]) k = i;
  return k;
}

function argMin(x: Float64Array): number {
  let k = 0;
  for (let i = 1; i < x.length; i++) if (x[i] < x[k]) k = i;
  return k;
}

/** 12 significant digits, as the tables write numbers (and no −0, which JSON cannot hold). */
export const sig12 = (x: number): number => Number(x.toPrecision(12)) + 0;

/** The band extremes a study records per case. */
export interface BandExtremes {
  worst_R_power: number; worst_R_power_f_GHz: number;
  worst_IL_dB: number; worst_IL_dB_f_GHz: number;
}

export function bandExtremes(f_Hz: Float64Array, q: Pick<Quantities, 'R_power' | 'IL_dB'>): BandExtremes {
  const r = argMax(q.R_power), t = argMax(q.IL_dB);
  return {
    worst_R_power: sig12(q.R_power[r]), worst_R_power_f_GHz: sig12(f_Hz[r] * 1e-9),
    worst_IL_dB: sig12(q.IL_dB[t]), worst_IL_dB_f_GHz: sig12(f_Hz[t] * 1e-9),
  };
}

/** The quantities in brief for summary.json's `results`: the ranges of each and where the worst occur. */
export function quantitiesInBrief(f_Hz: Float64Array, q: Quantities): Record<string, number> {
  const at = (i: number) => sig12(f_Hz[i] * 1e-9);
  const out: Record<string, number> = {};
  for (const name of QUANTITY_NAMES) {
    const lo = argMin(q[name]), hi = argMax(q[name]);
    out[`${name}_min`] = sig12(q[name][lo]);
    out[`${name}_min_at_GHz`] = at(lo);
    out[`${name}_max`] = sig12(q[name][hi]);
    out[`${name}_max_at_GHz`] = at(hi);
  }
  return out;
}
