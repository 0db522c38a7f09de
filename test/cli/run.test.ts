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
    // The pulse columns keep their place after the exact and FEM groups; the engineering quantities come last.
    expect(sp.header.slice(9, 13)).toEqual(['R_fdtd_re', 'R_fdtd_im', 'T_fdtd_re', 'T_fdtd_im']);
    expect(sp.header.slice(13)).toEqual(['R_power', 'T_power', 'absorbed', 'IL_dB', 'RL_dB', 'IPD_deg']);
    expect(sp.rows.flat().every(Number.isFinite)).toBe(true);
    expect(readFileSync(join(out, 'profile.csv'), 'utf8').split('\n')[0]).toMatch(/E_fdtd_re,E_fdtd_im$/);
    const echoes = readFileSync(join(out, 'echoes.csv'), 'utf8').trimEnd().split('\n');
    expect(echoes[0]).toBe('t_ns,level_dB,amplitude,predicted_t_ns,path,nearest_path,resolved');
    expect(echoes[1]).toMatch(/,front face,,yes$/);
    expect(echoes[2]).toMatch(/,back face,,yes$/);
    const echoesT = readFileSync(join(out, 'echoes_T.csv'), 'utf8').trimEnd().split('\n');
    expect(echoesT[0]).toBe(echoes[0]);
    expect(echoesT[1]).toMatch(/,direct,,yes$/);
    // the printed table: one line per echo with delay, level, prediction and path
    expect(r.stdout).toMatch(/reflected echoes \(floor -40 dB, pulse width 0\.53\d* ns\):/);
    expect(r.stdout).toMatch(/^\s+0\.66\d\s+-10\.\d\s+0\.66\d\s+back face$/m);
    expect(r.stdout).toMatch(/transmitted echoes:\n.*\n\s+0\.33\d\s+-1\.\d\s+0\.33\d\s+direct$/m);
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
    expect(readdirSync(out).sort()).toEqual(['echoes.csv', 'echoes_T.csv', 'profile.csv', 'spectrum.csv', 'summary.json', 'trace.csv']);
    expect(readCsv(readFileSync(join(out, 'profile.csv'), 'utf8')).header).toEqual(
      ['x_mm', 'E_tmm_re', 'E_tmm_im', 'H_tmm_re', 'H_tmm_im', 'E_fem_re', 'E_fem_im', 'H_fem_re', 'H_fem_im', 'E_fdtd_re', 'E_fdtd_im']);
    expect(readCsv(readFileSync(join(out, 'echoes.csv'), 'utf8')).rows.length).toBeGreaterThan(0);
    expect(readCsv(readFileSync(join(out, 'trace.csv'), 'utf8')).rows.length).toBeGreaterThan(100);
    expect(readCsv(readFileSync(join(out, 'spectrum.csv'), 'utf8')).header).toEqual(expect.arrayContaining(['R_fem_re', 'R_fdtd_re']));
    expect(r.stderr).not.toMatch(/FDTD skipped/);
  });

  it('--echo-floor lists echoes further down; a bad value is refused with the option named', async () => {
    // the slab's third reflected echo, two round trips inside (8/243 of the incident, −29.7 dB: the
    // multiple-reflection series, physics reference), and its fourth, −48.8 dB, below the default floor
    const deep = join(tmp.dir, 'deep');
    const r = await cli('run', slab, '--out', deep, '--echo-floor', '60');
    expect(r.code, r.stderr).toBe(0);
    const rows = readFileSync(join(deep, 'echoes.csv'), 'utf8').trimEnd().split('\n').slice(1);
    expect(rows.some((l) => /,"back face, 3 round trips in layer 1 \(dielectric\)",,yes$/.test(l))).toBe(true);
    expect(JSON.parse(readFileSync(join(deep, 'summary.json'), 'utf8')).echoes.floor_dB).toBe(-60);
    const bad = await cli('run', slab, '--out', join(tmp.dir, 'never'), '--echo-floor', '0');
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/--echo-floor: must be a number of dB below/);
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
