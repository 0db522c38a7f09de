// Export: one zip named from the stack title and the date, holding the run's tables as CSV (the same
// files, columns and number format the CLI writes), summary.json, the stack file, a PNG of each view,
// the latest clip of this stack when there is one, and a short README. Tables come from the core
// unchanged; only the text is made here.

import { zipSync, strToU8, type Zippable } from 'fflate';
import { formatCsv, type Column } from '../report/table.ts';
import { formatEchoesCsv } from '../report/echo-table.ts';
import type { StackFile } from '../stack/file.ts';
import type { Solved } from './engine.ts';
import type { WireColumn, WireReport } from './protocol.ts';
import { canvasPng, dateStamp, fileStem } from './download.ts';

export interface ExportInput {
  title: string;
  file: StackFile;
  solved: Solved | null;
  /** The full pulse-run report for the current stack, or null when it has not finished. */
  report: WireReport | null;
  canvases: Array<[string, HTMLCanvasElement]>;
  /** Further text files of the views (spacetime.csv …), each with a line for the README. */
  texts: Array<{ name: string; text: string; about: string }>;
  /** The latest clip, when it shows the current stack. */
  clip: { name: string; blob: Blob } | null;
  date: Date;
}

export interface ExportResult {
  name: string;
  blob: Blob;
  /** Paths inside the zip. */
  files: string[];
  /** What was left out, and why. */
  notes: string[];
}

/** Everything in one zip (built in memory: a few MB at most). */
export async function exportZip(input: ExportInput): Promise<ExportResult> {
  const stem = fileStem(input.title);
  const base = `${stem}-${dateStamp(input.date)}`;
  const notes: string[] = [];
  const entries: Zippable = {};
  const put = (name: string, data: Uint8Array, packed: boolean): void => { entries[`${base}/${name}`] = [data, { level: packed ? 0 : 6 }]; };
  const r = input.report;
  const tables: Array<[string, readonly WireColumn[] | null | undefined]> = [
    ['spectrum.csv', r?.spectrum ?? input.solved?.spectrum],
    ['profile.csv', r?.profile ?? input.solved?.profile],
    ['echoes.csv', r?.echoes],
    ['echoes_T.csv', r?.echoesT],
    ['trace.csv', r?.trace],
  ];
  if (r === null) notes.push('The pulse run for this stack has not finished: spectrum.csv and profile.csv hold the exact and FEM columns only; the echo tables, trace.csv and summary.json are left out.');
  for (const [name, t] of tables) {
    if (t === null || t === undefined || t.length === 0) continue;
    try {
      put(name, strToU8(tableCsv(t)), false);
    } catch (e) {
      notes.push(`${name}: ${e instanceof Error ? e.message : String(e)}`);
    }
  }
  if (r !== null) put('summary.json', strToU8(`${JSON.stringify(r.summary, null, 2)}\n`), false);
  const stackName = `${stem}.stack.json`;
  put(stackName, strToU8(`${JSON.stringify(input.file, null, 2)}\n`), false);
  for (const [name, canvas] of input.canvases) {
    try {
      put(`${name}.png`, new Uint8Array(await (await canvasPng(canvas)).arrayBuffer()), true);
    } catch (e) {
      notes.push(`${name}.png: ${e instanceof Error ? e.message : String(e)}`);
    }
  }
  for (const t of input.texts) put(t.name, strToU8(t.text), false);
  if (input.clip !== null) put(input.clip.name, new Uint8Array(await input.clip.blob.arrayBuffer()), true);
  const files = Object.keys(entries).map((k) => k.slice(base.length + 1));
  put('README.txt', strToU8(readme(input.title, stackName, files, input.texts.map((t) => t.about), notes)), false);
  const zip = zipSync(entries, { mtime: input.date });
  return { name: `${base}.zip`, blob: new Blob([zip], { type: 'application/zip' }), files: Object.keys(entries), notes };
}

function readme(title: string, stackName: string, files: string[], about: string[], notes: string[]): string {
  return [
    `slabecho export: ${title}`,
    '',
    'Files:',
    ...[...files, 'README.txt'].map((f) => `  ${f}`),
    '',
    `spectrum.csv, profile.csv, echoes.csv, echoes_T.csv, trace.csv and summary.json are those \`slabecho run ${stackName} --out DIR\` writes for this stack.`,
    ...about,
    ...(notes.length > 0 ? ['', 'Left out:', ...notes.map((n) => `  ${n}`)] : []),
    '',
    'These results are for an idealised infinite, planar, homogeneous stack lit by a plane wave. Where safety',
    'depends on shielding or on RF exposure limits, do not rely on them: defer to measurement, to local codes',
    'and regulations and to licensed professional practice.',
    '',
  ].join('\n');
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
