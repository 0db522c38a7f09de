// Atomic writes, directory creation and CSV formatting.
import { mkdirSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ensureDir, fsOps, OutputLimitError, readStackFile, textFile, writeAtomic, writeFilesAtomic } from '../../src/cli/io.ts';
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
    expect(() => writeFilesAtomic(dir, [textFile('keep.csv', 'new'), textFile('missing/sub.csv', 'y')])).toThrow(InputError);
    expect(readdirSync(dir).sort()).toEqual(['clash.csv', 'keep.csv']);
    expect(readFileSync(join(dir, 'keep.csv'), 'utf8')).toBe('old');
  });
});

/** An error as node's fs raises it (code and message), for conditions a test cannot produce on demand. */
const fsError = (code: string, syscall: string, path: string): Error =>
  Object.assign(new Error(`${code}: simulated, ${syscall} '${path}'`), { code, syscall, path });

/** Run `body` with one fs call replaced, restoring it afterwards. */
function withFsOp<K extends keyof typeof fsOps>(key: K, replacement: (typeof fsOps)[K], body: () => void): void {
  const original = fsOps[key];
  fsOps[key] = replacement;
  try { body(); } finally { fsOps[key] = original; }
}

const noTemps = (dir: string) => readdirSync(dir).filter((f) => f.endsWith('.tmp'));

describe('streamed writes', () => {
  it('write a file from many chunks in bounded pieces, never the whole text at once', () => {
    const dir = join(tmp.dir, 'stream');
    mkdirSync(dir);
    const rows = 200_000;
    function* lines() { for (let i = 0; i < rows; i++) yield `${i},${i * 0.5}\n`; }
    let calls = 0, largest = 0;
    const write = fsOps.writeSync;
    withFsOp('writeSync', ((fd: number, buf: Buffer) => { calls++; largest = Math.max(largest, buf.length); return write(fd, buf); }) as typeof fsOps.writeSync, () => {
      writeFilesAtomic(dir, [{ name: 'big.csv', chunks: lines() }]);
    });
    const text = readFileSync(join(dir, 'big.csv'), 'utf8');
    expect(text.split('\n').length).toBe(rows + 1);
    expect(text.startsWith('0,0\n1,0.5\n')).toBe(true);
    expect(calls).toBeGreaterThan(10);
    expect(largest).toBeLessThan(200_000); // the batches, not the ~2.8 MB file
    expect(noTemps(dir)).toEqual([]);
  });

  it('stop at the output limit: nothing written, no temporary file, previous files kept', () => {
    const dir = join(tmp.dir, 'limit');
    mkdirSync(dir);
    writeFileSync(join(dir, 'a.csv'), 'old');
    function* many() { for (let i = 0; i < 100_000; i++) yield '0123456789\n'; }
    expect(() => writeFilesAtomic(dir, [textFile('a.csv', 'new'), { name: 'b.csv', chunks: many() }], { maxBytes: 100_000, limitName: '--max-output-MB 0.1' }))
      .toThrow(OutputLimitError);
    expect(readdirSync(dir)).toEqual(['a.csv']);
    expect(readFileSync(join(dir, 'a.csv'), 'utf8')).toBe('old');
  });
});

describe('file-system errors in plain words (POSIX error meanings: common practice, no source)', () => {
  const dir = join(tmp.dir, 'errors');
  mkdirSync(dir);

  it('a full disk while writing: says so, names the directory given, removes its temporary files', () => {
    withFsOp('writeSync', (() => { throw fsError('ENOSPC', 'write', join(dir, '.x.tmp')); }) as typeof fsOps.writeSync, () => {
      expect(() => writeFilesAtomic(dir, [textFile('a.csv', 'x'), textFile('b.csv', 'y')])).toThrow(`cannot write into ${dir}: the disk is full; nothing was written`);
    });
    expect(readdirSync(dir)).toEqual([]);
  });

  it('a read-only directory or file system, and missing permission, never name a temporary file', () => {
    for (const [c, words] of [['EROFS', 'the file system is read-only'], ['EACCES', 'permission denied'], ['EPERM', 'permission denied']] as const) {
      withFsOp('openSync', ((p: string) => { throw fsError(c, 'open', p); }) as typeof fsOps.openSync, () => {
        let msg = '';
        try { writeFilesAtomic(dir, [textFile('a.csv', 'x')]); } catch (e) { msg = (e as Error).message; }
        expect(msg).toBe(`cannot write into ${dir}: ${words}; nothing was written`);
        expect(msg).not.toMatch(/\.tmp/);
      });
    }
  });

  it('a subdirectory that cannot be created on a read-only file system is named with that cause', () => {
    const sub = join(dir, 'new', 'deeper');
    withFsOp('mkdirSync', ((p: string) => { throw fsError('EROFS', 'mkdir', p); }) as typeof fsOps.mkdirSync, () => {
      expect(() => ensureDir(sub)).toThrow(`--out ${sub}: cannot create the directory ${join(dir, 'new')} (the file system is read-only)`);
    });
  });

  it('a file system that refuses every mkdir with "no such file" ends at once (no endless retry)', () => {
    const sub = join(dir, 'x', 'y');
    withFsOp('mkdirSync', ((p: string) => { throw fsError('ENOENT', 'mkdir', p); }) as typeof fsOps.mkdirSync, () => {
      expect(() => ensureDir(sub)).toThrow(/cannot create the directory/);
    });
  });

  it('a missing stack file, a directory, and a path through a file', () => {
    expect(() => readStackFile(join(dir, 'none.stack.json'))).toThrow(`${join(dir, 'none.stack.json')}: no such file or directory`);
    expect(() => readStackFile(dir)).toThrow(/is a directory, not a stack file/);
    const file = join(dir, 'plain.txt');
    writeFileSync(file, '');
    expect(() => readStackFile(join(file, 'x.json'))).toThrow(/a part of the path is not a directory/);
    expect(() => ensureDir(join(file, 'sub'))).toThrow(`--out ${join(file, 'sub')}: cannot create it, ${file} is a file, not a directory`);
    rmSync(file);
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
