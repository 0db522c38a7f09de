// Complex relative permeability μ_r(f) = μ' − jμ'' of a bulk material, e^{+jωt} convention.
// A material without a `magnetic` block has μ_r = 1. The returned im part is −μ'' (≤ 0 when passive).

import type { Complex } from '../complex.ts';
import { GHz, ps } from '../units.ts';
import { addDebyeTerm, addLorentzTerm } from './poles.ts';
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

/** μ_r of a bulk material at f_Hz. */
export const permeability = (spec: BulkModel, f_Hz: number): Complex => magneticPermeability(spec.magnetic, f_Hz);
