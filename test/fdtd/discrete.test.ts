// What the grid does to a medium, against closed forms, and the planner's model of the whole grid against
// the running engine.
// - 1D Yee dispersion relation sin(k̃Δx/2) = (n/S) sin(ωΔt/2) (Taflove & Hagness, Computational
//   Electrodynamics, 3rd ed., 2005, §2.5) for a lossless medium.
// - The kernel's trapezoidal pole updates are the bilinear transform of the media's ADEs, so their discrete
//   susceptibility at ω is the continuous one at the warped frequency ω̃ = (2/Δt) tan(ωΔt/2) (the bilinear
//   transform's frequency warping: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §7.2).
// - In vacuum at S = 1 the grid is exact (the "magic time step", Taflove & Hagness §2.6).
// - The grid's exact layered response (grid-response.ts) reproduces the pulse run's R and T, so its
//   difference from the exact solver (src/tmm) is the engine's error before the run; also with magnetic
//   media and at an angle in TM, where the H nodes carry their own (series) media.
import { describe, expect, it } from 'vitest';
import { uniformGrid } from '../../src/fdtd/build.ts';
import { discreteWave, warpedFrequency } from '../../src/fdtd/discrete.ts';
import { gridGeometry, gridResponse } from '../../src/fdtd/grid-response.ts';
import { lineMedium, stepModelFixed, stepModelOf, stepModelPermittivity } from '../../src/fdtd/media.ts';
import { createPulseRun, runToEndSync } from '../../src/fdtd/run.ts';
import { solveEffective } from '../../src/fdtd/stepped-exact.ts';
import type { Stack } from '../../src/stack/types.ts';
import { C0_m_per_s, linspace } from '../../src/units.ts';
import { maxDiff, runSpectrum } from './measure.ts';
import { air, bulk, fixed, material, sheet, stackOf } from './stacks.ts';

type Cx = { re: number; im: number };
const cmul = (a: Cx, b: Cx): Cx => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const cdiv = (a: Cx, b: Cx): Cx => { const d = b.re ** 2 + b.im ** 2; return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d }; };
const water = material('water', { model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: 73.16, tau_ps: 8.27 }], sigma_S_per_m: 0 });
const resonant = material('resonant', { model: 'lorentz', eps_inf: 2, poles: [{ delta_eps: 3, f0_GHz: 7, gamma_GHz: 1.5 }], sigma_S_per_m: 0.02 });

describe('the grid’s waves', () => {
  it('lossless medium: k̃ from the 1D Yee dispersion relation', () => {
    const n = 2, dx = 1e-3, S = 0.8, dt = (S * dx) / C0_m_per_s;
    for (const f of [1e9, 10e9, 40e9]) {
      const w = discreteWave(lineMedium(stepModelFixed(n * n)), f, dx, dt, S);
      const k = (2 / dx) * Math.asin((n / S) * Math.sin(Math.PI * f * dt));
      expect(Math.abs(w.k.re - k) / k).toBeLessThan(1e-12);
      expect(Math.abs(w.k.im)).toBeLessThan(1e-12 * k);
      expect(Math.abs((2 * Math.PI * f * n) / C0_m_per_s - k) / k).toBeGreaterThan(1e-6); // and it is not the exact k
    }
  });

  it('the kernel’s Debye and Lorentz coefficients are the bilinear transform of the continuous poles', () => {
    const dt = 2e-12;
    for (const m of [water, resonant]) {
      const model = stepModelOf(m.spec as never);
      const g = uniformGrid(20, lineMedium(model), { courant: 1, dt_s: dt, band_Hz: [1e9, 10e9], pmlFront: 0, pmlBack: 0 }).disp!.groups[0];
      for (const f of [0.5e9, 5e9, 50e9]) {
        const z = { re: Math.cos(2 * Math.PI * f * dt), im: Math.sin(2 * Math.PI * f * dt) };
        const zp1 = { re: z.re + 1, im: z.im };
        let chi: Cx = { re: 0, im: 0 };
        for (let q = 0; q < g.nd; q++) { const c = cdiv(cmul({ re: g.db[q], im: 0 }, zp1), { re: z.re - g.da[q], im: z.im }); chi = { re: chi.re + c.re, im: chi.im + c.im }; }
        for (let q = 0; q < g.no; q++) {
          const den = { re: z.re * z.re - z.im * z.im - g.oa[q] * z.re - g.ox[q], im: 2 * z.re * z.im - g.oa[q] * z.im };
          const c = cdiv(cmul({ re: g.oz[q], im: 0 }, cmul(zp1, zp1)), den);
          chi = { re: chi.re + c.re, im: chi.im + c.im };
        }
        const e = stepModelPermittivity(model, warpedFrequency(f, dt));
        const want = { re: e.re - model.epsInf, im: e.im + model.sigma / (2 * Math.PI * warpedFrequency(f, dt) * 8.8541878128e-12) };
        expect(Math.hypot(chi.re - want.re, chi.im - want.im)).toBeLessThan(1e-9 * Math.hypot(want.re, want.im));
      }
    }
  });
});

describe('the grid’s exact response (the planner’s prediction) against the running engine', () => {
  const check = (stack: Stack, cellsPerWavelength?: number) => {
    const run = runToEndSync(createPulseRun(stack, cellsPerWavelength ? { cellsPerWavelength } : {}));
    const p = run.plan, f = linspace(stack.band_Hz[0], stack.band_Hz[1], 21);
    const geo = gridGeometry(p.effective, p.dx_m, p.nodes.back - p.nodes.front);
    const predicted = Array.from(f, (fk) => gridResponse(geo, fk, p));
    const ref = { f_Hz: f, R_re: Float64Array.from(predicted, (x) => x.R.re), R_im: Float64Array.from(predicted, (x) => x.R.im), T_re: Float64Array.from(predicted, (x) => x.T.re), T_im: Float64Array.from(predicted, (x) => x.T.im) };
    const got = runSpectrum(run, f);
    return { vsGrid: maxDiff(got, ref), vsExact: maxDiff(got, solveEffective(p.effective, f)), plan: p };
  };

  it('coarse grids (12 cells/λ): faces inside cells, a layer thinner than a cell, a shared sheet, a conductor, an angle', () => {
    const stacks: Stack[] = [
      stackOf([bulk(fixed(4, 0.05), 20.37), bulk(fixed(9, 0.01), 13.31)], { back: fixed(2.5) }),
      stackOf([bulk(fixed(3), 10.3), bulk(water, 0.9), bulk(resonant, 6.1)], { band_GHz: [1, 6] }),
      stackOf([bulk(fixed(3), 7.13), sheet(120), bulk(fixed(2), 9.77)], { back: 'pec' }),
      { ...stackOf([bulk(fixed(4, 0.02), 25), bulk(air, 5)], { band_GHz: [1, 8] }), incidence: { angle_rad: Math.PI / 4, polarization: 'TE' } },
    ];
    for (const stack of stacks) {
      const { vsGrid, vsExact } = check(stack, 12);
      // The engine's own error is large on such a grid, and the prediction reproduces it to the boundaries' level.
      expect(Math.max(vsExact.R, vsExact.T)).toBeGreaterThan(3e-3);
      expect(vsGrid.R).toBeLessThan(2e-4);
      expect(vsGrid.T).toBeLessThan(2e-4);
    }
  });

  it('coarse grids with a series side: magnetic layers with faces inside cells and thinner than a cell, TM and TE at an angle', () => {
    const loaded = material('loaded', { model: 'fixed', eps_r: 6, sigma_S_per_m: 0.05, magnetic: { model: 'lorentz', mu_inf: 1.2, poles: [{ delta_mu: 2, f0_GHz: 3, gamma_GHz: 2.5 }] } });
    const relaxing = material('relaxing', { model: 'fixed', eps_r: 3, sigma_S_per_m: 0, magnetic: { model: 'debye', mu_inf: 1.5, poles: [{ delta_mu: 1.5, tau_ps: 40 }] } });
    const tilt = (stack: Stack, deg: number, polarization: 'TE' | 'TM'): Stack => ({ ...stack, incidence: { angle_rad: (deg * Math.PI) / 180, polarization } });
    const stacks: Stack[] = [
      stackOf([bulk(loaded, 7.37), bulk(fixed(3), 0.61), bulk(relaxing, 5.13)], { back: fixed(2), band_GHz: [1, 6] }),
      tilt(stackOf([bulk(fixed(4, 0.05), 20.37), bulk(water, 0.9), bulk(fixed(2.2), 9.13)], { band_GHz: [1, 6] }), 50, 'TM'),
      tilt(stackOf([bulk(loaded, 4.37), bulk(relaxing, 0.4), bulk(fixed(6), 3.3)], { back: 'pec', band_GHz: [1, 6] }), 35, 'TE'),
      tilt(stackOf([bulk(relaxing, 6.61), bulk(loaded, 3.07)], { band_GHz: [1, 6] }), 60, 'TM'),
    ];
    for (const stack of stacks) {
      const { vsGrid, vsExact } = check(stack, 12);
      expect(Math.max(vsExact.R, vsExact.T)).toBeGreaterThan(3e-3);
      expect(vsGrid.R).toBeLessThan(2e-4);
      expect(vsGrid.T).toBeLessThan(2e-4);
    }
  });

  it('vacuum at S = 1 is exact: an air gap before a conductor, nothing to predict', () => {
    const stack = stackOf([bulk(air, 12.3)], { back: 'pec' });
    const { vsGrid, vsExact, plan } = check(stack);
    expect(plan.courant).toBe(1);
    expect(plan.predictedError).toBeLessThan(1e-12);
    expect(vsExact.R).toBeLessThan(1e-5);
    expect(vsGrid.R).toBeLessThan(1e-5);
  });
});
