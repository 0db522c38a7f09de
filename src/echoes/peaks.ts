// Local maxima of a sampled envelope (each is then refined exactly: envelope.ts envelopePeak).

/**
 * Indices m in [from, to) (circular: indices wrap modulo the length, so `from` may be negative) where
 * mag[m] ≥ threshold and mag[m] is a local maximum (≥ the sample before, > the sample after).
 */
export function localMaxima(mag: Float64Array, threshold: number, from: number, to: number): number[] {
  const M = mag.length, at = (i: number) => mag[((i % M) + M) % M];
  const out: number[] = [];
  for (let i = from; i < to; i++) {
    const v = at(i);
    if (v >= threshold && v >= at(i - 1) && v > at(i + 1)) out.push(((i % M) + M) % M);
  }
  return out;
}
