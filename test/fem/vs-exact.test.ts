// FEM against the exact layered solution (src/tmm, transfer matrices: Orfanidis ch. 5–8, ITU-R P.2040-3
// Attachment 1) at default settings: the accuracy target is max |R_fem − R_tmm|, |T_fem − T_tmm| ≤ 1e-5.

import { describe, expect, it } from 'vitest';
import { solveFem } from '../../src/fem/solve.ts';
import { compareSpectra } from '../../src/report/agreement.ts';
import type { Stack } from '../../src/stack/types.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { linspace } from '../../src/units.ts';
import { AIR, bulk, dielectric, layer, makeStack, prng, sheet } from '../support/build-stack.ts';

const TARGET = 1e-5;
// Water at 25 °C, one Debye pole (Kaatze 1989, from memory; physics.md).
const water = bulk({ model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: 73.16, tau_ps: 8.27 }], sigma_S_per_m: 0 }, 'water');
// ITU-R P.2040-3 Table 3 concrete and glass (power law, evaluated exactly).
const concrete = bulk({ model: 'power-law', a: 5.24, b: 0, c: 0.0462, d: 0.7822 }, 'concrete');
const glass = bulk({ model: 'power-law', a: 6.31, b: 0, c: 0.0036, d: 1.3394 }, 'glass');
const lorentz = bulk({ model: 'lorentz', eps_inf: 2, poles: [{ delta_eps: 1, f0_GHz: 6, gamma_GHz: 0.5 }], sigma_S_per_m: 0 }, 'res');
const drude = bulk({ model: 'drude', eps_inf: 1, plasma_GHz: 4, collision_GHz: 1, sigma_S_per_m: 0 }, 'plasma');

const CASES: Record<string, Stack> = {
  'lossless slab': makeStack({ layers: [layer(dielectric(4), 0.05)] }),
  'lossy multilayer on a dielectric': makeStack({ layers: [layer(dielectric(3, 0.05), 0.03), layer(AIR, 0.02), layer(dielectric(6), 0.01)], back: dielectric(2) }),
  'Debye water film on a conductor': makeStack({ layers: [layer(water, 0.004)], back: 'pec' }),
  'power-law concrete wall on wet soil': makeStack({ layers: [layer(concrete, 0.2)], back: dielectric(30, 0.1) }),
  'double glazing with a coated pane': makeStack({ layers: [layer(glass, 0.004), layer(AIR, 0.016), sheet(20), layer(glass, 0.004)] }),
  'Lorentz and Drude layers': makeStack({ layers: [layer(lorentz, 0.01), layer(drude, 0.005), layer(dielectric(2.2), 0.01)] }),
  'sheets at both faces': makeStack({ layers: [sheet(377), layer(dielectric(2.2), 0.0075), sheet(50)] }),
  'oblique TE 45° with a sheet': makeStack({ layers: [layer(dielectric(4), 0.05), sheet(300), layer(dielectric(2, 0.01), 0.02)], angle_deg: 45, polarization: 'TE' }),
  'oblique TM 45° with a sheet': makeStack({ layers: [layer(dielectric(4), 0.05), sheet(300), layer(dielectric(2, 0.01), 0.02)], angle_deg: 45, polarization: 'TM' }),
  'oblique TM 60° sheet on a conductor': makeStack({ layers: [sheet(100), layer(dielectric(4), 0.05)], angle_deg: 60, polarization: 'TM', back: 'pec' }),
  'evanescent air gap (front ε_r = 4, 45° TM)': makeStack({ front: dielectric(4), layers: [layer(dielectric(4), 0.01), layer(AIR, 0.005)], back: dielectric(4), angle_deg: 45, polarization: 'TM' }),
  'lossy front medium, oblique TE': makeStack({ front: dielectric(3, 0.01), layers: [layer(dielectric(5), 0.02)], back: AIR, angle_deg: 30, polarization: 'TE' }),
};

describe('FEM vs exact at default settings (target 1e-5)', () => {
  const f = linspace(1e9, 10e9, 101);
  for (const [name, stack] of Object.entries(CASES)) {
    it(name, () => {
      const { spectrum, mesh } = solveFem(stack, f);
      const a = compareSpectra(spectrum, solveTmm(stack, f));
      expect(a.R_max).toBeLessThan(TARGET);
      expect(a.T_max).toBeLessThan(TARGET);
      // The a-priori estimate is conservative: the measured error never exceeds it.
      expect(Math.max(a.R_max, a.T_max)).toBeLessThanOrEqual(Math.max(mesh.estimate, 1e-12));
    });
  }

  it('random stacks (seeded): lossy dielectrics, sheets, TE/TM, 0–75°, open or conductor back', () => {
    const rand = prng(20240607);
    for (let trial = 0; trial < 20; trial++) {
      const layers = [];
      const n = 1 + Math.floor(rand() * 5);
      for (let i = 0; i < n; i++) {
        if (rand() < 0.2) layers.push(sheet(20 + rand() * 800));
        else layers.push(layer(dielectric(1 + rand() * 9, rand() < 0.5 ? 0 : rand() * 0.3), 0.001 + rand() * 0.06));
      }
      const stack = makeStack({
        layers, back: rand() < 0.3 ? 'pec' : dielectric(1 + rand() * 5),
        angle_deg: rand() * 75, polarization: rand() < 0.5 ? 'TE' : 'TM',
      });
      const fr = linspace(0.5e9, 12e9, 23);
      const a = compareSpectra(solveFem(stack, fr).spectrum, solveTmm(stack, fr));
      expect(a.R_max, `trial ${trial}`).toBeLessThan(TARGET);
      expect(a.T_max, `trial ${trial}`).toBeLessThan(TARGET);
    }
  });

  it('the a-priori estimate is never below the measured error (120 random stacks of every bulk model, resonant ones included)', () => {
    // Resonant stacks are the hard case: a lossless layer on a conductor magnifies a phase error by its bounce factor.
    const rand = prng(2004);
    const pick = <T>(a: T[]): T => a[Math.floor(rand() * a.length)];
    let worst = 0;
    for (let trial = 0; trial < 120; trial++) {
      const layers = [];
      for (let i = 1 + Math.floor(rand() * 4); i > 0; i--) {
        if (rand() < 0.15) { layers.push(sheet(10 ** (1 + rand() * 3))); continue; }
        const model = pick(['fixed', 'lossy', 'debye', 'lorentz', 'drude', 'power-law']);
        const mat = model === 'fixed' ? dielectric(1 + rand() * 12)
          : model === 'lossy' ? dielectric(1 + rand() * 12, 10 ** (-6 + rand() * 6))
          : model === 'debye' ? bulk({ model, eps_inf: 1 + rand() * 5, poles: [{ delta_eps: rand() * 70, tau_ps: 1 + rand() * 30 }], sigma_S_per_m: 0 })
          : model === 'lorentz' ? bulk({ model, eps_inf: 1 + rand() * 3, poles: [{ delta_eps: rand() * 3, f0_GHz: 1 + rand() * 20, gamma_GHz: 0.1 + rand() * 2 }], sigma_S_per_m: 0 })
          : model === 'drude' ? bulk({ model, eps_inf: 1 + rand() * 3, plasma_GHz: 0.1 + rand() * 10, collision_GHz: rand() * 3, sigma_S_per_m: 0 })
          : bulk({ model: 'power-law', a: 1.5 + rand() * 6, b: 0, c: rand() * 0.05, d: rand() * 1.4 });
        layers.push(layer(mat, 10 ** (-4 + rand() * 3)));
      }
      const f1 = 10 ** (-1 + rand() * 2), f2 = f1 * (1 + rand() * 10);
      const stack = makeStack({
        layers, band_GHz: [f1, f2], back: rand() < 0.3 ? 'pec' : pick([AIR, dielectric(1 + rand() * 5)]),
        angle_deg: rand() < 0.4 ? 0 : rand() * 80, polarization: rand() < 0.5 ? 'TE' : 'TM',
      });
      const fr = linspace(f1 * 1e9, f2 * 1e9, 41);
      const { spectrum, mesh } = solveFem(stack, fr);
      const a = compareSpectra(spectrum, solveTmm(stack, fr));
      const err = Math.max(a.R_max, a.T_max);
      expect(err, `trial ${trial}`).toBeLessThanOrEqual(mesh.estimate);
      worst = Math.max(worst, err / mesh.estimate);
    }
    expect(worst).toBeGreaterThan(0.05); // the estimate is not loose by orders of magnitude either
  });
});
