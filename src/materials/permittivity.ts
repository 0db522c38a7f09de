// Complex relative permittivity ε_r(f) = ε' − jε'' of every bulk model, e^{+jωt} convention.
// The returned im part is −ε'' (≤ 0 for a passive medium).

import type { Complex } from '../complex.ts';
import { EPS0_F_per_m, GHz, ps } from '../units.ts';
import { addDebyeTerm, addLorentzTerm } from './poles.ts';
import { tableValue } from './table.ts';
import type { BulkModel } from './types.ts';

/** ε_r at f_Hz (> 0). */
export function permittivity(m: BulkModel, f_Hz: number): Complex {
  const w = 2 * Math.PI * f_Hz;
  switch (m.model) {
    case 'fixed':
      return { re: m.eps_r, im: -m.sigma_S_per_m / (w * EPS0_F_per_m) };
    case 'debye': {
      const acc = { re: m.eps_inf, im: -m.sigma_S_per_m / (w * EPS0_F_per_m) };
      for (const p of m.poles) addDebyeTerm(acc, p.delta_eps, p.tau_ps * ps, w);
      return acc;
    }
    case 'lorentz': {
      const acc = { re: m.eps_inf, im: -m.sigma_S_per_m / (w * EPS0_F_per_m) };
      for (const p of m.poles) addLorentzTerm(acc, p.delta_eps, p.f0_GHz * GHz, p.gamma_GHz * GHz, w);
      return acc;
    }
    case 'drude': {
      // ε∞ − ωp² / (ω² − jωγ) = ε∞ − ωp² (ω² + jωγ) / (ω⁴ + ω²γ²)
      const wp = 2 * Math.PI * m.plasma_GHz * GHz, g = 2 * Math.PI * m.collision_GHz * GHz;
      const d = w * w * w * w + w * w * g * g;
      return {
        re: m.eps_inf - (wp * wp * w * w) / d,
        im: -(wp * wp * w * g) / d - m.sigma_S_per_m / (w * EPS0_F_per_m),
      };
    }
    case 'power-law': {
      const f_GHz = f_Hz / GHz;
      const sigma = m.c * Math.pow(f_GHz, m.d);
      return { re: m.a * Math.pow(f_GHz, m.b), im: -sigma / (w * EPS0_F_per_m) };
    }
    case 'table':
      return tableValue(m.points, f_Hz);
  }
}

/** Effective conductivity σ_eff = ω ε0 ε'' in S/m at f_Hz, as the catalog reports it. */
export function effectiveConductivity(m: BulkModel, f_Hz: number): number {
  return -permittivity(m, f_Hz).im * 2 * Math.PI * f_Hz * EPS0_F_per_m;
}
