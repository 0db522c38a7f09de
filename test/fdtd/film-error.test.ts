// A conductive film stepped as a resistive sheet: the sheet's excess transmission, said in the warning,
// against the exact solution of the film itself and of the sheet. Sources: Schelkunoff's transmission-line
// model of shielding (absorption term e^{d/δ}, 8.686 dB per skin depth; Ott, Electromagnetic Compatibility
// Engineering, ch. 6); |sinh((1+j)u)|² = sinh²u + sin²u (closed form).
import { describe, expect, it } from 'vitest';
import { sheetExcessTransmission_dB } from '../../src/fdtd/film-error.ts';
import { planGrid } from '../../src/fdtd/plan.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { MU0_H_per_m } from '../../src/units.ts';
import { bulk, material, sheet, stackOf } from './stacks.ts';

const dB = (re: number, im: number) => 20 * Math.log10(Math.hypot(re, im));
const skinDepth_m = (sigma: number, f_Hz: number) => Math.sqrt(2 / (2 * Math.PI * f_Hz * MU0_H_per_m * sigma));

describe('a conductive film as a sheet', () => {
  it('the excess transmission follows |sinh γd/γd|: 0 for thin films, 8.686 dB per skin depth for thick ones', () => {
    expect(sheetExcessTransmission_dB(0)).toBe(0);
    expect(sheetExcessTransmission_dB(0.01)).toBeLessThan(1e-6);
    // Large u: 20 log10(e^u / 2) − 20 log10(√2 u), the Schelkunoff absorption term less the sheet's share.
    for (const u of [25, 100, 400]) {
      expect(sheetExcessTransmission_dB(u)).toBeCloseTo(20 * (u * Math.LOG10E - Math.log10(2)) - 20 * Math.log10(Math.SQRT2 * u), 9);
    }
    // Continuity across the switch to the asymptotic form.
    expect(Math.abs(sheetExcessTransmission_dB(19.999999) - sheetExcessTransmission_dB(20.000001))).toBeLessThan(1e-4);
  });

  it('equals the exact film-vs-sheet difference of |T| (copper-like foils, 0.5 to 8 skin depths)', () => {
    const sigma = 5.8e7, f = 2e9, delta = skinDepth_m(sigma, f);
    for (const u of [0.5, 1, 2, 4.8, 8]) {
      const d_mm = u * delta * 1e3;
      const foil = material('foil', { model: 'fixed', eps_r: 1, sigma_S_per_m: sigma });
      const fs = new Float64Array([f]);
      const film = solveTmm(stackOf([bulk(foil, d_mm)]), fs);
      const asSheet = solveTmm(stackOf([sheet(1 / (sigma * d_mm * 1e-3))]), fs);
      const excess = dB(asSheet.T_re[0], asSheet.T_im[0]) - dB(film.T_re[0], film.T_im[0]);
      // The closed form assumes η0 ≫ the film's impedance (true for metals by 6 orders).
      expect(Math.abs(excess - sheetExcessTransmission_dB(u))).toBeLessThan(0.01);
    }
  });

  it('the planning warning says how much shielding the pulse run misses, and where to take it from', () => {
    const foil = material('foil', { model: 'fixed', eps_r: 1, sigma_S_per_m: 5.8e7 });
    const plan = planGrid(stackOf([bulk(foil, 0.010)], { band_GHz: [1, 2] })); // 10 µm: 4.8 skin depths at 2 GHz
    const w = plan.warnings.find((x) => x.includes('resistive sheet'));
    expect(w).toBeDefined();
    const u = 0.010e-3 / skinDepth_m(5.8e7, 2e9);
    expect(w).toContain(`${sheetExcessTransmission_dB(u).toFixed(1)} dB too high`);
    expect(w).toContain('exact solution');
    // A film far thinner than δ: no shielding note.
    const thin = planGrid(stackOf([bulk(foil, 0.00001)], { band_GHz: [1, 2] }));
    expect(thin.warnings.find((x) => x.includes('resistive sheet'))).not.toContain('too high');
  });
});
