// `slabecho run` in-process: the files it writes, its exit codes.
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { cli, readCsv, tempDir } from './support.ts';

const tmp = tempDir();
afterAll(tmp.cleanup);
const slab = join(tmp.dir, 'slab.stack.json');
writeFileSync(slab, JSON.stringify({
  title: 'Test slab', band_GHz: [1, 6], points: 21,
  materials: { dielectric: { model: 'fixed', eps_r: 4, sigma_S_per_m: 0 } },
  layers: [{ material: 'dielectric', thickness_mm: 50 }],
}));

describe('slabecho run', () => {
  it('writes the five files with the pulse columns and prints the agreement table', async () => {
    const out = join(tmp.dir, 'out');
    const r = await cli('run', slab, '--out', out);
    expect(r.code).toBe(0);
    const sp = readCsv(readFileSync(join(out, 'spectrum.csv'), 'utf8'));
    expect(sp.header.slice(-4)).toEqual(['R_fdtd_re', 'R_fdtd_im', 'T_fdtd_re', 'T_fdtd_im']);
    expect(sp.rows.flat().every(Number.isFinite)).toBe(true);
    expect(readFileSync(join(out, 'profile.csv'), 'utf8').split('\n')[0]).toMatch(/E_fdtd_re,E_fdtd_im$/);
    const echoes = readFileSync(join(out, 'echoes.csv'), 'utf8').trimEnd().split('\n');
    expect(echoes[0]).toBe('t_ns,level_dB,amplitude,predicted_t_ns,path');
    expect(echoes[1]).toMatch(/,front face$/);
    expect(echoes[2]).toMatch(/,back face$/);
    expect(readFileSync(join(out, 'trace.csv'), 'utf8').split('\n')[0]).toBe('t_ns,E_incident,E_reflected,E_transmitted');
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    expect(summary.grid.cell_mm).toBeGreaterThan(0);
    expect(summary.agreement.some((a: { pair: string }) => a.pair === 'fdtd-tmm')).toBe(true);
    expect(r.stdout).toMatch(/fdtd vs tmm/);
  });

  it('TM at an angle runs like TE: every file, the tangential H of the exact and FEM profiles, echoes and traces', async () => {
    const tm = join(tmp.dir, 'tm.stack.json');
    writeFileSync(tm, JSON.stringify({ ...JSON.parse(readFileSync(slab, 'utf8')), incidence: { angle_deg: 30, polarization: 'TM' } }));
    const out = join(tmp.dir, 'out-tm');
    mkdirSync(out);
    writeFileSync(join(out, 'profile.csv'), 'stale');
    const r = await cli('run', tm, '--out', out);
    expect(r.code, r.stderr).toBe(0);
    expect(readdirSync(out).sort()).toEqual(['echoes.csv', 'profile.csv', 'spectrum.csv', 'summary.json', 'trace.csv']);
    expect(readCsv(readFileSync(join(out, 'profile.csv'), 'utf8')).header).toEqual(
      ['x_mm', 'E_tmm_re', 'E_tmm_im', 'H_tmm_re', 'H_tmm_im', 'E_fem_re', 'E_fem_im', 'H_fem_re', 'H_fem_im', 'E_fdtd_re', 'E_fdtd_im']);
    expect(readCsv(readFileSync(join(out, 'echoes.csv'), 'utf8')).rows.length).toBeGreaterThan(0);
    expect(readCsv(readFileSync(join(out, 'trace.csv'), 'utf8')).rows.length).toBeGreaterThan(100);
    expect(readCsv(readFileSync(join(out, 'spectrum.csv'), 'utf8')).header).toEqual(expect.arrayContaining(['R_fem_re', 'R_fdtd_re']));
    expect(r.stderr).not.toMatch(/FDTD skipped/);
  });

  it('bad pulse options and a grid too large: exit 2, nothing written', async () => {
    const out = join(tmp.dir, 'refused');
    const a = await cli('run', slab, '--out', out, '--courant', '1.5');
    expect(a.code).toBe(2);
    expect(a.stderr).toMatch(/--courant/);
    const b = await cli('run', slab, '--out', out, '--cells-per-wavelength', '100000');
    expect(b.code).toBe(2);
    expect(b.stderr).toMatch(/cell-updates|cells/);
    expect(b.stderr).toMatch(/nothing was written/);
    expect(existsSync(join(out, 'summary.json'))).toBe(false);
  });
});
