// The engineering quantities (R_power, T_power, absorbed, IL_dB, RL_dB, IPD_deg) against closed forms and an
// independent Poynting-flux reference.
import { describe, expect, it } from 'vitest';
import { add as cadd, cx, div as cdiv, exp as cexp, mul as cmul, scale as cscale, sqrt as csqrt, type Complex } from '../../src/complex.ts';
import { solveExactWithQuantities } from '../../src/studies/exact.ts';
import { DB_CEILING, quantitiesOf } from '../../src/studies/quantities.ts';
import { bandFrequencies } from '../../src/results.ts';
import { absorption, solveTmm } from '../../src/tmm/solve.ts';
import { C0_m_per_s } from '../../src/units.ts';
import { AIR, dielectric, layer, magnetic, makeStack, type StackOptions } from '../support/build-stack.ts';
import { referenceOf, referenceProfile } from '../support/field-reference.ts';

const DEG = Math.PI / 180;
const at = (o: StackOptions, f_GHz = 3) => {
  const stack = makeStack({ band_GHz: [f_GHz, f_GHz + 1], points: 2, ...o });
  const { quantities: q } = solveExactWithQuantities(stack, Float64Array.of(f_GHz * 1e9));
  return { R: q.R_power[0], T: q.T_power[0], A: q.absorbed[0], IL: q.IL_dB[0], RL: q.RL_dB[0], IPD: q.IPD_deg[0] };
};

/** Fresnel power coefficients, from the amplitude coefficients of the total fields (Born & Wolf §1.5.3). */
function fresnel(n1: number, n2: number, theta: number, pol: 'TE' | 'TM'): { R: number; T: number } {
  const c1 = Math.cos(theta), c2 = Math.sqrt(1 - (n1 * Math.sin(theta) / n2) ** 2);
  const [r, t] = pol === 'TE'
    ? [(n1 * c1 - n2 * c2) / (n1 * c1 + n2 * c2), (2 * n1 * c1) / (n1 * c1 + n2 * c2)]
    : [(n2 * c1 - n1 * c2) / (n2 * c1 + n1 * c2), (2 * n1 * c1) / (n2 * c1 + n1 * c2)];
  return { R: r * r, T: ((n2 * c2) / (n1 * c1)) * t * t };
}

describe('power fractions', () => {
  it('one interface, air to ε_r = 4: R = 1/9, T = 8/9, losses in dB (physics reference: r = −1/3, t = 2/3)', () => {
    const q = at({ back: dielectric(4) });
    expect(q.R).toBeCloseTo(1 / 9, 14);
    expect(q.T).toBeCloseTo(8 / 9, 14);
    expect(q.A).toBeCloseTo(0, 14);
    expect(q.IL).toBeCloseTo(-10 * Math.log10(8 / 9), 12);
    expect(q.RL).toBeCloseTo(10 * Math.log10(9), 12);
    expect(q.IPD).toBeCloseTo(0, 12); // no thickness, t real and positive
  });

  it('Fresnel at oblique incidence in TE and TM, whatever field ratio the solver keeps (Born & Wolf §1.5.3)', () => {
    for (const pol of ['TE', 'TM'] as const) {
      for (const deg of [0, 25, 50, 75]) {
        const q = at({ back: dielectric(2.25), angle_deg: deg, polarization: pol });
        const ref = fresnel(1, 1.5, deg * DEG, pol);
        expect(q.R).toBeCloseTo(ref.R, 13);
        expect(q.T).toBeCloseTo(ref.T, 13);
      }
    }
  });

  it('vanishes in TM at the Brewster angle, arctan(n2/n1) (physics reference: 63.43° for ε_r = 4)', () => {
    const q = at({ back: dielectric(4), angle_deg: Math.atan(2) / DEG, polarization: 'TM' });
    expect(q.R).toBeLessThan(1e-28);
    expect(q.RL).toBeGreaterThan(300);
  });

  it('beyond the critical angle all power is reflected and the loss hits its ceiling (Born & Wolf §1.5.4)', () => {
    for (const pol of ['TE', 'TM'] as const) {
      const q = at({ front: dielectric(2.25), back: AIR, angle_deg: 50, polarization: pol }); // critical 41.8°
      expect(q.R).toBeCloseTo(1, 13);
      expect(q.T).toBe(0);
      expect(q.IL).toBe(DB_CEILING);
    }
  });

  it('a matched magnetic half-space (ε = μ) reflects nothing and passes everything (physics reference)', () => {
    const q = at({ back: magnetic(3, 0, 3) });
    expect(q.R).toBeLessThan(1e-30);
    expect(q.T).toBeCloseTo(1, 14);
  });

  it('match the Poynting flux of an independent ABCD reference on lossy, magnetic and oblique stacks (Orfanidis ch. 5–8)', () => {
    const stacks = [
      makeStack({ layers: [layer(dielectric(5, 0.05), 0.04), layer(magnetic(3, 0.01, 2, 0.5), 0.006)], back: dielectric(2.5), angle_deg: 35, polarization: 'TM' }),
      makeStack({ layers: [layer(dielectric(2.7, 0.02), 0.0125), layer(AIR, 0.07), layer(dielectric(2.7, 0.02), 0.0125)], angle_deg: 60, polarization: 'TE' }),
      makeStack({ layers: [layer(magnetic(10, 0, 2.5, 1.2), 0.003)], back: 'pec', angle_deg: 20, polarization: 'TE' }),
    ];
    for (const stack of stacks) {
      const f = bandFrequencies(stack);
      const q = quantitiesOf(stack, solveTmm(stack, f));
      for (let i = 0; i < f.length; i++) {
        const ref = referenceOf(stack, f[i]);
        const d = stack.layers.reduce((s, l) => s + (l.kind === 'bulk' ? l.thickness_m : 0), 0);
        const { E, H } = referenceProfile(ref, f[i], [-1e-9, d + 1e-9]);
        // Power flux along x over the incident one: Re(E · conj(H)) with E and H each over its incident value at
        // x = 0 (the front impedance is real, so it cancels), just in front of the stack and just behind it.
        const flux = (e: Complex, h: Complex) => e.re * h.re + e.im * h.im;
        const inFront = flux(E[0], H[0]), behind = stack.back === 'pec' ? 0 : flux(E[1], H[1]);
        expect(q.R_power[i]).toBeCloseTo(1 - inFront, 9);
        expect(q.T_power[i]).toBeCloseTo(behind, 9);
        expect(q.absorbed[i]).toBeCloseTo(inFront - behind, 9);
      }
      expect(Array.from(absorption(stack, solveTmm(stack, f)))).toEqual(Array.from(q.absorbed)); // the summary's figure
    }
  });
});

describe('building loss', () => {
  it('of a concrete wall equals the single-slab formulas of ITU-R P.2040-3 §2.2.2 (their form from memory)', () => {
    // R = r(1 − e^{−2jq}) / (1 − r² e^{−2jq}), T = (1 − r²) e^{−jq} / (1 − r² e^{−2jq}), q = k0 d √(ε − sin²θ),
    // r the Fresnel coefficient of air to the wall (TE here); ε from the P.2040 power law of concrete (Table 3).
    const concrete = { name: 'concrete', spec: { model: 'power-law' as const, a: 5.24, b: 0, c: 0.0462, d: 0.7822 }, source: 'test', valid_GHz: null };
    const d = 0.2, theta = 30 * DEG;
    const stack = makeStack({ layers: [{ kind: 'bulk', material: concrete, thickness_m: d }], band_GHz: [1, 6], points: 11, angle_deg: 30 });
    const f = bandFrequencies(stack);
    const q = quantitiesOf(stack, solveTmm(stack, f));
    for (let i = 0; i < f.length; i++) {
      const fG = f[i] / 1e9, w = 2 * Math.PI * f[i];
      const eps = cx(5.24, -(0.0462 * fG ** 0.7822) / (w * 8.8541878128e-12));
      const root = csqrt(cadd(eps, cx(-(Math.sin(theta) ** 2))));
      const c1 = Math.cos(theta);
      const r = cdiv(cadd(cx(c1), cscale(root, -1)), cadd(cx(c1), root));
      const k0 = w / C0_m_per_s;
      const e2 = cexp(cmul(cx(0, -2 * k0 * d), root)); // e^{−2jq}
      const num = cmul(cadd(cx(1), cscale(cmul(r, r), -1)), cexp(cmul(cx(0, -k0 * d), root)));
      const T = cdiv(num, cadd(cx(1), cscale(cmul(cmul(r, r), e2), -1)));
      expect(q.IL_dB[i]).toBeCloseTo(-10 * Math.log10(T.re * T.re + T.im * T.im), 9);
    }
  });
});

describe('insertion phase delay', () => {
  it('a half-wave slab delays by 180° − k0 d cos θ: T = −1 there (Kozakoff, radome convention; Orfanidis ch. 5)', () => {
    for (const [deg, pol] of [[0, 'TE'], [30, 'TE'], [30, 'TM']] as const) {
      const eps = 4, f = 3e9, k0 = (2 * Math.PI * f) / C0_m_per_s;
      const kx = k0 * Math.sqrt(eps - Math.sin(deg * DEG) ** 2);
      const d = Math.PI / kx; // k_x d = π: a half wave along the normal
      const q = at({ layers: [layer(dielectric(eps), d)], angle_deg: deg, polarization: pol });
      expect(q.R).toBeLessThan(1e-28);
      expect(q.IPD).toBeCloseTo(180 - (k0 * d * Math.cos(deg * DEG)) / DEG, 9);
    }
  });

  it('follows the phase continuously through many turns on a thick slab (unwrapped from the band\'s low end)', () => {
    const stack = makeStack({ layers: [layer(dielectric(9, 0.001), 0.05)], band_GHz: [0.05, 10], points: 4001 });
    const f = bandFrequencies(stack);
    const sp = solveTmm(stack, f);
    const q = quantitiesOf(stack, sp);
    let unwrapped = 0, prev = 0;
    for (let i = 0; i < f.length; i++) {
      const k0 = (2 * Math.PI * f[i]) / C0_m_per_s;
      const principal = -Math.atan2(sp.T_im[i], sp.T_re[i]) - k0 * 0.05;
      if (i === 0) unwrapped = principal; // ≈ 14° at 50 MHz, well inside the first turn
      else unwrapped += principal - prev - 2 * Math.PI * Math.round((principal - prev) / (2 * Math.PI));
      prev = principal;
      expect(q.IPD_deg[i]).toBeCloseTo(unwrapped / DEG, 7);
    }
    expect(q.IPD_deg[f.length - 1]).toBeGreaterThan(1000); // (n − 1) k0 d = 1200° at 10 GHz
  });

  it('is 0 behind a conductor, where T = 0', () => {
    expect(at({ layers: [layer(dielectric(4), 0.01)], back: 'pec' }).IPD).toBe(0);
  });
});
