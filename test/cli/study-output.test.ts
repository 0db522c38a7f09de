// A study's output set: files streamed to temporary files and renamed together; aborted (limit passed, Ctrl-C,
// error) it leaves the folder as it was.
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { OutputSet } from '../../src/cli/studies/output.ts';
import { tempDir } from './support.ts';

const tmp = tempDir();
afterAll(() => tmp.cleanup());

describe('OutputSet', () => {
  it('puts every file in place at commit, and nothing before', () => {
    const dir = join(tmp.dir, 'a');
    const set = new OutputSet(dir);
    const csv = set.stream('table.csv');
    csv.write('h\n'); csv.write(new TextEncoder().encode('1\n'));
    set.add('sub/one.txt', 'x');
    expect(readdirSync(dir).filter((n) => !n.startsWith('.'))).toEqual(['sub']);
    set.commit();
    expect(readFileSync(join(dir, 'table.csv'), 'utf8')).toBe('h\n1\n');
    expect(readFileSync(join(dir, 'sub', 'one.txt'), 'utf8')).toBe('x');
    expect(readdirSync(dir).some((n) => n.endsWith('.tmp'))).toBe(false);
  });

  it('aborts when the files pass the cap, keeping the earlier file and leaving no temporary one', () => {
    const dir = join(tmp.dir, 'b');
    mkdirSync(dir);
    writeFileSync(join(dir, 'table.csv'), 'old\n');
    const set = new OutputSet(dir, 10);
    const csv = set.stream('table.csv');
    csv.write('123456');
    expect(() => csv.write('7890123')).toThrow(/passed its limit of 0.00001 MB .* while writing table\.csv; nothing was written/);
    expect(readdirSync(dir)).toEqual(['table.csv']);
    expect(readFileSync(join(dir, 'table.csv'), 'utf8')).toBe('old\n');
  });

  it('removes stale files of an earlier, larger study at commit', () => {
    const dir = join(tmp.dir, 'c');
    mkdirSync(join(dir, 'touchstone'), { recursive: true });
    for (const n of ['case-0.s2p', 'case-1.s2p', 'notes.txt']) writeFileSync(join(dir, 'touchstone', n), n);
    const set = new OutputSet(dir);
    set.add('touchstone/case-0.s2p', 'new');
    set.commit([{ folder: 'touchstone', prefix: 'case-' }]);
    expect(readdirSync(join(dir, 'touchstone')).sort()).toEqual(['case-0.s2p', 'notes.txt']);
    expect(existsSync(join(dir, 'touchstone', 'case-1.s2p'))).toBe(false);
  });
});
