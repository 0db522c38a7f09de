// The causal fit against outside truths: a Debye material (ε = ε∞ + Δε/(1 + jωτ), Debye's relaxation, common
// practice, no source) is fitted back to itself; the probes' sensitivity (probe-sensitivity.ts) matches the
// closed-form derivative of the normal-incidence Fresnel reflection coefficient r = (1 − √ε)/(1 + √ε) (e.g.
// Hecht, Optics, 4th ed., §4.6; common practice); fitted walls of every ITU-R P.2040-3 Table 3 wall material
// (coefficients from the physics reference) at several thicknesses, bands and angles stay passive, keep ε' ≥ 1
// and the σ cap, and their stepped media stay close to the exact solution (src/tmm) of the stack as written.
import { describe, expect, it } from 'vitest';
import { resolveStack } from '../../src/fdtd/effective.ts';
import { fitPermittivity, type FitTarget } from '../../src/fdtd/causal-fit.ts';
import { stepModelPermittivity } from '../../src/fdtd/media.ts';
import { atIncidence } from '../../src/fdtd/oblique.ts';
import { probeSensitivity } from '../../src/fdtd/probe-sensitivity.ts';
import { solveEffective } from '../../src/fdtd/stepped-exact.ts';
import { catalogMaterial } from '../../src/materials/catalog.ts';
import { permittivity } from '../../src/materials/permittivity.ts';
import type { PowerLawModel } from '../../src/materials/types.ts';
import { compareSpectra } from '../../src/report/agreement.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { stackAtFrequency } from '../../src/tmm/media.ts';
import { solveAt } from '../../src/tmm/recursion.ts';
import { EPS0_F_per_m, linspace } from '../../src/units.ts';
import { air, bulk, material, stackOf } from './stacks.ts';

const GHz = 1e9;

describe('causal fit: outside truths', () => {
  it('a Debye material is fitted back to itself (it is causal: no residue beyond the dictionary\'s reach)', () => {
    // An invented lossy relaxation: ε∞ = 3, Δε = 4, relaxation frequency 1/(2πτ) = 3 GHz, in the middle of the band.
    const tau = 1 / (2 * Math.PI * 3 * GHz);
    const debye = (f: number) => {
      const x = 2 * Math.PI * f * tau, d = 1 + x * x;
      return { re: 3 + 4 / d, im: -(4 * x) / d };
    };
    const target: FitTarget = { source: 'table', eps: debye, range_Hz: null };
    for (const band of [[1, 6], [1, 40]] as [number, number][]) {
      const fit = fitPermittivity(target, [band[0] * GHz, band[1] * GHz], 'debye');
      expect(Math.max(fit.maxRelErr_re, fit.maxRelErr_im)).toBeLessThan(2e-3);
      for (const o of fit.model.osc) expect(o.c).toBeGreaterThan(0);
    }
  });

  it('every ITU wall material: worst relative error near the causal floor (1–6 GHz ≤ 0.75 %, 1–40 GHz ≤ 3.6 %)', () => {
    // The physics reference reports 0.6–0.7 % and 3.2 % for concrete (a measurement there, from an independent
    // minimax, not a standard); measured here: concrete 0.69 % and 3.4 %, chipboard 0.68 % and 3.3 %, the rest lower
    // (the previous fit: concrete 1.1 % and 4.9 %).
    for (const name of ['concrete', 'brick', 'plasterboard', 'wood', 'glass', 'chipboard', 'marble', 'ceiling-board']) {
      const pl = catalogMaterial(name)!.spec as PowerLawModel;
      for (const [band, bound] of [[[1, 6], 0.0075], [[1, 40], 0.036]] as [[number, number], number][]) {
        const fit = fitPermittivity({ source: 'power-law', eps: (f) => permittivity(pl, f), range_Hz: null }, [band[0] * GHz, band[1] * GHz], name);
        expect(Math.max(fit.maxRelErr_re, fit.maxRelErr_im)).toBeLessThan(bound);
      }
    }
  });

  it('the probes\' sensitivity is the derivative of the Fresnel coefficient of a half-space', () => {
    const eps = 4, dielectric = material('half-space', { model: 'fixed', eps_r: eps, sigma_S_per_m: 0 });
    const stack = stackOf([], { band_GHz: [1, 6], front: air, back: dielectric });
    const f = 3 * GHz, n = Math.sqrt(eps);
    const R = solveAt(stackAtFrequency(stack, f)).R;
    expect(Math.abs(Math.abs(R.re) - (n - 1) / (n + 1))).toBeLessThan(1e-12);
    // r(ε) = s(1 − √ε)/(1 + √ε), s = ±1 the solver's sign convention: dr/dε = −s/(√ε(1 + √ε)²).
    const s = Math.sign(R.re) * Math.sign(1 - n);
    const d = probeSensitivity(stack, 'half-space')(f);
    const exact = -s / (n * (1 + n) ** 2);
    expect(Math.abs(d.dR_re.re - exact)).toBeLessThan(1e-5 * Math.abs(exact));
    expect(Math.abs(d.dR_re.im)).toBeLessThan(1e-6);
    // ε'' (ε = ε' − jε''): dr/dε'' = −j dr/dε'.
    expect(Math.abs(d.dR_im.im + exact)).toBeLessThan(1e-5 * Math.abs(exact));
  });

  const walls: [string, number, [number, number], 'air' | 'pec', number, 'TE' | 'TM'][] = [
    ['concrete', 120, [1, 6], 'pec', 0, 'TE'], ['concrete', 250, [2, 8], 'air', 0, 'TE'], ['brick', 80, [1, 6], 'pec', 0, 'TE'],
    ['plasterboard', 40, [1, 20], 'pec', 30, 'TM'], ['wood', 30, [1, 40], 'air', 0, 'TE'], ['glass', 10, [24, 40], 'pec', 0, 'TE'],
    ['marble', 60, [1, 6], 'air', 50, 'TE'], ['chipboard', 25, [1, 10], 'pec', 20, 'TM'], ['ceiling-board', 15, [1, 40], 'air', 0, 'TE'],
  ];
  it('fitted walls: passive, ε′ ≥ 1 from half the band\'s bottom to twice its top, σ capped, model share bounded', () => {
    for (const [name, mm, band, back, angle_deg, pol] of walls) {
      const spec = catalogMaterial(name)!.spec as PowerLawModel;
      const stack = stackOf([bulk(material(name, spec), mm)], { band_GHz: band, back: back === 'pec' ? 'pec' : air });
      stack.incidence = { angle_rad: (angle_deg * Math.PI) / 180, polarization: pol };
      const { effective, fits } = resolveStack(stack);
      const fit = fits[0];
      for (const o of fit.model.osc) { expect(o.c).toBeGreaterThan(0); expect(o.gamma).toBeGreaterThan(0); }
      expect(fit.model.epsInf).toBeGreaterThanOrEqual(1);
      for (let lg = 6; lg <= 12; lg += 0.05) expect(stepModelPermittivity(fit.model, 10 ** lg).im).toBeLessThanOrEqual(0);
      expect(fit.minEpsRe_wide).toBeGreaterThanOrEqual(1 - 1e-9);
      expect(fit.model.sigma).toBeLessThanOrEqual(spec.c * Math.pow(fit.fitRange_Hz[0] / GHz, spec.d) * (1 + 1e-9));
      const lowF = 1e6, lowSigma = -stepModelPermittivity(fit.model, lowF).im * 2 * Math.PI * lowF * EPS0_F_per_m;
      expect(lowSigma).toBeLessThan(fit.model.sigma + 0.01);
      // Reference: the exact layered solution (src/tmm) of the wall as written. Measured: at most 9.9e-3 up to
      // 8 GHz (the previous fit: 1.5e-2), at most 4.6e-2 on the wider bands (previously 7.1e-2).
      const f = linspace(band[0] * GHz, band[1] * GHz, 201);
      const share = compareSpectra(solveEffective(atIncidence(effective, stack.incidence, stack.band_Hz), f), solveTmm(stack, f));
      expect(Math.max(share.R_max, share.T_max)).toBeLessThan(band[1] <= 8 ? 1.1e-2 : 5e-2);
    }
  });
});
