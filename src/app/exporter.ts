// Export: the run's tables as CSV (the same columns and number format the CLI writes), the stack
// file, and a PNG of each view. Tables come from the core unchanged; only the text is made here.

import { formatCsv, type Column } from '../report/table.ts';
import type { StackFile } from '../stack/file.ts';
import type { Solved } from './engine.ts';
import type { WireColumn, WireReport } from './protocol.ts';
import { canvasPng, downloadBlob, downloadText, safeName } from './download.ts';

export interface ExportInput {
  title: string;
  file: StackFile;
  solved: Solved | null;
  /** The full pulse-run report for the current stack, or null when it has not finished. */
  report: WireReport | null;
  canvases: Array<[string, HTMLCanvasElement]>;
}

/** Download everything; returns notes on anything left out. */
export async function exportAll(input: ExportInput): Promise<string[]> {
  const notes: string[] = [];
  const r = input.report;
  const tables: Array<[string, readonly WireColumn[] | null | undefined]> = [
    ['spectrum.csv', r?.spectrum ?? input.solved?.spectrum],
    ['profile.csv', r?.profile ?? input.solved?.profile],
    ['echoes.csv', r?.echoes],
    ['trace.csv', r?.trace],
  ];
  if (r === null) notes.push('The pulse run for this stack has not finished: spectrum.csv and profile.csv hold the exact and FEM columns only; echoes.csv and trace.csv are left out.');
  for (const [name, t] of tables) {
    if (t === null || t === undefined || t.length === 0) continue;
    try {
      downloadText(name, tableCsv(t), 'text/csv');
    } catch (e) {
      notes.push(`${name}: ${e instanceof Error ? e.message : String(e)}`);
    }
  }
  downloadText(`${safeName(input.title)}.stack.json`, `${JSON.stringify(input.file, null, 2)}\n`, 'application/json');
  for (const [name, canvas] of input.canvases) {
    try {
      downloadBlob(`${name}.png`, await canvasPng(canvas));
    } catch (e) {
      notes.push(`${name}.png: ${e instanceof Error ? e.message : String(e)}`);
    }
  }
  return notes;
}

/** CSV of a table; numeric tables go through the core formatter, a text column is quoted per RFC 4180. */
export function tableCsv(t: readonly WireColumn[]): string {
  if (t.every((c) => c.data instanceof Float64Array)) return formatCsv(t as Column[]);
  const numeric = t.map((c) => ({ name: c.name, data: c.data instanceof Float64Array ? c.data : new Float64Array(c.data.length) }));
  const lines = formatCsv(numeric).split('\n');
  const header = t.map((c) => c.name).join(',');
  const out = [header];
  for (let i = 1; i < lines.length - 1; i++) {
    const cells = lines[i].split(',');
    t.forEach((c, j) => { if (Array.isArray(c.data)) cells[j] = quote(c.data[i - 1]); });
    out.push(cells.join(','));
  }
  return `${out.join('\n')}\n`;
}

const quote = (s: string): string => (/[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
