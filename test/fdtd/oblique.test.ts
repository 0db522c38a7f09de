// Oblique TE incidence stepped as normal incidence on media of permittivity ε_r − ε_front sin²θ.
// Sources: phase matching and the TE transverse admittance k_x/(ωμ0) (Born & Wolf §1.6; Orfanidis,
// Electromagnetic Waves and Antennas, ch. 7); reference values from the exact solver at the same angle.

import { describe, expect, it } from 'vitest';
import { PlanError } from '../../src/fdtd/errors.ts';
import { planGrid } from '../../src/fdtd/plan.ts';
import { createPulseRun, runToEndSync } from '../../src/fdtd/run.ts';
import { solveEffective } from '../../src/fdtd/stepped-exact.ts';
import type { Stack } from '../../src/stack/types.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { linspace } from '../../src/units.ts';
import { maxDiff, runSpectrum } from './measure.ts';
import { bulk, fixed, material, sheet, stackOf } from './stacks.ts';

const at = (stack: Stack, angle_deg: number, polarization: 'TE' | 'TM' = 'TE'): Stack =>
  ({ ...stack, incidence: { angle_rad: (angle_deg * Math.PI) / 180, polarization } });

const water = material('water', { model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: 73.16, tau_ps: 8.27 }], sigma_S_per_m: 0 });

describe('oblique TE as an equivalent normal-incidence problem', () => {
  it('the shifted media reproduce the exact oblique R and T to rounding (lossy, Debye, sheet, conductor)', () => {
    const f = linspace(1e9, 10e9, 37);
    for (const back of [fixed(3), 'pec'] as const) {
      const stack = at(stackOf([bulk(fixed(4, 0.05), 20), sheet(150), bulk(water, 1.5), bulk(fixed(2.2), 12)], { back }), 50);
      const stepped = solveEffective(planGrid(stack).effective, f);
      const exact = solveTmm(stack, f);
      const normal = solveTmm(at(stack, 0), f); // the angle matters: far from the normal-incidence answer
      expect(Math.max(...exact.R_re.map((r, k) => Math.abs(r - normal.R_re[k])))).toBeGreaterThan(0.05);
      for (let k = 0; k < f.length; k++) {
        expect(Math.hypot(stepped.R_re[k] - exact.R_re[k], stepped.R_im[k] - exact.R_im[k])).toBeLessThan(1e-12);
        expect(Math.hypot(stepped.T_re[k] - exact.T_re[k], stepped.T_im[k] - exact.T_im[k])).toBeLessThan(1e-12);
      }
    }
  });

  it('a pulse run at 45° TE on a lossy slab agrees with the exact solver within its accuracy target', () => {
    const stack = at(stackOf([bulk(fixed(4, 0.02), 25)], { band_GHz: [1, 8] }), 45);
    const run = createPulseRun(stack);
    runToEndSync(run);
    const f = linspace(1e9, 8e9, 29);
    const err = maxDiff(runSpectrum(run, f), solveTmm(stack, f));
    expect(err.R).toBeLessThan(run.plan.accuracyTarget);
    expect(err.T).toBeLessThan(run.plan.accuracyTarget);
    // and it differs clearly from the normal-incidence answer, so the angle was really applied
    const normal = maxDiff(runSpectrum(run, f), solveTmm(at(stack, 0), f));
    expect(Math.max(normal.R, normal.T)).toBeGreaterThan(0.05);
  });

  it('refuses only a layer evanescent up to any frequency, naming the angle that works', () => {
    const fromGlass = stackOf([bulk(fixed(1, 0, 'air'), 10)], { front: fixed(4), back: fixed(4) });
    // The critical angle from ε = 4 into ε = 1 is asin(1/2) = 30° (Snell's law, Born & Wolf §1.5).
    for (const pol of ['TE', 'TM'] as const) {
      expect(() => planGrid(at(fromGlass, 40, pol))).toThrow(/no stable stepping; use an angle below 30.0°/);
      expect(() => planGrid(at(fromGlass, 20, pol))).not.toThrow(); // below the critical angle (30°)
    }
  });
});
