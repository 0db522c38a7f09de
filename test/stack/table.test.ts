// Table materials in stack files: the rows given inline or from a CSV file beside the stack file, what is
// refused (with the field named) and what the parsed stack holds. The physics of a table is checked in
// test/materials/table-methods.test.ts.
import { mkdirSync, symlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { tableFileReader } from '../../src/cli/io.ts';
import { permeability } from '../../src/materials/permeability.ts';
import { permittivity } from '../../src/materials/permittivity.ts';
import { parseStackObject, parseStackText, type ParseResult } from '../../src/stack/parse.ts';
import { NO_TABLE_FILES, type TableFileReader } from '../../src/stack/parse-table.ts';
import { cli, tempDir } from '../cli/support.ts';

const ROWS = [[1, 4, 0.1], [3, 3.8, 0.12], [6, 3.7, 0.15], [12, 3.6, 0.2]];
const stackWith = (mat: Record<string, unknown>, extra: Record<string, unknown> = {}) =>
  ({ band_GHz: [2, 10], layers: [{ material: 'sample', thickness_mm: 10 }], materials: { sample: mat }, ...extra });
const table = (extra: Record<string, unknown> = {}) => ({ model: 'table', points: ROWS, ...extra });

function errorsOf(r: ParseResult): string[] {
  if (r.ok) throw new Error('expected errors, got a valid stack');
  return r.errors;
}
function expectError(obj: unknown, path: string, text: RegExp, reader?: TableFileReader): void {
  const errs = errorsOf(parseStackObject(obj, { readTableFile: reader }));
  const line = errs.find((e) => e.startsWith(`${path}: `));
  expect(line, `no error for ${path} in:\n${errs.join('\n')}`).toBeDefined();
  expect(line).toMatch(text);
}
const filesOf = (files: Record<string, string>): TableFileReader => (name) =>
  name in files ? { ok: true, text: files[name] } : { ok: false, error: `"${name}": no such file beside the stack file` };

describe('table material: valid tables', () => {
  it('inline rows: ε = ε′ − jε″ at the rows themselves, the rows kept in the file form', () => {
    const r = parseStackObject(stackWith(table()));
    if (!r.ok) throw new Error(r.errors.join('\n'));
    const spec = r.stack.layers[0].material.spec;
    const e = permittivity(spec as never, 6e9);
    expect(e.re).toBeCloseTo(3.7, 14);
    expect(e.im).toBeCloseTo(-0.15, 14); // ε'' = 0.15 ≥ 0 is the loss, im = −ε'' (e^{+jωt})
    expect(r.file.materials.sample).toEqual({ model: 'table', points: ROWS });
  });

  it('a file beside the stack: its rows are read, held inline in the file form, μ columns become mu_points', () => {
    const csv = '# measured sample\nf_GHz,eps_re,eps_im,mu_re,mu_im\n1,4,0.1,1.2,0.05\n\n3,3.8,0.12,1.1,0.04\n12,3.6,0.2,1.05,0.02\n';
    const r = parseStackObject(stackWith({ model: 'table', file: 'sample.csv' }), { readTableFile: filesOf({ 'sample.csv': csv }) });
    if (!r.ok) throw new Error(r.errors.join('\n'));
    expect(r.file.materials.sample).toEqual({
      model: 'table', points: [[1, 4, 0.1], [3, 3.8, 0.12], [12, 3.6, 0.2]], mu_points: [[1, 1.2, 0.05], [3, 1.1, 0.04], [12, 1.05, 0.02]],
    });
    const mu = permeability(r.stack.layers[0].material.spec as never, 3e9);
    expect(mu.re).toBeCloseTo(1.1, 14);
    expect(mu.im).toBeCloseTo(-0.04, 14);
    // The file form re-parses on its own (no reader needed): a written stack is complete.
    expect(parseStackObject(r.file).ok).toBe(true);
  });

  it('a table may carry a magnetic block when it has no measured μ', () => {
    const r = parseStackObject(stackWith(table({ magnetic: { model: 'fixed', mu_r: 2, mu_loss: 0.1 } })));
    expect(r.ok).toBe(true);
  });
});

describe('table material: refused tables name the field', () => {
  it('decreasing frequencies', () => {
    expectError(stackWith(table({ points: [[1, 4, 0.1], [6, 3.8, 0.1], [5, 3.7, 0.1], [12, 3.6, 0.1]] })),
      'materials.sample.points[2][0]', /frequencies must increase .*5 GHz after 6 GHz/);
  });
  it('a repeated frequency', () => {
    expectError(stackWith(table({ points: [[1, 4, 0.1], [6, 3.8, 0.1], [6, 3.7, 0.1], [12, 3.6, 0.1]] })),
      'materials.sample.points[2][0]', /frequencies must increase/);
  });
  it('ε″ < 0 (a gain medium under e^{+jωt})', () => {
    expectError(stackWith(table({ points: [[1, 4, 0.1], [6, 3.8, -0.01], [12, 3.6, 0.1]] })),
      'materials.sample.points[1][2]', /ε'' as a number ≥ 0 .*got -0\.01/);
  });
  it('NaN (as JSON can carry it: a string) and a missing cell', () => {
    expectError(stackWith(table({ points: [[1, 4, 0.1], [6, 'NaN', 0.1], [12, 3.6, 0.1]] })),
      'materials.sample.points[1][1]', /ε' as a number > 0 .*the string "NaN"/);
    expectError(stackWith(table({ points: [[1, 4, 0.1], [6, 3.8], [12, 3.6, 0.1]] })),
      'materials.sample.points[1]', /a row of three numbers/);
  });
  it('one point', () => {
    expectError(stackWith(table({ points: [[6, 4, 0.1]] })), 'materials.sample.points', /a list of 2 to \d+ rows .*a list of 1/);
  });
  it('a band outside the table: the error gives both ranges', () => {
    expectError(stackWith(table(), { band_GHz: [2, 20] }), 'materials.sample.points', /covers 1–12 GHz but the band \(band_GHz\) is 2–20 GHz/);
  });
  it('a profile frequency outside the table', () => {
    expectError(stackWith(table(), { profile_GHz: 14 }), 'profile_GHz', /outside the range of the table material "sample" \(1–12 GHz\)/);
  });
  it('points and file together, or neither', () => {
    expectError(stackWith(table({ file: 'a.csv' })), 'materials.sample', /either as "points" or as "file"/);
    expectError(stackWith({ model: 'table' }), 'materials.sample', /needs "points"/);
  });
  it('μ given twice: mu_points and a magnetic block', () => {
    expectError(stackWith(table({ mu_points: [[1, 1.1, 0], [12, 1.1, 0]], magnetic: { model: 'fixed', mu_r: 2 } })),
      'materials.sample.magnetic', /give μ one way/);
  });
  it('μ″ < 0 in mu_points', () => {
    expectError(stackWith(table({ mu_points: [[1, 1.1, 0], [12, 1.1, -0.2]] })), 'materials.sample.mu_points[1][2]', /μ'' as a number ≥ 0/);
  });
  it('a file when no one can read it (the workbench): says so', () => {
    const errs = errorsOf(parseStackText(JSON.stringify(stackWith({ model: 'table', file: 'sample.csv' }))));
    expect(errs).toContain(`materials.sample.file: ${NO_TABLE_FILES}`);
  });
  it('bad rows in a file name the file, the line and the column', () => {
    const read = filesOf({
      'neg.csv': 'f_GHz,eps_re,eps_im\n1,4,0.1\n6,3.8,-0.2\n12,3.6,0.1\n',
      'nan.csv': 'f_GHz,eps_re,eps_im\n1,4,0.1\n6,NaN,0.2\n12,3.6,0.1\n',
      'down.csv': 'f_GHz,eps_re,eps_im\n1,4,0.1\n16,3.8,0.2\n12,3.6,0.1\n',
      'one.csv': 'f_GHz,eps_re,eps_im\n1,4,0.1\n',
      'cols.csv': 'f_GHz,eps_re,loss\n1,4,0.1\n12,3.6,0.1\n',
    });
    const file = (name: string) => stackWith({ model: 'table', file: name });
    expectError(file('neg.csv'), 'materials.sample.file', /neg\.csv line 3, eps_im: must be ε'' as a number ≥ 0/, read);
    expectError(file('nan.csv'), 'materials.sample.file', /nan\.csv line 3, eps_re: must be a number \(got "NaN"\)/, read);
    expectError(file('down.csv'), 'materials.sample.file', /down\.csv line 4, f_GHz: frequencies must increase/, read);
    expectError(file('one.csv'), 'materials.sample.file', /one\.csv: needs at least 2 rows/, read);
    expectError(file('cols.csv'), 'materials.sample.file', /unknown column "loss"/, read);
    expectError(file('gone.csv'), 'materials.sample.file', /no such file/, read);
  });
});

describe('table files from the command line: resolved beside the stack file, never outside its folder', () => {
  const tmp = tempDir();
  afterAll(tmp.cleanup);
  const inner = join(tmp.dir, 'project');
  mkdirSync(join(inner, 'data'), { recursive: true });
  const csv = 'f_GHz,eps_re,eps_im\n1,4,0.1\n12,3.6,0.2\n';
  writeFileSync(join(tmp.dir, 'outside.csv'), csv);
  writeFileSync(join(inner, 'data', 'sample.csv'), csv);
  symlinkSync(join(tmp.dir, 'outside.csv'), join(inner, 'link.csv'));
  const read = tableFileReader(inner);

  it('a file in a folder under the stack file is read', () => {
    expect(read('data/sample.csv')).toEqual({ ok: true, text: csv });
  });
  it('"..", an absolute path and a link pointing out are refused', () => {
    expect(read('../outside.csv')).toMatchObject({ ok: false, error: expect.stringMatching(/outside the stack file's folder/) });
    expect(read(join(tmp.dir, 'outside.csv'))).toMatchObject({ ok: false, error: expect.stringMatching(/absolute path/) });
    expect(read('link.csv')).toMatchObject({ ok: false, error: expect.stringMatching(/link to a file outside/) });
  });
  it('slabecho solve refuses a stack whose table lies outside its folder (exit 2, the field named), and solves one beside it', async () => {
    const bad = join(inner, 'bad.stack.json'), good = join(inner, 'good.stack.json');
    writeFileSync(bad, JSON.stringify(stackWith({ model: 'table', file: '../outside.csv' }, { points: 5 })));
    writeFileSync(good, JSON.stringify(stackWith({ model: 'table', file: 'data/sample.csv' }, { points: 5 })));
    const r = await cli('solve', bad, '--out', join(tmp.dir, 'out-bad'));
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/materials\.sample\.file: "\.\.\/outside\.csv" lies outside the stack file's folder/);
    const g = await cli('solve', good, '--out', join(tmp.dir, 'out-good'));
    expect(g.code, g.stderr).toBe(0);
  });
});
