// Predicted bounce paths: their sum is the exact response; names; group delays.
import { describe, expect, it } from 'vitest';
import { predictEchoes } from '../../src/echoes/lattice.ts';
import { pathName } from '../../src/echoes/names.ts';
import { layerGroupDelays_s } from '../../src/echoes/delays.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { AIR, bulk, dielectric, layer, makeStack, sheet } from '../support/build-stack.ts';

const C0 = 299792458;

describe('bounce-path lattice', () => {
  it('summed over enough bounces, Σ a_p e^{−jωτ_p} is the exact R of a lossless stack', () => {
    // Multiple-reflection (ray) series of a layered medium (Born & Wolf §1.6; Orfanidis ch. 6):
    // for nondispersive lossless layers phase and group delay coincide, so the series sums to R(f).
    const stack = makeStack({ layers: [layer(dielectric(4), 0.03), layer(dielectric(2.25), 0.06)], back: dielectric(9) });
    const f = Float64Array.from([1.3e9, 2.9e9, 4.4e9]);
    const exact = solveTmm(stack, f);
    for (let i = 0; i < f.length; i++) {
      const p = predictEchoes(stack, f[i], { maxRoundTrips: 40, minAmplitude: 1e-13 });
      let re = 0, im = 0;
      for (let j = 0; j < p.delay_s.length; j++) {
        const ph = -2 * Math.PI * f[i] * p.delay_s[j];
        re += p.amp_re[j] * Math.cos(ph) - p.amp_im[j] * Math.sin(ph);
        im += p.amp_re[j] * Math.sin(ph) + p.amp_im[j] * Math.cos(ph);
      }
      expect(Math.hypot(re - exact.R_re[i], im - exact.R_im[i])).toBeLessThan(1e-8);
    }
  });

  it('first arrivals of a slab: front face −1/3 at 0, back face 8/27 at 2d√ε/c', () => {
    // Air | ε_r = 4, 30 mm | air: r = (1 − 2)/(1 + 2) = −1/3; back face path t01 r12 t10 = (2/3)(1/3)(4/3)
    // (single-interface closed forms, physics reference); delay 2 d √ε'/c.
    const stack = makeStack({ layers: [layer(dielectric(4, 0, 'slab'), 0.03)] });
    const p = predictEchoes(stack, 3e9);
    expect(p.name.slice(0, 3)).toEqual(['front face', 'back face', 'two round trips inside layer 1 (slab)']);
    expect(p.delay_s[0]).toBe(0);
    expect(p.amp_re[0]).toBeCloseTo(-1 / 3, 12);
    expect(p.delay_s[1]).toBeCloseTo((2 * 0.03 * 2) / C0, 15);
    expect(p.amp_re[1]).toBeCloseTo(8 / 27, 12);
  });

  it('group delay of a Debye layer uses the group index n + f dn/df', () => {
    // n_g = n + f dn/df (standard definition); checked here against a fine finite difference of Re √ε(f).
    const water = bulk({ model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: 73.16, tau_ps: 8.27 }], sigma_S_per_m: 0 }, 'water');
    const d = 0.002, f = 6e9;
    const stack = makeStack({ layers: [layer(water, d)] });
    const eps = (fq: number) => { const wt = 2 * Math.PI * fq * 8.27e-12, den = 1 + wt * wt; return { re: 5.2 + 73.16 / den, im: -73.16 * wt / den }; };
    const n = (fq: number) => { const e = eps(fq), m = Math.hypot(e.re, e.im); return Math.sqrt((m + e.re) / 2); };
    const h = 1e3, ng = n(f) + (f * (n(f + h) - n(f - h))) / (2 * h);
    expect(layerGroupDelays_s(stack, f)[0]).toBeCloseTo((d * ng) / C0, 14);
    expect(ng).toBeLessThan(n(f)); // anomalous dispersion region of water: n falls with f
  });
});

describe('path names', () => {
  const stack = makeStack({ layers: [sheet(377), layer(dielectric(5, 0, 'concrete'), 0.1), layer(AIR, 0.02), layer(dielectric(6, 0, 'glass'), 0.006)], back: 'pec' });
  it('numbers layers as the stack file does and words the bounces', () => {
    expect(pathName(stack, [0, 0, 0])).toBe('front face');
    expect(pathName(stack, [1, 0, 0])).toBe('back of layer 2 (concrete)');
    expect(pathName(stack, [1, 1, 1])).toBe('conductor');
    expect(pathName(stack, [1, 2, 0])).toBe('two round trips inside layer 3 (air)');
    expect(pathName(stack, [3, 0, 0])).toBe('three round trips inside layer 2 (concrete)');
    expect(pathName(stack, [2, 1, 0])).toBe('back of layer 3 (air) + two round trips inside layer 2 (concrete)');
  });
});
