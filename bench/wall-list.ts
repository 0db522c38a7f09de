// The representative ITU-R P.2040-3 walls the pulse-engine benchmarks share (bench/walls.ts, bench/fits.ts):
// material, thickness in mm, band in GHz, what is behind ('air' or 'pec'). Invented cases, not measurements.
export const REPRESENTATIVE_WALLS: [string, number, [number, number], string][] = [
  ['concrete', 20, [1, 40], 'air'], ['concrete', 150, [1, 6], 'pec'], ['concrete', 200, [24, 40], 'air'],
  ['concrete', 200, [1, 6], 'pec'], ['concrete', 300, [1, 6], 'air'], ['concrete', 300, [1, 40], 'pec'],
  ['brick', 100, [1, 6], 'air'], ['brick', 20, [1, 40], 'pec'], ['glass', 20, [1, 40], 'pec'],
  ['plasterboard', 300, [1, 20], 'air'], ['wood', 50, [1, 40], 'pec'], ['concrete', 150, [1, 40], 'pec'],
  ['marble', 100, [1, 20], 'air'], ['chipboard', 20, [1, 40], 'air'],
];
