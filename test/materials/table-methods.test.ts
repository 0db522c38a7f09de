// A table built from samples of a Debye model stands in for that model in all three methods: the exact solver
// and the FEM interpolate it (PCHIP in ln f), the pulse engine fits it with its causal model. The reference is
// the Debye closed form ε = ε∞ + Δε/(1 + jωτ) (Debye, Polar Molecules, 1929; any dielectrics text), solved by
// the same method, so each figure is the table's own share. 41 log-spaced rows over 2–12 GHz.
import { describe, expect, it } from 'vitest';
import { stepModelPermittivity } from '../../src/fdtd/media.ts';
import { createPulseRun, runToEndSync } from '../../src/fdtd/run.ts';
import { solveFem } from '../../src/fem/solve.ts';
import { permittivity } from '../../src/materials/permittivity.ts';
import type { DebyeModel } from '../../src/materials/types.ts';
import { compareSpectra } from '../../src/report/agreement.ts';
import { runReport } from '../../src/report/run.ts';
import { spectrumFromRecords } from '../../src/spectra/spectrum.ts';
import { parseStackObject } from '../../src/stack/parse.ts';
import type { Stack } from '../../src/stack/types.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { linspace } from '../../src/units.ts';

const DEBYE: DebyeModel = { model: 'debye', eps_inf: 2.5, poles: [{ delta_eps: 4, tau_ps: 15 }], sigma_S_per_m: 0.02 };
const BAND: [number, number] = [2, 12];
const ROWS = 41;
const TOL = 1e-4;

function sampled(m: DebyeModel, n: number): number[][] {
  return Array.from({ length: n }, (_, i) => {
    const f = BAND[0] * Math.pow(BAND[1] / BAND[0], i / (n - 1));
    const e = permittivity(m, f * 1e9);
    return [f, e.re, -e.im];
  });
}

function pair(incidence?: Record<string, unknown>, back = 'air'): [Stack, Stack] {
  const file = (mat: unknown) => ({
    band_GHz: BAND, back, points: 51, materials: { m: mat }, ...(incidence ? { incidence } : {}),
    layers: [{ material: 'm', thickness_mm: 20 }],
  });
  const a = parseStackObject(file(DEBYE)), b = parseStackObject(file({ model: 'table', points: sampled(DEBYE, ROWS) }));
  if (!a.ok || !b.ok) throw new Error('stacks did not parse');
  return [a.stack, b.stack];
}
const f = linspace(BAND[0] * 1e9, BAND[1] * 1e9, 51);

describe('a table sampled from a Debye model reproduces its R and T', () => {
  it('exact solver: normal incidence, TM at 40°, before a conductor', () => {
    for (const [debye, table] of [pair(), pair({ angle_deg: 40, polarization: 'TM' }), pair(undefined, 'pec')]) {
      const d = compareSpectra(solveTmm(table, f), solveTmm(debye, f));
      expect(d.R_max).toBeLessThan(TOL);
      expect(d.T_max).toBeLessThan(TOL);
    }
  });

  it('FEM: normal incidence and TE at 30°', () => {
    for (const [debye, table] of [pair(), pair({ angle_deg: 30, polarization: 'TE' })]) {
      const d = compareSpectra(solveFem(table, f).spectrum, solveFem(debye, f).spectrum);
      expect(d.R_max).toBeLessThan(TOL);
      expect(d.T_max).toBeLessThan(TOL);
    }
  });

  it('pulse engine: the table is fitted (its error reported, recomputed here) and the run matches the Debye run', () => {
    const [debye, table] = pair();
    const runs = [debye, table].map((s) => { const r = createPulseRun(s); runToEndSync(r); return r; });
    const fit = runs[1].plan.fits[0];
    expect(fit.source).toBe('table');
    expect(fit.material).toBe('m');
    // The fitted model against the Debye closed form itself (the reported figure is against the table).
    let eRe = 0, eIm = 0;
    for (const x of f) {
      const want = permittivity(DEBYE, x), got = stepModelPermittivity(fit.model, x);
      eRe = Math.max(eRe, Math.abs(got.re - want.re) / want.re);
      eIm = Math.max(eIm, Math.abs(got.im - want.im) / -want.im);
    }
    expect(eRe).toBeLessThan(fit.maxRelErr_re + 1e-4);
    expect(eIm).toBeLessThan(fit.maxRelErr_im + 1e-4);
    expect(fit.maxRelErr_re).toBeLessThan(1e-3);
    expect(fit.maxRelErr_im).toBeLessThan(3e-3);
    const [sd, st] = runs.map((r) => spectrumFromRecords(r.records(), f));
    const d = compareSpectra(st, sd);
    expect(d.R_max).toBeLessThan(TOL);
    expect(d.T_max).toBeLessThan(TOL);
  });

  it('the run report names the table fit and its error, and its methods agree with each other', async () => {
    const [, table] = pair();
    const r = await runReport({ ...table, points: 11 });
    const fits = r.summary.power_law_fits as { material: string; source_model: string; max_rel_error_eps_re: number }[];
    expect(fits).toHaveLength(1);
    expect(fits[0]).toMatchObject({ material: 'm', source_model: 'table' });
    expect(fits[0].max_rel_error_eps_re).toBeLessThan(1e-3);
    const rows = r.agreement as { pair: string; within_target?: boolean }[];
    expect(rows.find((x) => x.pair === 'fem-tmm')?.within_target).toBe(true);
    expect(rows.find((x) => x.pair === 'fdtd-tmm')?.within_target).toBe(true);
  });
});
