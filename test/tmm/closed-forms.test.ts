// The exact solver against closed-form results. Each check names its source.

import { describe, expect, it } from 'vitest';
import { profilePositions, profileTmm } from '../../src/tmm/profile.ts';
import { absorption, solveTmm, tmmAt, transmittedPowerFactor } from '../../src/tmm/solve.ts';
import { C0_m_per_s, ETA0_ohm } from '../../src/units.ts';
import { AIR, dielectric, layer, makeStack, sheet } from '../support/build-stack.ts';

const TOL = 1e-9;
const f = 3e9;
const lambda0 = C0_m_per_s / f;

describe('single interface (Fresnel; physics.md closed forms, Orfanidis ch. 5 and 7)', () => {
  it('air to ε_r = 4 at normal incidence: r = −1/3, t = 2/3', () => {
    const { R, T } = tmmAt(makeStack({ back: dielectric(4) }), f);
    expect(R.re).toBeCloseTo(-1 / 3, 12); expect(Math.abs(R.im)).toBeLessThan(TOL);
    expect(T.re).toBeCloseTo(2 / 3, 12); expect(Math.abs(T.im)).toBeLessThan(TOL);
  });

  it('TE at oblique incidence matches r_TE = (n1 cos θ1 − n2 cos θ2)/(n1 cos θ1 + n2 cos θ2)', () => {
    for (const deg of [10, 30, 45, 60, 80]) {
      const t1 = (deg * Math.PI) / 180, n1 = 1, n2 = 2;
      const t2 = Math.asin((n1 * Math.sin(t1)) / n2);
      const r = (n1 * Math.cos(t1) - n2 * Math.cos(t2)) / (n1 * Math.cos(t1) + n2 * Math.cos(t2));
      const { R, T } = tmmAt(makeStack({ back: dielectric(4), angle_deg: deg, polarization: 'TE' }), f);
      expect(Math.abs(R.re - r)).toBeLessThan(TOL);
      expect(Math.abs(T.re - (1 + r))).toBeLessThan(TOL); // tangential E is continuous
    }
  });

  it('TM tangential-E ratio matches (n1 cos θ2 − n2 cos θ1)/(n1 cos θ2 + n2 cos θ1) (Orfanidis ch. 7, transverse impedances)', () => {
    for (const deg of [10, 30, 45, 60, 80]) {
      const t1 = (deg * Math.PI) / 180, n1 = 1, n2 = 2;
      const t2 = Math.asin((n1 * Math.sin(t1)) / n2);
      const r = (n1 * Math.cos(t2) - n2 * Math.cos(t1)) / (n1 * Math.cos(t2) + n2 * Math.cos(t1));
      const { R } = tmmAt(makeStack({ back: dielectric(4), angle_deg: deg, polarization: 'TM' }), f);
      expect(Math.abs(R.re - r)).toBeLessThan(TOL);
    }
  });

  it('TM reflection vanishes at the Brewster angle tan θ_B = n2/n1 (arctan 2 ≈ 63.43° for ε_r = 4)', () => {
    const thetaB = (Math.atan(2) * 180) / Math.PI;
    expect(thetaB).toBeCloseTo(63.43, 2);
    const at = (deg: number) => Math.hypot(...Object.values(tmmAt(makeStack({ back: dielectric(4), angle_deg: deg, polarization: 'TM' }), f).R));
    expect(at(thetaB)).toBeLessThan(TOL);
    expect(at(thetaB - 5)).toBeGreaterThan(0.01);
    expect(at(thetaB + 5)).toBeGreaterThan(0.01);
  });
});

describe('slabs and coatings (physics.md closed forms; Orfanidis ch. 5–6)', () => {
  it('a lossless half-wave slab, d = λ/(2n), is transparent: R = 0, |T| = 1', () => {
    const n = 2, d = lambda0 / (2 * n);
    const { R, T } = tmmAt(makeStack({ layers: [layer(dielectric(n * n), d)] }), f);
    expect(Math.hypot(R.re, R.im)).toBeLessThan(TOL);
    expect(Math.hypot(T.re, T.im)).toBeCloseTo(1, 9);
    // The half-wave slab delays the phase by π: T = −1 at the back face.
    expect(T.re).toBeCloseTo(-1, 9);
  });

  it('a quarter-wave matching layer n_c = √(n_front n_back), d = λ/(4 n_c), gives R = 0', () => {
    const nb = 3, nc = Math.sqrt(nb), d = lambda0 / (4 * nc);
    const st = makeStack({ layers: [layer(dielectric(nc * nc), d)], back: dielectric(nb * nb) });
    const { R } = tmmAt(st, f);
    expect(Math.hypot(R.re, R.im)).toBeLessThan(TOL);
    // and not at another frequency
    expect(Math.hypot(...Object.values(tmmAt(st, 2 * f).R))).toBeGreaterThan(0.1);
  });

  it('a resistive sheet in free space: r = −η0/(η0 + 2R_s), t = 2R_s/(η0 + 2R_s)', () => {
    for (const Rs of [10, 100, 188.4, 377, 1000]) {
      const { R, T } = tmmAt(makeStack({ layers: [sheet(Rs)] }), f);
      expect(Math.abs(R.re + ETA0_ohm / (ETA0_ohm + 2 * Rs))).toBeLessThan(TOL);
      expect(Math.abs(T.re - (2 * Rs) / (ETA0_ohm + 2 * Rs))).toBeLessThan(TOL);
      expect(Math.abs(R.im) + Math.abs(T.im)).toBeLessThan(TOL);
    }
  });

  it('Salisbury screen: a sheet of R_s = η0 a quarter wave in front of a conductor gives R = 0 (Salisbury 1952)', () => {
    const st = makeStack({ layers: [sheet(ETA0_ohm), layer(AIR, lambda0 / 4)], back: 'pec' });
    expect(Math.hypot(...Object.values(tmmAt(st, f).R))).toBeLessThan(TOL);
    expect(Math.hypot(...Object.values(tmmAt(st, 1.5 * f).R))).toBeGreaterThan(0.2);
  });
});

describe('perfect conductor (common practice, no source)', () => {
  it('reflects with R = −1 and T = 0 at every frequency, also at oblique TE', () => {
    const st = makeStack({ back: 'pec', points: 21 });
    const sp = solveTmm(st, Float64Array.from([0.5e9, 1e9, 7e9, 33e9]));
    for (let i = 0; i < sp.f_Hz.length; i++) {
      expect(sp.R_re[i]).toBeCloseTo(-1, 12); expect(Math.abs(sp.R_im[i])).toBeLessThan(TOL);
      expect(sp.T_re[i]).toBe(0); expect(sp.T_im[i]).toBe(0);
    }
    const { R } = tmmAt(makeStack({ back: 'pec', angle_deg: 40 }), f);
    expect(R.re).toBeCloseTo(-1, 12);
  });

  it('standing wave in front: |E| = 2|sin kx|, peaks of 2, nulls every half wavelength', () => {
    const st = makeStack({ back: 'pec' });
    const x = profilePositions(st, f);
    expect(x[0]).toBeLessThanOrEqual(-1.5 * lambda0 + 1e-12);
    expect(x[x.length - 1]).toBe(0); // nothing behind a conductor
    const p = profileTmm(st, f, x);
    const k = (2 * Math.PI) / lambda0;
    let peak = 0;
    for (let i = 0; i < x.length; i++) {
      const m = Math.hypot(p.E_re[i], p.E_im[i]);
      expect(Math.abs(m - 2 * Math.abs(Math.sin(k * x[i])))).toBeLessThan(TOL);
      peak = Math.max(peak, m);
    }
    expect(peak).toBeGreaterThan(1.99);
    const nulls = [0, -0.5, -1].map((w) => profileTmm(st, f, Float64Array.of(w * lambda0)));
    for (const z of nulls) expect(Math.hypot(z.E_re[0], z.E_im[0])).toBeLessThan(TOL);
  });

  it('phase is +90° in the first half wavelength and −90° in the second (e^{+jωt})', () => {
    const st = makeStack({ back: 'pec' });
    const p = profileTmm(st, f, Float64Array.of(-0.25 * lambda0, -0.75 * lambda0, -1.25 * lambda0));
    const deg = (i: number) => (Math.atan2(p.E_im[i], p.E_re[i]) * 180) / Math.PI;
    expect(deg(0)).toBeCloseTo(90, 9);
    expect(deg(1)).toBeCloseTo(-90, 9);
    expect(deg(2)).toBeCloseTo(90, 9);
  });
});

describe('profile (tangential E is continuous across every face and sheet: common practice, no source; positions per README "solve")', () => {
  it('is continuous at every interface and equals 1 + R at x = 0 and T at the back face', () => {
    const st = makeStack({ layers: [layer(dielectric(4, 0.02), 0.03), sheet(200), layer(dielectric(2.2), 0.05)], back: dielectric(9) });
    const { R, T } = tmmAt(st, f);
    const eps = 1e-12;
    const faces = [0, 0.03, 0.08];
    const xs = Float64Array.from(faces.flatMap((x) => [x - eps, x + eps]));
    const p = profileTmm(st, f, xs);
    for (let i = 0; i < faces.length; i++) {
      expect(Math.abs(p.E_re[2 * i] - p.E_re[2 * i + 1])).toBeLessThan(1e-8);
      expect(Math.abs(p.E_im[2 * i] - p.E_im[2 * i + 1])).toBeLessThan(1e-8);
    }
    const ends = profileTmm(st, f, Float64Array.of(0, 0.08));
    expect(Math.abs(ends.E_re[0] - (1 + R.re)) + Math.abs(ends.E_im[0] - R.im)).toBeLessThan(TOL);
    expect(Math.abs(ends.E_re[1] - T.re) + Math.abs(ends.E_im[1] - T.im)).toBeLessThan(TOL);
  });

  it('positions cover 1.5 front wavelengths, every interface, and half a back wavelength', () => {
    const st = makeStack({ layers: [layer(dielectric(4), 0.01), layer(dielectric(2), 0.002)], back: dielectric(4) });
    const x = profilePositions(st, f);
    expect(x[0]).toBeLessThanOrEqual(-1.5 * lambda0);
    expect(Array.from(x)).toContain(0);
    expect(Array.from(x)).toContain(0.01);
    expect(Array.from(x)).toContain(0.012);
    expect(x[x.length - 1]).toBeCloseTo(0.012 + 0.5 * (lambda0 / 2), 12);
    expect(x.filter((v) => v > 0.01 && v < 0.012).length).toBeGreaterThanOrEqual(7);
    for (let i = 1; i < x.length; i++) expect(x[i]).toBeGreaterThan(x[i - 1]);
  });
});

describe('energy (Poynting: power along x is ½ Re(Y)|E_t|², so a lossless stack has |R|² + P|T|² = 1; Orfanidis ch. 7, from memory)', () => {
  it('lossless oblique stacks conserve power with the transmitted power factor (TE and TM)', () => {
    for (const polarization of ['TE', 'TM'] as const) {
      const st = makeStack({ layers: [layer(dielectric(4), 0.02), layer(dielectric(2.5), 0.011)], back: dielectric(3), angle_deg: 35, polarization, band_GHz: [1, 12], points: 23 });
      const A = absorption(st, solveTmm(st, Float64Array.from({ length: 23 }, (_, i) => (1 + i * 0.5) * 1e9)));
      for (const a of A) expect(Math.abs(a)).toBeLessThan(1e-12);
    }
    expect(transmittedPowerFactor(makeStack({ back: dielectric(4) }), f)).toBeCloseTo(2, 12); // Re(Y2)/Re(Y1) = n2/n1
  });
});
