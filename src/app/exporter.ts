// Export: the run's tables as CSV (the same columns and number format the CLI writes), the stack
// file, and a PNG of each view. Tables come from the core unchanged; only the text is made here.

import { formatCsv, type Column } from '../report/table.ts';
import { formatEchoesCsv } from '../report/echo-table.ts';
import type { StackFile } from '../stack/file.ts';
import type { Solved } from './engine.ts';
import type { WireColumn, WireReport } from './protocol.ts';
import { canvasPng, downloadBlob as saveBlob, downloadText as saveText, safeName } from './download.ts';

export interface ExportInput {
  title: string;
  file: StackFile;
  solved: Solved | null;
  /** The full pulse-run report for the current stack, or null when it has not finished. */
  report: WireReport | null;
  canvases: Array<[string, HTMLCanvasElement]>;
}

/** Pause between downloads: browsers may drop some of a rapid burst of downloads from one page. */
const GAP_MS = 150;
const pause = (): Promise<void> => new Promise((ok) => setTimeout(ok, GAP_MS));

/** Download everything; returns notes on anything left out. */
export async function exportAll(input: ExportInput): Promise<string[]> {
  const notes: string[] = [];
  const downloadText = async (name: string, text: string, type: string): Promise<void> => { await pause(); saveText(name, text, type); };
  const downloadBlob = async (name: string, blob: Blob): Promise<void> => { await pause(); saveBlob(name, blob); };
  const r = input.report;
  const tables: Array<[string, readonly WireColumn[] | null | undefined]> = [
    ['spectrum.csv', r?.spectrum ?? input.solved?.spectrum],
    ['profile.csv', r?.profile ?? input.solved?.profile],
    ['echoes.csv', r?.echoes],
    ['echoes_T.csv', r?.echoesT],
    ['trace.csv', r?.trace],
  ];
  if (r === null) notes.push('The pulse run for this stack has not finished: spectrum.csv and profile.csv hold the exact and FEM columns only; the echo tables and trace.csv are left out.');
  for (const [name, t] of tables) {
    if (t === null || t === undefined || t.length === 0) continue;
    try {
      await downloadText(name, tableCsv(t), 'text/csv');
    } catch (e) {
      notes.push(`${name}: ${e instanceof Error ? e.message : String(e)}`);
    }
  }
  if (r !== null) await downloadText('summary.json', `${JSON.stringify(r.summary, null, 2)}\n`, 'application/json');
  await downloadText(`${safeName(input.title)}.stack.json`, `${JSON.stringify(input.file, null, 2)}\n`, 'application/json');
  for (const [name, canvas] of input.canvases) {
    try {
      await downloadBlob(`${name}.png`, await canvasPng(canvas));
    } catch (e) {
      notes.push(`${name}.png: ${e instanceof Error ? e.message : String(e)}`);
    }
  }
  return notes;
}

/** CSV text of a wire table, through the same core formatters the CLI uses. */
export function tableCsv(t: readonly WireColumn[]): string {
  const numeric = t.filter((c): c is Column => c.data instanceof Float64Array);
  const words = (name: string) => { const c = t.find((k) => k.name === name); return c !== undefined && Array.isArray(c.data) ? c.data : null; };
  const path = words('path');
  if (path !== null) return formatEchoesCsv({ columns: numeric, path, nearest_path: words('nearest_path') ?? [], resolved: words('resolved') ?? [] });
  // A table with no rows (the pulse engine skipped this stack): the header alone, as the CLI writes it.
  if (numeric.length > 0 && numeric[0].data.length === 0) return `${numeric.map((c) => c.name).join(',')}\n`;
  return formatCsv(numeric);
}
