// A chart's x axis: linear or logarithmic, data ↔ pixels both ways, and its ticks.

import { niceTicks, tickLabel } from './ticks.ts';

export type Scale = 'linear' | 'log';

export interface Axis {
  scale: Scale;
  /** Visible data range. */
  lo: number;
  hi: number;
  /** Pixel extent. */
  left: number;
  width: number;
}

/** The coordinate the axis is linear in: x itself, or log10 x (x ≤ 0 has none on a log axis). */
export const along = (scale: Scale, x: number): number => (scale === 'log' ? (x > 0 ? Math.log10(x) : Number.NaN) : x);
export const fromAlong = (scale: Scale, u: number): number => (scale === 'log' ? Math.pow(10, u) : u);

export function toPx(a: Axis, x: number): number {
  const u0 = along(a.scale, a.lo), u1 = along(a.scale, a.hi);
  return a.left + ((along(a.scale, x) - u0) / (u1 - u0)) * a.width;
}

export function fromPx(a: Axis, px: number): number {
  const u0 = along(a.scale, a.lo), u1 = along(a.scale, a.hi);
  return fromAlong(a.scale, u0 + ((px - a.left) / a.width) * (u1 - u0));
}

/**
 * Tick values for the axis. Linear: round steps of 1, 2 or 5 × 10^k. Log over a decade or more:
 * 1, 2 and 5 × 10^k (only the powers of ten when those would crowd); log over less than a decade:
 * round linear steps, placed logarithmically.
 */
export function axisTicks(a: Axis, target: number): number[] {
  if (a.scale === 'linear' || !(a.lo > 0)) return niceTicks(a.lo, a.hi, target);
  const decades = Math.log10(a.hi / a.lo);
  if (decades < 1) return niceTicks(a.lo, a.hi, target);
  const mantissas = decades * 3 <= target ? [1, 2, 5] : [1];
  const out: number[] = [];
  for (let k = Math.floor(Math.log10(a.lo)); k <= Math.ceil(Math.log10(a.hi)); k++) {
    for (const m of mantissas) {
      const v = m * Math.pow(10, k);
      if (v >= a.lo * (1 - 1e-12) && v <= a.hi * (1 + 1e-12)) out.push(Number(v.toPrecision(12)));
    }
  }
  return out;
}

export function axisTickLabel(a: Axis, v: number, ticks: number[]): string {
  if (a.scale === 'log' && a.lo > 0 && Math.log10(a.hi / a.lo) >= 1) return String(Number(v.toPrecision(3)));
  return tickLabel(v, ticks);
}
