// What the views need to draw a stack: each layer's extent and label, the back termination.
// Built from the parsed Stack; positions in metres with x = 0 at the front face.

import type { Stack } from '../stack/types.ts';
import { interfacePositions_m } from '../stack/types.ts';
import { pulseForBand } from '../fdtd/pulse.ts';
import { permittivity } from '../materials/permittivity.ts';
import { permeability } from '../materials/permeability.ts';
import { mul, sqrt } from '../complex.ts';
import { C0_m_per_s } from '../units.ts';

export interface SketchLayer {
  index: number;
  material: string;
  kind: 'bulk' | 'sheet';
  x0_m: number;
  x1_m: number;
  /** "plasterboard · 12.5 mm", "film · 377 Ω/sq". */
  label: string;
  /** Short form when the long one does not fit. */
  short: string;
}

export interface StackSketch {
  title: string;
  front: string;
  back: string;
  pec: boolean;
  thickness_m: number;
  layers: SketchLayer[];
  /** "30° TE" at oblique incidence, null at normal incidence. */
  oblique: string | null;
  /** Length along x of the pulse run's incident pulse in the front medium, where its envelope is above 10 % of its peak. */
  pulseLength_m: number;
}

export function sketchStack(stack: Stack): StackSketch {
  const pos = interfacePositions_m(stack);
  const layers = stack.layers.map((l, i): SketchLayer => {
    if (l.kind === 'sheet') {
      const ohm = l.material.spec.ohm_per_sq;
      return { index: i, material: l.material.name, kind: 'sheet', x0_m: pos[i], x1_m: pos[i],
        label: `${l.material.name} · ${fmt(ohm)} Ω/sq`, short: `${fmt(ohm)} Ω/sq` };
    }
    const mm = l.thickness_m * 1e3;
    return { index: i, material: l.material.name, kind: 'bulk', x0_m: pos[i], x1_m: pos[i + 1],
      label: `${l.material.name} · ${fmt(mm)} mm`, short: `${fmt(mm)} mm` };
  });
  return {
    title: stack.title,
    front: stack.front.name,
    back: stack.back === 'pec' ? 'conductor' : stack.back.name,
    pec: stack.back === 'pec',
    thickness_m: pos[stack.layers.length],
    layers,
    oblique: stack.incidence.angle_rad !== 0
      ? `${fmt((stack.incidence.angle_rad * 180) / Math.PI)}° ${stack.incidence.polarization}` : null,
    pulseLength_m: pulseLength_m(stack),
  };
}

/**
 * The engine's pulse (fdtd/pulse.ts) has the envelope exp(−(t/τ)²), above 10 % for |t| < τ √ln 10;
 * along x it moves at c / (n cos θ) in the front medium (the depth component of the wave vector
 * is k0 n cos θ), n = Re √(ε_r μ_r) at the band centre.
 */
function pulseLength_m(stack: Stack): number {
  const p = pulseForBand(stack.band_Hz);
  const n = sqrt(mul(permittivity(stack.front.spec, p.f0_Hz), permeability(stack.front.spec, p.f0_Hz))).re;
  const v = C0_m_per_s / (Math.max(1e-6, n) * Math.max(1e-6, Math.cos(stack.incidence.angle_rad)));
  return 2 * p.tau_s * Math.sqrt(Math.LN10) * v;
}

/** A number with up to 4 significant digits and no trailing zeros. */
export function fmt(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e5 || a < 1e-3) return v.toExponential(2);
  return String(Number(v.toPrecision(4)));
}
