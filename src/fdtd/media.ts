// Material models in the form the time-stepping kernel understands:
//   ε_r(ω) = ε∞ − jσ/(ωε0) + Σ Δε/(1 + jωτ)  (Debye poles)  + Σ c/(ω0² − ω² + jωγ)  (second-order poles)
// Lorentz poles have c = Δε ω0²; a Drude term is a second-order pole with ω0 = 0 and c = ωp².
// Time dependence e^{+jωt}; each term maps to an auxiliary differential equation (see kernel.ts).

import { type Complex, sqrt } from '../complex.ts';
import type { BulkModel } from '../materials/types.ts';
import { EPS0_F_per_m, GHz, ps } from '../units.ts';

export interface DebyeTerm { deps: number; tau_s: number }
/** P'' + γP' + ω0²P = ε0 c E. */
export interface OscTerm { c: number; w0sq: number; gamma: number }

export interface StepModel {
  epsInf: number;
  sigma: number;
  debye: DebyeTerm[];
  osc: OscTerm[];
}

export const stepModelFixed = (eps_r: number, sigma = 0): StepModel => ({ epsInf: eps_r, sigma, debye: [], osc: [] });

/** The step model of a bulk model that needs no fitting (everything except power-law and table). */
export function stepModelOf(m: Exclude<BulkModel, { model: 'power-law' | 'table' }>): StepModel {
  switch (m.model) {
    case 'fixed':
      return stepModelFixed(m.eps_r, m.sigma_S_per_m);
    case 'debye':
      return {
        epsInf: m.eps_inf, sigma: m.sigma_S_per_m,
        debye: m.poles.map((p) => ({ deps: p.delta_eps, tau_s: p.tau_ps * ps })), osc: [],
      };
    case 'lorentz':
      return {
        epsInf: m.eps_inf, sigma: m.sigma_S_per_m, debye: [],
        osc: m.poles.map((p) => {
          const w0 = 2 * Math.PI * p.f0_GHz * GHz;
          return { c: p.delta_eps * w0 * w0, w0sq: w0 * w0, gamma: 2 * Math.PI * p.gamma_GHz * GHz };
        }),
      };
    case 'drude': {
      const wp = 2 * Math.PI * m.plasma_GHz * GHz;
      return {
        epsInf: m.eps_inf, sigma: m.sigma_S_per_m, debye: [],
        osc: [{ c: wp * wp, w0sq: 0, gamma: 2 * Math.PI * m.collision_GHz * GHz }],
      };
    }
  }
}

/** ε_r(f) of a step model (continuous time), {re: ε', im: −ε''}. */
export function stepModelPermittivity(m: StepModel, f_Hz: number): Complex {
  const w = 2 * Math.PI * f_Hz;
  let re = m.epsInf, im = -m.sigma / (w * EPS0_F_per_m);
  for (const p of m.debye) {
    const wt = w * p.tau_s, d = 1 + wt * wt;
    re += p.deps / d;
    im -= (p.deps * wt) / d;
  }
  for (const p of m.osc) {
    const a = p.w0sq - w * w, b = w * p.gamma, d = a * a + b * b;
    re += (p.c * a) / d;
    im -= (p.c * b) / d;
  }
  return { re, im };
}

/** Re √ε (the refractive index that sets the wavelength). */
export function refractiveIndex(e: Complex): number {
  return sqrt(e).re;
}

/** Im-part magnitude of √ε (the attenuation index, ≥ 0). */
export function extinctionIndex(e: Complex): number {
  return Math.abs(sqrt(e).im);
}

export const hasPoles = (m: StepModel): boolean => m.debye.length + m.osc.length > 0;
