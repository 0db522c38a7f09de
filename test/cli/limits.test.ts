// Estimate before work: oversized jobs refused at once with the figure and what to change, outputs kept within
// --max-output-MB by sampling the profile and traces more sparsely (with a warning). The limits themselves are
// choices of this tool (common practice, no source); the stacks use ITU-R P.2040-3 Table 3 glass and concrete.
// Refusal times are printed (measured, not asserted).

import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ordinal } from '../../src/report/table.ts';
import { cli, readCsv, tempDir } from './support.ts';

const tmp = tempDir();
afterAll(tmp.cleanup);
const stackFile = (name: string, body: Record<string, unknown>): string => {
  const p = join(tmp.dir, `${name}.stack.json`);
  writeFileSync(p, JSON.stringify(body));
  return p;
};
const totalBytes = (dir: string): number => readdirSync(dir).reduce((n, f) => n + statSync(join(dir, f)).size, 0);

async function timed(...argv: string[]): Promise<Awaited<ReturnType<typeof cli>> & { ms: number }> {
  const t0 = performance.now();
  const r = await cli(...argv);
  return { ...r, ms: performance.now() - t0 };
}

const narrow = stackFile('narrow', { title: 'Narrow band', band_GHz: [10, 10.001], layers: [{ material: 'glass', thickness_mm: 6 }] });
const thick = stackFile('thick', { title: 'Thick wall', band_GHz: [1, 100], layers: [{ material: 'concrete', thickness_mm: 10_000 }] });

describe('refused before any work', () => {
  it('a 1 MHz band (6 mm glass at 10–10.001 GHz): run says the pulse is too long and what to change; nothing written', async () => {
    const out = join(tmp.dir, 'narrow-run');
    const r = await timed('run', narrow, '--out', out);
    console.log(`refusal time, run on a 1 MHz band: ${r.ms.toFixed(0)} ms`);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/would take about \d+ (s|min) of computing \(limit 30 s, --max-seconds\)/);
    expect(r.stderr).toMatch(/the band is only 1 MHz wide, so the pulse lasts about [\d.]+ µs: widen the band to at least \d+ MHz/);
    expect(r.stderr).toMatch(/nothing was written$/);
    expect(existsSync(out)).toBe(false);
    // solve needs no pulse: it runs.
    const s = await cli('solve', narrow, '--out', join(tmp.dir, 'narrow-solve'));
    expect(s.code, s.stderr).toBe(0);
  });

  it('10 m of concrete at 1–100 GHz: run refused by the grid planner in plain words, no internal figures', async () => {
    const r = await timed('run', thick, '--out', join(tmp.dir, 'thick-run'));
    console.log(`refusal time, run on 10 m of concrete at 1–100 GHz: ${r.ms.toFixed(0)} ms`);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/cells/);
    expect(r.stderr).not.toMatch(/\[cells|dx_m/);
  });

  it('a spectrum that alone passes the output limit: refused, saying how many points fit', async () => {
    const wide = stackFile('points', { band_GHz: [1, 2], points: 100_000, layers: [{ material: 'glass', thickness_mm: 6 }] });
    const r = await cli('solve', wide, '--out', join(tmp.dir, 'points'), '--max-output-MB', '1');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/over the output limit \(1 MB, --max-output-MB\); lower "points" to at most [\d ]+/);
  });

  it('converge and bench are estimated too', async () => {
    const c = await timed('converge', thick, '--method', 'fdtd');
    expect(c.code).toBe(2);
    const b = await timed('bench', '--cells', '20000000', '--steps', '10000000');
    console.log(`refusal times: converge ${c.ms.toFixed(0)} ms, bench ${b.ms.toFixed(0)} ms`);
    expect(b.code).toBe(2);
    expect(b.stderr).toMatch(/the benchmark \(20 million cells × 10 million steps\) would take about \d+ days/);
  });

  it('bad limits are usage errors naming the option', async () => {
    for (const [opt, v] of [['--max-output-MB', '0'], ['--max-seconds', '-1'], ['--max-output-MB', 'lots']]) {
      const r = await cli('solve', narrow, '--out', join(tmp.dir, 'x'), `${opt}=${v}`);
      expect(r.code).toBe(2);
      expect(r.stderr).toContain(`${opt}: must be a number`);
    }
  });
});

describe('outputs within the limit', () => {
  it('solve on 10 m of concrete: the FEM gives way with a warning; the profile fits the limit', async () => {
    const out = join(tmp.dir, 'thick-solve');
    const r = await cli('solve', thick, '--out', out, '--max-output-MB', '5');
    expect(r.code, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/warning: FEM skipped: the cross-check \([\d ]+ elements × 501 frequencies\) would take about \d+ s/);
    expect(r.stderr).toMatch(/warning: profile\.csv is sampled at \d+ points per wavelength/);
    expect(totalBytes(out)).toBeLessThanOrEqual(5e6);
    const profile = readCsv(readFileSync(join(out, 'profile.csv'), 'utf8'));
    expect(profile.rows.length).toBeGreaterThan(10_000);
    // Every interface is still a sample: x = 0 and the back face at 10 000 mm.
    expect(profile.rows.some((row) => row[0] === 0)).toBe(true);
    expect(profile.rows.some((row) => row[0] === 10_000)).toBe(true);
  });

  it('run with a small limit: trace.csv holds every k-th step, said in a warning and in summary.json', async () => {
    const slab = stackFile('slab', { band_GHz: [1, 6], points: 41, materials: { d: { model: 'fixed', eps_r: 4 } }, layers: [{ material: 'd', thickness_mm: 50 }] });
    const full = join(tmp.dir, 'slab-full'), small = join(tmp.dir, 'slab-small');
    expect((await cli('run', slab, '--out', full)).code).toBe(0);
    const r = await cli('run', slab, '--out', small, '--max-output-MB', '0.3');
    expect(r.code, r.stderr).toBe(0);
    expect(totalBytes(small)).toBeLessThanOrEqual(0.3e6);
    const stride = JSON.parse(readFileSync(join(small, 'summary.json'), 'utf8')).run.trace_every_nth_step as number;
    expect(stride).toBeGreaterThan(1);
    expect(r.stderr).toContain(`warning: trace.csv holds every ${ordinal(stride)} time step`);
    const a = readCsv(readFileSync(join(full, 'trace.csv'), 'utf8')).rows, b = readCsv(readFileSync(join(small, 'trace.csv'), 'utf8')).rows;
    expect(b.length).toBe(Math.ceil(a.length / stride));
    expect(b[3]).toEqual(a[3 * stride]);
    // The spectra use every step: the same numbers either way.
    expect(readFileSync(join(small, 'spectrum.csv'), 'utf8')).toBe(readFileSync(join(full, 'spectrum.csv'), 'utf8'));
  });
});
