// The pulse engine on the phase-matched line: TM at any angle, and magnetic media in either polarization.
// Sources: the line of a fixed transverse wavenumber (Born & Wolf §1.6; Orfanidis, Electromagnetic Waves and
// Antennas, ch. 7–8): TE series μ, shunt ε − s²/μ; TM series μ − s²/ε, shunt ε, s² = ε_f μ_f sin²θ. The
// references are the exact layered solution (src/tmm, itself checked against Fresnel with μ, the Brewster
// angle and the quarter-wave magnetic absorber in test/tmm) at the same angle, and the exact solution of the
// media as stepped (`solveEffective`), which isolates the engine's own error from the fits'.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { planGrid } from '../../src/fdtd/plan.ts';
import { createPulseRun, runToEndSync } from '../../src/fdtd/run.ts';
import { solveEffective } from '../../src/fdtd/stepped-exact.ts';
import { steppedStack } from '../../src/fdtd/stepped-stack.ts';
import { catalogMaterial } from '../../src/materials/catalog.ts';
import type { BulkModel, MagneticModel } from '../../src/materials/types.ts';
import type { BulkMaterial, Stack } from '../../src/stack/types.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { linspace } from '../../src/units.ts';
import { maxDiff, runSpectrum } from './measure.ts';
import { bulk, fixed, material, stackOf } from './stacks.ts';

const at = (stack: Stack, angle_deg: number, polarization: 'TE' | 'TM'): Stack =>
  ({ ...stack, incidence: { angle_rad: (angle_deg * Math.PI) / 180, polarization } });
const magnetic = (name: string, spec: BulkModel, mu: MagneticModel): BulkMaterial => material(name, { ...spec, magnetic: mu } as BulkModel);

// Test stacks (parameters chosen for the test, not data of any product).
const skin = material('skin', { model: 'debye', eps_inf: 3.9, poles: [{ delta_eps: 0.4, tau_ps: 12 }], sigma_S_per_m: 0.02 });
const foam = material('foam', { model: 'fixed', eps_r: 1.1, sigma_S_per_m: 0.0005 });
// Water: a single Debye pole (Kaatze 1989 at 25 °C, from memory).
const water = material('water', { model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: 73.16, tau_ps: 8.27 }], sigma_S_per_m: 0 });
// Glass: the ITU-R P.2040-3 Table 3 power law, from the catalog.
const glass = catalogMaterial('glass')! as BulkMaterial;
const loaded = magnetic('loaded-rubber', { model: 'fixed', eps_r: 12, sigma_S_per_m: 0.05 },
  { model: 'lorentz', mu_inf: 1, poles: [{ delta_mu: 3, f0_GHz: 2.5, gamma_GHz: 5 }] });
const ferrite = magnetic('ferrite', { model: 'fixed', eps_r: 8, sigma_S_per_m: 0 }, { model: 'fixed', mu_r: 2, mu_loss: 0.6 });
const relaxing = magnetic('relaxing', { model: 'fixed', eps_r: 4, sigma_S_per_m: 0.01 }, { model: 'debye', mu_inf: 1.3, poles: [{ delta_mu: 2, tau_ps: 60 }] });

const STACKS: [string, Stack][] = [
  ['radome sandwich, lossy skins on a foam core', stackOf([bulk(skin, 0.8), bulk(foam, 8), bulk(skin, 0.8)], { band_GHz: [8, 12] })],
  ['Debye water film', stackOf([bulk(water, 1)], { band_GHz: [1, 6] })],
  ['ITU glass pane', stackOf([bulk(glass, 6)], { band_GHz: [1, 6] })],
  ['magnetic absorber on a conductor', stackOf([bulk(loaded, 4)], { band_GHz: [2, 6], back: 'pec' })],
];

/** The run's worst |ΔR|, |ΔT| against the stepped media and against the exact solution of the stack. */
function errors(stack: Stack) {
  const run = runToEndSync(createPulseRun(stack));
  const f = linspace(stack.band_Hz[0], stack.band_Hz[1], 31);
  const got = runSpectrum(run, f);
  const engine = maxDiff(got, solveEffective(run.plan.effective, f)), total = maxDiff(got, solveTmm(stack, f));
  return { run, engine: Math.max(engine.R, engine.T), total: Math.max(total.R, total.T) };
}

describe('TM at 30°, 50° and 70°: the engine within its target against the stepped media', () => {
  for (const [name, stack] of STACKS) {
    it(name, () => {
      for (const deg of [30, 50, 70]) {
        const s = at(stack, deg, 'TM');
        const { run, engine, total } = errors(s);
        expect(run.doneReason, `${deg}°`).toBe('converged');
        expect(engine, `${deg}°`).toBeLessThan(run.plan.accuracyTarget);
        // The planner predicts it (the grid's exact response, series side included).
        expect(Math.abs(engine - run.plan.predictedError), `${deg}°`).toBeLessThan(0.1 * run.plan.accuracyTarget);
        // Against the stack's own media: within the target plus the fit's share (the glass power law only).
        const fitShare = run.plan.fits.reduce((a, fit) => Math.max(a, fit.maxRelErr_abs), 0);
        expect(total, `${deg}°`).toBeLessThan(run.plan.accuracyTarget + 2 * fitShare);
        // The angle and polarization were really applied: TM differs from TE here.
        if (deg === 50) {
          const te = solveTmm(at(stack, deg, 'TE'), Float64Array.of(s.band_Hz[1])), tm = solveTmm(s, Float64Array.of(s.band_Hz[1]));
          expect(Math.hypot(te.R_re[0] - tm.R_re[0], te.R_im[0] - tm.R_im[0])).toBeGreaterThan(0.02);
        }
      }
    });
  }
});

describe('magnetic media in TE (μ ≠ 1)', () => {
  it('a Lorentz-μ absorber, a Debye-μ layer and a fixed lossy μ (fitted), at 0° and 45°: within the target', () => {
    const stacks = [
      stackOf([bulk(loaded, 4)], { band_GHz: [2, 6], back: 'pec' }),
      stackOf([bulk(relaxing, 6.3), bulk(fixed(2.5), 3.1)], { band_GHz: [1, 5], back: fixed(3) }),
      stackOf([bulk(ferrite, 3)], { band_GHz: [2, 6], back: 'pec' }),
    ];
    for (const stack of stacks) {
      for (const deg of [0, 45]) {
        const s = at(stack, deg, 'TE');
        const { run, engine, total } = errors(s);
        expect(engine, `${stack.layers[0].material.name} ${deg}°`).toBeLessThan(run.plan.accuracyTarget);
        const fitShare = run.plan.fits.reduce((a, f) => Math.max(a, f.maxRelErr_abs), 0);
        expect(total).toBeLessThan(run.plan.accuracyTarget + 2 * fitShare);
      }
    }
  });

  it('a fixed μ with loss is stepped as a fitted causal model, reported as such', () => {
    const plan = planGrid(stackOf([bulk(ferrite, 3)], { band_GHz: [2, 6], back: 'pec' }));
    expect(plan.fits).toHaveLength(1);
    expect(plan.fits[0].quantity).toBe('permeability');
    // Constant μ'' is not causal (Kramers–Kronig), so a residue of order a per cent remains over a 3:1 band.
    expect(plan.fits[0].maxRelErr_abs).toBeLessThan(0.05);
    expect(plan.effective.substitutions).toBe(1);
  });
});

describe('a measured μ table', () => {
  it('is stepped as a fitted causal model: a table sampled from the Lorentz μ above runs like the Lorentz model, TM at 40°', () => {
    const mu = (f_GHz: number) => { const r = f_GHz / 2.5, d = (1 - r * r) ** 2 + (r * 2) ** 2; return { re: 1 + (3 * (1 - r * r)) / d, loss: (3 * r * 2) / d }; };
    const rows = Array.from({ length: 41 }, (_, i) => 1 + (7 * i) / 40).map((f): [number, number, number] => [f, mu(f).re, mu(f).loss]);
    const eps = rows.map(([f]): [number, number, number] => [f, 12, 0.05 / (2 * Math.PI * f * 1e9 * 8.8541878128e-12)]);
    const table = material('sampled', { model: 'table', points: eps, mu_points: rows } as BulkModel);
    const s = at(stackOf([bulk(table, 4)], { band_GHz: [2, 6], back: 'pec' }), 40, 'TM');
    const { run, engine, total } = errors(s);
    expect(run.plan.fits.map((f) => `${f.quantity}/${f.source}`)).toEqual(['permittivity/table', 'permeability/table']);
    expect(engine).toBeLessThan(run.plan.accuracyTarget);
    // Against the Lorentz model the table was sampled from (the exact solver on it).
    const f = linspace(2e9, 6e9, 31);
    const lorentz = maxDiff(runSpectrum(run, f), solveTmm(at(stackOf([bulk(loaded, 4)], { band_GHz: [2, 6], back: 'pec' }), 40, 'TM'), f));
    expect(Math.max(lorentz.R, lorentz.T)).toBeLessThan(run.plan.accuracyTarget);
    expect(total).toBeLessThan(run.plan.accuracyTarget);
  });
});

describe('the line the engine steps is the stack at its angle', () => {
  it('its exact solution equals the stack\'s at the angle to rounding of the partial fractions (TM and TE, μ and ε dispersive)', () => {
    const f = linspace(1e9, 8e9, 29);
    const stacks = [
      stackOf([bulk(skin, 2), bulk(water, 0.8), bulk(loaded, 3), bulk(relaxing, 5)], { back: fixed(3) }),
      stackOf([bulk(relaxing, 4), bulk(fixed(4, 0.2), 7)], { back: 'pec' }),
    ];
    for (const stack of stacks) {
      for (const pol of ['TE', 'TM'] as const) {
        for (const deg of [20, 65]) {
          const s = at(stack, deg, pol);
          const line = solveEffective(planGrid(s).effective, f), exact = solveTmm(s, f);
          for (let k = 0; k < f.length; k++) {
            expect(Math.hypot(line.R_re[k] - exact.R_re[k], line.R_im[k] - exact.R_im[k])).toBeLessThan(1e-9);
            expect(Math.hypot(line.T_re[k] - exact.T_re[k], line.T_im[k] - exact.T_im[k])).toBeLessThan(1e-9);
          }
        }
      }
    }
  });

  it('--media stepped writes the fitted permeability back as a magnetic block whose exact solution is the line\'s', () => {
    const s = at(stackOf([bulk(ferrite, 3), bulk(glass, 4)], { band_GHz: [2, 6] }), 40, 'TM');
    const stepped = steppedStack(s);
    const mu = (stepped.layers[0].material.spec as { magnetic?: MagneticModel }).magnetic;
    expect(mu?.model).toBe('lorentz');
    const f = linspace(2e9, 6e9, 17);
    const a = solveTmm(stepped, f), b = solveEffective(planGrid(s).effective, f);
    for (let k = 0; k < f.length; k++) expect(Math.hypot(a.R_re[k] - b.R_re[k], a.R_im[k] - b.R_im[k])).toBeLessThan(1e-9);
  });

  it('TF/SF stays exact: with nothing to scatter, the reflected record is rounding (magnetic dispersive medium; TM at 60°)', () => {
    for (const s of [stackOf([], { front: relaxing, back: relaxing, band_GHz: [1, 5] }), at(stackOf([bulk(fixed(1, 0, 'air'), 5)], { band_GHz: [1, 5] }), 60, 'TM')]) {
      // On the view's layout the incident grid spans the main grid and ends in the same CPML: total − incident is
      // the scattered field to rounding. The lean layout's incident grid ends ten cells behind the front face, so
      // its CPML's echo (about 1e-6 of the pulse, as any CPML's) is what the reflected record holds there.
      const leak = (forView: boolean) => {
        const r = runToEndSync(createPulseRun(s, { forView })).records();
        return Math.max(...r.reflected.map(Math.abs)) / Math.max(...r.incident.map(Math.abs));
      };
      expect(leak(true)).toBeLessThan(1e-12);
      expect(leak(false)).toBeLessThan(3e-6);
    }
  });
});

describe('random magnetic poles at random angles (property)', () => {
  it('runs stay finite, decay, and stay within the target against the stepped media', () => {
    const pole = fc.oneof(
      fc.record({ kind: fc.constant('debye' as const), dmu: fc.double({ min: 0.1, max: 5, noNaN: true }), lg: fc.double({ min: -1.5, max: 1, noNaN: true }) }),
      fc.record({ kind: fc.constant('lorentz' as const), dmu: fc.double({ min: 0.1, max: 5, noNaN: true }), lg: fc.double({ min: -1, max: 1, noNaN: true }), q: fc.double({ min: 0.2, max: 5, noNaN: true }) }),
    );
    fc.assert(fc.property(pole, fc.double({ min: 1, max: 3, noNaN: true }), fc.double({ min: 2, max: 10, noNaN: true }), fc.double({ min: 0, max: 0.2, noNaN: true }),
      fc.double({ min: 0, max: 70, noNaN: true }), fc.boolean(), fc.double({ min: 2, max: 8, noNaN: true }), fc.boolean(),
      (p, muInf, eps, sigma, deg, te, thickness_mm, onConductor) => {
        // Pole frequencies from 0.1× to 10× the band centre (3 GHz): inside and around the band.
        const f0_GHz = 3 * 10 ** p.lg;
        const mu: MagneticModel = p.kind === 'debye'
          ? { model: 'debye', mu_inf: muInf, poles: [{ delta_mu: p.dmu, tau_ps: 1e3 / (2 * Math.PI * f0_GHz) }] }
          : { model: 'lorentz', mu_inf: muInf, poles: [{ delta_mu: p.dmu, f0_GHz, gamma_GHz: f0_GHz / p.q }] };
        const layer = magnetic('random', { model: 'fixed', eps_r: eps, sigma_S_per_m: sigma }, mu);
        const stack = at(stackOf([bulk(layer, thickness_mm)], { band_GHz: [2, 4], back: onConductor ? 'pec' : fixed(2) }), deg, te ? 'TE' : 'TM');
        const run = runToEndSync(createPulseRun(stack, { accuracy: 0.02 }));
        const r = run.records();
        for (const key of ['incident', 'reflected', 'transmitted'] as const) expect(r[key].every(Number.isFinite)).toBe(true);
        expect(run.doneReason).toBe('converged');
        expect(run.energy().level_dB).toBeLessThan(-40);
        const f = linspace(2e9, 4e9, 9);
        const e = maxDiff(runSpectrum(run, f), solveEffective(run.plan.effective, f));
        expect(Math.max(e.R, e.T)).toBeLessThan(run.plan.accuracyTarget);
      }), { numRuns: 10 });
  });
});
