// Every preset passes `check` and `solve` (run in-process), with the documented headers and no NaN.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { afterAll, describe, expect, it } from 'vitest';
import { parseStackText } from '../../src/stack/parse.ts';
import { cli, readCsv, tempDir } from './support.ts';

const tmp = tempDir();
afterAll(tmp.cleanup);
const presets = readdirSync('presets').filter((f) => f.endsWith('.stack.json')).sort();

describe('presets', () => {
  it('there are at least five, including default.stack.json', () => {
    expect(presets.length).toBeGreaterThanOrEqual(5);
    expect(presets).toContain('default.stack.json');
  });

  for (const name of presets) {
    it(`${name}: check and solve`, async () => {
      const path = join('presets', name);
      const parsed = parseStackText(readFileSync(path, 'utf8'));
      if (!parsed.ok) throw new Error(parsed.errors.join('\n'));
      // Presets stay inside their materials' validity ranges: no warnings from check.
      const c = await cli('check', path);
      expect(c.code).toBe(0);
      expect(c.err).toEqual([]);

      const out = join(tmp.dir, name);
      const s = await cli('solve', path, '--out', out);
      expect(s.code, s.stderr).toBe(0);
      const sp = readCsv(readFileSync(join(out, 'spectrum.csv'), 'utf8'));
      expect(sp.header.slice(0, 5)).toEqual(['f_GHz', 'R_tmm_re', 'R_tmm_im', 'T_tmm_re', 'T_tmm_im']);
      expect(sp.rows).toHaveLength(parsed.stack.points);
      for (const row of sp.rows) {
        expect(row).toHaveLength(sp.header.length);
        for (const v of row) expect(Number.isFinite(v)).toBe(true);
        // Passive stack: |R| ≤ 1 (energy conservation, common practice).
        expect(Math.hypot(row[1], row[2])).toBeLessThanOrEqual(1 + 1e-9);
      }
      expect(readdirSync(out).sort()).toEqual(['profile.csv', 'spectrum.csv', 'summary.json']);
      const pr = readCsv(readFileSync(join(out, 'profile.csv'), 'utf8'));
      const tm = parsed.stack.incidence.polarization === 'TM';
      expect(pr.header.slice(0, tm ? 5 : 3)).toEqual(['x_mm', 'E_tmm_re', 'E_tmm_im', ...(tm ? ['H_tmm_re', 'H_tmm_im'] : [])]);
      for (const row of pr.rows) for (const v of row) expect(Number.isFinite(v)).toBe(true);
      const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
      expect(summary.title).toBe(parsed.stack.title);
      expect(summary.layers).toHaveLength(parsed.stack.layers.length);
    });
  }

  it('the Salisbury-type preset has its reflection null where the spacer is a quarter wavelength (Salisbury, US 2,599,944)', async () => {
    const text = readFileSync('presets/salisbury-absorber.stack.json', 'utf8');
    const r = parseStackText(text);
    if (!r.ok) throw new Error(r.errors.join('\n'));
    const spacer = r.file.layers[1];
    const eps = (r.file.materials['spacer-foam'] as { eps_r: number }).eps_r;
    const fQuarter_GHz = 0.299792458 / (4 * spacer.thickness_mm! * 1e-3 * Math.sqrt(eps));
    const out = join(tmp.dir, 'salisbury');
    await cli('solve', 'presets/salisbury-absorber.stack.json', '--out', out);
    const sp = readCsv(readFileSync(join(out, 'spectrum.csv'), 'utf8'));
    let best = sp.rows[0];
    for (const row of sp.rows) if (Math.hypot(row[1], row[2]) < Math.hypot(best[1], best[2])) best = row;
    expect(Math.abs(best[0] - fQuarter_GHz)).toBeLessThan(0.03);
    expect(Math.hypot(best[1], best[2])).toBeLessThan(0.01);
  });
});

describe('the bin entry (npx slabecho)', () => {
  it('runs check through tsx with exit codes 0 and 2', () => {
    const ok = spawnSync(process.execPath, ['bin/slabecho.mjs', 'check', 'presets/default.stack.json'], { encoding: 'utf8' });
    expect(ok.status).toBe(0);
    expect(ok.stdout).toMatch(/ok: "Single brick wall"/);
    const bad = spawnSync(process.execPath, ['bin/slabecho.mjs', 'check', 'no-such.stack.json'], { encoding: 'utf8' });
    expect(bad.status).toBe(2);
    expect(bad.stderr.trim().split('\n')).toHaveLength(1);
  });
});
