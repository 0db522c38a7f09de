// The planner: loss-aware grids, the accuracy target honoured (the Yee scheme is second order: the error
// falls as N⁻², Taflove & Hagness, Computational Electrodynamics, 3rd ed., ch. 4), a step limit that grows
// with the slowest relaxation of the stepped media (a Debye pole relaxes as e^{−t/τ}, closed form), and
// refusals in plain words. Attenuation of ITU-R P.2040-3 concrete (Table 3 row) from its ε'' (α = k0 Im√ε).
import { describe, expect, it } from 'vitest';
import { PlanError } from '../../src/fdtd/errors.ts';
import { lineMedium } from '../../src/fdtd/media.ts';
import { courantLimit, GRID_SHARE, planGrid } from '../../src/fdtd/plan.ts';
import type { Stack } from '../../src/stack/types.ts';
import { bulk, fixed, material, stackOf } from './stacks.ts';

const concrete = material('concrete', { model: 'power-law', a: 5.24, b: 0, c: 0.0462, d: 0.7822 });
const refusal = (stack: Stack, options = {}): PlanError => {
  try { planGrid(stack, options); } catch (e) { if (e instanceof PlanError) return e; throw e; }
  throw new Error('not refused');
};
const plain = (msg: string): void => {
  expect(msg).not.toMatch(/Infinity|NaN|undefined|\[|\{/);
  expect(msg).toMatch(/:/); // what, then what to change
};

describe('loss-aware grid', () => {
  it('a wall that swallows the wave does not pay for its depth; a lossless one of the same length does', () => {
    // Concrete at 24–40 GHz loses ≥ 40 dB per 100 mm one way (α = k0 Im√ε from the ITU row): the deep wall is invisible.
    const lossy = (mm: number) => planGrid(stackOf([bulk(concrete, mm)], { band_GHz: [24, 40] }));
    const thin = lossy(100), thick = lossy(300);
    expect(Math.abs(thick.cellsPerWavelength / thin.cellsPerWavelength - 1)).toBeLessThan(0.01);
    expect(thick.predictedError).toBeLessThanOrEqual(GRID_SHARE * thick.accuracyTarget);
    const clear = planGrid(stackOf([bulk(fixed(5.24), 300)], { band_GHz: [24, 40] }), { maxWork: 1e14 });
    expect(clear.cellsPerWavelength).toBeGreaterThan(3 * thick.cellsPerWavelength);
    // The step estimate sees only the depth that comes back: far less than two transits of the wall.
    const transit = (2 * 0.3 * Math.sqrt(5.24)) / 299792458;
    expect(thick.expectedSteps * thick.dt_s).toBeLessThan(transit);
  });

  it('the accuracy target is honoured down to 1e-4: predicted error within a fifth of it, N ∝ target^(−1/2)', () => {
    const stack = stackOf([bulk(fixed(4, 0.01), 20)], { band_GHz: [1, 6] });
    const plans = [1e-2, 1e-3, 1e-4].map((accuracy) => planGrid(stack, { accuracy }));
    for (const p of plans) expect(p.predictedError).toBeLessThanOrEqual(GRID_SHARE * p.accuracyTarget * (1 + 1e-9));
    for (let i = 1; i < plans.length; i++) {
      const ratio = plans[i].cellsPerWavelength / plans[i - 1].cellsPerWavelength;
      expect(ratio).toBeGreaterThan(Math.sqrt(10) / 1.4);
      expect(ratio).toBeLessThan(Math.sqrt(10) * 1.4);
    }
  });
});

describe('time step and step limit', () => {
  it('no pole demands a smaller step: S = 1 for a Lorentz pole far above the band and for a lossless Drude medium', () => {
    const above = material('above', { model: 'lorentz', eps_inf: 2.5, poles: [{ delta_eps: 3.56, f0_GHz: 46.5, gamma_GHz: 0.55 }], sigma_S_per_m: 0 });
    const plasma = material('plasma', { model: 'drude', eps_inf: 1, plasma_GHz: 8, collision_GHz: 0, sigma_S_per_m: 0 });
    for (const stack of [stackOf([bulk(above, 30)], { band_GHz: [1, 2.2] }), stackOf([bulk(plasma, 10)], { band_GHz: [1, 5] })]) {
      const p = planGrid(stack);
      expect(p.courant).toBe(1);
      expect(p.layers.every((l) => Number.isFinite(l.cellsPerWavelength) && l.cellsPerWavelength > 0)).toBe(true);
      expect(Number.isFinite(p.predictedError)).toBe(true);
      expect(planGrid(stack, { courant: 0.5 }).courant).toBe(0.5);
    }
  });

  it('the limit is √(min ε∞): at 60° TE from air the front medium steps as ε = 1/4, so S ≤ 1/2; never a bound ≤ 0', () => {
    const stack = { ...stackOf([bulk(fixed(4), 10)]), incidence: { angle_rad: Math.PI / 3, polarization: 'TE' as const } };
    expect(planGrid(stack).courant).toBeCloseTo(0.5, 12);
    const e = refusal(stack, { courant: 0.6 });
    plain(e.message);
    expect(e.message).toMatch(/use at most 0\.5000/);
    for (const eps of [1e-6, 0.01, 0.3, 1, 7]) expect(courantLimit([lineMedium({ epsInf: eps, sigma: 0, debye: [], osc: [] })])).toBeGreaterThan(0);
  });

  it('grows with the slowest relaxation of the stepped media', () => {
    const debye = (tau_ps: number) => material('slow', { model: 'debye', eps_inf: 4, poles: [{ delta_eps: 3, tau_ps }], sigma_S_per_m: 0 });
    const fast = planGrid(stackOf([bulk(debye(20), 10)], { band_GHz: [1, 6] }));
    const slow = planGrid(stackOf([bulk(debye(2000), 10)], { band_GHz: [1, 6] }));
    expect(slow.slowestRelaxation_s).toBeCloseTo(2e-9, 20);
    // Energy falls 60 dB in τ·60·ln10/20 (amplitude e^{−t/τ}); the limit is three times the expectation.
    const extra = (2e-9 - 20e-12) * (60 * Math.LN10) / 20;
    expect((slow.stepsLimit - fast.stepsLimit) * slow.dt_s).toBeGreaterThan(2.5 * extra);
  });
});

describe('refusals in plain words', () => {
  it('a run too long says by how much and what to change; planning it is cheap (no grid is made)', () => {
    const e = refusal(stackOf([bulk(concrete, 20000)], { band_GHz: [1, 100] }));
    expect(e.code).toBe('too-much-work');
    plain(e.message);
    expect(e.message).toMatch(/× over/);
    expect(e.message).toMatch(/narrow the band/);
  });

  it('a grid too large says so, with the cell size and the limit', () => {
    const e = refusal(stackOf([bulk(fixed(10), 5000)], { band_GHz: [1, 3000] }));
    expect(e.code).toBe('too-many-cells');
    plain(e.message);
    expect(e.message).toMatch(/cells of [0-9.e-]+ mm \(the limit is/);
  });

  it('at a grazing angle the refusal names the small time step as the cause', () => {
    const stack = { ...stackOf([bulk(fixed(4, 0.01), 100)], { band_GHz: [1, 6] }), incidence: { angle_rad: (89.97 * Math.PI) / 180, polarization: 'TE' as const } };
    const e = refusal(stack);
    plain(e.message);
    expect(e.message).toMatch(/a smaller angle shortens the run/);
  });
});
