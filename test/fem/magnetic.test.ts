// The FEM with μ ≠ 1 (weight 1/μ in TE, 1/ε in TM) against the closed forms the exact solver is checked with
// (test/support/magnetic-cases.ts names each source), to 1e-6 with the mesh aimed at 1e-8.

import { describe, expect, it } from 'vitest';
import { type Complex } from '../../src/complex.ts';
import { solveFem } from '../../src/fem/solve.ts';
import type { Stack } from '../../src/stack/types.ts';
import { layer, magnetic, makeStack } from '../support/build-stack.ts';
import { CASE_FREQUENCY_Hz, type ClosedFormCase, fresnelCases, matchedCases, quarterWaveAbsorber, shortedLayerCases } from '../support/magnetic-cases.ts';

const TOL = 1e-6;
const OPTIONS = { tolerance: 1e-8 };
const dist = (a: Complex, b: Complex) => Math.hypot(a.re - b.re, a.im - b.im);

function femAt(stack: Stack, f_Hz: number): { R: Complex; T: Complex } {
  const sp = solveFem(stack, Float64Array.of(f_Hz), OPTIONS).spectrum;
  return { R: { re: sp.R_re[0], im: sp.R_im[0] }, T: { re: sp.T_re[0], im: sp.T_im[0] } };
}

function check(cases: ClosedFormCase[]): void {
  for (const c of cases) {
    const { R, T } = femAt(c.stack, c.f_Hz);
    expect(dist(R, c.R), c.name).toBeLessThan(TOL);
    expect(c.T ? dist(T, c.T) : Math.hypot(T.re, T.im), c.name).toBeLessThan(TOL);
  }
}

describe('FEM closed forms with μ ≠ 1 (1e-6)', () => {
  it('Fresnel with μ through a layer of the back medium, TE and TM, 0–80°, total reflection included', () => check(fresnelCases()));
  it('the matched ε = μ half-space and slab', () => check(matchedCases()));
  it('a lossy magnetic layer on a conductor (shorted line), TE and TM at 0, 40 and 70°', () => check(shortedLayerCases()));
  it('the quarter-wave magnetic absorber: R = 0 at its design frequency', () => {
    for (const [eps, d] of [[10, 0.005], [40, 0.004]]) {
      const { mu } = quarterWaveAbsorber(eps, d);
      const st = makeStack({ layers: [layer(magnetic(eps, 0, mu.re, -mu.im), d)], back: 'pec', band_GHz: [1, 6] });
      expect(Math.hypot(...Object.values(femAt(st, CASE_FREQUENCY_Hz).R))).toBeLessThan(TOL);
    }
  });
  it('the Brewster angles of magnetic media (formulas and sources in test/tmm/magnetic.test.ts): TM ε = 4, μ = 2; TE ε = 2, μ = 4', () => {
    const th = (Math.asin(Math.sqrt(8 / 15)) * 180) / Math.PI;
    for (const [pol, e, m] of [['TM', 4, 2], ['TE', 2, 4]] as const) {
      const back = magnetic(e, 0, m);
      const st = makeStack({ layers: [layer(back, 0.01)], back, angle_deg: th, polarization: pol });
      expect(Math.hypot(...Object.values(femAt(st, CASE_FREQUENCY_Hz).R))).toBeLessThan(TOL);
    }
  });
});
