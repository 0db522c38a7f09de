// One-way group delay of each bulk layer at a frequency: τ_i = d_i · dRe(k_x)/dω, which at normal
// incidence is d_i n_g / c with n_g = n + f dn/df the group index (n = Re √ε_r). The derivative
// is taken numerically (central difference) from ε_r(f) of each material model.

import { stackAtFrequency } from '../tmm/media.ts';
import type { Stack } from '../stack/types.ts';

/** Relative step of the central difference in f (error ~ step², well below 1e-6 for smooth ε_r). */
const REL_STEP = 1e-4;

export function layerGroupDelays_s(stack: Stack, f_Hz: number): Float64Array {
  const h = f_Hz * REL_STEP;
  const a = stackAtFrequency(stack, f_Hz - h), b = stackAtFrequency(stack, f_Hz + h);
  const out = new Float64Array(a.layers.length);
  for (let i = 0; i < out.length; i++) {
    const dk_dw = (b.layers[i].kx.re - a.layers[i].kx.re) / (2 * Math.PI * 2 * h);
    // kx.re is ≥ 0 for a forward wave; a medium with ε' < 0 (Drude below its plasma frequency) has ~no group delay
    out[i] = Math.max(0, a.layers[i].thickness_m * dk_dw);
  }
  return out;
}

/**
 * Group slowness along x of the two half-spaces at a frequency, dRe(k_x)/dω in s/m (n_g/c at normal incidence):
 * how fast an echo's envelope leaves the stack on either side. Null behind a conductor.
 */
export function halfSpaceSlowness_s_per_m(stack: Stack, f_Hz: number): { front: number; back: number | null } {
  const h = f_Hz * REL_STEP;
  const a = stackAtFrequency(stack, f_Hz - h), b = stackAtFrequency(stack, f_Hz + h);
  const slope = (ka: number, kb: number) => Math.max(0, (kb - ka) / (2 * Math.PI * 2 * h));
  return {
    front: slope(a.front.kx.re, b.front.kx.re),
    back: a.back !== null && b.back !== null ? slope(a.back.kx.re, b.back.kx.re) : null,
  };
}
