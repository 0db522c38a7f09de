// How much the probes see a material: the change of R and T for a small relative change of the
// material's ε' and, separately, of its ε'' (every layer or half-space made of it changed together),
// from the exact layered solution of the stack (src/tmm). A wall that swallows the wave makes its own
// depth invisible to R, and a face that reflects little makes a small error in ε' cheap; the power-law
// fit uses these figures as weights, so its error lands where the probes cannot see it.

import { mul, scale, type Complex } from '../complex.ts';
import type { Stack } from '../stack/types.ts';
import { regionOf, stackAtFrequency, type Region, type StackAtFrequency } from '../tmm/media.ts';
import { solveAt } from '../tmm/recursion.ts';
import type { ProbeWeight } from './causal-fit.ts';

/** Relative step of the finite difference (the response is smooth in ε; this keeps rounding far below it). */
const STEP = 1e-6;

/**
 * |ΔR| + |ΔT| per unit relative change of ε' (re) and of ε'' (im) of the material named `material`, or of its
 * μ' and μ'' with quantity 'permeability'.
 */
export function probeWeights(stack: Stack, material: string, quantity: 'permittivity' | 'permeability' = 'permittivity'): ProbeWeight {
  const onMu = quantity === 'permeability';
  const s2 = Math.sin(stack.incidence.angle_rad) ** 2;
  const pol = stack.incidence.polarization;
  const bulkNames: string[] = [];
  for (const l of stack.layers) if (l.kind === 'bulk') bulkNames.push(l.material.name);
  return (f_Hz: number) => {
    const base = stackAtFrequency(stack, f_Hz);
    const kt2 = scale(mul(base.front.eps, base.front.mu), s2);
    const perturbed = (delta: (e: Complex) => Complex): StackAtFrequency => {
      const swap = (r: Region, isMaterial: boolean): Region => {
        if (!isMaterial) return r;
        const x = onMu ? r.mu : r.eps, d = delta(x), moved = { re: x.re + d.re, im: x.im + d.im };
        return onMu ? regionOf(r.eps, r.thickness_m, f_Hz, kt2, pol, moved) : regionOf(moved, r.thickness_m, f_Hz, kt2, pol, r.mu);
      };
      return {
        ...base,
        front: swap(base.front, stack.front.name === material),
        layers: base.layers.map((r, i) => swap(r, bulkNames[i] === material)),
        back: base.back && stack.back !== 'pec' ? swap(base.back, stack.back.name === material) : base.back,
      };
    };
    const ref = solveAt(base);
    const change = (delta: (e: Complex) => Complex): number => {
      const p = solveAt(perturbed(delta));
      return (Math.hypot(p.R.re - ref.R.re, p.R.im - ref.R.im) + Math.hypot(p.T.re - ref.T.re, p.T.im - ref.T.im)) / STEP;
    };
    // ε' → ε'(1 + h);  ε'' → ε''(1 + h), i.e. im (= −ε'') scaled alike.
    const re = change((e) => ({ re: STEP * e.re, im: 0 }));
    const im = change((e) => ({ re: 0, im: STEP * e.im }));
    return { re: Number.isFinite(re) ? re : 0, im: Number.isFinite(im) ? im : 0 };
  };
}
