// Complex relative permeability μ_r(f) = μ' − jμ'' of a bulk material, e^{+jωt} convention.
// A material without a `magnetic` block has μ_r = 1. The returned im part is −μ'' (≤ 0 when passive).

import type { Complex } from '../complex.ts';
import { GHz, ps } from '../units.ts';
import { addDebyeTerm, addLorentzTerm } from './poles.ts';
import { tableValue } from './table.ts';
import type { BulkModel, MagneticModel } from './types.ts';

/** μ_r of a magnetic block at f_Hz (> 0); 1 when there is none. */
export function magneticPermeability(m: MagneticModel | undefined, f_Hz: number): Complex {
  if (m === undefined) return { re: 1, im: 0 };
  const w = 2 * Math.PI * f_Hz;
  switch (m.model) {
    case 'fixed':
      return { re: m.mu_r, im: -m.mu_loss };
    case 'debye': {
      const acc = { re: m.mu_inf, im: 0 };
      for (const p of m.poles) addDebyeTerm(acc, p.delta_mu, p.tau_ps * ps, w);
      return acc;
    }
    case 'lorentz': {
      const acc = { re: m.mu_inf, im: 0 };
      for (const p of m.poles) addLorentzTerm(acc, p.delta_mu, p.f0_GHz * GHz, p.gamma_GHz * GHz, w);
      return acc;
    }
  }
}

/** μ_r of a bulk material at f_Hz: a table's measured μ (`mu_points`), else its magnetic block's. */
export const permeability = (spec: BulkModel, f_Hz: number): Complex =>
  spec.model === 'table' && spec.mu_points !== undefined ? tableValue(spec.mu_points, f_Hz) : magneticPermeability(spec.magnetic, f_Hz);

/** True when the material has μ_r = 1 at every frequency (no magnetic block that changes it, no μ table other than 1 − j0). */
export function isNonMagneticMaterial(spec: BulkModel): boolean {
  if (spec.model === 'table' && spec.mu_points !== undefined) return spec.mu_points.every(([, re, loss]) => re === 1 && loss === 0);
  return isNonMagnetic(spec.magnetic);
}

/** True when the block leaves μ_r = 1 at every frequency (absent, fixed 1 − j0, or no pole strength on μ∞ = 1). */
export function isNonMagnetic(m: MagneticModel | undefined): boolean {
  if (m === undefined) return true;
  if (m.model === 'fixed') return m.mu_r === 1 && m.mu_loss === 0;
  return m.mu_inf === 1 && m.poles.every((p) => p.delta_mu === 0);
}
