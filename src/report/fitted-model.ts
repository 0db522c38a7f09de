// The causal model the pulse engine steps in place of an ITU-R P.2040 power law, written in the stack
// file's own terms (the debye, lorentz and drude models of the README), so summary.json shows a reader
// what was stepped in units they know, rather than the engine's internal coefficients.

import type { DebyePole, LorentzMagneticPole, LorentzPole } from '../materials/types.ts';
import type { StepModel } from '../fdtd/media.ts';

export interface FittedModel {
  eps_inf: number;
  sigma_S_per_m: number;
  /** Δε/(1 + jωτ) each. */
  debye: DebyePole[];
  /** Δε ω0²/(ω0² − ω² + jωγ) each, ω0 = 2π f0, γ = 2π gamma. */
  lorentz: LorentzPole[];
  /** −ωp²/(ω² − jωγ) each, ωp = 2π plasma, γ = 2π collision. */
  drude: { plasma_GHz: number; collision_GHz: number }[];
}

const r6 = (x: number): number => Number(x.toPrecision(6));
const GHzOf = (w_rad_per_s: number): number => r6(w_rad_per_s / (2 * Math.PI * 1e9));

/** The step model in the stack file's terms; terms of zero strength are left out. */
export function fittedModel(m: StepModel): FittedModel {
  const out: FittedModel = { eps_inf: r6(m.epsInf), sigma_S_per_m: r6(m.sigma), debye: [], lorentz: [], drude: [] };
  for (const p of m.debye) if (p.deps > 0) out.debye.push({ delta_eps: r6(p.deps), tau_ps: r6(p.tau_s * 1e12) });
  for (const p of m.osc) {
    if (!(p.c > 0)) continue;
    // A second-order term with ω0 = 0 is a Drude term with ωp² = c; otherwise a Lorentz pole with Δε = c/ω0².
    if (p.w0sq > 0) out.lorentz.push({ delta_eps: r6(p.c / p.w0sq), f0_GHz: GHzOf(Math.sqrt(p.w0sq)), gamma_GHz: GHzOf(p.gamma) });
    else out.drude.push({ plasma_GHz: GHzOf(Math.sqrt(p.c)), collision_GHz: GHzOf(p.gamma) });
  }
  return out;
}

/** A fitted permeability (a fixed μ with loss) as the magnetic block's lorentz model: μ∞ + Σ Δμ ω0²/(ω0² − ω² + jωγ). */
export interface FittedMagneticModel { model: 'lorentz'; mu_inf: number; poles: LorentzMagneticPole[] }

/** The fitted series model in the magnetic block's terms (the fit has only Lorentz terms); zero strengths left out. */
export function fittedMagneticModel(m: StepModel): FittedMagneticModel {
  const poles: LorentzMagneticPole[] = [];
  for (const p of m.osc) {
    if (p.c > 0 && p.w0sq > 0) poles.push({ delta_mu: r6(p.c / p.w0sq), f0_GHz: GHzOf(Math.sqrt(p.w0sq)), gamma_GHz: GHzOf(p.gamma) });
  }
  return { model: 'lorentz', mu_inf: r6(m.epsInf), poles };
}
