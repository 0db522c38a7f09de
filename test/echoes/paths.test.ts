// Each bounce path's own echo through the band pulse: for a lossless layer at the series delay
// 2 d √ε / c with the Fresnel product as its level; for a lossy, dispersive wall (ITU-R P.2040 concrete
// on a conductor) where the exact band envelope (support.ts) has its peak, not at 2 d √ε′/c.
import { describe, expect, it } from 'vitest';
import { bandPulse } from '../../src/echoes/band-pulse.ts';
import { latticePaths } from '../../src/echoes/lattice.ts';
import { latticeFrequencies, predictPaths } from '../../src/echoes/paths.ts';
import { catalogMaterial } from '../../src/materials/catalog.ts';
import type { BulkMaterial } from '../../src/stack/types.ts';
import { dielectric, layer, makeStack } from '../support/build-stack.ts';
import { exactEnvelope, exactPeaks } from './support.ts';

const C0 = 299792458;

describe("a path's own echo", () => {
  it('lossless slab: at 2 d √ε / c with level 8/27 (back face)', () => {
    const band: [number, number] = [1e9, 6e9], d = 0.1;
    const stack = makeStack({ band_GHz: [1, 6], layers: [layer(dielectric(4), d)] });
    const W = bandPulse(band).width_s;
    const P = predictPaths(latticePaths(stack, latticeFrequencies(band, 64), 3.5e9, { minAmplitude: 1e-4, maxDelay_s: 5e-9 }).reflected, band, W);
    expect(Math.abs(P.t_s[1] - (2 * d * 2) / C0)).toBeLessThan(1e-16);
    expect(P.level[1]).toBeCloseTo(8 / 27, 6);
    expect(P.re[1]).toBeCloseTo(8 / 27, 6); // the amplitude's phase at the band centre, with the delay taken out
  });

  it('150 mm concrete on a conductor, 1–6 GHz: the conductor path peaks where the exact envelope does', () => {
    const band: [number, number] = [1e9, 6e9];
    const stack = makeStack({ band_GHz: [1, 6], layers: [layer(catalogMaterial('concrete') as BulkMaterial, 0.15)], back: 'pec' });
    const W = bandPulse(band).width_s;
    const P = predictPaths(latticePaths(stack, latticeFrequencies(band, 64), 3.5e9, { minAmplitude: 1e-5, maxDelay_s: 10e-9 }).reflected, band, W);
    const exact = exactPeaks(exactEnvelope(stack, 'R', W / 400), 0.01);
    expect(exact.length).toBe(2);
    // the conductor echo is alone: its own peak is the envelope's to 0.05 % and 0.05 dB
    expect(Math.abs(P.t_s[1] / exact[1].t_s - 1)).toBeLessThan(5e-4);
    expect(Math.abs(20 * Math.log10(P.level[1] / exact[1].level))).toBeLessThan(0.05);
    // while 2 d √ε′/c, ε′ = 5.24 (the table's a), is 2.7 ps (0.12 %) early
    expect(exact[1].t_s - (2 * 0.15 * Math.sqrt(5.24)) / C0).toBeGreaterThan(2e-12);
  });
});
