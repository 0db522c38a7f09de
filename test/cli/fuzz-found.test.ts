// Cases the fuzz suite (fuzz.test.ts) found, or that turned up while reading the code, kept as plain regression checks.

import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { cli, readCsv, tempDir } from './support.ts';

const tmp = tempDir();
afterAll(tmp.cleanup);

describe('found by fuzzing', () => {
  it('a Lorentz front medium resonating far above the band is stepped stably (R = −1 on the conductor at x = 0)', async () => {
    // An explicit second-order pole update needs ω0 Δt < 2 (von Neumann analysis; common practice, no source). At
    // f0 = 1 GHz on a 10 MHz grid Δt is far too long for that; the planner's fixed-point search for the stable
    // Courant number used to swing between 0 and 1 and end unstable (exit 1, "FDTD instability").
    const file = join(tmp.dir, 'lorentz-front.stack.json');
    writeFileSync(file, JSON.stringify({
      band_GHz: [0.01, 0.0128], front: 'res', back: 'pec', points: 5,
      materials: { res: { model: 'lorentz', eps_inf: 1, poles: [{ delta_eps: 0.5, f0_GHz: 1, gamma_GHz: 1 }] } },
    }));
    const out = join(tmp.dir, 'lorentz-front');
    const r = await cli('run', file, '--out', out);
    expect(r.code, r.stderr).toBe(0);
    // A perfect conductor at x = 0 reflects R = −1 (common practice, no source).
    const sp = readCsv(readFileSync(join(out, 'spectrum.csv'), 'utf8'));
    const re = sp.header.indexOf('R_fdtd_re'), im = sp.header.indexOf('R_fdtd_im');
    for (const row of sp.rows) expect(Math.hypot(row[re] + 1, row[im])).toBeLessThan(0.01);
  });

  it('a profile in a lossy front medium in front of a thick stack stays finite (it grew past 1e308 before)', async () => {
    // 10 m of glass behind ITU-R P.2040-3 concrete as the front half-space: the profile reached 10 m into the
    // concrete, where the field relative to the incident wave at x = 0 grows like e^{α|x|} (α ≈ 100 Np/m at 50 GHz).
    const file = join(tmp.dir, 'lossy-front.stack.json');
    writeFileSync(file, JSON.stringify({ band_GHz: [40, 60], front: 'concrete', layers: [{ material: 'glass', thickness_mm: 10_000 }], points: 5 }));
    const out = join(tmp.dir, 'lossy-front');
    const r = await cli('solve', file, '--out', out);
    expect(r.code, r.stderr).toBe(0);
    const prof = readCsv(readFileSync(join(out, 'profile.csv'), 'utf8'));
    expect(prof.rows.flat().every(Number.isFinite)).toBe(true);
    const e = prof.header.indexOf('E_tmm_re');
    expect(prof.rows.reduce((m, row) => Math.max(m, Math.abs(row[e])), 0)).toBeLessThan(2 * Math.exp(20));
  });

  it('a layer met exactly at its critical angle (k_x = 0 to the last bit) gives finite R and T, TE and TM, agreeing with the FEM', async () => {
    // ε_layer = ε_front sin²θ exactly as doubles: the exact solver's recursion used to give 0/0 (NaN, exit 1).
    const s = Math.sin((40 * Math.PI) / 180);
    for (const polarization of ['TE', 'TM']) {
      const file = join(tmp.dir, `critical-${polarization}.stack.json`);
      writeFileSync(file, JSON.stringify({
        band_GHz: [1, 2], points: 5, front: 'f', back: 'f', layers: [{ material: 'g', thickness_mm: 5 }],
        materials: { f: { model: 'fixed', eps_r: 4 }, g: { model: 'fixed', eps_r: 4 * (s * s) } },
        incidence: { angle_deg: 40, polarization },
      }));
      const out = join(tmp.dir, `critical-${polarization}`);
      const r = await cli('solve', file, '--out', out);
      expect(r.code, r.stderr).toBe(0);
      const fem = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')).agreement[0];
      expect(fem.pair).toBe('fem-tmm');
      expect(Math.max(fem.R_max, fem.T_max)).toBeLessThan(1e-6);
    }
  });
});
