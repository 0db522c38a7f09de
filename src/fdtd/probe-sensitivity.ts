// How the probes see a material: the complex change of R and of T per unit change of the material's ε' and,
// separately, of its ε'' (every layer or half-space made of it changed together), from the exact layered
// solution of the stack (src/tmm), at the stack's angle and polarization. The causal fit (causal-fit.ts)
// bounds the change of R and T its error makes, to first order, with these derivatives: a wall that swallows
// the wave makes its own depth invisible to R, a face that reflects little makes an error in ε' cheap, and an
// error in ε' that an error in ε'' offsets (the same change of the wave number) costs nothing.

import type { Complex } from '../complex.ts';
import { mul, scale } from '../complex.ts';
import type { Stack } from '../stack/types.ts';
import { regionOf, stackAtFrequency, type Region, type StackAtFrequency } from '../tmm/media.ts';
import { solveAt } from '../tmm/recursion.ts';

/** ∂R/∂ε', ∂R/∂ε'', ∂T/∂ε', ∂T/∂ε'' at f (ε = ε' − jε''; μ' and μ'' for a permeability). */
export interface ResponseDerivatives { dR_re: Complex; dR_im: Complex; dT_re: Complex; dT_im: Complex }
export type ProbeSensitivity = (f_Hz: number) => ResponseDerivatives;

/** Relative step of the finite difference (the response is smooth in ε; this keeps rounding far below it). */
const STEP = 1e-6;

const ZERO: Complex = { re: 0, im: 0 };
const finite = (z: Complex): Complex => (Number.isFinite(z.re) && Number.isFinite(z.im) ? z : ZERO);

/** The derivatives of R and T with respect to the ε (or, with quantity 'permeability', the μ) of `material`. */
export function probeSensitivity(stack: Stack, material: string, quantity: 'permittivity' | 'permeability' = 'permittivity'): ProbeSensitivity {
  const onMu = quantity === 'permeability';
  const s2 = Math.sin(stack.incidence.angle_rad) ** 2;
  const pol = stack.incidence.polarization;
  const bulkNames: string[] = [];
  for (const l of stack.layers) if (l.kind === 'bulk') bulkNames.push(l.material.name);
  return (f_Hz: number) => {
    const base = stackAtFrequency(stack, f_Hz);
    const kt2 = scale(mul(base.front.eps, base.front.mu), s2);
    const perturbed = (d: Complex): StackAtFrequency => {
      const swap = (r: Region, isMaterial: boolean): Region => {
        if (!isMaterial) return r;
        const x = onMu ? r.mu : r.eps, moved = { re: x.re + d.re, im: x.im + d.im };
        return onMu ? regionOf(r.eps, r.thickness_m, f_Hz, kt2, pol, moved) : regionOf(moved, r.thickness_m, f_Hz, kt2, pol, r.mu);
      };
      return {
        ...base,
        front: swap(base.front, stack.front.name === material),
        layers: base.layers.map((r, i) => swap(r, bulkNames[i] === material)),
        back: base.back && stack.back !== 'pec' ? swap(base.back, stack.back.name === material) : base.back,
      };
    };
    // The step: relative to the material's |ε| where it appears (the first region made of it).
    const regions = [base.front, ...base.layers, ...(base.back ? [base.back] : [])];
    const names = [stack.front.name, ...bulkNames, ...(stack.back !== 'pec' ? [stack.back.name] : [])];
    const own = regions[names.indexOf(material)];
    const x = own ? (onMu ? own.mu : own.eps) : { re: 1, im: 0 };
    const h = STEP * Math.max(Math.hypot(x.re, x.im), 1e-3);
    const ref = solveAt(base);
    const derivative = (d: Complex): { R: Complex; T: Complex } => {
      const p = solveAt(perturbed(d));
      return { R: finite({ re: (p.R.re - ref.R.re) / h, im: (p.R.im - ref.R.im) / h }), T: finite({ re: (p.T.re - ref.T.re) / h, im: (p.T.im - ref.T.im) / h }) };
    };
    // ε' → ε' + h;  ε'' → ε'' + h, i.e. im (= −ε'') − h.
    const re = derivative({ re: h, im: 0 }), im = derivative({ re: 0, im: -h });
    return { dR_re: re.R, dR_im: im.R, dT_re: re.T, dT_im: im.T };
  };
}
