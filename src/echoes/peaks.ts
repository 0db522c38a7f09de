// Peak helpers on an envelope: sub-sample refinement by a parabola through the log-envelope
// (exact for a Gaussian envelope, whose logarithm is a parabola), and the width at half maximum.

export interface RefinedPeak {
  /** Fractional sample index of the peak. */
  index: number;
  /** Interpolated envelope value there. */
  value: number;
}

/** Parabolic interpolation of ln(env) through samples i − 1, i, i + 1. */
export function refinePeak(env: Float64Array, i: number): RefinedPeak {
  if (i <= 0 || i >= env.length - 1) return { index: i, value: env[i] };
  const a = Math.log(env[i - 1]), b = Math.log(env[i]), c = Math.log(env[i + 1]);
  const den = a - 2 * b + c;
  if (!Number.isFinite(den) || den >= 0) return { index: i, value: env[i] };
  const d = Math.max(-0.5, Math.min(0.5, (0.5 * (a - c)) / den));
  return { index: i + d, value: Math.exp(b - 0.25 * (a - c) * d) };
}

/** Full width at half maximum (in samples) of the peak at i, by linear interpolation of the crossings. */
export function widthAtHalf(env: Float64Array, i: number): number {
  const half = env[i] / 2;
  let lo = i, hi = i;
  while (lo > 0 && env[lo] > half) lo--;
  while (hi < env.length - 1 && env[hi] > half) hi++;
  const left = env[lo] <= half && env[lo + 1] !== env[lo] ? lo + (half - env[lo]) / (env[lo + 1] - env[lo]) : lo;
  const right = env[hi] <= half && env[hi - 1] !== env[hi] ? hi - (half - env[hi]) / (env[hi - 1] - env[hi]) : hi;
  return Math.max(right - left, 1);
}
