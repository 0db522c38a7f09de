// A small CSV of numbers with a header row, as measurement files are: comma-separated, one header line naming
// the columns, then one row of plain decimal numbers per line. Blank lines and lines starting with "#" are
// skipped; a byte-order mark is dropped. Every problem names the line and the column:
//   sample.csv line 7, eps_im: must be a number (got "n/a")

/** The columns read, by name, in the file's order. */
export interface NumericCsv {
  readonly names: readonly string[];
  readonly columns: ReadonlyMap<string, Float64Array>;
  readonly rows: number;
  /** Line number (from 1) of each row, for messages about a row. */
  readonly lines: Uint32Array;
}

export type NumericCsvResult = { ok: true; csv: NumericCsv } | { ok: false; errors: string[] };

export interface NumericCsvSpec {
  required: readonly string[];
  optional: readonly string[];
  maxRows: number;
}

/** A plain decimal number: 12, -0.5, .5, 1e-3 (no hex, no "NaN", no "Infinity"). */
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;
/** At most this many problems are listed (a wrong file would otherwise give one per cell). */
const MAX_ERRORS = 20;

const shown = (t: string): string => JSON.stringify(t.length > 30 ? `${t.slice(0, 30)}…` : t);

/** Read `text` (named `what` in messages) with the columns `spec` allows. */
export function readNumericCsv(text: string, what: string, spec: NumericCsvSpec): NumericCsvResult {
  const lines = (text.charCodeAt(0) === 0xfeff ? text.slice(1) : text).split(/\r?\n/);
  const errors: string[] = [];
  const content = lines.map((l, i) => ({ cells: l.trim(), line: i + 1 })).filter((l) => l.cells !== '' && !l.cells.startsWith('#'));
  if (content.length === 0) return { ok: false, errors: [`${what}: empty (a header line ${spec.required.join(',')} … and rows of numbers)`] };
  const header = content[0].cells.split(',').map((c) => c.trim());
  const known = [...spec.required, ...spec.optional];
  header.forEach((name, j) => {
    if (!known.includes(name)) errors.push(`${what} line ${content[0].line}: unknown column ${shown(name)} (column ${j + 1}); the columns are ${known.join(', ')}`);
    else if (header.indexOf(name) !== j) errors.push(`${what} line ${content[0].line}: column ${name} given twice`);
  });
  for (const r of spec.required) if (!header.includes(r)) errors.push(`${what}: missing column ${r} (the header line names the columns: ${spec.required.join(',')} …)`);
  const body = content.slice(1);
  if (body.length > spec.maxRows) errors.push(`${what}: ${body.length} rows is more than the ${spec.maxRows} allowed`);
  if (errors.length > 0) return { ok: false, errors };
  const columns = new Map<string, Float64Array>(header.map((n) => [n, new Float64Array(body.length)]));
  const rowLines = new Uint32Array(body.length);
  body.forEach((row, i) => {
    rowLines[i] = row.line;
    const cells = row.cells.split(',');
    if (cells.length !== header.length) {
      errors.push(`${what} line ${row.line}: ${cells.length} values for ${header.length} columns (${header.join(',')})`);
      return;
    }
    cells.forEach((c, j) => {
      const t = c.trim();
      const x = DECIMAL.test(t) ? Number(t) : Number.NaN;
      if (!Number.isFinite(x)) errors.push(`${what} line ${row.line}, ${header[j]}: must be a number (got ${shown(t)})`);
      else columns.get(header[j])![i] = x;
    });
  });
  if (errors.length > 0) {
    const more = errors.length - MAX_ERRORS;
    return { ok: false, errors: more > 0 ? [...errors.slice(0, MAX_ERRORS), `${what}: … and ${more} more problems`] : errors };
  }
  return { ok: true, csv: { names: header, columns, rows: body.length, lines: rowLines } };
}
