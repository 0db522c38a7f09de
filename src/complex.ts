// Minimal complex arithmetic on plain {re, im} values, for the frequency-domain solvers.
// Hot loops may call the `…Into` forms, which write into a caller's object; columnar results store
// re and im in separate Float64Arrays.
//
// Accuracy: every primitive here keeps a small part small and right. The square root in particular
// never forms |z| − Re z (which cancels when |Im z| ≪ Re z and would drop a loss of ε''/ε' ≲ 1e-8).

export interface Complex { re: number; im: number }

export const cx = (re: number, im = 0): Complex => ({ re, im });
export const add = (a: Complex, b: Complex): Complex => ({ re: a.re + b.re, im: a.im + b.im });
export const sub = (a: Complex, b: Complex): Complex => ({ re: a.re - b.re, im: a.im - b.im });
export const mul = (a: Complex, b: Complex): Complex => ({
  re: a.re * b.re - a.im * b.im,
  im: a.re * b.im + a.im * b.re,
});
export const scale = (a: Complex, s: number): Complex => ({ re: a.re * s, im: a.im * s });
export const conj = (a: Complex): Complex => ({ re: a.re, im: -a.im });
export const abs = (a: Complex): number => Math.hypot(a.re, a.im);
export const abs2 = (a: Complex): number => a.re * a.re + a.im * a.im;
export const arg = (a: Complex): number => Math.atan2(a.im, a.re);

/**
 * a / b by Smith's algorithm (scaled by the larger part of b, so nothing overflows on the way). Each part
 * of the quotient is a sum of two products of the same size as the result, so no part is lost to cancellation
 * that the quotient itself does not carry.
 */
export function div(a: Complex, b: Complex): Complex {
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re, d = b.re + b.im * r;
    return { re: (a.re + a.im * r) / d, im: (a.im - a.re * r) / d };
  }
  const r = b.re / b.im, d = b.re * r + b.im;
  return { re: (a.re * r + a.im) / d, im: (a.im * r - a.re) / d };
}

/**
 * Principal square root of re + j·im written into `out` (branch cut on the negative real axis, result with
 * Re ≥ 0; on the cut itself, Im ≥ 0). Kahan ("Branch cuts for complex elementary functions", 1987):
 * t = √((|z| + |x|)/2) is a sum of two non-negative terms, so it is accurate; the other part is y / (2t),
 * a quotient, so it keeps every digit of a small Im z. Relative error of each part within a few ulps.
 */
export function sqrtInto(out: Complex, re: number, im: number): Complex {
  if (re === 0 && im === 0) { out.re = 0; out.im = 0; return out; }
  // Halve before adding so |z| + |x| cannot overflow for parts near the largest double.
  const t = Math.sqrt(Math.hypot(re, im) / 2 + Math.abs(re) / 2);
  if (re >= 0) { out.re = t; out.im = im / (2 * t); }
  else { out.re = Math.abs(im) / (2 * t); out.im = im < 0 ? -t : t; }
  return out;
}

/** Principal square root (branch cut on the negative real axis, result with re ≥ 0). See sqrtInto. */
export const sqrt = (a: Complex): Complex => sqrtInto({ re: 0, im: 0 }, a.re, a.im);

/**
 * √z on the branch with Im ≤ 0 (a wave e^{−j k x} with k = √z decays, or is undamped, along +x), written into
 * `out`: the principal root, negated when its imaginary part is positive (an evanescent wave in a lossless
 * medium, or z on the branch cut).
 */
export function decayingSqrtInto(out: Complex, re: number, im: number): Complex {
  sqrtInto(out, re, im);
  if (out.im > 0) { out.re = -out.re; out.im = -out.im; }
  return out;
}

/** e^{z}. Magnitude and phase are computed apart (e^{re} times cos, sin of im), so neither part cancels. */
export function exp(a: Complex): Complex {
  const m = Math.exp(a.re);
  return { re: m * Math.cos(a.im), im: m * Math.sin(a.im) };
}
