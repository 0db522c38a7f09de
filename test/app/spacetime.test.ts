// The space–time map's plumbing (src/app/spacetime/): the recorder reads the run's field where the records
// do (the total field at x = 0 is incident + reflected there, the front-face record's definition), rows stay
// evenly spaced when the store is thinned, the CSV holds its stated grid, and the drawn rays leave the stack
// at the front medium's group slowness (1/c in air: closed form). Layout arithmetic otherwise: common
// practice, no source.

import { describe, expect, it } from 'vitest';
import { SpacetimeRecorder } from '../../src/app/spacetime/recorder.ts';
import { csvGrid, spacetimeCsv } from '../../src/app/spacetime/csv.ts';
import { drawnRays, exitTime_ns } from '../../src/app/spacetime/rays.ts';
import { runReport } from '../../src/report/run.ts';
import { findColumn } from '../../src/report/table.ts';
import { dielectric, layer, makeStack } from '../support/build-stack.ts';

const C0 = 299792458;
const slab = () => makeStack({ band_GHz: [2, 8], points: 41, layers: [layer(dielectric(4, 0, 'tile'), 0.04)] });

async function recorded(maxRows?: number) {
  const stack = slab(), rec = new SpacetimeRecorder(stack, maxRows);
  const rep = await runReport(stack, { observe: rec });
  return { rep, map: rec.map()! };
}

describe('space–time recorder', () => {
  it('keeps the total field at x = 0 equal to the front-face record (incident + reflected) at each row\'s time', async () => {
    for (const maxRows of [undefined, 40]) {
      const { rep, map } = await recorded(maxRows);
      const t = findColumn(rep.trace, 't_ns')!.data, inc = findColumn(rep.trace, 'E_incident')!.data, refl = findColumn(rep.trace, 'E_reflected')!.data;
      const dt = t[1] - t[0];
      const c0 = map.x_mm.findIndex((x) => Math.abs(x) < 1e-6 * (map.x_mm[1] - map.x_mm[0]));
      expect(c0).toBeGreaterThanOrEqual(0);
      const nx = map.x_mm.length;
      let worst = 0;
      map.t_ns.forEach((tr, r) => {
        if (r > 0) expect(tr - map.t_ns[r - 1]).toBeCloseTo(map.stepsPerRow * dt, 9); // even spacing, thinned or not
        const k = Math.round(tr / dt);
        worst = Math.max(worst, Math.abs(map.total[r * nx + c0] - (inc[k] + refl[k])));
        expect(map.scattered[r * nx + c0]).toBeCloseTo(map.total[r * nx + c0] - inc[k], 5);
      });
      expect(worst).toBeLessThan(1e-6); // Float32 storage
      if (maxRows === 40) expect(map.t_ns.length).toBeLessThanOrEqual(40);
      expect(map.x_mm[0]).toBeLessThan(0);
      expect(map.x_mm[nx - 1]).toBeGreaterThan(40);
    }
  });

  it('writes spacetime.csv on its stated grid, and draws rays leaving at 1/c in air', async () => {
    const { rep, map } = await recorded();
    const g = csvGrid(map);
    const lines = spacetimeCsv(map, 'total').trimEnd().split('\n');
    expect(lines[0]).toBe('t_ns,x_mm,E');
    expect(lines.length - 1).toBe(g.times * g.positions);
    expect(g.times).toBeLessThanOrEqual(400);
    expect(g.positions).toBeLessThanOrEqual(240);
    const rays = drawnRays(rep.rays!, map.x_mm[0], map.x_mm[map.x_mm.length - 1]);
    const front = rays.find((r) => r.label === '1')!;
    const n = front.x_mm.length;
    expect((front.t_ns[n - 1] - front.t_ns[n - 2]) / (front.x_mm[n - 2] - front.x_mm[n - 1])).toBeCloseTo(1e6 / C0, 9); // ns per mm
    const second = rays.find((r) => r.label === '2')!;
    expect(exitTime_ns(second, 40) - exitTime_ns(front, 40)).toBeCloseTo((2 * 0.04 * 2) / C0 * 1e9, 6); // 2 d √ε / c
  });
});
