// The dispersive models' ε_r(f) against their closed forms, and the pulse engine's step models of them
// (src/fdtd/media.ts, written separately) against src/materials/permittivity.ts. With e^{+jωt} a passive medium
// has Im ε_r ≤ 0 (physics reference, conventions).

import { describe, expect, it } from 'vitest';
import { stepModelOf, stepModelPermittivity } from '../../src/fdtd/media.ts';
import { permittivity } from '../../src/materials/permittivity.ts';
import type { BulkModel, DebyeModel, DrudeModel, LorentzModel } from '../../src/materials/types.ts';

const GHz = 1e9;

describe('closed forms', () => {
  it('lossless Drude plasma: ε_r = 1 − (f_p/f)², negative below the plasma frequency (Jackson, Classical Electrodynamics §7.5, from memory)', () => {
    const m: DrudeModel = { model: 'drude', eps_inf: 1, plasma_GHz: 6, collision_GHz: 0, sigma_S_per_m: 0 };
    for (const f of [1, 3, 6, 9, 20]) {
      const e = permittivity(m, f * GHz);
      expect(e.re).toBeCloseTo(1 - (6 / f) ** 2, 12);
      expect(e.im).toBeCloseTo(0, 12);
    }
  });

  it('Drude with collisions: ε_r = ε∞ − f_p²/(f² − j f f_c) (the same form with ω → f; common practice, no source)', () => {
    const m: DrudeModel = { model: 'drude', eps_inf: 2, plasma_GHz: 5, collision_GHz: 1.5, sigma_S_per_m: 0 };
    const f = 4, d = f ** 4 + f * f * 1.5 ** 2;
    const e = permittivity(m, f * GHz);
    expect(e.re).toBeCloseTo(2 - (25 * f * f) / d, 12);
    expect(e.im).toBeCloseTo(-(25 * f * 1.5) / d, 12);
    expect(e.im).toBeLessThan(0); // passive
  });

  it('lossless Lorentz: ε_r = ε∞ + Δε f0²/(f0² − f²), ε∞ + Δε at DC (Born & Wolf §2.3, from memory)', () => {
    const m: LorentzModel = { model: 'lorentz', eps_inf: 2, poles: [{ delta_eps: 3, f0_GHz: 6, gamma_GHz: 0 }], sigma_S_per_m: 0 };
    for (const f of [0.001, 2, 5, 7, 20]) expect(permittivity(m, f * GHz).re).toBeCloseTo(2 + (3 * 36) / (36 - f * f), 9);
    expect(permittivity(m, 1e3).re).toBeCloseTo(5, 9);
  });

  it('damped Lorentz at resonance: ε_r = ε∞ − j Δε f0/γ (common practice, no source)', () => {
    const m: LorentzModel = { model: 'lorentz', eps_inf: 2, poles: [{ delta_eps: 3, f0_GHz: 6, gamma_GHz: 0.5 }], sigma_S_per_m: 0 };
    const e = permittivity(m, 6 * GHz);
    expect(e.re).toBeCloseTo(2, 12);
    expect(e.im).toBeCloseTo((-3 * 6) / 0.5, 9);
  });

  it("Debye: ε_r = ε∞ + Δε/(1 + jωτ), loss peak ε'' = Δε/2 at ωτ = 1 (Debye relaxation; common practice, no source)", () => {
    const m: DebyeModel = { model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: 73.16, tau_ps: 8.27 }], sigma_S_per_m: 0 };
    const f = 1 / (2 * Math.PI * 8.27e-12);
    const e = permittivity(m, f);
    expect(e.re).toBeCloseTo(5.2 + 73.16 / 2, 9);
    expect(e.im).toBeCloseTo(-73.16 / 2, 9);
  });
});

describe('the pulse engine steps the same media', () => {
  it('step models of Debye, Lorentz and Drude materials (with σ) give the material ε_r(f) to rounding', () => {
    const models: Exclude<BulkModel, { model: 'power-law' | 'table' }>[] = [
      { model: 'debye', eps_inf: 3, poles: [{ delta_eps: 10, tau_ps: 20 }, { delta_eps: 2, tau_ps: 3 }], sigma_S_per_m: 0.05 },
      { model: 'lorentz', eps_inf: 2, poles: [{ delta_eps: 3, f0_GHz: 6, gamma_GHz: 1 }, { delta_eps: 0.5, f0_GHz: 15, gamma_GHz: 4 }], sigma_S_per_m: 0.01 },
      { model: 'drude', eps_inf: 1, plasma_GHz: 6, collision_GHz: 0.5, sigma_S_per_m: 0.2 },
      { model: 'fixed', eps_r: 4.4, sigma_S_per_m: 0.02 },
    ];
    for (const m of models)
      for (const f of [0.3, 1, 4, 6, 11, 40]) {
        const a = permittivity(m, f * GHz), b = stepModelPermittivity(stepModelOf(m), f * GHz);
        expect(Math.hypot(a.re - b.re, a.im - b.im), `${m.model} at ${f} GHz`).toBeLessThan(1e-12 * Math.hypot(a.re, a.im));
      }
  });
});
