// The stack as the solvers see it: resolved materials, SI units.
// A stack file (JSON, units in key names) is parsed and validated into this by stack/parse.ts.

import type { BulkModel, Material, SheetModel } from '../materials/types.ts';

export type Polarization = 'TE' | 'TM';

/** A bulk material (never a sheet). */
export interface BulkMaterial extends Material { spec: BulkModel }
export interface SheetMaterial extends Material { spec: SheetModel }

export interface BulkLayer { kind: 'bulk'; material: BulkMaterial; thickness_m: number }
export interface SheetLayer { kind: 'sheet'; material: SheetMaterial }
export type Layer = BulkLayer | SheetLayer;

export interface Incidence { angle_rad: number; polarization: Polarization }

export interface Stack {
  title: string;
  /** [min, max] in Hz, 0 < min < max. */
  band_Hz: [number, number];
  /** Half-space the wave comes from (x < 0). */
  front: BulkMaterial;
  /** Front to back; x = 0 is the front face of layers[0]. */
  layers: Layer[];
  /** Half-space behind the stack, or a perfect conductor at the back face. */
  back: BulkMaterial | 'pec';
  incidence: Incidence;
  /** Frequency of the standing-wave profile, Hz. */
  profile_Hz: number;
  /** Spectrum points, linear over the band, ends included. */
  points: number;
}

/** Total thickness of the stack in metres (sheets count zero). */
export function stackThickness_m(stack: Stack): number {
  let d = 0;
  for (const l of stack.layers) if (l.kind === 'bulk') d += l.thickness_m;
  return d;
}

/** Position of each layer's front face, metres from x = 0; one more entry for the back face. */
export function interfacePositions_m(stack: Stack): Float64Array {
  const out = new Float64Array(stack.layers.length + 1);
  let x = 0;
  stack.layers.forEach((l, i) => { out[i] = x; if (l.kind === 'bulk') x += l.thickness_m; });
  out[stack.layers.length] = x;
  return out;
}
