// Oblique incidence, either polarization, as a phase-matched line stepped at normal incidence.
//
// For a plane wave at angle θ in a front medium (ε_f, μ_f), phase matching fixes the transverse wavenumber
// k_t = k0 √(ε_f μ_f) sin θ in every layer, so k_x = k0 √(εμ − s²) with s² = ε_f μ_f sin²θ. The tangential E and H
// along x then obey the equations of a transmission line (Born & Wolf §1.6; Orfanidis, Electromagnetic Waves
// and Antennas, ch. 7–8) whose
//   TE: series μ,            shunt ε − s²/μ     (admittance k_x/(ωμ0μ));
//   TM: series μ − s²/ε,     shunt ε            (admittance ωε0ε/k_x),
// which the 1D engine steps exactly as it steps normal incidence on a medium of that ε and μ. With the
// front medium lossless and non-dispersive s² is a real constant, and 1/μ (TE) or 1/ε (TM) of a stepped
// model is rational too: its partial fractions (inverse.ts) add Debye and second-order terms to the other side.
// A lossy dielectric at TM, ε′ − jσ/(ωε0), so gets series 1 − s²/ε′ + (s²/ε′)/(1 + jωτ), τ = ε0ε′/σ: one magnetic
// Debye term. The line's high-frequency product ε∞μ∞ − s² must stay positive (the engine's time step is
// √(ε∞μ∞) at most, kernel.ts): a medium where it does not is evanescent up to any frequency and has no stable
// stepping, and is refused with the angle that would work.

import type { Incidence } from '../stack/types.ts';
import { PlanError } from './errors.ts';
import { ReciprocalError, addScaled, reciprocal } from './inverse.ts';
import { type LineMedium, type StepModel, isConstantModel, stepModelPermittivity } from './media.ts';
import type { EffectiveStack } from './types.ts';

/** Reciprocals of the models seen (the effective stacks are cached, so their models recur). */
const reciprocals = new WeakMap<StepModel, StepModel>();

function reciprocalOf(m: StepModel, where: string, angle_deg: number): StepModel {
  let r = reciprocals.get(m);
  if (r) return r;
  try { r = reciprocal(m); } catch (e) {
    if (!(e instanceof ReciprocalError)) throw e;
    throw new PlanError(`${where}: at ${angle_deg.toFixed(2)}° the pulse engine could not step this medium (${e.message}); use the exact solver and the FEM`, 'unsupported', { angle_deg });
  }
  reciprocals.set(m, r);
  return r;
}

/** Im of a model over its band must stay ≤ 0 (passive); a check on the partial fractions' rounding. */
function assertPassive(m: StepModel, band_Hz: [number, number], where: string): void {
  for (let i = 0; i <= 32; i++) {
    const f = band_Hz[0] * Math.pow(4 * band_Hz[1] / band_Hz[0], i / 32) / 2;
    const v = stepModelPermittivity(m, f);
    if (v.im > 1e-9 * Math.hypot(v.re, v.im)) throw new PlanError(`${where}: the stepped oblique line of this medium came out active at ${(f / 1e9).toPrecision(3)} GHz (a rounding failure); use the exact solver and the FEM`, 'unsupported');
  }
}

/** The effective stack at the given incidence (unchanged at normal incidence). */
export function atIncidence(eff: EffectiveStack, incidence: Incidence, band_Hz: [number, number]): EffectiveStack {
  const sin = Math.sin(incidence.angle_rad);
  if (Math.abs(sin) < 1e-12) return eff;
  const angle_deg = (incidence.angle_rad * 180) / Math.PI;
  if (!isConstantModel(eff.front.shunt) || !isConstantModel(eff.front.series)) {
    throw new PlanError(
      'front: at oblique incidence the pulse engine needs a lossless, non-dispersive front medium (such as air)',
      'unsupported',
      { angle_deg },
    );
  }
  const frontIndex2 = eff.front.shunt.epsInf * eff.front.series.epsInf;
  const s2 = frontIndex2 * sin * sin;
  const te = incidence.polarization === 'TE';
  const done = new Map<LineMedium, LineMedium>();
  const line = (m: LineMedium, where: string): LineMedium => {
    const hit = done.get(m);
    if (hit) return hit;
    const product = m.shunt.epsInf * m.series.epsInf;
    if (!(product - s2 > 0)) {
      // The highest angle at which ε∞μ∞ − s² stays positive.
      const limit_deg = (Math.asin(Math.min(1, Math.sqrt(product / frontIndex2))) * 180) / Math.PI;
      throw new PlanError(
        `${where}: at ${angle_deg.toFixed(2)}° the pulse engine would step this medium with ε∞μ∞ − ε_front μ_front sin²θ = ${(product - s2).toPrecision(3)} ` +
        `(ε∞μ∞ = ${product.toPrecision(4)}, ε_front μ_front sin²θ = ${s2.toPrecision(4)}): it is evanescent up to any frequency and has no stable stepping; ` +
        `use an angle below ${limit_deg.toFixed(1)}°, or the exact solver and the FEM`,
        'unsupported',
        { angle_deg, limit_deg },
      );
    }
    const out: LineMedium = te
      ? { shunt: addScaled(m.shunt, reciprocalOf(m.series, where, angle_deg), -s2), series: m.series }
      : { shunt: m.shunt, series: addScaled(m.series, reciprocalOf(m.shunt, where, angle_deg), -s2) };
    assertPassive(te ? out.shunt : out.series, band_Hz, where);
    done.set(m, out);
    return out;
  };
  return {
    ...eff,
    front: line(eff.front, 'front'),
    segments: eff.segments.map((g) => ({ ...g, model: line(g.model, g.label) })),
    back: eff.back === 'pec' ? 'pec' : line(eff.back, 'back'),
  };
}
