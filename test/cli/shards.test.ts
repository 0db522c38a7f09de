// Sharded studies merge into exactly the files one run writes; threads change nothing; Ctrl-C writes nothing;
// Touchstone files from solve and sweep read back to the solver's values.
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { readTouchstone } from '../support/touchstone-reader.ts';
import { cli, readCsv, tempDir } from './support.ts';

const tmp = tempDir();
afterAll(() => tmp.cleanup());

const PANEL = {
  title: 'Sandwich panel', band_GHz: [8, 12], points: 21,
  materials: { skin: { model: 'fixed', eps_r: 4.2, sigma_S_per_m: 0.02 }, core: { model: 'fixed', eps_r: 1.1 } },
  layers: [{ material: 'skin', thickness_mm: 0.8 }, { material: 'core', thickness_mm: 6 }, { material: 'skin', thickness_mm: 0.8 }],
};
const file = join(tmp.dir, 'panel.stack.json');
writeFileSync(file, JSON.stringify(PANEL));

/** Every file under a folder, by relative path, as text. */
function tree(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  const walk = (rel: string) => {
    for (const e of readdirSync(join(dir, rel), { withFileTypes: true })) {
      const r = rel ? `${rel}/${e.name}` : e.name;
      if (e.isDirectory()) walk(r); else out[r] = readFileSync(join(dir, r), 'utf8');
    }
  };
  walk('');
  return out;
}

const SWEEP = ['--angle', '0:60:20', '--polarization', 'TE,TM', '--set', 'layers[1].thickness_mm=5,6,7', '--touchstone', '--deembed-mm', '2,3'];

describe('sharded sweeps', () => {
  it('merge into files byte-identical to one run, Touchstone files included, with shards given in any order', async () => {
    const whole = join(tmp.dir, 'whole');
    expect((await cli('sweep', file, '--out', whole, ...SWEEP)).code).toBe(0);
    const shards = [0, 1, 2].map((k) => join(tmp.dir, `shard-${k}`));
    for (const [k, dir] of shards.entries()) expect((await cli('sweep', file, '--out', dir, ...SWEEP, '--shard', `${k}/3`)).code).toBe(0);
    const merged = join(tmp.dir, 'merged');
    const m = await cli('merge', shards[2], shards[0], shards[1], '--out', merged);
    expect(m.code).toBe(0);
    const a = tree(whole), b = tree(merged);
    expect(Object.keys(b).sort()).toEqual(Object.keys(a).sort());
    expect(Object.keys(a).filter((n) => n.startsWith('touchstone/'))).toHaveLength(24);
    for (const name of Object.keys(a)) expect(b[name], name).toBe(a[name]);
  });

  it('refuse a missing, doubled or foreign shard', async () => {
    const shards = [0, 1, 2].map((k) => join(tmp.dir, `shard-${k}`));
    expect((await cli('merge', shards[0], shards[1], '--out', join(tmp.dir, 'm2'))).stderr).toMatch(/shard 2\/3 missing/);
    expect((await cli('merge', shards[0], shards[0], shards[1], '--out', join(tmp.dir, 'm2'))).stderr).toMatch(/both shard 0\/3/);
    const other = join(tmp.dir, 'other-0');
    await cli('sweep', file, '--out', other, '--angle', '0:60:20', '--polarization', 'TE', '--shard', '0/3');
    expect((await cli('merge', other, shards[1], shards[2], '--out', join(tmp.dir, 'm2'))).stderr).toMatch(/shards of different studies/);
    expect((await cli('merge', join(tmp.dir, 'whole'), '--out', join(tmp.dir, 'm2'))).stderr).toMatch(/not a shard/);
    expect(existsSync(join(tmp.dir, 'm2', 'sweep.csv'))).toBe(false);
  });

  it('give the same files on two worker threads as in one thread', async () => {
    const one = join(tmp.dir, 'threads-1'), two = join(tmp.dir, 'threads-2');
    expect((await cli('sweep', file, '--out', one, ...SWEEP, '--threads', '1')).code).toBe(0);
    expect((await cli('sweep', file, '--out', two, ...SWEEP, '--threads', '2')).code).toBe(0);
    expect(tree(two)).toEqual(tree(one));
  });
});

describe('Touchstone from solve and sweep', () => {
  it('reads back to the spectrum\'s R and T with energy and reciprocity (Touchstone 2.0; Pozar §4.3)', async () => {
    const out = join(tmp.dir, 'solve-ts');
    expect((await cli('solve', file, '--out', out, '--touchstone')).code).toBe(0);
    const ts = readTouchstone(readFileSync(join(out, 'spectrum.s2p'), 'utf8'));
    const sp = readCsv(readFileSync(join(out, 'spectrum.csv'), 'utf8'));
    const col = (n: string) => sp.header.indexOf(n);
    sp.rows.forEach((row, i) => {
      expect(ts.f_Hz[i] / 1e9).toBeCloseTo(row[col('f_GHz')], 12);
      expect(ts.S[0][0][i].re).toBe(row[col('R_tmm_re')]);
      expect(ts.S[0][0][i].im).toBe(row[col('R_tmm_im')]);
      const s21 = ts.S[1][0][i], s12 = ts.S[0][1][i];
      expect(s21.re ** 2 + s21.im ** 2 + row[col('R_power')]).toBeCloseTo(1 - row[col('absorbed')], 10);
      expect(s12.re).toBeCloseTo(s21.re, 11);
      expect(s12.im).toBeCloseTo(s21.im, 11);
    });
  });

  it('is refused with the half-space named when it cannot be a port, and then nothing is written', async () => {
    const lossy = join(tmp.dir, 'lossy.stack.json');
    writeFileSync(lossy, JSON.stringify({ ...PANEL, back: 'concrete', band_GHz: [2, 6] }));
    const out = join(tmp.dir, 'solve-lossy');
    const r = await cli('solve', lossy, '--out', out, '--touchstone');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--touchstone: back: "concrete" gives no real wave impedance/);
    expect(existsSync(join(out, 'spectrum.csv'))).toBe(false);
    expect((await cli('solve', file, '--out', out, '--deembed-mm', '1,1')).stderr).toMatch(/give --touchstone too/);
  });
});

describe('sharded tolerance runs', () => {
  it('merge into tolerance.csv and tolerance.json byte-identical to one run', async () => {
    const vary = ['--vary', 'layers[1].thickness_mm:normal:0.2', '--vary', 'materials.skin.eps_r:uniform:0.1', '--samples', '300', '--seed', '42'];
    const whole = join(tmp.dir, 'tol-whole');
    const r = await cli('tolerance', file, '--out', whole, ...vary);
    expect(r.code).toBe(0);
    expect(readFileSync(join(whole, 'tolerance.csv'), 'utf8').split('\n')[0]).toBe('f_GHz,' +
      ['R_power', 'T_power', 'absorbed', 'IL_dB', 'IPD_deg'].flatMap((q) => ['p05', 'p50', 'p95'].map((p) => `${q}_${p}`)).join(','));
    const shards = [0, 1].map((k) => join(tmp.dir, `tol-shard-${k}`));
    for (const [k, dir] of shards.entries()) expect((await cli('tolerance', file, '--out', dir, ...vary, '--shard', `${k}/2`, '--threads', '2')).code).toBe(0);
    expect(existsSync(join(shards[0], 'tolerance-samples.csv'))).toBe(true);
    const merged = join(tmp.dir, 'tol-merged');
    expect((await cli('merge', shards[1], shards[0], '--out', merged)).code).toBe(0);
    expect(tree(merged)).toEqual(tree(whole));
    const doc = JSON.parse(readFileSync(join(whole, 'tolerance.json'), 'utf8'));
    expect(doc.worst.R_power.stack.layers[1].thickness_mm).toBe(doc.worst.R_power.values['layers[1].thickness_mm']);
  });
});

describe('Ctrl-C', () => {
  it('stops a sweep on worker threads with exit 130, leaving the folder as it was and no temporary file', async () => {
    const out = join(tmp.dir, 'interrupted');
    mkdirSync(out);
    writeFileSync(join(out, 'sweep.csv'), 'earlier results\n');
    const slow = join(tmp.dir, 'slow.stack.json');
    writeFileSync(slow, JSON.stringify({ ...PANEL, band_GHz: [2, 18], points: 201 }));
    // 3 600 cases with a pulse run each: minutes of work, stopped half a second after it starts.
    const child = spawn(process.execPath, ['bin/slabecho.mjs', 'sweep', slow, '--out', out, '--angle', '0:89:0.5', '--polarization', 'TE,TM',
      '--set', 'layers[1].thickness_mm=1:10:1', '--methods', 'tmm,fem,fdtd', '--threads', '2', '--max-output-MB', '1000'], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stderr = '', sent = false;
    const code = await new Promise<number | null>((resolve) => {
      child.stderr.on('data', (d) => {
        stderr += String(d);
        if (/^sweep: \d+ cases/m.test(stderr) && !sent) { sent = true; setTimeout(() => child.kill('SIGINT'), 500); }
      });
      child.on('exit', (c) => resolve(c));
    });
    expect(code).toBe(130);
    expect(stderr).toMatch(/stopped \(Ctrl-C\); nothing was written/);
    expect(readdirSync(out)).toEqual(['sweep.csv']);
    expect(readFileSync(join(out, 'sweep.csv'), 'utf8')).toBe('earlier results\n');
  }, 120_000);
});
