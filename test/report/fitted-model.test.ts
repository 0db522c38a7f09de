// The fitted causal model in summary.json, in the stack file's terms, must be the model the engine steps:
// evaluated with the README's debye, lorentz and drude formulas (Taflove & Hagness, Computational
// Electrodynamics, 3rd ed., ch. 9, give the same three forms) it reproduces the engine's ε_r(f).
import { describe, expect, it } from 'vitest';
import { stepModelPermittivity, type StepModel } from '../../src/fdtd/media.ts';
import { permittivity } from '../../src/materials/permittivity.ts';
import { fittedModel, type FittedModel } from '../../src/report/fitted-model.ts';

/** ε_r(f) of the summary's model, each part through the material models of the stack file. */
function epsOf(m: FittedModel, f_Hz: number): { re: number; im: number } {
  const parts = [
    permittivity({ model: 'debye', eps_inf: m.eps_inf, poles: m.debye, sigma_S_per_m: m.sigma_S_per_m }, f_Hz),
    permittivity({ model: 'lorentz', eps_inf: 0, poles: m.lorentz, sigma_S_per_m: 0 }, f_Hz),
    ...m.drude.map((d) => permittivity({ model: 'drude', eps_inf: 0, ...d, sigma_S_per_m: 0 }, f_Hz)),
  ];
  return parts.reduce((a, b) => ({ re: a.re + b.re, im: a.im + b.im }));
}

describe('fitted model in the stack file\'s terms', () => {
  it('reproduces the stepped ε_r(f) and leaves out terms of zero strength', () => {
    const w = (f_GHz: number) => 2 * Math.PI * f_GHz * 1e9;
    const step: StepModel = {
      epsInf: 4.1, sigma: 0.013,
      debye: [{ deps: 0.8, tau_s: 25e-12 }, { deps: 0, tau_s: 3e-12 }],
      osc: [
        { c: 0.3 * w(14) ** 2, w0sq: w(14) ** 2, gamma: w(9) }, // Lorentz pole, Δε = 0.3 at 14 GHz
        { c: w(0.4) ** 2, w0sq: 0, gamma: w(0.2) },            // Drude term, plasma 0.4 GHz
        { c: 0, w0sq: w(20) ** 2, gamma: w(5) },
      ],
    };
    const m = fittedModel(step);
    expect(m.debye).toEqual([{ delta_eps: 0.8, tau_ps: 25 }]);
    expect(m.lorentz).toEqual([{ delta_eps: 0.3, f0_GHz: 14, gamma_GHz: 9 }]);
    expect(m.drude).toEqual([{ plasma_GHz: 0.4, collision_GHz: 0.2 }]);
    for (const f of [0.5e9, 2e9, 7.5e9, 13e9]) {
      const a = epsOf(m, f), b = stepModelPermittivity(step, f);
      expect(Math.hypot(a.re - b.re, a.im - b.im) / Math.hypot(b.re, b.im)).toBeLessThan(1e-5);
    }
  });
});
