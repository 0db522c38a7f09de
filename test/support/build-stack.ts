// Builders for Stack objects in tests, independent of the stack-file parser.

import type { BulkModel } from '../../src/materials/types.ts';
import type { BulkMaterial, Layer, Polarization, SheetMaterial, Stack } from '../../src/stack/types.ts';

export const bulk = (spec: BulkModel, name: string = spec.model): BulkMaterial => ({ name, spec, source: 'test', valid_GHz: null });
export const dielectric = (eps_r: number, sigma_S_per_m = 0, name = `eps${eps_r}`): BulkMaterial =>
  bulk({ model: 'fixed', eps_r, sigma_S_per_m }, name);
export const AIR = dielectric(1, 0, 'air');
/** A fixed-model material with permeability μ_r = mu_r − j mu_loss. */
export const magnetic = (eps_r: number, sigma_S_per_m: number, mu_r: number, mu_loss = 0,
  name = `eps${eps_r}-mu${mu_r}-${mu_loss}`): BulkMaterial =>
  bulk({ model: 'fixed', eps_r, sigma_S_per_m, magnetic: { model: 'fixed', mu_r, mu_loss } }, name);
export const sheetMaterial = (ohm_per_sq: number): SheetMaterial =>
  ({ name: `sheet${ohm_per_sq}`, spec: { model: 'sheet', ohm_per_sq }, source: 'test', valid_GHz: null });

export const layer = (material: BulkMaterial, thickness_m: number): Layer => ({ kind: 'bulk', material, thickness_m });
export const sheet = (ohm_per_sq: number): Layer => ({ kind: 'sheet', material: sheetMaterial(ohm_per_sq) });

export interface StackOptions {
  layers?: Layer[];
  front?: BulkMaterial;
  back?: BulkMaterial | 'pec';
  band_GHz?: [number, number];
  angle_deg?: number;
  polarization?: Polarization;
  profile_GHz?: number;
  points?: number;
}

export function makeStack(o: StackOptions = {}): Stack {
  const band = o.band_GHz ?? [1, 10];
  return {
    title: 'test stack',
    band_Hz: [band[0] * 1e9, band[1] * 1e9],
    front: o.front ?? AIR,
    layers: o.layers ?? [],
    back: o.back ?? AIR,
    incidence: { angle_rad: ((o.angle_deg ?? 0) * Math.PI) / 180, polarization: o.polarization ?? 'TE' },
    profile_Hz: (o.profile_GHz ?? (band[0] + band[1]) / 2) * 1e9,
    points: o.points ?? 11,
  };
}

/** Deterministic PRNG (mulberry32) for property tests. */
export function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
