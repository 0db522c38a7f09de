// slabecho tune from the command line: the three files and how they relate, determinism for a seed, refusals with
// exit 2 naming the option or path, and Ctrl-C writing nothing. The designs themselves are checked against closed
// forms in test/tune.
import { spawn } from 'node:child_process';
import { mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parseStackText } from '../../src/stack/parse.ts';
import { Mt19937 } from '../../src/studies/random.ts';
import { parsed, synthetic } from '../tune/support.ts';
import { cli, tempDir } from './support.ts';

const tmp = tempDir();
afterAll(tmp.cleanup);

const SCREEN = {
  title: 'sheet over a plate', band_GHz: [9, 11], points: 21, back: 'pec',
  materials: { 'wet, card': { model: 'sheet', ohm_per_sq: 200 } },
  layers: [{ material: 'wet, card' }, { material: 'air', thickness_mm: 5 }],
};
const screen = join(tmp.dir, 'screen.stack.json');
writeFileSync(screen, JSON.stringify(SCREEN));
const FREE = ['--free', 'materials["wet, card"].ohm_per_sq=50:1000', '--free', 'layers[1].thickness_mm=3:12'];

describe('slabecho tune', () => {
  it('writes tuned.stack.json, tune.csv (one row per evaluation) and tune.json, which agree with each other', async () => {
    const out = join(tmp.dir, 'screen-out');
    const r = await cli('tune', screen, ...FREE, '--goal', 'min-worst-R', '--out', out, '--budget', '120');
    expect(r.code, r.stderr).toBe(0);
    expect(readdirSync(out).sort()).toEqual(['tune.csv', 'tune.json', 'tuned.stack.json']);
    const summary = JSON.parse(readFileSync(join(out, 'tune.json'), 'utf8'));
    const lines = readFileSync(join(out, 'tune.csv'), 'utf8').trimEnd().split('\n');
    expect(lines[0]).toBe('evaluation,stage,"materials[""wet, card""].ohm_per_sq",layers[1].thickness_mm,objective');
    expect(lines.length - 1).toBe(summary.evaluations.total);
    expect(summary.evaluations.total).toBeLessThanOrEqual(120);
    // The best row of the log is the summary's objective, and the tuned file holds the best values.
    const objectives = lines.slice(1).map((l) => Number(l.split(',').at(-1)));
    expect(Math.min(...objectives)).toBeCloseTo(summary.objective.value, 10);
    const tuned = parseStackText(readFileSync(join(out, 'tuned.stack.json'), 'utf8'));
    if (!tuned.ok) throw new Error(tuned.errors.join('\n'));
    expect(tuned.file.materials['wet, card']).toMatchObject({ ohm_per_sq: summary.best['materials["wet, card"].ohm_per_sq'] });
    expect(tuned.file.layers[1].thickness_mm).toBe(summary.best['layers[1].thickness_mm']);
    expect(r.stdout).toMatch(/layers\[1\]\.thickness_mm = 7\.\d+/);
    expect(r.stderr).toMatch(/^tune: 2 free paths, goal min-worst-R, 1 case, budget 120, seed 1/m);
  });

  it('the same seed gives the same log; another seed another', async () => {
    const run = async (seed: string, dir: string) => {
      expect((await cli('tune', screen, ...FREE, '--goal', 'min-worst-R', '--out', join(tmp.dir, dir), '--budget', '60', '--seed', seed)).code).toBe(0);
      return readFileSync(join(tmp.dir, dir, 'tune.csv'), 'utf8');
    };
    const a = await run('7', 'seed-a'), b = await run('7', 'seed-b'), c = await run('8', 'seed-c');
    expect(a).toBe(b);
    expect(a).not.toBe(c);
  });

  it('match from the command line: the measured file is read and the intervals written', async () => {
    const truth = parsed({ band_GHz: [4, 8], points: 21, materials: { slab: { model: 'fixed', eps_r: 3.3 } }, layers: [{ material: 'slab', thickness_mm: 12 }] });
    writeFileSync(join(tmp.dir, 'measured.csv'), synthetic(truth.stack, 21, ['R', 'T'], 0.002, new Mt19937(1)));
    const start = join(tmp.dir, 'slab.stack.json');
    writeFileSync(start, JSON.stringify({ band_GHz: [4, 8], points: 21, materials: { slab: { model: 'fixed', eps_r: 4 } }, layers: [{ material: 'slab', thickness_mm: 10 }] }));
    const out = join(tmp.dir, 'match-out');
    const r = await cli('tune', start, '--free', 'materials.slab.eps_r=1.5:8', '--free', 'layers[0].thickness_mm=5:20',
      '--goal', `match=${join(tmp.dir, 'measured.csv')}`, '--out', out);
    expect(r.code, r.stderr).toBe(0);
    const s = JSON.parse(readFileSync(join(out, 'tune.json'), 'utf8'));
    const [lo, hi] = s.interval_95['materials.slab.eps_r'];
    expect(lo).toBeLessThan(3.3);
    expect(hi).toBeGreaterThan(3.3);
    expect(s.evaluations.jacobian).toBeGreaterThan(0);
    expect(r.stdout).toMatch(/materials\.slab\.eps_r = 3\.\d+ \(95 %: /);
  });

  it('refuses what it cannot do, naming the option or path (exit 2, nothing written)', async () => {
    const out = join(tmp.dir, 'refused');
    const refusals: [string[], RegExp][] = [
      [['--free', 'layers[1].thickness_mm=0:12', '--goal', 'min-worst-R'], /--free layers\[1\]\.thickness_mm=0:12: the stack is refused at layers\[1\]\.thickness_mm = 0: layers\[1\]\.thickness_mm: must be a number > 0/],
      [['--free', 'layers[4].thickness_mm=1:2', '--goal', 'min-worst-R'], /layers\[4\]: no such entry/],
      [['--free', 'layers[1].thickness_mm=5', '--goal', 'min-worst-R'], /write layers\[1\]\.thickness_mm=LO:HI/],
      [['--free', 'layers[1].thickness_mm=9:5', '--goal', 'min-worst-R'], /LO must be below HI/],
      [['--free', 'layers[1].material=1:2', '--goal', 'min-worst-R'], /holds a text/],
      [['--free', 'layers[1].thickness_mm=3:12', '--goal', 'least-R'], /--goal: "least-R" is not a goal/],
      [['--free', 'layers[1].thickness_mm=3:12'], /--goal is required/],
      [['--free', 'layers[1].thickness_mm=3:12', '--goal', 'max-worst-T'], /nothing is transmitted/],
      [['--free', 'layers[1].thickness_mm=3:12', '--goal', 'min-worst-R', '--angle', '0:95:5'], /--angle: incidence\.angle_deg: must be/],
      [['--free', 'layers[1].thickness_mm=3:12', '--goal', 'min-worst-R', '--polarization', 'TX'], /--polarization: "TX" is not a polarization/],
      [['--free', 'layers[1].thickness_mm=3:12', '--goal', 'match=nowhere.csv'], /nowhere\.csv: no such file/],
    ];
    for (const [args, message] of refusals) {
      const r = await cli('tune', screen, ...args, '--out', out);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.stderr, args.join(' ')).toMatch(message);
    }
    const bad = join(tmp.dir, 'bad.csv');
    writeFileSync(bad, 'f_GHz,R_re\n9.5,0.1\n12,0.2\n');
    const r = await cli('tune', screen, '--free', 'layers[1].thickness_mm=3:12', '--goal', `match=${bad}`, '--out', out);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/give R_re and R_im together/);
    expect(r.stderr).toMatch(/line 3, f_GHz: 12 GHz is outside the stack's band 9–11 GHz/);
    expect(() => readdirSync(out)).toThrow();
  });

  it('Ctrl-C stops the search: exit 130, the folder keeps its previous files', async () => {
    const out = join(tmp.dir, 'interrupted');
    mkdirSync(out);
    writeFileSync(join(out, 'tune.csv'), 'earlier\n');
    const slow = join(tmp.dir, 'slow.stack.json');
    writeFileSync(slow, JSON.stringify({ ...SCREEN, points: 20001 }));
    const child = spawn(process.execPath, ['bin/slabecho.mjs', 'tune', slow, ...FREE, '--goal', 'min-worst-R', '--out', out, '--budget', '1000000', '--max-seconds', '1e7', '--max-output-MB', '1000'],
      { stdio: ['ignore', 'pipe', 'pipe'] });
    let stderr = '', sent = false;
    const code = await new Promise<number | null>((resolve) => {
      child.stderr.on('data', (d) => {
        stderr += String(d);
        if (/^tune: \d+\/1000000 evaluations/m.test(stderr) && !sent) { sent = true; child.kill('SIGINT'); }
      });
      child.on('exit', (c) => resolve(c));
    });
    expect(code).toBe(130);
    expect(stderr).toMatch(/stopped \(Ctrl-C\); nothing was written/);
    expect(readdirSync(out)).toEqual(['tune.csv']);
    expect(readFileSync(join(out, 'tune.csv'), 'utf8')).toBe('earlier\n');
  }, 60_000);
});

describe('slabecho tune: estimates', () => {
  it('refuses a tuning estimated over --max-seconds or --max-output-MB, before any work', async () => {
    const out = join(tmp.dir, 'too-big');
    const slow = await cli('tune', screen, ...FREE, '--goal', 'min-worst-R', '--out', out, '--angle', '0:80:1', '--polarization', 'TE,TM', '--max-seconds', '0.5');
    expect(slow.code).toBe(2);
    expect(slow.stderr).toMatch(/this tuning would take about \d+ s of computing \(600 evaluations × 3402 frequencies; limit 0\.5 s, --max-seconds\)/);
    const big = await cli('tune', screen, ...FREE, '--goal', 'min-worst-R', '--out', out, '--budget', '100000', '--max-output-MB', '0.1', '--max-seconds', '1e6');
    expect(big.code).toBe(2);
    expect(big.stderr).toMatch(/tune\.csv would hold about .* limit 0\.1 MB, --max-output-MB/);
    expect(() => readdirSync(out)).toThrow();
  });
});
