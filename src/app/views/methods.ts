// The methods whose columns appear in a table (R_<m>_re …), with their display names and styles.

import { THEME } from '../theme.ts';
import type { WireColumn } from '../protocol.ts';

export interface MethodStyle { stem: string; label: string; color: string; width: number; dash?: number[] }

/** Method stems present in a table for a quantity prefix ('R', 'T' or 'E'), exact first. */
export function methodsIn(table: readonly WireColumn[] | null | undefined, prefix: 'R' | 'T' | 'E'): MethodStyle[] {
  const stems: string[] = [];
  const re = new RegExp(`^${prefix}_(.+)_re$`);
  for (const c of table ?? []) {
    const m = re.exec(c.name);
    if (m !== null && !stems.includes(m[1])) stems.push(m[1]);
  }
  const rank = (s: string): number => (s === 'tmm' ? 0 : s.startsWith('fem') ? 1 : s.startsWith('fdtd') ? 2 : 3);
  return stems.sort((a, b) => rank(a) - rank(b) || a.localeCompare(b)).map(styleOf);
}

export function styleOf(stem: string): MethodStyle {
  if (stem === 'tmm') return { stem, label: 'exact (TMM)', color: THEME.exact, width: 1.5 };
  if (stem.startsWith('fem')) return { stem, label: stem === 'fem' ? 'FEM' : `FEM ${stem.slice(4)}`, color: THEME.fem, width: 2.25, dash: [7, 4] };
  if (stem.startsWith('fdtd')) return { stem, label: 'FDTD', color: THEME.fdtd, width: 2, dash: [2, 3] };
  return { stem, label: stem, color: THEME.inkSoft, width: 1.5, dash: [4, 2] };
}
