// slabecho sweep: cases equal single solve runs, closed forms over angle and thickness, cross-checks per case,
// and field-named refusals.
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { C0_m_per_s } from '../../src/units.ts';
import { cli, tempDir } from './support.ts';

const tmp = tempDir();
afterAll(() => tmp.cleanup());

const SLAB = {
  title: 'Sweep slab', band_GHz: [1, 6], points: 11,
  materials: { dielectric: { model: 'fixed', eps_r: 4, sigma_S_per_m: 0.01 }, film: { model: 'sheet', ohm_per_sq: 600 } },
  layers: [{ material: 'dielectric', thickness_mm: 25 }, { material: 'film' }],
};
const write = (name: string, obj: unknown): string => { const p = join(tmp.dir, name); writeFileSync(p, JSON.stringify(obj)); return p; };
const lines = (path: string): string[] => readFileSync(path, 'utf8').trimEnd().split('\n');

describe('slabecho sweep', () => {
  it('writes the documented header and matches single solve runs of the same cases exactly', async () => {
    const file = write('slab.stack.json', SLAB);
    const out = join(tmp.dir, 'sweep-grid');
    const r = await cli('sweep', file, '--out', out, '--angle', '0,30', '--polarization', 'TE,TM',
      '--set', 'layers[0].thickness_mm=20,25', '--set', 'materials.film.ohm_per_sq=377');
    expect(r.code).toBe(0);
    const rows = lines(join(out, 'sweep.csv'));
    expect(rows[0]).toBe('case,angle_deg,polarization,layers[0].thickness_mm,materials.film.ohm_per_sq,' +
      'f_GHz,R_re,R_im,T_re,T_im,R_power,T_power,absorbed,IL_dB,RL_dB,IPD_deg');
    expect(rows).toHaveLength(1 + 8 * 11);
    const doc = JSON.parse(readFileSync(join(out, 'sweep.json'), 'utf8'));
    expect(doc.case_count).toBe(8);
    expect(doc.cases.map((c: { values: unknown[] }) => c.values)).toEqual([
      [0, 'TE', 20, 377], [0, 'TE', 25, 377], [0, 'TM', 20, 377], [0, 'TM', 25, 377],
      [30, 'TE', 20, 377], [30, 'TE', 25, 377], [30, 'TM', 20, 377], [30, 'TM', 25, 377],
    ]);
    // Each case as its own stack file, written here by hand, through `solve`.
    for (const [angle, pol, d] of [[0, 'TE', 20], [0, 'TM', 25], [30, 'TE', 25], [30, 'TM', 20]] as const) {
      const index = doc.cases.findIndex((c: { values: unknown[] }) => c.values[0] === angle && c.values[1] === pol && c.values[2] === d);
      const caseFile = write(`case-${index}.stack.json`, {
        ...SLAB, incidence: { angle_deg: angle, polarization: pol },
        layers: [{ material: 'dielectric', thickness_mm: d }, { material: 'film' }],
        materials: { ...SLAB.materials, film: { model: 'sheet', ohm_per_sq: 377 } },
      });
      expect(index).toBeGreaterThanOrEqual(0);
      const solved = join(tmp.dir, `solve-${index}`);
      expect((await cli('solve', caseFile, '--out', solved)).code).toBe(0);
      const sp = lines(join(solved, 'spectrum.csv'));
      const h = sp[0].split(',');
      const pick = ['f_GHz', 'R_tmm_re', 'R_tmm_im', 'T_tmm_re', 'T_tmm_im', 'R_power', 'T_power', 'absorbed', 'IL_dB', 'RL_dB', 'IPD_deg'].map((n) => h.indexOf(n));
      expect(pick.every((j) => j >= 0)).toBe(true);
      const mine = rows.slice(1 + index * 11, 1 + (index + 1) * 11);
      sp.slice(1).forEach((line, i) => {
        const v = line.split(',');
        expect(mine[i]).toBe(`${index},${angle},${pol},${d},377,${pick.map((j) => v[j]).join(',')}`);
      });
    }
  });

  it('over angle reproduces Fresnel on a half-space and finds the Brewster angle (Born & Wolf §1.5.3; physics reference 63.43°)', async () => {
    const file = write('half.stack.json', { title: 'Half-space', band_GHz: [1, 2], points: 2, materials: { d4: { model: 'fixed', eps_r: 4 } }, back: 'd4' });
    const out = join(tmp.dir, 'sweep-fresnel');
    expect((await cli('sweep', file, '--out', out, '--angle', '0:89:0.5', '--polarization', 'TE,TM', '--methods', 'tmm')).code).toBe(0);
    const rows = lines(join(out, 'sweep.csv')).slice(1).map((l) => l.split(','));
    let best = { R: Infinity, angle: 0 };
    for (const r of rows) {
      const angle = Number(r[1]) * Math.PI / 180, pol = r[2], R_power = Number(r[8]);
      const c1 = Math.cos(angle), c2 = Math.sqrt(1 - Math.sin(angle) ** 2 / 4);
      const amp = pol === 'TE' ? (c1 - 2 * c2) / (c1 + 2 * c2) : (2 * c1 - c2) / (2 * c1 + c2);
      expect(R_power).toBeCloseTo(amp * amp, 11);
      if (pol === 'TM' && R_power < best.R) best = { R: R_power, angle: Number(r[1]) };
    }
    expect(best.angle).toBe(63.5); // the grid point nearest arctan 2 = 63.435°
    const fine = join(tmp.dir, 'sweep-brewster');
    expect((await cli('sweep', file, '--out', fine, '--angle', '63.3:63.6:0.005', '--polarization', 'TM', '--methods', 'tmm')).code).toBe(0);
    const doc = JSON.parse(readFileSync(join(fine, 'sweep.json'), 'utf8'));
    const minCase = doc.cases.reduce((a: { worst_R_power: number }, b: { worst_R_power: number }) => (b.worst_R_power < a.worst_R_power ? b : a));
    expect(Math.abs(minCase.values[0] - Math.atan(2) * 180 / Math.PI)).toBeLessThanOrEqual(0.0025);
  });

  it('of a quarter-wave layer\'s thickness finds the R_power minimum at λ/(4 n_c), n_c = √(n_front n_back) (physics reference)', async () => {
    const f_GHz = 10, nc = Math.SQRT2;
    const quarter_mm = (C0_m_per_s / (f_GHz * 1e9) / (4 * nc)) * 1e3; // 5.3033 mm
    const file = write('qw.stack.json', {
      title: 'Quarter wave', band_GHz: [f_GHz, f_GHz + 1], points: 2,
      materials: { coat: { model: 'fixed', eps_r: 2 }, sub: { model: 'fixed', eps_r: 4 } },
      layers: [{ material: 'coat', thickness_mm: 5 }], back: 'sub',
    });
    const out = join(tmp.dir, 'sweep-qw');
    expect((await cli('sweep', file, '--out', out, '--set', 'layers[0].thickness_mm=4:6.6:0.001', '--methods', 'tmm')).code).toBe(0);
    const rows = lines(join(out, 'sweep.csv')).slice(1).map((l) => l.split(',').map(Number)).filter((r) => r[4] === f_GHz);
    const min = rows.reduce((a, b) => (b[9] < a[9] ? b : a));
    expect(Math.abs(min[3] - quarter_mm)).toBeLessThanOrEqual(0.0005);
    expect(min[9]).toBeLessThan(1e-7);
  });

  it('adds pulse runs with --methods fdtd, TM at an angle included; a case the engine declines keeps its exact and FEM rows and says why', async () => {
    const file = write('thin.stack.json', { title: 'Thin', band_GHz: [2, 6], points: 9, materials: { d: { model: 'fixed', eps_r: 3 } }, layers: [{ material: 'd', thickness_mm: 10 }] });
    const out = join(tmp.dir, 'sweep-fdtd');
    const r = await cli('sweep', file, '--out', out, '--angle', '0,30', '--polarization', 'TM', '--methods', 'tmm,fem,fdtd');
    expect(r.code).toBe(0);
    const doc = JSON.parse(readFileSync(join(out, 'sweep.json'), 'utf8'));
    for (const c of doc.cases) {
      expect(c.agreement.map((a: { pair: string }) => a.pair)).toEqual(['fem-tmm', 'fdtd-tmm', 'fdtd-fem']);
      expect(c.agreement[1].within_target).toBe(true);
    }
    // An air gap seen from a dense medium beyond the critical angle asin(1/2) = 30° (Snell's law) is declined:
    // evanescent up to any frequency, it has no stable stepping (the exact and FEM results stay).
    const gap = write('gap.stack.json', {
      title: 'Gap', band_GHz: [2, 6], points: 9, front: 'block', back: 'block', materials: { block: { model: 'fixed', eps_r: 4 } },
      layers: [{ material: 'air', thickness_mm: 5 }],
    });
    const out2 = join(tmp.dir, 'sweep-fdtd-declined');
    expect((await cli('sweep', gap, '--out', out2, '--angle', '0,40', '--polarization', 'TM', '--methods', 'tmm,fem,fdtd')).code).toBe(0);
    const [normal, oblique] = JSON.parse(readFileSync(join(out2, 'sweep.json'), 'utf8')).cases;
    expect(normal.agreement.map((a: { pair: string }) => a.pair)).toEqual(['fem-tmm', 'fdtd-tmm', 'fdtd-fem']);
    expect(oblique.agreement.map((a: { pair: string }) => a.pair)).toEqual(['fem-tmm']);
    expect(oblique.declined.fdtd).toMatch(/no stable stepping; use an angle below 30\.0°/);
  });

  it('refuses a bad path or value before any work, naming the path and the case (exit 2, nothing written)', async () => {
    const file = write('slab2.stack.json', SLAB);
    const out = join(tmp.dir, 'sweep-bad');
    const noLayer = await cli('sweep', file, '--out', out, '--set', 'layers[3].thickness_mm=1,2');
    expect(noLayer.code).toBe(2);
    expect(noLayer.stderr).toMatch(/--set layers\[3\]\.thickness_mm=1,2: layers\[3\]: no such entry \(layers has 2 entries/);
    const negative = await cli('sweep', file, '--out', out, '--set', 'layers[0].thickness_mm=-1:3:2');
    expect(negative.code).toBe(2);
    expect(negative.stderr).toMatch(/case 0 \(layers\[0\]\.thickness_mm = -1\): layers\[0\]\.thickness_mm: must be a number > 0 \(got -1\)/);
    expect(negative.stderr).toMatch(/1 of 3 cases is invalid; nothing was computed or written/);
    const angle = await cli('sweep', file, '--out', out, '--angle', '80:90:5');
    expect(angle.stderr).toMatch(/case 2 \(incidence\.angle_deg = 90\): incidence\.angle_deg: must be a number of degrees/);
    const catalog = await cli('sweep', file, '--out', out, '--set', 'materials.brick.a=3,4');
    expect(catalog.stderr).toMatch(/materials --export brick/);
    expect((await cli('sweep', file, '--out', out, '--polarization', 'TE,XY')).stderr).toMatch(/"XY" is not a polarization/);
    expect((await cli('sweep', file, '--out', out, '--shard', '4/4')).stderr).toMatch(/--shard: must be K\/N .* from 0 to N − 1/);
    expect((await cli('sweep', file, '--out', out, '--methods', 'tmm,fit')).stderr).toMatch(/"fit" is not a method/);
    expect((await cli('sweep', file, '--out', out, '--angle', '0,10', '--set', 'incidence.angle_deg=5')).stderr).toMatch(/given twice \(--angle sets it\)/);
    expect(() => readFileSync(join(out, 'sweep.csv'))).toThrow();
  });

  it('refuses before any work a sweep whose files would pass --max-output-MB, with the size and what to change', async () => {
    const file = write('slab3.stack.json', { ...SLAB, points: 1001 });
    const out = join(tmp.dir, 'sweep-big');
    const r = await cli('sweep', file, '--out', out, '--angle', '0:89:1', '--set', 'layers[0].thickness_mm=1:20:1', '--max-output-MB', '10');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/the output would be about \d+(\.\d)? MB \(sweep\.csv [\d.]+ MB, sweep\.json [\d.]+ [kM]B\), over the limit of 10\.0 MB \(--max-output-MB 10\); .*--shard K\/N/);
    expect(() => readFileSync(join(out, 'sweep.csv'))).toThrow();
  });
});
