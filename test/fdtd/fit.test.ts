// The power-law fit against the ITU-R P.2040-3 Table 3 rows (coefficients from the physics reference, all
// checked there): the reported worst errors are the true ones (recomputed here from
// src/materials/permittivity.ts); the fitted model is passive and causal (Kramers–Kronig, checked by
// numerical integration; common practice, e.g. Jackson, Classical Electrodynamics, 3rd ed., §7.10);
// ε' ≥ 1 from half the band's bottom to twice its top; no static conductivity beyond the table's own at
// the bottom of the fitted range; near the causal floor the physics reference reports for concrete
// (0.6–0.7 % over 1–6 GHz, 3.2 % over 1–40 GHz, a measurement there, not a standard).
import { describe, expect, it } from 'vitest';
import { fitWarnings, resolveStack } from '../../src/fdtd/effective.ts';
import { fitPowerLaw, type PowerLawFit } from '../../src/fdtd/causal-fit.ts';
import { stepModelPermittivity, type StepModel } from '../../src/fdtd/media.ts';
import { solveEffective } from '../../src/fdtd/stepped-exact.ts';
import { permittivity } from '../../src/materials/permittivity.ts';
import type { PowerLawModel } from '../../src/materials/types.ts';
import { compareSpectra } from '../../src/report/agreement.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { EPS0_F_per_m, linspace } from '../../src/units.ts';
import { bulk, material, stackOf } from './stacks.ts';

const itu: Record<string, PowerLawModel> = {
  concrete: { model: 'power-law', a: 5.24, b: 0, c: 0.0462, d: 0.7822 },
  brick: { model: 'power-law', a: 3.91, b: 0, c: 0.0238, d: 0.16 },
  plasterboard: { model: 'power-law', a: 2.73, b: 0, c: 0.0085, d: 0.9395 },
  wood: { model: 'power-law', a: 1.99, b: 0, c: 0.0047, d: 1.0718 },
  glass: { model: 'power-law', a: 6.31, b: 0, c: 0.0036, d: 1.3394 },
};
const GHz = 1e9;

/** ε'(ω) − ε∞ from ε''(ω') by the Kramers–Kronig integral (σ's 1/ω part left out), log grid, trapezoid. */
function kramersKronig(m: StepModel, f: number): number {
  const w = 2 * Math.PI * f;
  const loss = (x: number) => -stepModelPermittivity(m, x / (2 * Math.PI)).im - m.sigma / (x * EPS0_F_per_m);
  const e0 = loss(w), N = 40000, a = Math.log(w * 1e-6), b = Math.log(w * 1e6);
  let sum = 0;
  for (let i = 0; i <= N; i++) {
    const x = Math.exp(a + ((b - a) * (i + 0.5)) / (N + 1)); // offset: never exactly at ω' = ω
    const g = ((x * loss(x) - w * e0) / (x * x - w * w)) * x; // dω' = ω' du
    sum += g * (i === 0 || i === N ? 0.5 : 1);
  }
  return ((2 / Math.PI) * sum * (b - a)) / (N + 1);
}

describe('power-law fit (linear program over passive second-order terms and σ)', () => {
  for (const [name, pl] of Object.entries(itu)) {
    it(`${name}, 8–12 GHz: reported errors are the true worst errors, below 0.5 %`, () => {
      const band: [number, number] = [8 * GHz, 12 * GHz];
      const fit = fitPowerLaw(pl, band, name);
      let eRe = 0, eIm = 0;
      for (let i = 0; i <= 400; i++) {
        const f = band[0] + ((band[1] - band[0]) * i) / 400;
        const t = permittivity(pl, f), g = stepModelPermittivity(fit.model, f);
        eRe = Math.max(eRe, Math.abs(g.re - t.re) / t.re);
        eIm = Math.max(eIm, Math.abs(g.im - t.im) / Math.abs(t.im));
      }
      expect(fit.maxRelErr_re).toBeLessThan(0.005);
      expect(fit.maxRelErr_im).toBeLessThan(0.005);
      expect(Math.abs(eRe - fit.maxRelErr_re)).toBeLessThan(0.2 * eRe + 1e-5);
      expect(Math.abs(eIm - fit.maxRelErr_im)).toBeLessThan(0.2 * eIm + 1e-5);
    });
  }

  it('passive (ε′′ ≥ 0 everywhere), ε∞ ≥ 1, ε′ ≥ 1 from half the bottom to twice the top, no invented DC conduction', () => {
    for (const pl of Object.values(itu)) {
      for (const band of [[1, 6], [1, 40]] as [number, number][]) {
        const fit = fitPowerLaw(pl, [band[0] * GHz, band[1] * GHz]);
        expect(fit.model.epsInf).toBeGreaterThanOrEqual(1);
        expect(fit.model.debye).toEqual([]);
        for (const o of fit.model.osc) { expect(o.c).toBeGreaterThan(0); expect(o.gamma).toBeGreaterThan(0); expect(o.w0sq).toBeGreaterThan(0); }
        for (let lg = 6; lg <= 12; lg += 0.02) expect(stepModelPermittivity(fit.model, 10 ** lg).im).toBeLessThanOrEqual(0);
        for (let i = 0; i <= 2000; i++) {
          const f = (band[0] / 2) * GHz * Math.pow((4 * band[1]) / band[0], i / 2000);
          expect(stepModelPermittivity(fit.model, f).re).toBeGreaterThanOrEqual(1 - 1e-9);
        }
        expect(fit.minEpsRe_wide).toBeGreaterThanOrEqual(1 - 1e-9);
        // Static conductivity: σ alone (second-order terms have none), at most the table's σ at the fit's bottom.
        expect(fit.model.sigma).toBeLessThanOrEqual(pl.c * Math.pow(fit.fitRange_Hz[0] / GHz, pl.d) * (1 + 1e-9));
        const lowF = 1e6, lowSigma = -stepModelPermittivity(fit.model, lowF).im * 2 * Math.PI * lowF * EPS0_F_per_m;
        expect(lowSigma).toBeLessThan(fit.model.sigma + 0.01);
      }
    }
  });

  it('the fitted model is causal: its ε′ follows from its ε′′ by the Kramers–Kronig integral', () => {
    const fit = fitPowerLaw(itu.concrete, [1 * GHz, 6 * GHz]);
    for (const f of [0.7, 1, 2.5, 6, 10].map((x) => x * GHz)) {
      const e = stepModelPermittivity(fit.model, f).re;
      expect(Math.abs(fit.model.epsInf + kramersKronig(fit.model, f) - e)).toBeLessThan(2e-3 * e);
    }
  });

  it('near the causal floor for concrete; and over a decade the non-causal table cannot be matched: the residue is reported', () => {
    const narrow = fitPowerLaw(itu.concrete, [1 * GHz, 6 * GHz]), wide = fitPowerLaw(itu.concrete, [1 * GHz, 40 * GHz]);
    // The reference's 0.6–0.7 % over 1–6 GHz and 3.2 % over 1–40 GHz: this fit reaches 0.7 % and 3.4 %.
    expect(Math.max(narrow.maxRelErr_re, narrow.maxRelErr_im)).toBeLessThan(0.008);
    expect(Math.max(wide.maxRelErr_re, wide.maxRelErr_im)).toBeLessThan(0.04);
    // Constant ε′ with a falling ε′′ violates Kramers–Kronig; a percent-level residue remains.
    expect(narrow.maxRelErr_abs).toBeGreaterThan(0.003);
    // Below the band, where the pulse still carries energy, the fit follows the table at a far gentler weight
    // (0.03 of the band's, falling with the pulse's content): within 10 % at 0.7 GHz, 35 % at the fit's bottom.
    for (const [f, bound] of [[0.7, 0.1], [0.5, 0.35]]) {
      const t = permittivity(itu.concrete, f * GHz).re, g = stepModelPermittivity(narrow.model, f * GHz).re;
      expect(Math.abs(g - t) / t).toBeLessThan(bound);
    }
  });

  it('weighted by what reaches the probes: 150 mm of concrete on a conductor, 1–6 GHz, model share ≤ 1.0e-2', () => {
    // Reference: the exact layered solution (src/tmm) of the ITU concrete wall; the model share is the exact
    // solution of the fitted medium against it.
    const concrete = material('concrete', itu.concrete);
    const stack = stackOf([bulk(concrete, 150)], { band_GHz: [1, 6], back: 'pec' });
    const f = linspace(1 * GHz, 6 * GHz, 201);
    const share = compareSpectra(solveEffective(resolveStack(stack).effective, f), solveTmm(stack, f));
    expect(share.R_max).toBeLessThanOrEqual(1.0e-2);
    expect(share.R_max).toBeGreaterThan(1e-3); // a non-causal table leaves a visible share
  });

  it('warns on ε′ and on ε′′ separately', () => {
    const fit = (re: number, im: number): PowerLawFit => ({
      material: 'glass', source: 'power-law', quantity: 'permittivity', band_Hz: [1e9, 4e10], model: { epsInf: 6, sigma: 0, debye: [], osc: [] },
      maxRelErr_re: re, maxRelErr_im: im, maxRelErr_abs: Math.max(re, im), minEpsRe_wide: 6, fitRange_Hz: [5e8, 1.2e11],
    });
    expect(fitWarnings([fit(0.002, 0.005)])).toEqual([]);
    const im = fitWarnings([fit(0.002, 0.275)]);
    expect(im).toHaveLength(1);
    expect(im[0]).toMatch(/27\.50 % in ε''/);
    expect(im[0]).toMatch(/0\.20 % in ε' and 27\.50 % in ε''/); // ε'' alone raises it; both figures are given
    expect(fitWarnings([fit(0.03, 0.01)])[0]).toMatch(/is 3\.00 % in ε' and 1\.00 % in ε''/);
  });
});
