// The clean band-limited pulse every echo is measured with: a Kaiser window over the stack's band,
//
//   W(f) = I0(β √(1 − u²)) / I0(β),   u = (f − f0) / (B/2),   |u| ≤ 1 (zero outside the band),
//
// with f0 the band centre and B its width. Its analytic signal is e^{j2πf0t} b(t), with the real,
// even envelope known in closed form (the Fourier transform of the Kaiser window; Kaiser & Schafer,
// IEEE Trans. ASSP 28(1), 1980):
//
//   b(t) ∝ sinh(√(β² − x²)) / √(β² − x²),   x = π B t   (sin(√(x² − β²)) / √(x² − β²) once x > β).
//
// β = 12 keeps every sidelobe near −90 dB (the envelope is clean far below the −80 dB the trace view
// draws) for a main lobe 2.67/B wide at half maximum; the engine's own pulse spreads past the band
// edges, where the material tables no longer hold, so it is not used directly.

/** Kaiser parameter of the band pulse. */
export const KAISER_BETA = 12;

/** Modified Bessel function I0 by its power series (converges for all x; β ≤ 40 here). */
export function besselI0(x: number): number {
  let sum = 1, term = 1;
  const q = (x * x) / 4;
  for (let k = 1; k < 200; k++) {
    term *= q / (k * k);
    sum += term;
    if (term < 1e-17 * sum) break;
  }
  return sum;
}

const I0_BETA = besselI0(KAISER_BETA);

/** W(f): the band pulse's spectrum, 1 at the band centre, 0 outside the band. */
export function bandWindow(f_Hz: number, band_Hz: readonly [number, number]): number {
  const u = (2 * f_Hz - band_Hz[0] - band_Hz[1]) / (band_Hz[1] - band_Hz[0]);
  if (!(Math.abs(u) <= 1)) return 0;
  return besselI0(KAISER_BETA * Math.sqrt(1 - u * u)) / I0_BETA;
}

/** b(x)/b(0) as a function of x = π B t (closed form above). */
export function envelopeShape(x: number): number {
  const b = KAISER_BETA, s2 = b * b - x * x;
  const atZero = Math.sinh(b) / b;
  if (s2 > 1e-12) { const s = Math.sqrt(s2); return Math.sinh(s) / s / atZero; }
  if (s2 < -1e-12) { const q = Math.sqrt(-s2); return Math.sin(q) / q / atZero; }
  return 1 / atZero;
}

/** x at which envelopeShape falls to one half (bisection; it falls monotonically up to x = β). */
function halfWidthX(): number {
  let lo = 0, hi = KAISER_BETA;
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (envelopeShape(mid) > 0.5) lo = mid; else hi = mid;
  }
  return (lo + hi) / 2;
}

/** Full width at half maximum of the envelope times the band width B (≈ 2.67 for β = 12). */
export const WIDTH_TIMES_BAND = (2 * halfWidthX()) / Math.PI;

/** First sidelobe of |sin q / q| (at q ≈ 4.4934). */
const FIRST_SIDELOBE = 0.217234;

/**
 * An upper bound of |b(t)|/b(0) over all |t| ≥ the given t: how much of a clean echo's own shape can
 * reach that far from its peak. Exact over the main lobe (b falls monotonically up to x = β); beyond,
 * the sidelobes |sin q/q| are bounded by their first maximum and then by 1/q.
 */
export function leakBeyond(t_s: number, bandWidth_Hz: number): number {
  const x = Math.PI * bandWidth_Hz * Math.abs(t_s), b = KAISER_BETA;
  if (x <= b) return envelopeShape(x);
  const edge = b / Math.sinh(b), q = Math.sqrt(x * x - b * b);
  if (q <= Math.PI) return edge * Math.max(Math.sin(q) / q, FIRST_SIDELOBE);
  if (q <= 4.4934) return edge * FIRST_SIDELOBE;
  return edge / q;
}

/** The band pulse of a stack's band: centre, width, and the pulse width (FWHM) that sets the resolution. */
export interface BandPulse {
  band_Hz: [number, number];
  f0_Hz: number;
  /** Envelope full width at half maximum (s): echoes closer than this are one row. */
  width_s: number;
}

export function bandPulse(band_Hz: readonly [number, number]): BandPulse {
  const B = band_Hz[1] - band_Hz[0];
  return { band_Hz: [band_Hz[0], band_Hz[1]], f0_Hz: (band_Hz[0] + band_Hz[1]) / 2, width_s: WIDTH_TIMES_BAND / B };
}
