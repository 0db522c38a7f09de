// Columnar tables: one named Float64Array per column, and their CSV form.

export interface Column { name: string; data: Float64Array }

/** Thrown when a table is inconsistent or holds a non-finite number: a bug, never a user error. */
export class TableError extends Error {
  override name = 'TableError';
}

/** Two columns `${prefix}_re`, `${prefix}_im` from split complex data. */
export const complexColumns = (prefix: string, re: Float64Array, im: Float64Array): Column[] =>
  [{ name: `${prefix}_re`, data: re }, { name: `${prefix}_im`, data: im }];

/** A new column `scale · data` (unit conversion at the edge: Hz → GHz, m → mm). */
export function scaledColumn(name: string, data: Float64Array, scale: number): Column {
  const out = new Float64Array(data.length);
  for (let i = 0; i < data.length; i++) out[i] = data[i] * scale;
  return { name, data: out };
}

/** Check equal lengths, distinct names and finite values; throws TableError naming the column. */
export function assertTable(columns: readonly Column[]): void {
  if (columns.length === 0) throw new TableError('table has no columns');
  const n = columns[0].data.length;
  const names = new Set<string>();
  for (const c of columns) {
    if (!/^[A-Za-z0-9_]+$/.test(c.name)) throw new TableError(`column name "${c.name}" is not a plain identifier`);
    if (names.has(c.name)) throw new TableError(`column ${c.name} appears twice`);
    names.add(c.name);
    if (c.data.length !== n) throw new TableError(`column ${c.name} has ${c.data.length} rows, ${columns[0].name} has ${n}`);
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(c.data[i])) throw new TableError(`column ${c.name} holds ${c.data[i]} at row ${i}`);
    }
  }
}

/**
 * Check that every number in a JSON-bound value (a report's summary) is finite; throws TableError naming
 * the first that is not. JSON.stringify would write NaN and ±Infinity as null without a word.
 */
export function assertFiniteValues(value: unknown, path = 'summary'): void {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new TableError(`${path} is ${value}`);
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => assertFiniteValues(v, `${path}[${i}]`));
  } else if (value !== null && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) assertFiniteValues(v, `${path}.${k}`);
  }
}

/** An English ordinal: 1st, 2nd, 3rd, 4th, 11th, 12th, 13th, 21st, 102nd (common practice, no source). */
export function ordinal(n: number): string {
  const teen = Math.floor(n / 10) % 10 === 1, last = n % 10;
  return `${n}${teen ? 'th' : last === 1 ? 'st' : last === 2 ? 'nd' : last === 3 ? 'rd' : 'th'}`;
}

/** A number with 12 significant digits, trailing zeros dropped: 1.5, 0.000123, 1.23e-7, -0 → 0. */
export function formatNumber(x: number): string {
  if (x === 0) return '0';
  // Fast path, the same text as String(Number(x.toPrecision(12))) (the definition, below): in fixed notation
  // (1e-6 ≤ |x| < 1e12) the 12 digits with trailing zeros cut are what String(Number(·)) gives back, since the
  // shortest text naming the same double has no fewer digits.
  const s = x.toPrecision(12);
  if (s.indexOf('e') >= 0) return String(Number(s));
  if (s.indexOf('.') < 0) return s;
  let end = s.length;
  while (s.charCodeAt(end - 1) === 48) end--; // '0'
  if (s.charCodeAt(end - 1) === 46) end--; // '.'
  return s.slice(0, end);
}

/** x with n decimals for a printed summary, never "-0.00" (a rounding of a tiny negative value). */
export function fixedDecimals(x: number, n: number): string {
  const s = x.toFixed(n);
  return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
}

/** The header line of a table's CSV form, with its "\n". */
export const csvHeader = (columns: readonly Column[]): string => `${columns.map((c) => c.name).join(',')}\n`;

/** Row i of a table's CSV form, with its "\n" (no checks: csvChunks checks the table first). */
export function csvRow(columns: readonly Column[], i: number): string {
  let line = '';
  for (let j = 0; j < columns.length; j++) line += (j === 0 ? '' : ',') + formatNumber(columns[j].data[i]);
  return `${line}\n`;
}

/** Rows per chunk of csvChunks: a chunk is then some tens of kilobytes. */
export const CSV_ROWS_PER_CHUNK = 512;

/**
 * A table's CSV form as a sequence of text chunks (the header, then rows in batches), for streaming to a file:
 * the whole text is never built. Refuses NaN and ±Infinity (TableError) before yielding anything.
 */
export function* csvChunks(columns: readonly Column[], rowsPerChunk = CSV_ROWS_PER_CHUNK): Generator<string> {
  assertTable(columns);
  yield csvHeader(columns);
  const n = columns[0].data.length;
  for (let i0 = 0; i0 < n; i0 += rowsPerChunk) {
    let chunk = '';
    for (let i = i0; i < Math.min(n, i0 + rowsPerChunk); i++) chunk += csvRow(columns, i);
    yield chunk;
  }
}

/** CSV text in one string: a header line of column names, then one line per row; "\n" line ends. For small
 *  tables (the workbench's downloads, tests); files are written from csvChunks. Refuses NaN and ±Infinity. */
export function formatCsv(columns: readonly Column[]): string {
  return [...csvChunks(columns)].join('');
}

/** Characters a number takes at most in CSV (sign, 12 digits, point, "e-308"), plus its separator. */
export const CSV_CHARS_PER_NUMBER = 20;

/** An upper bound on the bytes of a numeric table's CSV form with these columns and rows. */
export const csvBytesBound = (names: readonly string[], rows: number): number =>
  names.reduce((n, c) => n + c.length + 1, 0) + rows * names.length * CSV_CHARS_PER_NUMBER;

/** The column called `name`, or undefined. */
export const findColumn = (columns: readonly Column[], name: string): Column | undefined =>
  columns.find((c) => c.name === name);
