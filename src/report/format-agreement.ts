// The agreement table between methods: one row per pair (fem-tmm, fdtd-tmm, fdtd-fem …), and its compact
// text form for the end of `solve` and `run`.

import type { Spectrum } from '../results.ts';
import { compareSpectra, type Agreement } from './agreement.ts';

export interface AgreementRow extends Agreement {
  /** "<test>-<reference>", e.g. "fem-tmm". */
  pair: string;
  /** The figure the pair is expected to meet, and whether both R and T do. */
  target?: number;
  within_target?: boolean;
}

/** Compare `test` against `ref` and label the row. */
export function agreementRow(pair: string, test: Spectrum, ref: Spectrum, target?: number): AgreementRow {
  const a = compareSpectra(test, ref);
  const row: AgreementRow = { pair, ...a };
  if (target !== undefined) { row.target = target; row.within_target = a.R_max <= target && a.T_max <= target; }
  return row;
}

/** The row with its figures to 3 significant digits and its frequencies to 6, as summary.json carries it. */
export function roundedRow(r: AgreementRow): AgreementRow {
  const sig = (x: number, n: number) => Number(x.toPrecision(n));
  return { ...r, R_max: sig(r.R_max, 3), T_max: sig(r.T_max, 3), R_worst_f_GHz: sig(r.R_worst_f_GHz, 6), T_worst_f_GHz: sig(r.T_worst_f_GHz, 6) };
}

const sci = (x: number): string => (x === 0 ? '0' : x.toExponential(1));
const ghz = (x: number): string => String(Number(x.toPrecision(6)));

/** A compact fixed-width table, one line per pair, e.g.
 *  `fem vs tmm   max|dR| 2.0e-7 at 5.12 GHz   max|dT| 2.9e-7 at 9.87 GHz   target 1e-5 met` */
export function formatAgreement(rows: readonly AgreementRow[]): string {
  if (rows.length === 0) return '';
  const cells = rows.map((r) => {
    const [a, b] = r.pair.split('-');
    return [
      b === undefined ? r.pair : `${a} vs ${b}`,
      `max|dR| ${sci(r.R_max)} at ${ghz(r.R_worst_f_GHz)} GHz`,
      `max|dT| ${sci(r.T_max)} at ${ghz(r.T_worst_f_GHz)} GHz`,
      r.target === undefined ? '' : `target ${sci(r.target).replace('.0e', 'e')} ${r.within_target ? 'met' : 'NOT met'}`,
    ];
  });
  const widths = [0, 1, 2].map((j) => Math.max(...cells.map((c) => c[j].length)));
  const lines = cells.map((c) => [c[0].padEnd(widths[0]), c[1].padEnd(widths[1]), c[2].padEnd(widths[2]), c[3]].join('   ').trimEnd());
  return ['agreement between methods:', ...lines.map((l) => `  ${l}`)].join('\n');
}
