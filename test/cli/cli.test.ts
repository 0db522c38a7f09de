// The command line run in-process through main(): exit codes 0/1/2, help, one-line errors, outputs.
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { COMMANDS, runCommand } from '../../src/cli/main.ts';
import { SLABECHO_VERSION } from '../../src/version.ts';
import { cli, readCsv, tempDir } from './support.ts';

const tmp = tempDir();
afterAll(tmp.cleanup);
let n = 0;
const file = (obj: unknown): string => {
  const p = join(tmp.dir, `in-${n++}.stack.json`);
  writeFileSync(p, typeof obj === 'string' ? obj : JSON.stringify(obj));
  return p;
};
const wall = { title: 'Test wall', band_GHz: [1, 6], layers: [{ material: 'concrete', thickness_mm: 150 }], points: 21 };

describe('top level', () => {
  it('--help lists every command and exits 0', async () => {
    const r = await cli('--help');
    expect(r.code).toBe(0);
    for (const c of ['check', 'materials', 'solve']) expect(r.stdout).toMatch(new RegExp(`^  ${c} `, 'm'));
  });
  it('no command: help on stderr, exit 2', async () => {
    const r = await cli();
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('Usage: slabecho COMMAND');
  });
  it('unknown command or option: one message, exit 2', async () => {
    const r = await cli('chek');
    expect(r.code).toBe(2);
    expect(r.err).toHaveLength(1);
    expect(r.stderr).toMatch(/unknown command "chek" \(did you mean "check"\?\)/);
    expect((await cli('--frobnicate')).code).toBe(2);
  });
  it('--version matches package.json', async () => {
    const pkg = JSON.parse(readFileSync('package.json', 'utf8')) as { version: string };
    expect(SLABECHO_VERSION).toBe(pkg.version);
    expect((await cli('--version')).stdout).toBe(pkg.version);
  });
  it('every command has --help (exit 0) and refuses unknown options (exit 2)', async () => {
    for (const c of COMMANDS) {
      const h = await cli(c.name, '--help');
      expect(h.code, c.name).toBe(0);
      expect(h.stdout).toContain(`Usage: slabecho ${c.name}`);
      expect((await cli('help', c.name)).stdout).toContain(`Usage: slabecho ${c.name}`);
      const u = await cli(c.name, '--no-such-option');
      expect(u.code, c.name).toBe(2);
      expect(u.stderr).toContain('unknown option --no-such-option');
      expect(u.err).toHaveLength(1);
    }
  });
  it('numeric options take plain decimal numbers only: one line naming the option, exit 2', async () => {
    const f = file(wall), out = join(tmp.dir, 'never-written');
    const cases: [string[], string][] = [
      [['materials', '--at-GHz', '0x10'], '--at-GHz'],
      [['materials', '--at-GHz', 'Infinity'], '--at-GHz'],
      [['solve', f, '--out', out, '--fem-density', ' '], '--fem-density'],
      [['solve', f, '--out', out, '--fem-order', '2.5'], '--fem-order'],
      [['run', f, '--out', out, '--courant', '0b1'], '--courant'],
      [['run', f, '--out', out, '--accuracy', '1e-2x'], '--accuracy'],
      [['converge', f, '--fem-order', '4'], '--fem-order'],
      [['bench', '--steps', '1e3.5'], '--steps'],
    ];
    for (const [args, option] of cases) {
      const r = await cli(...args);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.err, args.join(' ')).toHaveLength(1);
      expect(r.stderr).toMatch(new RegExp(`^slabecho \\w+: ${option}: must be `));
    }
    expect(existsSync(out)).toBe(false);
    // Exponent notation is a plain decimal: 1e1 GHz is 10 GHz.
    expect((await cli('materials', '--at-GHz', '1e1', '--json')).code).toBe(0);
  });
  it('an unexpected exception is one line and exit 1, no stack trace', async () => {
    const out: string[] = [], err: string[] = [];
    const code = await runCommand({
      name: 'boom', summary: '', usage: '',
      run: async () => { throw new TypeError('cannot read x of undefined'); },
    }, [], { out: (l) => out.push(l), err: (l) => err.push(l) });
    expect(code).toBe(1);
    expect(err).toHaveLength(1);
    expect(err[0]).toMatch(/^slabecho boom: internal error: cannot read x of undefined/);
    expect(err.join('\n')).not.toMatch(/\n\s+at /);
  });
});

describe('check', () => {
  it('a valid file: exit 0, a one-line summary', async () => {
    const r = await cli('check', file(wall));
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/ok: "Test wall", 1 layer, 1–6 GHz, 21 points/);
    expect(r.err).toEqual([]);
  });
  it('an invalid file: exit 2, one line per problem naming the field', async () => {
    const p = file({ band_GHz: [1, 6], layers: [{ material: 'brick', thickness_mm: 10 }, { material: 'brick', thickness_mm: 0 }], points: '12' });
    const r = await cli('check', p);
    expect(r.code).toBe(2);
    expect(r.err).toContain(`${p}: layers[1].thickness_mm: must be a number > 0 (got 0)`);
    expect(r.err).toContain(`${p}: points: must be a whole number from 2 to 100000 (got the string "12")`);
    expect(r.out).toEqual([]);
  });
  it('invalid JSON names line and column', async () => {
    const r = await cli('check', file('{\n  "band_GHz": [1, 6],\n  "layers": [}\n'));
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/file: invalid JSON at line 3, column 14/);
  });
  it('missing file, directory, over 1 MB, not UTF-8: exit 2, no stack trace', async () => {
    const big = file(JSON.stringify(wall) + ' '.repeat(1_000_001));
    const bin = join(tmp.dir, 'bin.stack.json');
    writeFileSync(bin, Buffer.from([0x7b, 0xff, 0xfe, 0x7d]));
    for (const [p, msg] of [[join(tmp.dir, 'nope.json'), /no such file/], [tmp.dir, /is a directory/], [big, /over the 1 MB limit/], [bin, /not UTF-8/]] as const) {
      const r = await cli('check', p);
      expect(r.code, p).toBe(2);
      expect(r.stderr).toMatch(msg);
      expect(r.stderr).not.toMatch(/\n\s+at /);
    }
  });
  it('warnings go to stderr and keep exit 0', async () => {
    const r = await cli('check', file({ band_GHz: [0.5, 6], layers: [{ material: 'brick', thickness_mm: 100 }] }));
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/warning: layers\[0\]: the band 0\.5–6 GHz leaves the validity range of "brick", 1–40 GHz/);
  });
  it('--expanded prints the file with defaults filled in', async () => {
    const r = await cli('check', '--expanded', file({ band_GHz: [1, 3] }));
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout)).toMatchObject({ title: 'Untitled stack', front: 'air', back: 'air', points: 501, profile_GHz: 2 });
  });
  it('needs a FILE', async () => {
    expect((await cli('check')).code).toBe(2);
  });
});

describe('materials', () => {
  it('a readable table with every catalog name, sources and validity', async () => {
    const r = await cli('materials');
    expect(r.code).toBe(0);
    for (const name of ['air', 'concrete', 'ceiling-board', 'wet-ground', 'water-25c']) expect(r.stdout).toMatch(new RegExp(`^${name} `, 'm'));
    expect(r.stdout).toContain('ITU-R P.2040-3');
    expect(r.stdout).toContain('1–100');
  });
  it('--json rows carry the documented keys; --at-GHz adds eps_r and sigma (ITU-R P.2040-3 Table 3: concrete 5.24, 0.0462 S/m at 1 GHz)', async () => {
    const plain = JSON.parse((await cli('materials', '--json')).stdout) as Record<string, unknown>[];
    expect(Object.keys(plain[1])).toEqual(['name', 'model', 'parameters', 'source', 'valid_GHz', 'note']);
    const r = await cli('materials', '--json', '--at-GHz', '1');
    expect(r.code).toBe(0);
    const rows = JSON.parse(r.stdout) as Record<string, unknown>[];
    const concrete = rows.find((x) => x.name === 'concrete')!;
    expect(Object.keys(concrete)).toEqual(['name', 'model', 'eps_r', 'sigma_S_per_m', 'parameters', 'source', 'valid_GHz', 'note']);
    expect(concrete.eps_r).toBe(5.24);
    expect(concrete.sigma_S_per_m).toBeCloseTo(0.0462, 10);
    expect(concrete.valid_GHz).toEqual([1, 100]);
    // Water at 10 GHz: ε' ≈ 62.8 (physics reference, from memory).
    const w = (JSON.parse((await cli('materials', '--json', '--at-GHz', '10')).stdout) as { name: string; eps_r: number }[]).find((x) => x.name === 'water-25c')!;
    expect(w.eps_r).toBeCloseTo(62.8, 1);
  });
  it('--at-GHz 300 lists glass and ceiling board from their 220–450 GHz rows (ITU-R P.2040-3 Table 3: 5.79, 0.0004·f^1.658; 1.52, 0.0029·f^1.029)', async () => {
    const rows = JSON.parse((await cli('materials', '--json', '--at-GHz', '300')).stdout) as { name: string; eps_r: number; sigma_S_per_m: number; valid_GHz: number[] }[];
    expect(rows.filter((x) => x.name === 'glass')).toHaveLength(1);
    const glass = rows.find((x) => x.name === 'glass')!, board = rows.find((x) => x.name === 'ceiling-board')!;
    expect(glass.eps_r).toBe(5.79);
    expect(glass.sigma_S_per_m / (0.0004 * 300 ** 1.658)).toBeCloseTo(1, 5);
    expect(glass.valid_GHz).toEqual([220, 450]);
    expect(board.eps_r).toBe(1.52);
    expect(board.sigma_S_per_m / (0.0029 * 300 ** 1.029)).toBeCloseTo(1, 5);
    // Without a frequency every range is its own row, and the edition is stated.
    const all = await cli('materials');
    expect(all.stdout.match(/^glass /gm)).toHaveLength(2);
    expect(all.stdout).toContain('unchanged from P.2040-2');
    expect(all.stdout).not.toMatch(/from memory, verify against the Recommendation/);
  });
  it('--at-GHz must be a number > 0: exit 2 naming the option', async () => {
    for (const bad of ['abc', '0', '-1', '', '1e400', 'NaN']) {
      const r = await cli('materials', `--at-GHz=${bad}`);
      expect(r.code, bad).toBe(2);
      expect(r.stderr).toMatch(/--at-GHz: must be a number > 0/);
    }
    expect((await cli('materials', '--at-GHz')).code).toBe(2);
  });
});

describe('solve', () => {
  it('writes spectrum.csv, profile.csv and summary.json', async () => {
    const out = join(tmp.dir, 'out-wall');
    const r = await cli('solve', file(wall), '--out', out);
    expect(r.code).toBe(0);
    expect(readdirSync(out).sort()).toEqual(['profile.csv', 'spectrum.csv', 'summary.json']);
    const sp = readCsv(readFileSync(join(out, 'spectrum.csv'), 'utf8'));
    // The exact solution's group first; other methods append their own groups after it.
    expect(sp.header.slice(0, 5)).toEqual(['f_GHz', 'R_tmm_re', 'R_tmm_im', 'T_tmm_re', 'T_tmm_im']);
    expect(sp.rows).toHaveLength(21);
    expect(sp.rows[0][0]).toBe(1);
    expect(sp.rows[20][0]).toBe(6);
    const pr = readCsv(readFileSync(join(out, 'profile.csv'), 'utf8'));
    expect(pr.header.slice(0, 3)).toEqual(['x_mm', 'E_tmm_re', 'E_tmm_im']);
    for (const row of [...sp.rows, ...pr.rows]) for (const v of row) expect(Number.isFinite(v)).toBe(true);
    // E(0) = 1 + R at the front face: incident amplitude 1 at x = 0, R referred to x = 0 (README conventions).
    const at0 = pr.rows.find((row) => row[0] === 0)!;
    const s = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    expect(s).toMatchObject({ title: 'Test wall', band_GHz: [1, 6], points: 21, profile_GHz: 3.5, incidence: { angle_deg: 0, polarization: 'TE' } });
    expect(s.layers[0]).toMatchObject({ name: 'concrete', model: 'power-law', thickness_mm: 150, source: expect.stringContaining('ITU-R P.2040-3') });
    expect(s.layers[0].eps_r_at_centre.re).toBe(5.24);
    expect(s.methods[0].name).toBe('tmm');
    expect(s.methods[0].time_ms).toBeGreaterThanOrEqual(0);
    expect(at0).toBeDefined();
    const atProfile = sp.rows.find((row) => row[0] === s.profile_GHz)!;
    expect(Math.hypot(at0[1] - (1 + atProfile[1]), at0[2] - atProfile[2])).toBeLessThan(1e-9);
    expect(r.stdout).toMatch(/wrote .*spectrum\.csv/);
  });
  it('an invalid stack: exit 2 and nothing written', async () => {
    const out = join(tmp.dir, 'out-bad');
    const r = await cli('solve', file({ band_GHz: [6, 1] }), '--out', out);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('band_GHz: min must be below max');
    expect(existsSync(out)).toBe(false);
  });
  it('usage errors: missing --out, missing FILE, --out a file', async () => {
    expect((await cli('solve', file(wall))).code).toBe(2);
    expect((await cli('solve', '--out', join(tmp.dir, 'x'))).code).toBe(2);
    const f = file(wall);
    const r = await cli('solve', f, '--out', f);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/exists and is not a directory/);
  });
  it('oblique incidence: profile.csv along the normal line, with the tangential H in TM, and no profile warning', async () => {
    const out = join(tmp.dir, 'out-oblique');
    mkdirSync(out);
    writeFileSync(join(out, 'profile.csv'), 'stale');
    const r = await cli('solve', file({ ...wall, incidence: { angle_deg: 30, polarization: 'TM' } }), '--out', out);
    expect(r.code).toBe(0);
    expect(readdirSync(out).sort()).toEqual(['profile.csv', 'spectrum.csv', 'summary.json']);
    const pr = readCsv(readFileSync(join(out, 'profile.csv'), 'utf8'));
    expect(pr.header).toEqual(['x_mm', 'E_tmm_re', 'E_tmm_im', 'H_tmm_re', 'H_tmm_im', 'E_fem_re', 'E_fem_im', 'H_fem_re', 'H_fem_im']);
    // At x = 0: E_t = 1 + R and H_t = 1 − R over their incident values (superposition of the incident and
    // reflected waves, common practice); R at the profile frequency 3.5 GHz is row 10 of the spectrum.
    const sp = readCsv(readFileSync(join(out, 'spectrum.csv'), 'utf8'));
    const R = sp.rows[10], at0 = pr.rows.find((row) => row[0] === 0)!;
    expect(R[0]).toBe(3.5);
    expect(Math.hypot(at0[1] - (1 + R[1]), at0[2] - R[2])).toBeLessThan(1e-9);
    expect(Math.hypot(at0[3] - (1 - R[1]), at0[4] + R[2])).toBeLessThan(1e-9);
    expect(r.stderr).not.toMatch(/profile_GHz/);
    const s = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    expect(s.profile_GHz).toBe(3.5);
  });
  it('leaves no temporary files and replaces earlier results', async () => {
    const out = join(tmp.dir, 'out-twice');
    await cli('solve', file(wall), '--out', out);
    const r = await cli('solve', file({ ...wall, points: 5 }), '--out', out);
    expect(r.code).toBe(0);
    expect(readdirSync(out).filter((f) => f.endsWith('.tmp') || f.startsWith('.'))).toEqual([]);
    expect(readCsv(readFileSync(join(out, 'spectrum.csv'), 'utf8')).rows).toHaveLength(5);
  });
});
