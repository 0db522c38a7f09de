// The stack file: the JSON form users write (units in the key names), as parse.ts returns it with
// every default filled in. `toStackFile` turns a resolved Stack back into this form.

import type { MaterialModel } from '../materials/types.ts';
import type { Polarization, Stack } from './types.ts';
import { ghzFromHz, mmFromM, degFromRad } from '../units.ts';
import { catalogMaterial, catalogRanges } from '../materials/catalog.ts';

export interface StackFileLayer {
  /** A catalog name or a key of `materials`. */
  material: string;
  /** Required for bulk materials, absent for sheets. */
  thickness_mm?: number;
}

/** A user material: one of the models, plus optional provenance. */
export type StackFileMaterial = MaterialModel & {
  /** Frequency range the user vouches for; the band leaving it gives a warning. */
  valid_GHz?: [number, number];
  /** Free text shown with the material. */
  note?: string;
};

export interface StackFileIncidence { angle_deg: number; polarization: Polarization }

export interface StackFile {
  title: string;
  band_GHz: [number, number];
  front: string;
  layers: StackFileLayer[];
  /** A half-space material, or "pec". */
  back: string;
  /** User materials by name (a null-prototype record; names never reuse a catalog name). */
  materials: Record<string, StackFileMaterial>;
  incidence: StackFileIncidence;
  profile_GHz: number;
  points: number;
}

/** Defaults for the optional keys. */
export const STACK_DEFAULTS = Object.freeze({
  title: 'Untitled stack',
  front: 'air',
  back: 'air',
  angle_deg: 0,
  polarization: 'TE' as Polarization,
  points: 501,
});

/** Limits on sizes and ranges (the README lists them). */
export const STACK_LIMITS = Object.freeze({
  maxTextBytes: 1_000_000,
  maxLayers: 200,
  maxThickness_mm: 10_000,
  minBand_GHz: 0.001,
  maxBand_GHz: 1000,
  minPoints: 2,
  maxPoints: 100_000,
  maxPoles: 16,
  maxTableRows: 10_000,
  maxTitleChars: 200,
  maxNameChars: 64,
  maxNoteChars: 1000,
  maxUserMaterials: 100,
  maxExponent: 10,
});

/** The top-level keys, in the order a canonical file lists them. */
export const STACK_KEYS = ['title', 'band_GHz', 'front', 'layers', 'back', 'materials', 'incidence', 'profile_GHz', 'points'] as const;

/**
 * A resolved Stack back in file form. Materials not in the catalog are written under `materials`;
 * a material that carries a catalog name but different parameters (edited in the app) is written
 * under a new name `<name>-custom` (then `-custom-2` …), since a file may not reuse a catalog name.
 */
export function toStackFile(stack: Stack): StackFile {
  const materials: Record<string, StackFileMaterial> = Object.create(null);
  const written = new Map<string, string>(); // JSON of the material → its name in the file
  const nameOf = (m: { name: string; spec: MaterialModel; valid_GHz: [number, number] | null; note?: string }): string => {
    const cat = catalogMaterial(m.name);
    const key = JSON.stringify([m.name, m.spec, m.valid_GHz, m.note ?? null]);
    // Any of the catalog's ranges for this name: the band picks the range again when the file is read.
    if (catalogRanges(m.name).some((r) => JSON.stringify(r.spec) === JSON.stringify(m.spec))) return m.name;
    const known = written.get(key);
    if (known !== undefined) return known;
    const base = cat !== undefined ? `${m.name}-custom` : m.name;
    let name = base;
    for (let i = 2; catalogMaterial(name) !== undefined || name === 'pec' || name in materials; i++) name = `${base}-${i}`;
    const entry: StackFileMaterial = { ...structuredClone(m.spec) };
    if (cat === undefined && m.valid_GHz !== null) entry.valid_GHz = [m.valid_GHz[0], m.valid_GHz[1]];
    if (cat === undefined && m.note !== undefined) entry.note = m.note;
    materials[name] = entry;
    written.set(key, name);
    return name;
  };
  return {
    title: stack.title,
    band_GHz: [ghzFromHz(stack.band_Hz[0]), ghzFromHz(stack.band_Hz[1])],
    front: nameOf(stack.front),
    layers: stack.layers.map((l) => l.kind === 'bulk'
      ? { material: nameOf(l.material), thickness_mm: mmFromM(l.thickness_m) }
      : { material: nameOf(l.material) }),
    back: stack.back === 'pec' ? 'pec' : nameOf(stack.back),
    materials,
    incidence: { angle_deg: degFromRad(stack.incidence.angle_rad), polarization: stack.incidence.polarization },
    profile_GHz: ghzFromHz(stack.profile_Hz),
    points: stack.points,
  };
}
