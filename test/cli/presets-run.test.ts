// Every preset through `slabecho run` at default settings: all files written, no NaN, and the three
// methods agree within their targets (FEM vs exact ≤ 1e-5, FDTD vs exact ≤ 0.01). The reference is
// the exact transfer-matrix solution, itself checked against closed forms in test/tmm.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { cli, readCsv, tempDir } from './support.ts';

const tmp = tempDir();
afterAll(tmp.cleanup);
const presets = readdirSync('presets').filter((f) => f.endsWith('.stack.json')).sort();

interface Row { pair: string; R_max: number; T_max: number; target?: number; within_target?: boolean }

describe('run on every preset', () => {
  for (const name of presets) {
    it(name, async () => {
      const out = join(tmp.dir, name);
      const r = await cli('run', join('presets', name), '--out', out);
      expect(r.code, r.stderr).toBe(0);
      for (const f of ['spectrum.csv', 'echoes.csv', 'trace.csv', 'summary.json']) expect(existsSync(join(out, f))).toBe(true);
      const sp = readCsv(readFileSync(join(out, 'spectrum.csv'), 'utf8'));
      expect(sp.header).toEqual(expect.arrayContaining(['R_tmm_re', 'R_fem_re', 'R_fdtd_re', 'T_fdtd_im']));
      expect(sp.rows.flat().every(Number.isFinite)).toBe(true);
      const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
      const rows: Row[] = summary.agreement;
      const row = (pair: string) => rows.find((x) => x.pair === pair);
      expect(row('fem-tmm')?.within_target).toBe(true);
      const fdtd = row('fdtd-tmm');
      expect(fdtd, 'the pulse engine ran').toBeDefined();
      expect(fdtd!.R_max).toBeLessThanOrEqual(0.01);
      expect(fdtd!.T_max).toBeLessThanOrEqual(0.01);
      expect(summary.run.truncated).toBe(false);
      // Fitted power laws are reported in the stack file's own model terms (README, Pulse run).
      for (const fit of summary.power_law_fits) {
        expect(Object.keys(fit.model)).toEqual(['eps_inf', 'sigma_S_per_m', 'debye', 'lorentz', 'drude']);
        expect(fit.model.eps_inf).toBeGreaterThanOrEqual(1);
      }
      // A fixed permeability with loss is stepped as a fitted Lorentz sum, written as a magnetic block.
      for (const fit of summary.permeability_fits) expect(Object.keys(fit.magnetic)).toEqual(['model', 'mu_inf', 'poles']);
      const echoes = readFileSync(join(out, 'echoes.csv'), 'utf8').trimEnd().split('\n');
      expect(echoes.length).toBeGreaterThan(1);
      expect(echoes[1]).toMatch(/front face/);
    });
  }
});
