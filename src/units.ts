// Physical constants (CODATA 2018) and unit conversions at the edges.
// Inside the core everything is SI; mm, GHz, ns and ps appear only in names at the edges.

export const C0_m_per_s = 299_792_458;
export const MU0_H_per_m = 1.25663706212e-6;
export const EPS0_F_per_m = 8.8541878128e-12;
/** Impedance of free space, sqrt(mu0/eps0) ≈ 376.730 Ω. */
export const ETA0_ohm = Math.sqrt(MU0_H_per_m / EPS0_F_per_m);

export const GHz = 1e9;
export const mm = 1e-3;
export const ns = 1e-9;
export const ps = 1e-12;

export const hzFromGHz = (f_GHz: number): number => f_GHz * GHz;
export const ghzFromHz = (f_Hz: number): number => f_Hz / GHz;
export const mFromMm = (d_mm: number): number => d_mm * mm;
export const mmFromM = (d_m: number): number => d_m / mm;
export const nsFromS = (t_s: number): number => t_s / ns;
export const degFromRad = (a_rad: number): number => (a_rad * 180) / Math.PI;
export const radFromDeg = (a_deg: number): number => (a_deg * Math.PI) / 180;

/** Power ratio |x|² to dB; a floor keeps log of zero finite. */
export const dbFromPower = (p: number, floor_dB = -400): number =>
  p > 0 ? Math.max(10 * Math.log10(p), floor_dB) : floor_dB;
/** Amplitude ratio |x| to dB. */
export const dbFromAmplitude = (a: number, floor_dB = -400): number => dbFromPower(a * a, floor_dB);

/** n points linear over [lo, hi], both ends included. */
export function linspace(lo: number, hi: number, n: number): Float64Array {
  const out = new Float64Array(n);
  if (n === 1) { out[0] = lo; return out; }
  const step = (hi - lo) / (n - 1);
  for (let i = 0; i < n; i++) out[i] = lo + i * step;
  out[n - 1] = hi;
  return out;
}
