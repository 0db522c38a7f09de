// Stack builders for the FDTD tests (Stack objects directly, SI units).

import type { BulkModel } from '../../src/materials/types.ts';
import type { BulkMaterial, Layer, Stack } from '../../src/stack/types.ts';

export const material = (name: string, spec: BulkModel): BulkMaterial => ({ name, spec, source: 'test', valid_GHz: null });
export const fixed = (eps_r: number, sigma_S_per_m = 0, name = `eps${eps_r}`): BulkMaterial =>
  material(name, { model: 'fixed', eps_r, sigma_S_per_m });
export const air = fixed(1, 0, 'air');
export const bulk = (m: BulkMaterial, thickness_mm: number): Layer => ({ kind: 'bulk', material: m, thickness_m: thickness_mm * 1e-3 });
export const sheet = (ohm_per_sq: number): Layer => ({
  kind: 'sheet', material: { name: `sheet${ohm_per_sq}`, spec: { model: 'sheet', ohm_per_sq }, source: 'test', valid_GHz: null },
});

export function stackOf(layers: Layer[], opts: { band_GHz?: [number, number]; front?: BulkMaterial; back?: BulkMaterial | 'pec'; profile_GHz?: number } = {}): Stack {
  const band = opts.band_GHz ?? [1, 10];
  return {
    title: 'test',
    band_Hz: [band[0] * 1e9, band[1] * 1e9],
    front: opts.front ?? air,
    layers,
    back: opts.back ?? air,
    incidence: { angle_rad: 0, polarization: 'TE' },
    profile_Hz: (opts.profile_GHz ?? (band[0] + band[1]) / 2) * 1e9,
    points: 11,
  };
}
