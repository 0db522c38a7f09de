// The echo rows' rays as the space–time view draws them: the core's rays (src/echoes/rays.ts, delays after the
// incident pulse reaches x = 0) moved to the run's time, in mm and ns, and carried out of the stack through the
// front (or back) half-space to the edge of the map at that medium's group slowness. The incident pulse's own
// ray comes in from the left edge.

import type { EchoRays } from '../../echoes/rays.ts';

export interface DrawnRay {
  /** The echo row's number as the tables show it ("3", "T2"); "" for the incident ray and for weaker paths of a row. */
  label: string;
  kind: 'incident' | 'reflected' | 'transmitted';
  row: number;
  path: string;
  x_mm: number[];
  t_ns: number[];
}

/** Every ray over the map's positions [x0, x1] (mm). */
export function drawnRays(rays: EchoRays, x0_mm: number, x1_mm: number): DrawnRay[] {
  const t0 = rays.incidentAt_s, d_mm = rays.faces_m[rays.faces_m.length - 1] * 1e3;
  const front = rays.frontSlowness_s_per_m * 1e-3 * 1e9; // ns per mm
  const back = rays.backSlowness_s_per_m !== null ? rays.backSlowness_s_per_m * 1e-3 * 1e9 : null;
  const out: DrawnRay[] = [];
  const t0_ns = t0 * 1e9;
  if (x0_mm < 0) out.push({ label: '', kind: 'incident', row: 0, path: 'incident', x_mm: [x0_mm, 0], t_ns: [t0_ns + x0_mm * front, t0_ns] });
  const side = (list: EchoRays['reflected'], kind: 'reflected' | 'transmitted') => {
    for (const row of list) {
      row.paths.forEach((p, k) => {
        const x = Array.from(p.x_m, (v) => v * 1e3), t = Array.from(p.t_s, (v) => t0_ns + v * 1e9);
        const end = t[t.length - 1];
        if (kind === 'reflected' && x0_mm < 0) { x.push(x0_mm); t.push(end - x0_mm * front); }
        if (kind === 'transmitted' && back !== null && x1_mm > d_mm) { x.push(x1_mm); t.push(end + (x1_mm - d_mm) * back); }
        const label = k > 0 ? '' : kind === 'reflected' ? String(row.row) : `T${row.row}`;
        out.push({ label, kind, row: row.row, path: p.path, x_mm: x, t_ns: t });
      });
    }
  };
  side(rays.reflected, 'reflected');
  side(rays.transmitted, 'transmitted');
  return out;
}

/** Where a ray leaves the stack (x = 0 for a reflected path, the back face for a transmitted one): its run time, ns. */
export function exitTime_ns(ray: DrawnRay, d_mm: number): number {
  const face = ray.kind === 'transmitted' ? d_mm : 0;
  for (let k = ray.x_mm.length - 1; k >= 0; k--) if (Math.abs(ray.x_mm[k] - face) < 1e-9 * Math.max(1, d_mm)) return ray.t_ns[k];
  return Number.NaN;
}
