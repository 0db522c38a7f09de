// The excitation: a sine-modulated Gaussian centred on the band.
//
//   g(t) = exp(−((t − t0)/τ)²) · sin(2π f0 (t − t0))
//
// Its spectrum is two Gaussians of 1/e half-width 1/(π τ) at ±f0 (their difference), so it has no
// DC content (the signal is odd about t0; sampled symmetrically about t0 the sum is exactly zero).
// τ is chosen so the band edges sit `edge_dB` below the spectral peak (default −12 dB in amplitude),
// which keeps the division by the incident spectrum well conditioned over the whole band, and the
// content falls off fast above the band top (about −48 dB at one band-width beyond it).

export interface PulseShape {
  /** Carrier (band centre), Hz. */
  f0_Hz: number;
  /** Gaussian 1/e half-width in time, s. */
  tau_s: number;
  /** Time of the envelope peak, s (a whole number of time steps once a grid is chosen). */
  t0_s: number;
  /** Amplitude of the spectrum at the band edges relative to its peak, dB (≤ 0). */
  edge_dB: number;
  /** The envelope is below 1e−11 of its peak outside [0, 2 t0]: the source is over after 2 t0. */
  end_s: number;
}

export const PULSE_EDGE_dB = -12;
/** Delay of the envelope peak in units of τ (exp(−25) ≈ 1.4e−11 at t = 0). */
const DELAY_TAUS = 5;

/** A pulse for the band [f1, f2] (Hz); dt_s, when given, snaps t0 to a whole number of steps. */
export function pulseForBand(band_Hz: [number, number], dt_s?: number, edge_dB = PULSE_EDGE_dB): PulseShape {
  const [f1, f2] = band_Hz;
  const f0 = (f1 + f2) / 2, half = (f2 - f1) / 2;
  // exp(−(π half τ)²) = 10^(edge_dB/20)
  const tau = Math.sqrt((-edge_dB * Math.LN10) / 20) / (Math.PI * half);
  let t0 = DELAY_TAUS * tau;
  if (dt_s !== undefined && dt_s > 0) t0 = Math.ceil(t0 / dt_s) * dt_s;
  return { f0_Hz: f0, tau_s: tau, t0_s: t0, edge_dB, end_s: 2 * t0 };
}

/** g(t). */
export function pulseValue(p: PulseShape, t_s: number): number {
  const u = t_s - p.t0_s;
  const env = Math.exp(-((u / p.tau_s) ** 2));
  return env * Math.sin(2 * Math.PI * p.f0_Hz * u);
}

/**
 * |G(f)| relative to the peak of one Gaussian lobe (continuous-time transform, f > 0):
 * |exp(−(π τ (f − f0))²) − exp(−(π τ (f + f0))²)|.
 */
export function pulseSpectrumRelative(p: PulseShape, f_Hz: number): number {
  const a = Math.PI * p.tau_s;
  return Math.abs(Math.exp(-((a * (f_Hz - p.f0_Hz)) ** 2)) - Math.exp(-((a * (f_Hz + p.f0_Hz)) ** 2)));
}

/** Envelope level (relative to its peak) at which the pulse is said to begin, for display. */
const VISIBLE_ENVELOPE = 1e-3;

/**
 * Whole time steps before the pulse's envelope at the source rises to 1e−3 of its peak: nothing
 * visible happens on the grid before then, so an animation may start there (the run's time and
 * step count stay true).
 */
export function leadInSteps(p: PulseShape, dt_s: number): number {
  const t = p.t0_s - p.tau_s * Math.sqrt(-Math.log(VISIBLE_ENVELOPE));
  return Math.max(0, Math.floor(t / dt_s));
}
