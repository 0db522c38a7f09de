// Group delay τ_g = −dφ/dω of a complex response sampled at increasing frequencies,
// from the unwrapped phase by finite differences (central inside, one-sided at the ends).

/** Phase in radians, unwrapped so successive samples differ by less than π. */
export function unwrappedPhase(re: Float64Array, im: Float64Array): Float64Array {
  const n = re.length, out = new Float64Array(n);
  let offset = 0, prev = 0;
  for (let k = 0; k < n; k++) {
    const p = Math.atan2(im[k], re[k]);
    if (k > 0) offset -= 2 * Math.PI * Math.round((p - prev) / (2 * Math.PI));
    out[k] = p + offset;
    prev = p;
  }
  return out;
}

/** −dφ/dω in seconds at each frequency (needs ≥ 2 frequencies; 0 otherwise). */
export function groupDelay(f_Hz: Float64Array, re: Float64Array, im: Float64Array): Float64Array {
  const n = f_Hz.length, out = new Float64Array(n);
  if (n < 2) return out;
  const phi = unwrappedPhase(re, im);
  for (let k = 0; k < n; k++) {
    const a = Math.max(0, k - 1), b = Math.min(n - 1, k + 1);
    const dw = 2 * Math.PI * (f_Hz[b] - f_Hz[a]);
    const v = dw !== 0 ? -(phi[b] - phi[a]) / dw : 0;
    out[k] = Number.isFinite(v) ? v : 0;
  }
  return out;
}
