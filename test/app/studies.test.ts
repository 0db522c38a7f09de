// The workbench's studies (src/app/studies/compute.ts) give what the command line writes for the same stack:
// sweep.csv's quantity columns and tolerance.csv itself (test/cli covers those against closed forms and
// reference libraries), and a tuning matches a synthetic measurement made from the exact solution (test/tmm
// holds that to closed forms) back to the slab it came from.

import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runSweep, runTolerance, runTuning, StudyInputError } from '../../src/app/studies/compute.ts';
import { formatCsv } from '../../src/report/table.ts';
import { parseStackObject } from '../../src/stack/parse.ts';
import { QUANTITY_NAMES } from '../../src/studies/quantities.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { cli, readCsv, tempDir } from '../cli/support.ts';

const WALL = { title: 'Panel for the study checks', band_GHz: [2, 8], points: 61, layers: [{ material: 'board', thickness_mm: 18 }], materials: { board: { model: 'fixed', eps_r: 3.2, sigma_S_per_m: 0.02 } } };
const quiet = () => {};

describe('workbench studies against the command line', () => {
  it('a sweep gives sweep.csv\'s quantities, case by case and frequency by frequency', async () => {
    const { dir, cleanup } = tempDir();
    try {
      const file = join(dir, 'wall.stack.json');
      writeFileSync(file, JSON.stringify(WALL));
      const r = await cli('sweep', file, '--set', 'layers[0].thickness_mm=10:30:5', '--out', join(dir, 'out'));
      expect(r.code, r.stderr).toBe(0);
      const csv = readCsv(readFileSync(join(dir, 'out', 'sweep.csv'), 'utf8'));
      const got = runSweep(WALL, 'layers[0].thickness_mm=10:30:5', quiet);
      expect(got.values).toEqual([10, 15, 20, 25, 30]);
      expect(got.path).toBe('layers[0].thickness_mm');
      for (const q of QUANTITY_NAMES) {
        const col = csv.header.indexOf(q);
        csv.rows.forEach((row, i) => expect(Math.abs(got.quantities[q][i] - row[col])).toBeLessThanOrEqual(1e-11 * Math.max(1, Math.abs(row[col]))));
      }
      csv.rows.slice(0, 61).forEach((row, i) => expect(got.f_GHz[i]).toBeCloseTo(row[csv.header.indexOf('f_GHz')], 10));
    } finally { cleanup(); }
  });

  it('a tolerance study gives tolerance.csv itself', async () => {
    const { dir, cleanup } = tempDir();
    try {
      const file = join(dir, 'wall.stack.json');
      writeFileSync(file, JSON.stringify(WALL));
      const r = await cli('tolerance', file, '--vary', 'layers[0].thickness_mm:normal:0.4', '--vary', 'materials.board.eps_r:uniform:0.1', '--samples', '40', '--seed', '5', '--out', join(dir, 'out'));
      expect(r.code, r.stderr).toBe(0);
      const got = runTolerance(WALL, ['layers[0].thickness_mm:normal:0.4', 'materials.board.eps_r:uniform:0.1'], 40, 5, quiet);
      expect(formatCsv(got.columns)).toBe(readFileSync(join(dir, 'out', 'tolerance.csv'), 'utf8'));
    } finally { cleanup(); }
  });

  it('refuses what the cores refuse, in their words', () => {
    const problems = (work: () => unknown): string[] => {
      try { work(); } catch (e) { if (e instanceof StudyInputError) return e.lines; throw e; }
      return [];
    };
    expect(problems(() => runSweep(WALL, 'layers[4].thickness_mm=1:3:1', quiet))[0]).toMatch(/^sweep over: layers\[4\]/);
    expect(problems(() => runSweep(WALL, 'layers[0].thickness_mm=-2:2:2', quiet))[0]).toMatch(/layers\[0\]\.thickness_mm: must be a number > 0/);
    expect(problems(() => runTolerance(WALL, ['layers[0].thickness_mm:gauss:1'], 10, 1, quiet))[0]).toMatch(/^vary layers\[0\]\.thickness_mm:gauss:1:/);
    expect(problems(() => runSweep({ ...WALL, points: 100_000 }, 'incidence.angle_deg=0:80:1', quiet))[0]).toMatch(/more than the workbench runs/);
  });
});

describe('workbench tuning', () => {
  it('matches complex R and T of a 12.3 mm slab of ε_r = 4.4 back to its thickness and permittivity', async () => {
    const truth = parseStackObject({ ...WALL, layers: [{ material: 'board', thickness_mm: 12.3 }], materials: { board: { model: 'fixed', eps_r: 4.4 } } });
    if (!truth.ok) throw new Error(truth.errors.join('; '));
    const f = Float64Array.from({ length: 31 }, (_, k) => (2 + 0.2 * k) * 1e9);
    const x = solveTmm(truth.stack, f);
    const text = ['f_GHz,R_re,R_im,T_re,T_im', ...Array.from(f, (v, k) => [v / 1e9, x.R_re[k], x.R_im[k], x.T_re[k], x.T_im[k]].map((n) => String(n)).join(','))].join('\n');
    const start = { ...WALL, materials: { board: { model: 'fixed', eps_r: 3 } } };
    const r = await runTuning(start, {
      free: ['layers[0].thickness_mm=8:20', 'materials.board.eps_r=2:6'], goal: 'match', angles: '', polarizations: '',
      measured: { name: 'slab.csv', text }, seed: 1, budget: 120,
    }, quiet);
    const best = r.summary.best as Record<string, number>;
    expect(best['layers[0].thickness_mm']).toBeCloseTo(12.3, 6);
    expect(best['materials.board.eps_r']).toBeCloseTo(4.4, 6);
    expect(r.tunedFile!.layers[0].thickness_mm).toBeCloseTo(12.3, 6);
  });

  it('says what is missing', async () => {
    await expect(runTuning(WALL, { free: ['layers[0].thickness_mm=8:20'], goal: 'match', angles: '', polarizations: '', measured: null, seed: 1, budget: 50 }, quiet))
      .rejects.toThrow(/load a measured CSV first/);
    await expect(runTuning(WALL, { free: ['layers[3].thickness_mm=8:20'], goal: 'min-worst-R', angles: '', polarizations: '', measured: null, seed: 1, budget: 50 }, quiet))
      .rejects.toThrow(/--free layers\[3\]/);
  });
});
