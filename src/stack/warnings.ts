// Warnings about a valid stack that a user should see (they do not stop a run):
// the band leaving a material's validity range, a lossy front half-space.

import { catalogRanges, pickRange } from '../materials/catalog.ts';
import type { Material } from '../materials/types.ts';
import { isSheet } from '../materials/types.ts';
import { permeability } from '../materials/permeability.ts';
import { permittivity } from '../materials/permittivity.ts';
import { ghzFromHz } from '../units.ts';
import type { Stack } from './types.ts';

/** Compact GHz for messages: 0.5, 12, 1e-3. */
export const fmtGHz = (f: number): string => String(Number(f.toPrecision(6)));

/** The materials a stack uses, each once, in order of appearance with where it is first used. */
export function usedMaterials(stack: Stack): { material: Material; where: string }[] {
  const out: { material: Material; where: string }[] = [];
  const add = (m: Material, where: string) => { if (!out.some((u) => u.material.name === m.name)) out.push({ material: m, where }); };
  add(stack.front, 'front');
  stack.layers.forEach((l, i) => add(l.material, `layers[${i}]`));
  if (stack.back !== 'pec') add(stack.back, 'back');
  return out;
}

const rangeText = (m: Material): string => (m.valid_GHz ? `${fmtGHz(m.valid_GHz[0])}–${fmtGHz(m.valid_GHz[1])} GHz` : 'any frequency');

/** The catalog's ranges of this material when it is one of them (same name and coefficients), else just itself. */
function rangesOf(m: Material): readonly Material[] {
  const ranges = catalogRanges(m.name);
  return ranges.some((r) => JSON.stringify(r.spec) === JSON.stringify(m.spec)) ? ranges : [m];
}

/** The band against a material's validity range(s): nothing when one range holds it, else one warning. */
function validityWarning(m: Material, where: string, lo: number, hi: number): string | null {
  const fit = pickRange(rangesOf(m), lo, hi);
  const band = `the band ${fmtGHz(lo)}–${fmtGHz(hi)} GHz`;
  const used = `the ${rangeText(m)} coefficients are used over the whole band, extrapolated outside their range`;
  switch (fit.kind) {
    case 'inside': return null;
    case 'straddles':
      return `${where}: ${band} straddles two validity ranges of "${m.name}", ${rangeText(fit.between[0])} and ` +
        `${rangeText(fit.between[1])} (${m.source}); ${used}`;
    case 'gap':
      return `${where}: ${band} falls between the validity ranges of "${m.name}", ${rangeText(fit.between[0])} and ` +
        `${rangeText(fit.between[1])} (${m.source}); ${used}`;
    case 'outside':
      return `${where}: ${band} leaves the validity range of "${m.name}", ${rangeText(m)} (${m.source}); ` +
        'results outside it are extrapolated';
  }
}

export function stackWarnings(stack: Stack): string[] {
  const out: string[] = [];
  const lo = ghzFromHz(stack.band_Hz[0]), hi = ghzFromHz(stack.band_Hz[1]);
  for (const { material: m, where } of usedMaterials(stack)) {
    const w = validityWarning(m, where, lo, hi);
    if (w !== null) out.push(w);
  }
  const front = stack.front;
  if (!isSheet(front.spec)) {
    const fc = (stack.band_Hz[0] + stack.band_Hz[1]) / 2;
    if (permittivity(front.spec, fc).im < 0 || permeability(front.spec, fc).im < 0) {
      out.push(`front: "${front.name}" is lossy; R and T are referred to the plane x = 0 and the incident wave ` +
        'is taken with amplitude 1 there');
    }
  }
  return out;
}
