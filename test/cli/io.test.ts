// Atomic writes, directory creation and CSV formatting.
import { mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ensureDir, writeAtomic, writeFilesAtomic } from '../../src/cli/io.ts';
import { InputError } from '../../src/cli/command.ts';
import { assertFiniteValues, formatCsv, formatNumber, TableError } from '../../src/report/table.ts';
import { tempDir } from './support.ts';

const tmp = tempDir();
afterAll(tmp.cleanup);

describe('writeAtomic', () => {
  it('writes the whole text and leaves no temporary file', () => {
    const p = join(tmp.dir, 'a.txt');
    writeAtomic(p, 'first');
    writeAtomic(p, 'second, longer');
    expect(readFileSync(p, 'utf8')).toBe('second, longer');
    expect(readdirSync(tmp.dir).filter((f) => f.includes('.tmp'))).toEqual([]);
  });
  it('a failed write leaves no temporary file and the old file intact', () => {
    const dir = join(tmp.dir, 'fail');
    mkdirSync(dir);
    writeFileSync(join(dir, 'keep.csv'), 'old');
    mkdirSync(join(dir, 'clash.csv')); // renaming a file onto a directory fails
    expect(() => writeAtomic(join(dir, 'clash.csv'), 'x')).toThrow();
    expect(() => writeFilesAtomic(dir, [{ name: 'keep.csv', text: 'new' }, { name: 'missing/sub.csv', text: 'y' }])).toThrow(InputError);
    expect(readdirSync(dir).sort()).toEqual(['clash.csv', 'keep.csv']);
    expect(readFileSync(join(dir, 'keep.csv'), 'utf8')).toBe('old');
  });
});

describe('ensureDir', () => {
  it('creates nested directories and refuses a file', () => {
    const d = join(tmp.dir, 'x', 'y', 'z');
    ensureDir(d);
    ensureDir(d);
    const f = join(tmp.dir, 'plain');
    writeFileSync(f, '');
    expect(() => ensureDir(f)).toThrow(/exists and is not a directory/);
  });
});

describe('CSV', () => {
  it('writes a header and rows with 12 significant digits', () => {
    const text = formatCsv([
      { name: 'f_GHz', data: Float64Array.of(1, 2.5) },
      { name: 'R_re', data: Float64Array.of(-1 / 3, 1.23e-17) },
    ]);
    expect(text).toBe('f_GHz,R_re\n1,-0.333333333333\n2.5,1.23e-17\n');
    expect(formatNumber(-0)).toBe('0');
    expect(formatNumber(0.1 + 0.2)).toBe('0.3');
    expect(Number(formatNumber(Math.PI))).toBeCloseTo(Math.PI, 11);
  });
  it('refuses NaN and Infinity, naming the column and row', () => {
    expect(() => formatCsv([{ name: 'f_GHz', data: Float64Array.of(1, 2) }, { name: 'T_re', data: Float64Array.of(0, Number.NaN) }]))
      .toThrow(new TableError('column T_re holds NaN at row 1'));
    expect(() => formatCsv([{ name: 'E', data: Float64Array.of(Infinity) }])).toThrow(/column E holds Infinity/);
  });
  it('a summary with a non-finite number is refused, naming where it is', () => {
    expect(() => assertFiniteValues({ a: [1, { b: Number.NaN }] })).toThrow(new TableError('summary.a[1].b is NaN'));
    expect(() => assertFiniteValues({ a: null, b: 'x', c: [0, -1e300] })).not.toThrow();
  });
  it('refuses ragged or duplicate columns', () => {
    expect(() => formatCsv([{ name: 'a', data: new Float64Array(2) }, { name: 'b', data: new Float64Array(3) }])).toThrow(/rows/);
    expect(() => formatCsv([{ name: 'a', data: new Float64Array(2) }, { name: 'a', data: new Float64Array(2) }])).toThrow(/twice/);
  });
});
