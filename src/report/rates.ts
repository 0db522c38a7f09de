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
  /** Echo analysis: fixed (band bins, bounce paths, attribution; bench/echoes.ts measures 7–27 ms on the
   *  presets), besides the records' transforms at the band's bins (at dtftPerSampleFrequency_s); the bounce-path
   *  lattice at its cap of waves in flight may add up to echoesLatticeCap_s. */
  echoesFixed_s: 0.05,
  echoesLatticeCap_s: 0.5,
  /** Formatting and writing CSV text, per byte. */
  csvPerByte_s: 20e-9,
});

/** Bytes the echo analysis holds per band bin and per analytic-signal sample (32 samples per bin at most). */
export const ECHO_BYTES_PER_BIN = 64;
/** Bytes the pulse run holds per recorded time step: four records grown by doubling, then the trace table. */
export const RECORD_BYTES_PER_STEP = 4 * 8 * 2 + 4 * 8;
/** Bytes per FEM element (mesh arrays while building, system arrays), and per profile row (positions, columns). */
export const FEM_BYTES_PER_ELEMENT = 200;
export const PROFILE_BYTES_PER_ROW = 100;

