// A stack with a magnetic material through the report pipelines: μ_r at the band centre in the summary,
// the FEM row within its target, the tangential H in TM, and the pulse engine stepping it (the exact and FEM
// results still written beside it).

import { describe, expect, it } from 'vitest';
import { materialRow, parameterText } from '../../src/cli/commands/materials.ts';
import { runReport } from '../../src/report/run.ts';
import { solveReport } from '../../src/report/solve.ts';
import { findColumn } from '../../src/report/table.ts';
import { parseStackObject } from '../../src/stack/parse.ts';

const absorber = (polarization: 'TE' | 'TM', angle_deg = 0) => {
  const r = parseStackObject({
    title: 'Test absorber', band_GHz: [2, 6], points: 9, back: 'pec', incidence: { angle_deg, polarization },
    materials: {
      'loaded-rubber': {
        model: 'fixed', eps_r: 10,
        magnetic: { model: 'lorentz', mu_inf: 1, poles: [{ delta_mu: 3, f0_GHz: 2, gamma_GHz: 4 }] },
      },
    },
    layers: [{ material: 'loaded-rubber', thickness_mm: 4 }],
  });
  if (!r.ok) throw new Error(r.errors.join('\n'));
  return r.stack;
};

describe('magnetic materials in the reports', () => {
  it('the summary gives μ_r at the band centre beside ε_r: Lorentz μ∞ + Δμ f0²/(f0² − f² + j f γ) at 4 GHz', () => {
    const rep = solveReport(absorber('TE'));
    const layer = (rep.summary.layers as Record<string, unknown>[])[0];
    // The Lorentz closed form evaluated by hand at f = 4 GHz: 1 + 3·4/(4 − 16 + j·16) = 1 + 12(−12 − 16j)/400.
    const mu = layer.mu_r_at_centre as { re: number; im: number };
    expect(mu.re).toBeCloseTo(1 - 144 / 400, 12);
    expect(mu.im).toBeCloseTo(-192 / 400, 12);
    expect(layer.parameters).toMatchObject({ magnetic: { model: 'lorentz', mu_inf: 1 } });
    expect((rep.summary.front as Record<string, unknown>).mu_r_at_centre).toBeUndefined(); // air: none
    const fem = rep.agreement.find((a) => a.pair === 'fem-tmm')!;
    expect(fem.within_target).toBe(true);
    // Absorption: all power that is not reflected is absorbed in front of the conductor.
    const res = rep.summary.results as Record<string, number>;
    expect(res.absorbed_fraction_max).toBeGreaterThan(0.1);
    expect(res.absorbed_fraction_max).toBeLessThanOrEqual(1);
  });

  it('TM at 40° writes the tangential H of both methods beside E', () => {
    const rep = solveReport(absorber('TM', 40));
    expect(rep.profile.map((c) => c.name)).toEqual(['x_mm', 'E_tmm_re', 'E_tmm_im', 'H_tmm_re', 'H_tmm_im', 'E_fem_re', 'E_fem_im', 'H_fem_re', 'H_fem_im']);
    // On the conductor's face (the last row) the tangential E vanishes and the tangential H does not.
    const x = findColumn(rep.profile, 'x_mm')!.data, last = x.length - 1;
    expect(x[last]).toBeCloseTo(4, 12);
    expect(Math.abs(findColumn(rep.profile, 'E_tmm_re')!.data[last])).toBeLessThan(1e-12);
    expect(Math.abs(findColumn(rep.profile, 'H_tmm_re')!.data[last]) + Math.abs(findColumn(rep.profile, 'H_tmm_im')!.data[last])).toBeGreaterThan(0.1);
  });

  it('the pulse engine steps a magnetic stack, its agreement row within the target; solve\'s results are kept', async () => {
    const r = await runReport(absorber('TE'));
    expect(r.skipped).toBeUndefined();
    expect(r.trace.every((c) => c.data.length > 100)).toBe(true);
    const row = r.agreement.find((a) => a.pair === 'fdtd-tmm')!;
    expect(Math.max(row.R_max, row.T_max)).toBeLessThan(0.01);
    expect(findColumn(r.spectrum, 'R_fem_re')).toBeDefined();
    expect(findColumn(r.profile, 'E_tmm_re')).toBeDefined();
  });

  it('a fixed μ with loss: stepped as a fitted causal model, in summary.permeability_fits as a magnetic block, its share in its own row', async () => {
    const r = parseStackObject({
      title: 'Test ferrite tile', band_GHz: [2, 6], points: 9, back: 'pec',
      materials: { tile: { model: 'fixed', eps_r: 8, magnetic: { model: 'fixed', mu_r: 2, mu_loss: 0.6 } } },
      layers: [{ material: 'tile', thickness_mm: 3 }],
    });
    if (!r.ok) throw new Error(r.errors.join('\n'));
    const rep = await runReport(r.stack);
    const fits = rep.summary.permeability_fits as { material: string; magnetic: { model: string; mu_inf: number; poles: unknown[] } }[];
    expect(fits).toHaveLength(1);
    expect(fits[0].material).toBe('tile');
    expect(fits[0].magnetic.model).toBe('lorentz');
    expect(fits[0].magnetic.poles.length).toBeGreaterThan(0);
    expect(rep.summary.power_law_fits).toEqual([]);
    const pairs = rep.agreement.map((a) => a.pair);
    expect(pairs).toEqual(expect.arrayContaining(['fdtd-tmm as stepped', 'stepped media-tmm']));
    const own = rep.agreement.find((a) => a.pair === 'fdtd-tmm as stepped')!;
    expect(Math.max(own.R_max, own.T_max)).toBeLessThan(0.01);
  });

  it('the materials listing shows the permeability parameters and, at a frequency, μ\' and μ\'\'', () => {
    const m = absorber('TE').layers[0].material;
    expect(parameterText(m)).toBe('ε_r=10 σ=0 μ: μ∞=1 Δμ=3 f0=2 γ=4GHz');
    const row = materialRow(m, 4);
    expect(row.mu_r).toBeCloseTo(0.64, 6);
    expect(row.mu_loss).toBeCloseTo(0.48, 6);
    expect(materialRow(absorber('TE').front, 4).mu_r).toBeUndefined();
  });
});
