// Material models in the form the time-stepping kernel understands:
//   ε_r(ω) = ε∞ − jσ/(ωε0) + Σ Δε/(1 + jωτ)  (Debye poles)  + Σ (c + jωd)/(ω0² − ω² + jωγ)  (second-order poles)
// Lorentz poles have c = Δε ω0², d = 0; a Drude term is a second-order pole with ω0 = 0 and c = ωp². The
// s-term d comes only from partial fractions of a reciprocal (inverse.ts), whose strengths may also be negative.
// Time dependence e^{+jωt}; each term maps to an auxiliary differential equation (see kernel.ts).
//
// The engine steps a line (the phase-matched 1D problem, oblique.ts): a shunt model on the E nodes (ε-like) and a
// series model on the H nodes (μ-like), both StepModels. On the series side the same terms mean the same
// thing with μ in place of ε; its `sigma` is in the same normalized unit (the term −j sigma/(ωε0)).

import { type Complex, div as cdiv, mul as cmul, sqrt, sqrt as csqrt } from '../complex.ts';
import type { BulkModel } from '../materials/types.ts';
import { EPS0_F_per_m, GHz, ps } from '../units.ts';

export interface DebyeTerm { deps: number; tau_s: number }
/** P'' + γP' + ω0²P = c E + d E' (ε0 dropped); d absent means 0. */
export interface OscTerm { c: number; d?: number; w0sq: number; gamma: number }

export interface StepModel {
  epsInf: number;
  sigma: number;
  debye: DebyeTerm[];
  osc: OscTerm[];
}

export const stepModelFixed = (eps_r: number, sigma = 0): StepModel => ({ epsInf: eps_r, sigma, debye: [], osc: [] });

/** A medium of the line the engine steps: shunt (ε-like, E nodes) and series (μ-like, H nodes). */
export interface LineMedium { shunt: StepModel; series: StepModel }

/** μ = 1: the series side of every non-magnetic medium at normal incidence. */
export const UNIT_MODEL: StepModel = Object.freeze({ epsInf: 1, sigma: 0, debye: [], osc: [] });

/** A line medium; the series side defaults to μ = 1. */
export const lineMedium = (shunt: StepModel, series: StepModel = UNIT_MODEL): LineMedium => ({ shunt, series });

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
    // (c + jωd)/(a + jb), a = ω0² − ω², b = ωγ.
    const a = p.w0sq - w * w, b = w * p.gamma, q = a * a + b * b, dw = w * (p.d ?? 0);
    re += (p.c * a + dw * b) / q;
    im += (dw * a - p.c * b) / q;
  }
  return { re, im };
}

/** The line's shunt (ε) and series (μ) values at f. */
export function linePermittivity(m: LineMedium, f_Hz: number): { eps: Complex; mu: Complex } {
  return { eps: stepModelPermittivity(m.shunt, f_Hz), mu: stepModelPermittivity(m.series, f_Hz) };
}

/** √(εμ) on the decaying branch (Im ≤ 0): the line's index, n − jκ. */
export function lineIndex(m: LineMedium, f_Hz: number): Complex {
  const { eps, mu } = linePermittivity(m, f_Hz);
  return decaying(csqrt(cmul(eps, mu)));
}

/** The line's admittance relative to free space, √(εμ)/μ (→ √(ε/μ)). */
export function lineAdmittance(m: LineMedium, f_Hz: number): Complex {
  const { eps, mu } = linePermittivity(m, f_Hz);
  return cdiv(decaying(csqrt(cmul(eps, mu))), mu);
}

const decaying = (r: Complex): Complex => (r.im > 0 || (r.im === 0 && r.re < 0) ? { re: -r.re, im: -r.im } : r);

/** Re √ε (the refractive index that sets the wavelength). */
export function refractiveIndex(e: Complex): number {
  return sqrt(e).re;
}

/** Im-part magnitude of √ε (the attenuation index, ≥ 0). */
export function extinctionIndex(e: Complex): number {
  return Math.abs(sqrt(e).im);
}

export const hasPoles = (m: StepModel): boolean => m.debye.length + m.osc.length > 0;

/** A constant model (no σ, no poles). */
export const isConstantModel = (m: StepModel): boolean => m.sigma === 0 && !hasPoles(m);

/** The media's models, shunt then series, each once. */
export const lineModels = (m: LineMedium): StepModel[] => [m.shunt, m.series];
