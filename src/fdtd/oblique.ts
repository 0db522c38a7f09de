// Oblique incidence in TE as an equivalent normal-incidence problem.
//
// For a plane wave at angle θ in a front medium of permittivity ε_f, phase matching fixes the
// transverse wavenumber k_t = k0 √ε_f sin θ in every layer, so k_x = k0 √(ε_r(ω) − ε_f sin²θ) and the
// TE wave admittance is k_x/(ωμ0). Both are those of normal incidence on a medium of permittivity
// ε_r(ω) − ε_f sin²θ (Born & Wolf §1.6; Orfanidis ch. 7, transverse refractive index). When ε_f is a
// real constant the shift is a constant, so each stepped medium keeps its form with ε∞ lowered by
// ε_f sin²θ, and the 1D engine steps the x-dependence exactly as it does at normal incidence.
// TM would need a dispersive magnetic response (μ_eff = 1 − ε_f sin²θ / ε_r), which the kernel lacks.

import type { Incidence } from '../stack/types.ts';
import { PlanError } from './errors.ts';
import type { StepModel } from './media.ts';
import type { EffectiveStack } from './types.ts';

const isConstant = (m: StepModel): boolean => m.sigma === 0 && m.debye.length === 0 && m.osc.length === 0;

/** The effective stack at the given incidence (unchanged at normal incidence). */
export function atIncidence(eff: EffectiveStack, incidence: Incidence): EffectiveStack {
  const s = Math.sin(incidence.angle_rad);
  if (Math.abs(s) < 1e-12) return eff;
  const angle_deg = (incidence.angle_rad * 180) / Math.PI;
  if (incidence.polarization !== 'TE') {
    throw new PlanError(
      'incidence.polarization: the pulse engine models oblique incidence in TE only; for TM at an angle use the exact solver and the FEM',
      'unsupported',
      { angle_deg },
    );
  }
  if (!isConstant(eff.front)) {
    throw new PlanError(
      'front: at oblique incidence the pulse engine needs a lossless, non-dispersive front medium (such as air)',
      'unsupported',
      { angle_deg },
    );
  }
  const shift = eff.front.epsInf * s * s;
  const shifted = (m: StepModel, where: string): StepModel => {
    const epsInf = m.epsInf - shift;
    if (!(epsInf > 0)) {
      // The highest angle whose shift leaves this medium's ε∞ positive.
      const limit_deg = (Math.asin(Math.min(1, Math.sqrt(m.epsInf / eff.front.epsInf))) * 180) / Math.PI;
      throw new PlanError(
        `${where}: at ${angle_deg.toFixed(2)}° the pulse engine would step this medium with ε∞ − ε_front sin²θ = ${epsInf.toPrecision(3)} ` +
        `(ε∞ = ${m.epsInf.toPrecision(4)}, ε_front sin²θ = ${shift.toPrecision(4)}), which it cannot; use an angle below ${limit_deg.toFixed(1)}°, or the exact solver and the FEM`,
        'unsupported',
        { angle_deg, limit_deg },
      );
    }
    return { ...m, epsInf };
  };
  return {
    ...eff,
    front: shifted(eff.front, 'front'),
    segments: eff.segments.map((g) => ({ ...g, model: shifted(g.model, g.label) })),
    back: eff.back === 'pec' ? 'pec' : shifted(eff.back, 'back'),
  };
}
