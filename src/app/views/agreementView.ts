// The agreement readout under the frequency-domain views: for each pair of methods, the largest
// |ΔR| and |ΔT| over the band, where it occurs, and whether the pair meets its target. The rows are
// the ones the report computes (src/report/format-agreement.ts); this file only lays them out.

import type { AgreementRow } from '../../report/format-agreement.ts';

const METHOD_NAMES: Record<string, string> = {
  tmm: 'exact', fem: 'FEM', fdtd: 'FDTD', 'tmm as stepped': 'exact (stepped media)', 'stepped media': 'stepped media',
};

/** "fdtd-tmm as stepped" → "FDTD vs exact (stepped media)". */
export function pairLabel(pair: string): string {
  const cut = pair.indexOf('-');
  if (cut < 0) return pair;
  const a = pair.slice(0, cut), b = pair.slice(cut + 1);
  return `${METHOD_NAMES[a] ?? a} vs ${METHOD_NAMES[b] ?? b}`;
}

const sci = (x: number): string => (x === 0 ? '0' : x.toExponential(1));
const ghz = (x: number): string => `${Number(x.toPrecision(4))} GHz`;

export class AgreementView {
  constructor(private readonly el: HTMLElement) {}

  show(rows: readonly AgreementRow[], note: string): void {
    const doc = this.el.ownerDocument;
    this.el.replaceChildren();
    const head = doc.createElement('div');
    head.className = 'agreement-head';
    head.textContent = 'How far the methods agree (largest complex difference over the band)';
    this.el.append(head);
    if (rows.length > 0) {
      const table = doc.createElement('table');
      const tr = (cells: string[], tag: 'th' | 'td', cls = ''): HTMLTableRowElement => {
        const r = doc.createElement('tr');
        if (cls) r.className = cls;
        for (const c of cells) { const x = doc.createElement(tag); x.textContent = c; r.append(x); }
        return r;
      };
      table.append(tr(['methods', 'max |ΔR|', 'at', 'max |ΔT|', 'at', 'target'], 'th'));
      for (const row of rows) {
        const verdict = row.target === undefined ? 'material model share'
          : `${sci(row.target)} ${row.within_target ? 'met' : 'NOT met'}`;
        // Behind a conductor T is zero for every method: nothing to compare, so no worst frequency.
        const noT = row.T_max === 0;
        table.append(tr([pairLabel(row.pair), sci(row.R_max), ghz(row.R_worst_f_GHz), noT ? '—' : sci(row.T_max), noT ? '—' : ghz(row.T_worst_f_GHz), verdict],
          'td', row.within_target === false ? 'missed' : ''));
      }
      this.el.append(table);
    }
    if (note) {
      const p = doc.createElement('div');
      p.className = 'agreement-note';
      p.textContent = note;
      this.el.append(p);
    }
  }
}
