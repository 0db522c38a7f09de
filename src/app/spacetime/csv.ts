// spacetime.csv: the space–time map as rows `t_ns,x_mm,E`, times in order and positions in order within each
// time, decimated to at most CSV_TIMES × CSV_POSITIONS samples (every k-th recorded row and column; the grid is
// stated in the export's README).

import type { SpacetimeMap } from './recorder.ts';
import type { SpacetimeField } from './view.ts';

export const CSV_TIMES = 400;
export const CSV_POSITIONS = 240;

export interface SpacetimeGrid { times: number; positions: number; every_row: number; every_column: number; dt_ns: number; dx_mm: number }

/** The decimated grid of the map. */
export function csvGrid(m: SpacetimeMap): SpacetimeGrid {
  const nt = m.t_ns.length, nx = m.x_mm.length;
  const every_row = Math.max(1, Math.ceil(nt / CSV_TIMES)), every_column = Math.max(1, Math.ceil(nx / CSV_POSITIONS));
  const times = Math.ceil(nt / every_row), positions = Math.ceil(nx / every_column);
  const dt_ns = nt > 1 ? (m.t_ns[Math.min(nt - 1, every_row)] - m.t_ns[0]) : 0;
  const dx_mm = nx > 1 ? (m.x_mm[Math.min(nx - 1, every_column)] - m.x_mm[0]) : 0;
  return { times, positions, every_row, every_column, dt_ns, dx_mm };
}

const g6 = (v: number): string => String(Number(v.toPrecision(6)));
const g5 = (v: number): string => (Number.isFinite(v) ? String(Number(v.toPrecision(5))) : '');

/** The CSV text; E empty where the map has no field (in front of the source plane). */
export function spacetimeCsv(m: SpacetimeMap, field: SpacetimeField): string {
  const g = csvGrid(m), nx = m.x_mm.length, values = field === 'total' ? m.total : m.scattered;
  const lines = ['t_ns,x_mm,E'];
  for (let r = 0; r < m.t_ns.length; r += g.every_row) {
    const t = g6(m.t_ns[r]);
    for (let c = 0; c < nx; c += g.every_column) lines.push(`${t},${g6(m.x_mm[c])},${g5(values[r * nx + c])}`);
  }
  return `${lines.join('\n')}\n`;
}
