// The echo tables of a pulse run (echoes.csv for the reflected record, echoes_T.csv for the transmitted
// one) and their summary blocks. CSV columns: the numbers as report/table.ts writes them, then the text
// columns path, nearest_path, resolved (quoted when needed). Rows are formatted one by one
// (`formatEchoRow`), so a streamed writer and the whole-text writer share one formatter.

import type { EchoTable } from '../echoes/table.ts';
import { nsFromS } from '../units.ts';
import { assertTable, formatNumber, scaledColumn, TableError, type Column } from './table.ts';

export interface EchoColumns {
  /** t_ns, level_dB, amplitude, predicted_t_ns. */
  columns: Column[];
  path: string[];
  nearest_path: string[];
  /** "yes" or "no". */
  resolved: string[];
}

export const ECHO_NUMERIC_COLUMNS = ['t_ns', 'level_dB', 'amplitude', 'predicted_t_ns'] as const;
export const ECHO_TEXT_COLUMNS = ['path', 'nearest_path', 'resolved'] as const;
/** The header line of echoes.csv and echoes_T.csv. */
export const ECHO_CSV_HEADER = [...ECHO_NUMERIC_COLUMNS, ...ECHO_TEXT_COLUMNS].join(',');

export function echoColumns(e: EchoTable): EchoColumns {
  return {
    columns: [
      scaledColumn('t_ns', e.t_s, 1e9),
      { name: 'level_dB', data: e.level_dB },
      { name: 'amplitude', data: e.amplitude },
      scaledColumn('predicted_t_ns', e.predicted_t_s, 1e9),
    ],
    path: e.path.slice(),
    nearest_path: e.nearest_path.slice(),
    resolved: e.resolved.map((r) => (r ? 'yes' : 'no')),
  };
}

export const emptyEchoColumns = (): EchoColumns => ({
  columns: ECHO_NUMERIC_COLUMNS.map((name) => ({ name, data: new Float64Array(0) })),
  path: [], nearest_path: [], resolved: [],
});

/** RFC 4180 quoting for a text field. */
const quote = (s: string): string => (/[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);

/** Row i of an echo table as one CSV line (no line end). Refuses a non-finite number (TableError). */
export function formatEchoRow(t: EchoColumns, i: number): string {
  const nums = t.columns.map((c) => {
    if (!Number.isFinite(c.data[i])) throw new TableError(`column ${c.name} holds ${c.data[i]} at row ${i}`);
    return formatNumber(c.data[i]);
  });
  return [...nums, quote(t.path[i]), quote(t.nearest_path[i] ?? ''), t.resolved[i] ?? 'yes'].join(',');
}

/** An echo table's CSV as text chunks, each with its "\n" (header, then the rows), for streaming. */
export function* echoCsvChunks(t: EchoColumns): Generator<string> {
  if (t.path.length > 0) assertTable(t.columns);
  yield `${ECHO_CSV_HEADER}\n`;
  for (let i = 0; i < t.path.length; i++) yield `${formatEchoRow(t, i)}\n`;
}

/** CSV text in one string: header, then one line per echo. */
export function formatEchoesCsv(t: EchoColumns): string {
  return [...echoCsvChunks(t)].join('');
}

/** Delays in ns, for summaries. */
export const nsList = (t_s: Float64Array): number[] => Array.from(t_s, (t) => Number(nsFromS(t).toPrecision(6)));
const r4 = (x: number): number => Number(x.toPrecision(4));

/** An echo table for summary.json: the CSV's columns, the complex amplitudes and every path in full. */
export function echoSummary(e: EchoTable): Record<string, unknown> {
  return {
    count: e.t_s.length,
    t_ns: nsList(e.t_s),
    level_dB: Array.from(e.level_dB, (x) => Number(x.toFixed(2))),
    amplitude_re: Array.from(e.amplitude_re, r4),
    amplitude_im: Array.from(e.amplitude_im, r4),
    predicted_t_ns: nsList(e.predicted_t_s),
    path: e.path,
    nearest_path: e.nearest_path,
    resolved: e.resolved,
    paths: e.members.map((row) => row.map((m) => ({ path: m.path, t_ns: Number(nsFromS(m.t_s).toPrecision(6)), level_dB: Number(m.level_dB.toFixed(2)) }))),
    unseen: e.unseen.map((m) => ({ path: m.path, t_ns: Number(nsFromS(m.t_s).toPrecision(6)), level_dB: Number(m.level_dB.toFixed(2)) })),
    lattice_residual: Number(e.lattice_residual.toPrecision(3)),
  };
}

/** A lattice residual above this many times the floor leaves echoes above the floor unnamed. */
const RESIDUAL_FLOORS = 10;

/**
 * The warning for a table whose bounce paths, summed, fall well short of the exact response (`lattice_residual`
 * above 10 floors), or null. The residual bounds the envelope of every path not followed, so below it no
 * echo above the floor can be missed.
 */
export function latticeWarning(which: 'reflected' | 'transmitted', e: EchoTable, floor_dB: number): string | null {
  const floor = 10 ** (floor_dB / 20);
  if (!(e.lattice_residual > RESIDUAL_FLOORS * floor)) return null;
  return `${which} echoes: the bounce paths followed sum to the exact ${which === 'reflected' ? 'R' : 'T'} only within ` +
    `${e.lattice_residual.toPrecision(2)} at the worst frequency (the floor is ${floor.toPrecision(2)}, ${floor_dB} dB): ` +
    'this stack has more paths of each delay than can be followed (many layers of equal delay, such as a quarter-wave mirror, ' +
    'or a stack far thinner than the pulse, whose single bounces only are followed), ' +
    'so path names and predicted delays are incomplete and a row marked "unexplained" may be paths not followed ' +
    'rather than an error of the pulse run';
}

/** Rows of the printed table before "… N more". */
const PRINTED_ROWS = 12;

/** The echo table as aligned text lines for a terminal: delay, level, prediction, path. */
export function formatEchoText(title: string, t: EchoColumns): string[] {
  if (t.path.length === 0) return [`${title}: none above the floor`];
  const [tn, lv, , pr] = t.columns.map((c) => c.data);
  const lines = [`${title}:`, `  ${'t_ns'.padStart(9)} ${'level_dB'.padStart(8)} ${'predicted'.padStart(9)}  path`];
  const n = Math.min(t.path.length, PRINTED_ROWS);
  for (let i = 0; i < n; i++) {
    const path = t.nearest_path[i] ? `${t.path[i]} (nearest: ${t.nearest_path[i]})` : t.path[i];
    lines.push(`  ${tn[i].toFixed(3).padStart(9)} ${lv[i].toFixed(1).padStart(8)} ${pr[i].toFixed(3).padStart(9)}  ${path}`);
  }
  if (t.path.length > n) lines.push(`  … ${t.path.length - n} more`);
  return lines;
}
