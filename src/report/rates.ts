// Nominal unit costs of every stage, for the work estimates (estimate.ts). Measured on the two-core development
// machine with `nice npx tsx bench/estimate-rates.ts` (rounded up); a faster machine runs sooner, a loaded one
// later. The estimates only need to be right within a factor of about two: they decide what is refused, and the
// same input is refused (or not) on every machine.

export const RATES = Object.freeze({
  /** Exact solver: per frequency, and per region (layer or half-space) and frequency. */
  tmmPerFrequency_s: 6e-6,
  tmmPerRegionFrequency_s: 0.3e-6,
  /** FEM: per frequency, per element and frequency, per region and frequency. */
  femPerFrequency_s: 5e-6,
  femPerElementFrequency_s: 0.15e-6,
  femPerRegionFrequency_s: 1.6e-6,
  /** Building a FEM mesh, per element (profiles build their own). */
  femMeshPerElement_s: 0.3e-6,
  /** Profiles: per row of the exact solution, per row of the FEM's. */
  tmmProfilePerRow_s: 0.12e-6,
  femProfilePerRow_s: 0.3e-6,
  /** FDTD: per time step, per cell-update, and per pole term and cell-update. */
  fdtdPerStep_s: 10e-6,
  fdtdPerCellUpdate_s: 8e-9,
  fdtdPerPoleTermUpdate_s: 4e-9,
  /** Spectra from the records (DTFT): per sample and frequency, for each of the three records. */
  dtftPerSampleFrequency_s: 3e-9,
  /** Echo extraction: fixed, and per record sample (typical); its re-fitting may add up to echoesRelaxCap_s
   *  (echoes/clean.ts caps that work) when many echoes overlap. */
  echoesFixed_s: 0.05,
  echoesPerSample_s: 3e-6,
  echoesRelaxCap_s: 0.8,
  /** Formatting and writing CSV text, per byte. */
  csvPerByte_s: 20e-9,
});

/** Bytes the echo extraction holds per point of its FFT (nfft = the power of two ≥ twice the record). */
export const ECHO_BYTES_PER_FFT_POINT = 64;
/** Bytes the pulse run holds per recorded time step: four records grown by doubling, then the trace table. */
export const RECORD_BYTES_PER_STEP = 4 * 8 * 2 + 4 * 8;
/** Bytes per FEM element (mesh arrays while building, system arrays), and per profile row (positions, columns). */
export const FEM_BYTES_PER_ELEMENT = 200;
export const PROFILE_BYTES_PER_ROW = 100;

