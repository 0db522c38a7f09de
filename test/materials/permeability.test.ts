// The permeability models' μ_r(f) against their closed forms. With e^{+jωt} a passive medium has Im μ_r ≤ 0
// (the same sign convention as ε_r; physics reference, conventions). A material without a magnetic block has μ_r = 1.

import { describe, expect, it } from 'vitest';
import { isNonMagnetic, magneticPermeability, permeability } from '../../src/materials/permeability.ts';
import { permittivity } from '../../src/materials/permittivity.ts';
import type { BulkModel, DebyeMagnetic, LorentzMagnetic } from '../../src/materials/types.ts';

const GHz = 1e9;

describe('closed forms', () => {
  it('no magnetic block: μ_r = 1 at every frequency; a fixed block: μ_r = mu_r − j mu_loss', () => {
    const plain: BulkModel = { model: 'fixed', eps_r: 4, sigma_S_per_m: 0 };
    for (const f of [1e6, 1e9, 1e12]) expect(permeability(plain, f)).toEqual({ re: 1, im: 0 });
    const lossy: BulkModel = { ...plain, magnetic: { model: 'fixed', mu_r: 2.5, mu_loss: 0.7 } };
    expect(permeability(lossy, 3 * GHz)).toEqual({ re: 2.5, im: -0.7 });
    // The block leaves the permittivity alone.
    expect(permittivity(lossy, 3 * GHz)).toEqual(permittivity(plain, 3 * GHz));
  });

  it('Debye relaxation: μ∞ + Δμ at DC, μ∞ + Δμ/2 − jΔμ/2 at ωτ = 1, → μ∞ far above (Debye form; common practice, no source)', () => {
    const m: DebyeMagnetic = { model: 'debye', mu_inf: 1.2, poles: [{ delta_mu: 8, tau_ps: 50 }] };
    const fRelax = 1 / (2 * Math.PI * 50e-12);
    const mid = magneticPermeability(m, fRelax);
    expect(mid.re).toBeCloseTo(1.2 + 4, 12);
    expect(mid.im).toBeCloseTo(-4, 12);
    expect(magneticPermeability(m, 1e3).re).toBeCloseTo(9.2, 9);
    expect(magneticPermeability(m, 1e16).re).toBeCloseTo(1.2, 6);
    // Two poles add.
    const two: DebyeMagnetic = { model: 'debye', mu_inf: 1, poles: [{ delta_mu: 2, tau_ps: 10 }, { delta_mu: 3, tau_ps: 100 }] };
    const f = 2 * GHz, w = 2 * Math.PI * f;
    const term = (d: number, t: number) => ({ re: d / (1 + (w * t) ** 2), im: (-d * w * t) / (1 + (w * t) ** 2) });
    const a = term(2, 10e-12), b = term(3, 100e-12), mu = magneticPermeability(two, f);
    expect(mu.re).toBeCloseTo(1 + a.re + b.re, 12);
    expect(mu.im).toBeCloseTo(a.im + b.im, 12);
  });

  it('damped Lorentz resonance: μ∞ − j Δμ f0/γ at f0, μ∞ + Δμ at DC (a ferrite\'s natural resonance; common practice, no source)', () => {
    const m: LorentzMagnetic = { model: 'lorentz', mu_inf: 1, poles: [{ delta_mu: 6, f0_GHz: 2, gamma_GHz: 1.5 }] };
    const at = magneticPermeability(m, 2 * GHz);
    expect(at.re).toBeCloseTo(1, 12);
    expect(at.im).toBeCloseTo((-6 * 2) / 1.5, 12);
    expect(magneticPermeability(m, 1e3).re).toBeCloseTo(7, 9);
    // Above the resonance μ' falls below 1 (and may go negative): the medium stays passive.
    const above = magneticPermeability(m, 4 * GHz);
    expect(above.re).toBeLessThan(1);
    for (const f of [0.5, 1, 2, 3, 5, 10]) expect(magneticPermeability(m, f * GHz).im).toBeLessThanOrEqual(0);
  });
});

describe('isNonMagnetic', () => {
  it('is true only for blocks that leave μ_r = 1', () => {
    expect(isNonMagnetic(undefined)).toBe(true);
    expect(isNonMagnetic({ model: 'fixed', mu_r: 1, mu_loss: 0 })).toBe(true);
    expect(isNonMagnetic({ model: 'debye', mu_inf: 1, poles: [{ delta_mu: 0, tau_ps: 3 }] })).toBe(true);
    expect(isNonMagnetic({ model: 'fixed', mu_r: 1, mu_loss: 0.01 })).toBe(false);
    expect(isNonMagnetic({ model: 'fixed', mu_r: 1.5, mu_loss: 0 })).toBe(false);
    expect(isNonMagnetic({ model: 'lorentz', mu_inf: 1, poles: [{ delta_mu: 1, f0_GHz: 3, gamma_GHz: 1 }] })).toBe(false);
  });
});
