// Matching a measured response: synthetic measurements of a slab from the exact solver (the transfer-matrix
// solution, itself checked against closed forms in test/tmm) with seeded Gaussian noise of a known σ, matched back.
// With 95 % intervals, a true value falls outside its interval in 1 case in 20 on average; over 20 independent cases
// four or more misses of one parameter have probability 1.6 % (binomial, n = 20, p = 0.05; common practice), so
// each parameter must be inside its interval in at least 17 of the 20 cases (on this seed: 18 and 18). The noise
// the fit infers (s = √(Σr²/(m − n))) must come out near the σ put in.
import { describe, expect, it } from 'vitest';
import { Mt19937 } from '../../src/studies/random.ts';
import { parseFree } from '../../src/tune/stack-access.ts';
import { runTune } from '../../src/tune/tune.ts';
import { measuredOf, parsed, synthetic } from './support.ts';

const slab = (eps_r: number, thickness_mm: number, sigma_S_per_m = 0.02, band = [4, 8]) => ({
  band_GHz: band, points: 41, materials: { slab: { model: 'fixed', eps_r, sigma_S_per_m } },
  layers: [{ material: 'slab', thickness_mm }],
});

describe('match: ε′ and thickness of a slab from noisy R and T', () => {
  it('20 random slabs: the truth inside the reported 95 % intervals, the noise level recovered', async () => {
    const rng = new Mt19937(2024), sigma = 0.003;
    let epsInside = 0, dInside = 0;
    for (let c = 0; c < 20; c++) {
      const eps = 2 + 6 * rng.uniform(), d = 5 + 25 * rng.uniform(), loss = 0.05 * rng.uniform();
      const truth = parsed(slab(eps, d, loss));
      const start = parsed(slab(4, 15, loss));
      const measured = measuredOf(synthetic(truth.stack, 41, ['R', 'T'], sigma, rng), start.stack);
      const free = [parseFree('materials.slab.eps_r=1.5:10', start.file), parseFree('layers[0].thickness_mm=2:40', start.file)];
      const out = await runTune({ file: start.file, free, goal: { name: 'match', measured }, goalText: 'match=measured.csv', seed: 1, budget: 200 });
      const s = out.summary as { interval_95: Record<string, [number, number]>; residual: { noise_estimate: number }; warnings: string[] };
      const [ie, id] = [s.interval_95['materials.slab.eps_r'], s.interval_95['layers[0].thickness_mm']];
      if (ie[0] <= eps && eps <= ie[1]) epsInside++;
      if (id[0] <= d && d <= id[1]) dInside++;
      expect(s.residual.noise_estimate / sigma).toBeGreaterThan(0.75);
      expect(s.residual.noise_estimate / sigma).toBeLessThan(1.25);
      expect(s.warnings.filter((w) => /identifiable/.test(w))).toEqual([]);
      // The tuned stack file is the best point, valid as a stack file.
      expect(out.tunedFile!.materials.slab).toMatchObject({ eps_r: expect.closeTo(eps, 1) });
    }
    expect(epsInside).toBeGreaterThanOrEqual(17);
    expect(dInside).toBeGreaterThanOrEqual(17);
  });

  it('|R| alone on a thick lossy slab: ε′ is found, the thickness is flagged as not identifiable', async () => {
    // 300 mm of ε′ = 6, σ = 0.5 S/m at 8–12 GHz: the wave dies out inside (about −130 dB for the round trip), so
    // |R| is the front face's alone and says nothing of the thickness (common practice).
    const rng = new Mt19937(5);
    const truth = parsed(slab(6, 300, 0.5, [8, 12]));
    const start = parsed(slab(4, 250, 0.5, [8, 12]));
    const measured = measuredOf(synthetic(truth.stack, 41, ['R_dB'], 0.05, rng), start.stack);
    const free = [parseFree('materials.slab.eps_r=2:10', start.file), parseFree('layers[0].thickness_mm=200:400', start.file)];
    const out = await runTune({ file: start.file, free, goal: { name: 'match', measured }, goalText: 'match=measured.csv', seed: 1, budget: 200 });
    const s = out.summary as { best: Record<string, number>; interval_95: Record<string, [number, number] | null>; warnings: string[] };
    expect(s.warnings.some((w) => /not identifiable: layers\[0\]\.thickness_mm/.test(w))).toBe(true);
    expect(s.warnings.some((w) => /not identifiable: materials\.slab\.eps_r/.test(w))).toBe(false);
    const ie = s.interval_95['materials.slab.eps_r']!;
    expect(ie[0]).toBeLessThanOrEqual(6);
    expect(ie[1]).toBeGreaterThanOrEqual(6);
  });
});
