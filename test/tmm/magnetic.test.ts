// The exact solver with μ ≠ 1 against closed forms, to 1e-9 (cases and their sources in
// test/support/magnetic-cases.ts): Fresnel in both polarizations, the matched ε = μ medium, a lossy magnetic
// layer on a conductor, the quarter-wave magnetic absorber, and the Brewster angles of magnetic media.

import { describe, expect, it } from 'vitest';
import { type Complex } from '../../src/complex.ts';
import { tmmAt } from '../../src/tmm/solve.ts';
import { AIR, layer, magnetic, makeStack } from '../support/build-stack.ts';
import { CASE_FREQUENCY_Hz, type ClosedFormCase, fresnelCases, matchedCases, quarterWaveAbsorber, shortedLayerCases } from '../support/magnetic-cases.ts';

const TOL = 1e-9;
const dist = (a: Complex, b: Complex) => Math.hypot(a.re - b.re, a.im - b.im);

function worstOf(cases: ClosedFormCase[]): number {
  let worst = 0;
  for (const c of cases) {
    const { R, T } = tmmAt(c.stack, c.f_Hz);
    const e = Math.max(dist(R, c.R), c.T ? dist(T, c.T) : Math.hypot(T.re, T.im));
    expect(e, c.name).toBeLessThan(TOL);
    worst = Math.max(worst, e);
  }
  return worst;
}

describe('closed forms with μ ≠ 1 (exact solver, 1e-9)', () => {
  it('Fresnel with μ, TE and TM, 0–80°, lossy and magnetic fronts and total reflection included', () => {
    const cases = fresnelCases();
    expect(cases).toHaveLength(40);
    worstOf(cases);
    // Past the critical angle (ε μ = 15 to air: about 14.96°) the reflection is total.
    const tir = cases.filter((c) => c.name.includes('→ air at 40°') || c.name.includes('→ air at 80°'));
    for (const c of tir) expect(Math.hypot(c.R.re, c.R.im)).toBeCloseTo(1, 12);
  });

  it('a medium with ε = μ is matched at normal incidence: no reflection, T = e^{−j k0 ε d} through a slab', () => {
    worstOf(matchedCases());
    // ... but not at an angle (the TE and TM impedances k0μ/k_z and k_z/(k0ε) leave η0/cos θ).
    const m = magnetic(4, 0, 4);
    expect(Math.hypot(...Object.values(tmmAt(makeStack({ back: m, angle_deg: 50 }), CASE_FREQUENCY_Hz).R))).toBeGreaterThan(0.05);
  });

  it('a lossy magnetic layer on a conductor is a shorted line, TE and TM at 0, 40 and 70°', () => {
    worstOf(shortedLayerCases());
  });

  it('the quarter-wave magnetic absorber on a conductor reflects nothing at its design frequency', () => {
    for (const [eps, d] of [[10, 0.005], [20, 0.005], [40, 0.004]]) {
      const { mu, t } = quarterWaveAbsorber(eps, d);
      expect(mu.im).toBeLessThan(0); // passive
      // About a quarter wave thick: Re(k d) between 0.85 and 1 times π/2.
      expect(t.re).toBeGreaterThan(0.85 * Math.PI / 2); expect(t.re).toBeLessThanOrEqual(Math.PI / 2);
      const st = makeStack({ layers: [layer(magnetic(eps, 0, mu.re, -mu.im), d)], back: 'pec', band_GHz: [1, 6] });
      expect(Math.hypot(...Object.values(tmmAt(st, CASE_FREQUENCY_Hz).R))).toBeLessThan(TOL);
      expect(Math.hypot(...Object.values(tmmAt(st, 2 * CASE_FREQUENCY_Hz).R))).toBeGreaterThan(0.1);
    }
  });
});

/**
 * Brewster angles of magnetic media, front medium 1 and back medium 2 (Balanis, Advanced Engineering
 * Electromagnetics, 2nd ed., ch. 5, "Reflection and transmission", the Brewster-angle section (§5.3.4, the
 * number from memory); the same results in Rothwell & Cloud, Electromagnetics, CRC Press 2001, ch. 4):
 *   TM (parallel):      sin²θ_B = ε2 (ε2 μ1 − ε1 μ2) / (μ1 (ε2² − ε1²))
 *   TE (perpendicular): sin²θ_B = μ2 (μ1 ε2 − μ2 ε1) / (ε1 (μ1² − μ2²))
 * With μ1 = μ2 the TM form is tan θ_B = √(ε2/ε1) and TE has none; with ε1 = ε2 the TE form is tan θ_B = √(μ2/μ1).
 */
describe('Brewster angles with μ (exact solver, 1e-9)', () => {
  const brewster = (pol: 'TE' | 'TM', e2: number, m2: number, e1 = 1, m1 = 1): number => {
    const s2 = pol === 'TM' ? (e2 * (e2 * m1 - e1 * m2)) / (m1 * (e2 * e2 - e1 * e1)) : (m2 * (m1 * e2 - m2 * e1)) / (e1 * (m1 * m1 - m2 * m2));
    return (Math.asin(Math.sqrt(s2)) * 180) / Math.PI;
  };
  const R = (pol: 'TE' | 'TM', e2: number, m2: number, deg: number, front = AIR) =>
    Math.hypot(...Object.values(tmmAt(makeStack({ front, back: magnetic(e2, 0, m2), angle_deg: deg, polarization: pol }), CASE_FREQUENCY_Hz).R));

  it('TM into ε = 4, μ = 2: sin²θ_B = 8/15 (θ_B ≈ 46.91°), and R ≠ 0 five degrees either side', () => {
    const th = brewster('TM', 4, 2);
    expect(Math.sin((th * Math.PI) / 180) ** 2).toBeCloseTo(8 / 15, 14);
    expect(R('TM', 4, 2, th)).toBeLessThan(TOL);
    expect(R('TM', 4, 2, th - 5)).toBeGreaterThan(0.01);
    expect(R('TM', 4, 2, th + 5)).toBeGreaterThan(0.01);
    // The same medium has no TE Brewster angle in (0°, 90°): sin²θ_B would be negative.
    expect(R('TE', 4, 2, th)).toBeGreaterThan(0.1);
  });

  it('TE into ε = 2, μ = 4: sin²θ_B = 8/15 (the dual of the TM case); TE into ε = 1, μ = 3: tan θ_B = √3, θ_B = 60°', () => {
    const th = brewster('TE', 2, 4);
    expect(R('TE', 2, 4, th)).toBeLessThan(TOL);
    expect(R('TE', 2, 4, th + 5)).toBeGreaterThan(0.01);
    expect(brewster('TE', 1, 3)).toBeCloseTo(60, 12);
    expect(R('TE', 1, 3, 60)).toBeLessThan(TOL);
    expect(R('TM', 1, 3, 60)).toBeGreaterThan(0.1);
  });

  it('TM from a magnetic front medium (ε1 = 2, μ1 = 1.5) into ε2 = 6, μ2 = 1.2', () => {
    const th = brewster('TM', 6, 1.2, 2, 1.5);
    expect(R('TM', 6, 1.2, th, magnetic(2, 0, 1.5))).toBeLessThan(TOL);
    expect(R('TM', 6, 1.2, th - 5, magnetic(2, 0, 1.5))).toBeGreaterThan(0.01);
  });
});
