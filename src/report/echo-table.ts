// The echoes table of a pulse run (t_ns, level_dB, amplitude, predicted_t_ns, path) and its CSV form:
// numeric columns as report/table.ts writes them, then the path in plain words (quoted when needed).

import { nsFromS } from '../units.ts';
import type { EchoTable } from '../echoes/table.ts';
import { assertTable, formatNumber, scaledColumn, type Column } from './table.ts';

export interface EchoColumns {
  /** t_ns, level_dB, amplitude, predicted_t_ns. */
  columns: Column[];
  path: string[];
}

export function echoColumns(e: EchoTable): EchoColumns {
  return {
    columns: [
      scaledColumn('t_ns', e.t_s, 1e9),
      { name: 'level_dB', data: e.level_dB },
      { name: 'amplitude', data: e.amplitude },
      scaledColumn('predicted_t_ns', e.predicted_t_s, 1e9),
    ],
    path: e.path,
  };
}

/** RFC 4180 quoting for a text field. */
const quote = (s: string): string => (/[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);

/** The header line of the echoes CSV, with its "\n". */
export const echoCsvHeader = (t: EchoColumns): string => `${[...t.columns.map((c) => c.name), 'path'].join(',')}\n`;

/** Echo i as one CSV line with its "\n": the numeric columns, then the path (quoted when needed). */
export const echoCsvRow = (t: EchoColumns, i: number): string =>
  `${[...t.columns.map((c) => formatNumber(c.data[i])), quote(t.path[i])].join(',')}\n`;

/** The echoes CSV as text chunks (header, then the rows), for streaming. Refuses non-finite numbers (TableError). */
export function* echoCsvChunks(t: EchoColumns): Generator<string> {
  if (t.path.length > 0) assertTable(t.columns);
  yield echoCsvHeader(t);
  for (let i = 0; i < t.path.length; i++) yield echoCsvRow(t, i);
}

/** CSV text in one string: header, then one line per echo. Refuses non-finite numbers (TableError). */
export function formatEchoesCsv(t: EchoColumns): string {
  return [...echoCsvChunks(t)].join('');
}

/** Delays in ns, for summaries. */
export const nsList = (t_s: Float64Array): number[] => Array.from(t_s, (t) => Number(nsFromS(t).toPrecision(6)));
