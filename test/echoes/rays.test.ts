// Rays of the echo paths (src/echoes/rays.ts): walks whose layer crossings are the lattice's, and on lossless,
// non-dispersive stacks delays equal to the multiple-reflection series (Born & Wolf, Principles of Optics,
// §1.6: each round trip in a layer of thickness d and index n adds 2 d n / c) and to the echo table's own delays.
import { describe, expect, it } from 'vitest';
import { echoRays, pathWalk, walkRay } from '../../src/echoes/rays.ts';
import { analyseEchoes } from '../../src/echoes/table.ts';
import { dielectric, layer, makeStack, sheet } from '../support/build-stack.ts';
import { exactRecords } from './support.ts';

const C0 = 299792458;

/** Crossings of each layer by a walk over faces. */
function crossingsOf(walk: Int32Array, layers: number): number[] {
  const c = new Array<number>(layers).fill(0);
  for (let k = 1; k < walk.length; k++) {
    expect(Math.abs(walk[k] - walk[k - 1])).toBe(1); // one layer at a time
    c[Math.min(walk[k], walk[k - 1])]++;
  }
  return c;
}

describe('pathWalk: a walk over the faces with the given crossings', () => {
  it('reflected paths start and end at the front face; transmitted ones end at the back face', () => {
    expect([...pathWalk([0, 0], false)]).toEqual([0]);
    expect([...pathWalk([2, 0], false)]).toEqual([0, 1, 0]);
    expect([...pathWalk([2, 2], false)]).toEqual([0, 1, 2, 1, 0]);
    expect([...pathWalk([1, 1], true)]).toEqual([0, 1, 2]);
    for (const [c, t] of [[[4, 2, 2], false], [[6, 4, 0], false], [[3, 1, 5], true], [[1, 3, 1], true]] as const) {
      const w = pathWalk(c, t);
      expect(w[0]).toBe(0);
      expect(w[w.length - 1]).toBe(t ? c.length : 0);
      expect(crossingsOf(w, c.length)).toEqual([...c]);
    }
  });

  it('refuses counts no path can have', () => {
    expect(() => pathWalk([1, 0], false)).toThrow(/layer 0 crossed 1 times/);
    expect(() => pathWalk([2, 0], true)).toThrow(/no transmitted path/);
    expect(() => pathWalk([0, 2], false)).toThrow(/do not form one path/); // layer 2 cannot be reached
  });

  it('times along the walk add the layers\' delays', () => {
    const r = walkRay(Int32Array.of(0, 1, 2, 1, 0), Float64Array.of(0, 0.01, 0.03), Float64Array.of(1e-9, 2e-9));
    expect([...r.x_m]).toEqual([0, 0.01, 0.03, 0.01, 0]);
    [0, 1, 3, 5, 6].forEach((t, k) => expect(r.t_s[k] * 1e9).toBeCloseTo(t, 12));
  });
});

describe('echoRays on lossless stacks: the series delays, the echo table\'s delays', () => {
  it('a 100 mm slab of ε = 4: row k returns to x = 0 after k round trips of 2 d √ε / c', () => {
    const d = 0.1, stack = makeStack({ band_GHz: [1, 6], layers: [layer(dielectric(4, 0, 'slab'), d)] });
    const a = analyseEchoes(stack, exactRecords(stack));
    const rays = echoRays(stack, a);
    expect(rays.frontSlowness_s_per_m * C0).toBeCloseTo(1, 9); // air in front: n_g = 1
    expect(rays.backSlowness_s_per_m! * C0).toBeCloseTo(1, 9);
    expect(rays.reflected.length).toBe(a.reflected.t_s.length);
    expect(rays.reflected.length).toBeGreaterThanOrEqual(3);
    const roundTrip = (2 * d * 2) / C0;
    rays.reflected.forEach((row, i) => {
      const ray = row.paths[0];
      expect(ray.x_m[0]).toBe(0);
      expect(ray.x_m[ray.x_m.length - 1]).toBe(0);
      const end = ray.t_s[ray.t_s.length - 1];
      expect(Math.abs(end - i * roundTrip)).toBeLessThan(1e-6 * roundTrip);
      // The echo table's delay of the same row (its envelope peak), within a thousandth of the pulse width.
      expect(Math.abs(end - a.reflected.t_s[i])).toBeLessThan(1e-3 * a.pulse.width_s);
      expect(Math.max(...ray.x_m)).toBeCloseTo(i === 0 ? 0 : d, 12);
    });
    // Transmitted: T1 leaves the back face after one crossing, d √ε / c.
    const t1 = rays.transmitted[0].paths[0];
    expect([...t1.x_m]).toEqual([0, d]);
    expect(t1.t_s[1] * C0 / (2 * d)).toBeCloseTo(1, 6);
  });

  it('two layers and a sheet: each path\'s ray ends at its band-centre delay, crossings preserved', () => {
    const stack = makeStack({ band_GHz: [4, 12], layers: [layer(dielectric(2.25, 0, 'a'), 0.02), sheet(300), layer(dielectric(6.25, 0, 'b'), 0.01)] });
    const a = analyseEchoes(stack, exactRecords(stack));
    const rays = echoRays(stack, a, 10);
    expect([...rays.faces_m]).toEqual([0, 0.02, 0.03]);
    // One-way delays d n / c of each layer (non-dispersive: group index = index).
    expect(rays.layerDelays_s[0] * C0 / (0.02 * 1.5)).toBeCloseTo(1, 6);
    expect(rays.layerDelays_s[1] * C0 / (0.01 * 2.5)).toBeCloseTo(1, 6);
    let checked = 0;
    rays.reflected.forEach((row, i) => row.paths.forEach((p, j) => {
      const member = [...a.reflected.members[i]].sort((x, y) => y.level_dB - x.level_dB)[j];
      expect(p.path).toBe(member.path);
      const want = member.crossings[0] * rays.layerDelays_s[0] + member.crossings[1] * rays.layerDelays_s[1];
      expect(p.t_s[p.t_s.length - 1]).toBeCloseTo(want, 18);
      expect(Math.abs(p.t_s[p.t_s.length - 1] - p.echo_t_s)).toBeLessThan(1e-3 * a.pulse.width_s);
      checked++;
    }));
    expect(checked).toBeGreaterThanOrEqual(4);
  });
});
