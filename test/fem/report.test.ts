// The FEM in the report and the CLI: every preset at default settings meets the accuracy target against the
// exact solver (max |R_fem − R_tmm|, |T_fem − T_tmm| ≤ 1e-5, the acceptance figure), the profile carries
// ≥ 10 samples per FEM element, a bare conductor's report profile shows the standing-wave facts (common
// practice, no source), and `converge` prints orders near 2p (Ihlenburg & Babuška 1995; Ainsworth 2004).

import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { planProfileMesh } from '../../src/fem/profile.ts';
import { formatAgreement, type AgreementRow } from '../../src/report/format-agreement.ts';
import { solveReport } from '../../src/report/solve.ts';
import { findColumn } from '../../src/report/table.ts';
import { parseStackText } from '../../src/stack/parse.ts';
import { C0_m_per_s } from '../../src/units.ts';
import { makeStack } from '../support/build-stack.ts';
import { cli } from '../cli/support.ts';

const presets = readdirSync('presets').filter((f) => f.endsWith('.stack.json')).sort();
const load = (name: string) => {
  const r = parseStackText(readFileSync(join('presets', name), 'utf8'));
  if (!r.ok) throw new Error(r.errors.join('\n'));
  return r.stack;
};

describe('FEM in the report, every preset at defaults', () => {
  for (const name of presets) {
    it(`${name}: fem-tmm within 1e-5, columns present, profile ≥ 10 samples per element`, () => {
      const stack = load(name);
      const rep = solveReport(stack);
      const row = rep.agreement.find((r) => r.pair === 'fem-tmm')!;
      expect(row.R_max).toBeLessThanOrEqual(1e-5);
      expect(row.T_max).toBeLessThanOrEqual(1e-5);
      expect(row.within_target).toBe(true);
      expect((rep.summary.fem as { order: number }).order).toBeGreaterThanOrEqual(1);
      for (const c of ['R_fem_re', 'R_fem_im', 'T_fem_re', 'T_fem_im']) expect(findColumn(rep.spectrum, c)).toBeDefined();
      const x = findColumn(rep.profile, 'x_mm')!.data;
      expect(findColumn(rep.profile, 'E_fem_re')).toBeDefined();
      const tm = stack.incidence.polarization === 'TM';
      expect(findColumn(rep.profile, 'H_fem_re') !== undefined).toBe(tm);
      const mesh = planProfileMesh(stack, stack.profile_Hz, x[0] / 1e3, x[x.length - 1] / 1e3, {}, tm);
      for (let s = 0; s < mesh.segRegion.length; s++) {
        if (mesh.segRegion[s] < 0) continue;
        const a = mesh.segX0[s] * 1e3, b = a + mesh.segH[s] * 1e3;
        let n = 0;
        for (const v of x) if (v >= a - 1e-9 && v < b - 1e-9) n++;
        expect(n).toBeGreaterThanOrEqual(10);
      }
    });
  }
});

describe('bare conductor profile in the report (common practice, no source)', () => {
  it('E_fem peaks at 2 with nulls every half wavelength over 1.5 wavelengths in front', () => {
    const stack = makeStack({ back: 'pec', band_GHz: [1, 10], profile_GHz: 3 });
    const rep = solveReport(stack);
    const x = findColumn(rep.profile, 'x_mm')!.data, re = findColumn(rep.profile, 'E_fem_re')!.data, im = findColumn(rep.profile, 'E_fem_im')!.data;
    const lambda_mm = (C0_m_per_s / 3e9) * 1e3;
    expect(x[0]).toBeLessThanOrEqual(-1.5 * lambda_mm + 1e-9);
    let peaks = 0;
    for (let i = 1; i < x.length - 1; i++) {
      const m = Math.hypot(re[i], im[i]);
      if (m > Math.hypot(re[i - 1], im[i - 1]) && m >= Math.hypot(re[i + 1], im[i + 1])) {
        peaks++;
        expect(Math.abs(m - 2)).toBeLessThan(1e-3);
      }
      const d = -x[i] / lambda_mm; // nulls at multiples of λ/2: |E| = 2|sin(2π d)| there and near
      expect(Math.abs(m - 2 * Math.abs(Math.sin(2 * Math.PI * d)))).toBeLessThan(1e-4);
    }
    expect(peaks).toBe(3);
  });
});

describe('agreement table text', () => {
  it('one line per pair with both maxima, where they occur and the verdict', () => {
    const rows: AgreementRow[] = [
      { pair: 'fem-tmm', R_max: 2.1e-7, R_worst_f_GHz: 5.5, T_max: 3.4e-7, T_worst_f_GHz: 9.75, target: 1e-5, within_target: true },
      { pair: 'fdtd-tmm', R_max: 0.02, R_worst_f_GHz: 12, T_max: 0.011, T_worst_f_GHz: 11.5, target: 0.01, within_target: false },
    ];
    const lines = formatAgreement(rows).split('\n');
    expect(lines).toHaveLength(3);
    expect(lines[1]).toMatch(/fem vs tmm .*2\.1e-7 at 5\.5 GHz.*3\.4e-7 at 9\.75 GHz.*target 1e-5 met/);
    expect(lines[2]).toMatch(/fdtd vs tmm .*2\.0e-2 at 12 GHz.*NOT met/);
    expect(formatAgreement([])).toBe('');
  });
});

describe('CLI', () => {
  it('converge prints an order near 2p for each p and refuses a bad method', async () => {
    const r = await cli('converge', join('presets', 'default.stack.json'));
    expect(r.code).toBe(0);
    for (const p of [1, 2, 3]) {
      const orders = r.stdout.split("\n").filter((l) => l.startsWith(`p = ${p}`)).map((l) => Number(l.trim().split(/\s+/)[7]))
        .filter(Number.isFinite);
      expect(orders.length).toBeGreaterThan(0);
      expect(Math.abs(orders[orders.length - 1] - 2 * p)).toBeLessThan(0.5);
    }
    const bad = await cli('converge', join('presets', 'default.stack.json'), '--method', 'magic');
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/--method/);
  });

  it('solve refuses a bad --fem-order / --fem-density with exit 2 naming the option', async () => {
    const a = await cli('solve', join('presets', 'default.stack.json'), '--out', '/nonexistent-never-written', '--fem-order', '5');
    expect(a.code).toBe(2); expect(a.stderr).toMatch(/--fem-order/);
    const b = await cli('solve', join('presets', 'default.stack.json'), '--out', '/nonexistent-never-written', '--fem-density', 'x');
    expect(b.code).toBe(2); expect(b.stderr).toMatch(/--fem-density/);
  });
});
