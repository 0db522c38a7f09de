// Reading the column tables the core produces (the same columns the CLI writes as CSV).

import type { WireColumn } from './protocol.ts';

/** A numeric column by name, or null. */
export function num(table: readonly WireColumn[] | null | undefined, name: string): Float64Array | null {
  const c = table?.find((k) => k.name === name);
  return c !== undefined && c.data instanceof Float64Array ? c.data : null;
}

/** A text column by name, or null. */
export function text(table: readonly WireColumn[] | null | undefined, name: string): string[] | null {
  const c = table?.find((k) => k.name === name);
  return c !== undefined && Array.isArray(c.data) ? c.data : null;
}

/** A complex column pair `<stem>_re`, `<stem>_im`, or null. */
export function complexCol(table: readonly WireColumn[] | null | undefined, stem: string): { re: Float64Array; im: Float64Array } | null {
  const re = num(table, `${stem}_re`), im = num(table, `${stem}_im`);
  return re !== null && im !== null && re.length === im.length ? { re, im } : null;
}

/** |z| in dB (amplitude), with a floor so a null stays on the chart. */
export function magDb(z: { re: Float64Array; im: Float64Array }, floor_dB = -120): Float64Array {
  const out = new Float64Array(z.re.length);
  for (let i = 0; i < out.length; i++) {
    const a2 = z.re[i] * z.re[i] + z.im[i] * z.im[i];
    out[i] = a2 > 0 ? Math.max(floor_dB, 10 * Math.log10(a2)) : floor_dB;
  }
  return out;
}

/** |z|. */
export function mag(z: { re: Float64Array; im: Float64Array }): Float64Array {
  const out = new Float64Array(z.re.length);
  for (let i = 0; i < out.length; i++) out[i] = Math.hypot(z.re[i], z.im[i]);
  return out;
}

/** Phase in degrees, wrapped to (−180, 180]. */
export function phaseDeg(z: { re: Float64Array; im: Float64Array }): Float64Array {
  const out = new Float64Array(z.re.length);
  for (let i = 0; i < out.length; i++) out[i] = (Math.atan2(z.im[i], z.re[i]) * 180) / Math.PI;
  return out;
}

/** |a − b| in dB (amplitude), the difference curve between two methods. */
export function diffDb(a: { re: Float64Array; im: Float64Array }, b: { re: Float64Array; im: Float64Array }, floor_dB = -160): Float64Array {
  const n = Math.min(a.re.length, b.re.length), out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const dr = a.re[i] - b.re[i], di = a.im[i] - b.im[i];
    const d2 = dr * dr + di * di;
    out[i] = d2 > 0 ? Math.max(floor_dB, 10 * Math.log10(d2)) : floor_dB;
  }
  return out;
}

/** Copy a column table (so it can be transferred or kept while the source is reused). */
export const copyTable = (t: readonly { name: string; data: Float64Array | string[] }[]): WireColumn[] =>
  t.map((c) => ({ name: c.name, data: c.data instanceof Float64Array ? new Float64Array(c.data) : [...c.data] }));
