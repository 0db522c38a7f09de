// The probe records a pulse run hands to the spectra and echo modules (the FDTD engine's
// records() output): E at the reference planes, sampled every dt_s from t = 0.

export interface PulseRecords {
  dt_s: number;
  /** Samples recorded (arrays may be longer; only the first `count` are read). */
  count: number;
  /** Incident E at x = 0 (from the auxiliary grid). */
  incident: Float64Array;
  /** Reflected E at x = 0 (total − incident). */
  reflected: Float64Array;
  /** E at the back face; absent or all zero behind a perfect conductor. */
  transmitted?: Float64Array | null;
}

/** The first `count` samples of a record (a view, no copy); an empty array when absent. */
export function trimmed(x: Float64Array | null | undefined, count: number): Float64Array {
  if (!x) return new Float64Array(0);
  return x.subarray(0, Math.min(count, x.length));
}
