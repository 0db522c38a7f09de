// Axis ticks at "nice" values (1, 2, 5 × 10^k) and their labels.

/** Tick values covering [lo, hi] with about `target` intervals. */
export function niceTicks(lo: number, hi: number, target = 6): number[] {
  if (!(hi > lo) || !Number.isFinite(lo) || !Number.isFinite(hi)) return [lo];
  const raw = (hi - lo) / Math.max(1, target);
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const f = raw / mag;
  const step = (f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10) * mag;
  const out: number[] = [];
  const start = Math.ceil(lo / step - 1e-9) * step;
  for (let v = start; v <= hi + step * 1e-9; v += step) out.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  return out;
}

/** A compact label for a tick value, with as many decimals as the tick step needs. */
export function tickLabel(v: number, ticks: number[]): string {
  const step = ticks.length > 1 ? Math.abs(ticks[1] - ticks[0]) : Math.abs(v) || 1;
  const decimals = Math.max(0, Math.min(6, -Math.floor(Math.log10(step) + 1e-9)));
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e6 || a < 1e-4)) return v.toExponential(1);
  return v.toFixed(decimals);
}

/** Range [lo, hi] of the finite values, or null. */
export function finiteRange(values: ArrayLike<number>, n = values.length): [number, number] | null {
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < n; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return lo <= hi && Number.isFinite(lo) && Number.isFinite(hi) ? [lo, hi] : null;
}
