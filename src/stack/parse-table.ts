// A measured table material: {"model": "table", "points": [[f_GHz, eps_re, eps_im], …]} with an optional
// "mu_points" of the same shape (μ', μ''), or {"model": "table", "file": "name.csv"} whose columns are
// f_GHz,eps_re,eps_im and optionally mu_re,mu_im. Losses are ε'' ≥ 0 and μ'' ≥ 0 of ε = ε' − jε'' under
// e^{+jωt}. Rows: at least two, frequencies strictly increasing, covering the band (and the profile frequency,
// checked in parse.ts). The core reads no files: the caller hands over a `readTableFile` that returns the
// file's text or says why it cannot (the command line resolves the name beside the stack file and refuses one
// outside its folder); without one a `file` is refused. The normalized file form holds the points themselves,
// so a parsed stack written back out is complete on its own.

import type { TablePoint, TableModel } from '../materials/types.ts';
import { tableCovers, tableRange_GHz } from '../materials/table.ts';
import { STACK_LIMITS } from './file.ts';
import { readNumericCsv } from './numeric-csv.ts';
import { describe, has, joinIndex, joinKey, own, type Problems } from './problems.ts';
import { fmtGHz } from './warnings.ts';

/** The text of a table file named in a stack file, or why it cannot be had. */
export type TableFileResult = { ok: true; text: string } | { ok: false; error: string };
export type TableFileReader = (name: string) => TableFileResult;

/** What the parser says when there is no reader (the workbench, or a stack given as text alone). */
export const NO_TABLE_FILES = 'a table file can only be read by the command line, beside the stack file; ' +
  'put its rows into "points" as [[f_GHz, eps_re, eps_im], …] instead';

type Part = 'eps' | 'mu';
const COLUMN_NEED: Record<Part, [string, string, string]> = {
  eps: ['a frequency in GHz > 0', "ε' as a number > 0", "ε'' as a number ≥ 0 (the loss of ε = ε' − jε'', e^{+jωt}; a passive medium)"],
  mu: ['a frequency in GHz > 0', "μ' as a number > 0", "μ'' as a number ≥ 0 (the loss of μ = μ' − jμ'', e^{+jωt}; a passive medium)"],
};
const CELL_OK = [(x: number) => x > 0, (x: number) => x > 0, (x: number) => x >= 0];

/** Where a cell is, for messages: the field path and a prefix inside the message (a file's line). */
type Place = (row: number, column: number) => { path: string; prefix: string };

/** The table model of `def` at `path`, or undefined after reporting its problems. */
export function parseTableModel(p: Problems, def: Record<string, unknown>, path: string,
  band_GHz: [number, number] | undefined, readTableFile: TableFileReader | undefined): TableModel | undefined {
  const before = p.count;
  const hasPoints = has(def, 'points'), hasFile = has(def, 'file');
  if (hasPoints === hasFile) {
    p.error(path, hasPoints
      ? 'give the rows either as "points" or as "file", not both'
      : 'a table needs "points": [[f_GHz, eps_re, eps_im], …] or "file": "name.csv" (columns f_GHz,eps_re,eps_im)');
    return undefined;
  }
  let points: TablePoint[] | undefined, mu: TablePoint[] | undefined, muPath = joinKey(path, 'mu_points');
  let pointsPath = joinKey(path, 'points');
  if (hasFile) {
    pointsPath = muPath = joinKey(path, 'file');
    if (has(def, 'mu_points')) p.error(joinKey(path, 'mu_points'), 'with "file", the permeability comes from the file\'s mu_re,mu_im columns');
    ({ points, mu } = readTableFileRows(p, own(def, 'file'), pointsPath, readTableFile));
  } else {
    points = readInlineRows(p, own(def, 'points'), pointsPath, 'eps');
    if (has(def, 'mu_points')) mu = readInlineRows(p, own(def, 'mu_points'), muPath, 'mu');
  }
  if (mu !== undefined && has(def, 'magnetic')) {
    p.error(joinKey(path, 'magnetic'), 'a table with a measured permeability (mu_points or mu_re,mu_im columns) takes no magnetic block; give μ one way');
  }
  if (band_GHz) {
    if (points) refuseUncovered(p, points, pointsPath, band_GHz, 'ε');
    if (mu) refuseUncovered(p, mu, muPath, band_GHz, 'μ');
  }
  if (p.count !== before || points === undefined) return undefined;
  return mu === undefined ? { model: 'table', points } : { model: 'table', points, mu_points: mu };
}

function refuseUncovered(p: Problems, rows: TablePoint[], path: string, band: [number, number], what: string): void {
  if (tableCovers(rows, band[0], band[1])) return;
  const [a, b] = tableRange_GHz(rows);
  p.error(path, `the ${what} table covers ${fmtGHz(a)}–${fmtGHz(b)} GHz but the band (band_GHz) is ${fmtGHz(band[0])}–${fmtGHz(band[1])} GHz; ` +
    `a table is not extrapolated: measure over the whole band, or narrow band_GHz to lie within ${fmtGHz(a)}–${fmtGHz(b)} GHz`);
}

/** `points` / `mu_points` written in the stack file: a list of [f_GHz, re, loss] lists. */
function readInlineRows(p: Problems, v: unknown, path: string, part: Part): TablePoint[] | undefined {
  const max = STACK_LIMITS.maxTableRows;
  if (!Array.isArray(v) || v.length < 2 || v.length > max) {
    p.error(path, `must be a list of 2 to ${max} rows [f_GHz, ${part}_re, ${part}_im] (got ${describe(v)})`);
    return undefined;
  }
  const before = p.count;
  const cells: number[][] = v.map((row, i) => {
    if (!Array.isArray(row) || row.length !== 3) {
      p.error(joinIndex(path, i), `must be a row of three numbers [f_GHz, ${part}_re, ${part}_im] (got ${describe(row)})`);
      return [];
    }
    return row.map((c) => (typeof c === 'number' ? c : Number.NaN));
  });
  if (p.count !== before) return undefined;
  // A cell that is not a number is named with what it holds.
  const place: Place = (i, j) => ({ path: joinIndex(joinIndex(path, i), j), prefix: '' });
  return checkRows(p, cells, place, part, (i, j) => describe((v[i] as unknown[])[j]));
}

/** Rows of numbers checked cell by cell, then the frequencies for order; undefined after any problem. */
function checkRows(p: Problems, cells: number[][], place: Place, part: Part, shown: (i: number, j: number) => string): TablePoint[] | undefined {
  const before = p.count;
  cells.forEach((row, i) => row.forEach((x, j) => {
    if (!Number.isFinite(x) || !CELL_OK[j](x)) {
      const at = place(i, j);
      p.error(at.path, `${at.prefix}must be ${COLUMN_NEED[part][j]} (got ${shown(i, j)})`);
    }
  }));
  if (p.count !== before) return undefined;
  for (let i = 1; i < cells.length; i++) {
    if (!(cells[i][0] > cells[i - 1][0])) {
      const at = place(i, 0);
      p.error(at.path, `${at.prefix}frequencies must increase from row to row (${cells[i][0]} GHz after ${cells[i - 1][0]} GHz)`);
      return undefined;
    }
  }
  return cells.map((r) => [r[0], r[1], r[2]]);
}

/** A table file's rows: f_GHz,eps_re,eps_im and optionally mu_re,mu_im (both or neither). */
function readTableFileRows(p: Problems, name: unknown, path: string, reader: TableFileReader | undefined):
  { points?: TablePoint[]; mu?: TablePoint[] } {
  if (typeof name !== 'string' || name.trim() === '' || name.length > STACK_LIMITS.maxNameChars * 4) {
    p.error(path, `must be the name of a CSV file beside the stack file, e.g. "sample.csv" (got ${describe(name)})`);
    return {};
  }
  if (reader === undefined) { p.error(path, NO_TABLE_FILES); return {}; }
  const got = reader(name);
  if (!got.ok) { p.error(path, got.error); return {}; }
  const read = readNumericCsv(got.text, name, {
    required: ['f_GHz', 'eps_re', 'eps_im'], optional: ['mu_re', 'mu_im'], maxRows: STACK_LIMITS.maxTableRows,
  });
  if (!read.ok) { for (const e of read.errors) p.error(path, e); return {}; }
  const { csv } = read;
  const hasMu = csv.columns.has('mu_re'), bothMu = hasMu === csv.columns.has('mu_im');
  if (!bothMu) { p.error(path, `${name}: give both mu_re and mu_im columns, or neither`); return {}; }
  if (csv.rows < 2) { p.error(path, `${name}: needs at least 2 rows of numbers (got ${csv.rows})`); return {}; }
  const col = (c: string) => csv.columns.get(c)!;
  const read3 = (cols: [string, string, string]): TablePoint[] | undefined => {
    const rows = Array.from({ length: csv.rows }, (_, i) => cols.map((c) => col(c)[i]));
    const place: Place = (i, j) => ({ path, prefix: `${name} line ${csv.lines[i]}, ${cols[j]}: ` });
    return checkRows(p, rows, place, cols[1] === 'eps_re' ? 'eps' : 'mu', (i, j) => String(rows[i][j]));
  };
  const points = read3(['f_GHz', 'eps_re', 'eps_im']);
  const mu = hasMu && points ? read3(['f_GHz', 'mu_re', 'mu_im']) : undefined;
  return { points, mu };
}
