// The FEM against closed-form results, independently of the exact solver. Each check names its source.
// Every stack has at least one bulk layer so the elements do the work (a lone interface has no elements).

import { describe, expect, it } from 'vitest';
import { solveFem } from '../../src/fem/solve.ts';
import { C0_m_per_s, ETA0_ohm } from '../../src/units.ts';
import { AIR, dielectric, layer, makeStack, sheet } from '../support/build-stack.ts';

const TOL = 1e-5;
const f = Float64Array.of(3e9);
const at = (stack: Parameters<typeof solveFem>[0], freqs = f) => solveFem(stack, freqs).spectrum;

describe('Fresnel (physics.md; Orfanidis, Electromagnetic Waves and Antennas, ch. 5 and 7)', () => {
  // A 7 cm layer of the back medium in front of its own half-space: the only reflection is at x = 0, and T is
  // the interface's t delayed by the layer, so |T| = |t|.
  const eps4 = dielectric(4);
  it('normal incidence air → ε_r = 4: r = −1/3, |t| = 2/3', () => {
    const sp = at(makeStack({ layers: [layer(eps4, 0.07)], back: eps4 }));
    expect(Math.abs(sp.R_re[0] + 1 / 3)).toBeLessThan(TOL);
    expect(Math.abs(sp.R_im[0])).toBeLessThan(TOL);
    expect(Math.abs(Math.hypot(sp.T_re[0], sp.T_im[0]) - 2 / 3)).toBeLessThan(TOL);
  });

  it('oblique TE: r_TE = (n1 cos θ1 − n2 cos θ2)/(n1 cos θ1 + n2 cos θ2)', () => {
    for (const deg of [20, 45, 70]) {
      const t1 = (deg * Math.PI) / 180, t2 = Math.asin(Math.sin(t1) / 2);
      const r = (Math.cos(t1) - 2 * Math.cos(t2)) / (Math.cos(t1) + 2 * Math.cos(t2));
      const sp = at(makeStack({ layers: [layer(eps4, 0.07)], back: eps4, angle_deg: deg, polarization: 'TE' }));
      expect(Math.hypot(sp.R_re[0] - r, sp.R_im[0])).toBeLessThan(TOL);
    }
  });

  it('oblique TM (tangential-E ratio): r_TM = (n1 cos θ2 − n2 cos θ1)/(n1 cos θ2 + n2 cos θ1)', () => {
    for (const deg of [20, 45, 70]) {
      const t1 = (deg * Math.PI) / 180, t2 = Math.asin(Math.sin(t1) / 2);
      const r = (Math.cos(t2) - 2 * Math.cos(t1)) / (Math.cos(t2) + 2 * Math.cos(t1));
      const sp = at(makeStack({ layers: [layer(eps4, 0.07)], back: eps4, angle_deg: deg, polarization: 'TM' }));
      expect(Math.hypot(sp.R_re[0] - r, sp.R_im[0])).toBeLessThan(TOL);
      // tangential E is continuous across the face: |T| = |1 + r|
      expect(Math.abs(Math.hypot(sp.T_re[0], sp.T_im[0]) - Math.abs(1 + r))).toBeLessThan(TOL);
    }
  });
});

describe('Brewster angle in TM (tan θ_B = n2/n1; arctan 2 ≈ 63.43° for ε_r = 4; physics.md)', () => {
  const thetaB = (Math.atan(2) * 180) / Math.PI;
  it('a slab of ε_r = 4 in air reflects nothing in TM at θ_B at every frequency, but does in TE', () => {
    // Inside the slab the ray meets the back face at the 2→1 Brewster angle too, so both faces are silent.
    const band = Float64Array.of(1e9, 2.5e9, 4e9, 6.5e9, 9e9);
    const tm = at(makeStack({ layers: [layer(dielectric(4), 0.02)], angle_deg: thetaB, polarization: 'TM' }), band);
    const te = at(makeStack({ layers: [layer(dielectric(4), 0.02)], angle_deg: thetaB, polarization: 'TE' }), band);
    let teMax = 0;
    for (let i = 0; i < band.length; i++) {
      expect(Math.hypot(tm.R_re[i], tm.R_im[i])).toBeLessThan(TOL);
      teMax = Math.max(teMax, Math.hypot(te.R_re[i], te.R_im[i]));
    }
    expect(teMax).toBeGreaterThan(0.3);
  });

  it('|R_TM| of air → ε_r = 4 is smallest at 63.43° on a 0.01° scan', () => {
    let best = Infinity, bestDeg = 0;
    for (let deg = 63; deg <= 64; deg += 0.01) {
      const sp = at(makeStack({ layers: [layer(dielectric(4), 0.03)], back: dielectric(4), angle_deg: deg, polarization: 'TM' }));
      const r = Math.hypot(sp.R_re[0], sp.R_im[0]);
      if (r < best) { best = r; bestDeg = deg; }
    }
    expect(Math.abs(bestDeg - thetaB)).toBeLessThan(0.006);
  });
});

describe('slab resonances (physics.md closed forms)', () => {
  it('a lossless half-wave slab (d = λ/(2n)) between equal media: R = 0 at that frequency', () => {
    const f0 = 5e9, n = 3, d = C0_m_per_s / f0 / (2 * n);
    const sp = at(makeStack({ layers: [layer(dielectric(n * n), d)] }), Float64Array.of(f0, 2 * f0));
    expect(Math.hypot(sp.R_re[0], sp.R_im[0])).toBeLessThan(TOL);
    expect(Math.hypot(sp.R_re[1], sp.R_im[1])).toBeLessThan(TOL); // a full wave at 2 f0
  });

  it('quarter-wave matching layer n_c = √(n_front n_back), d = λ/(4 n_c): R = 0', () => {
    const f0 = 4e9, nb = 3, nc = Math.sqrt(nb), d = C0_m_per_s / f0 / (4 * nc);
    const sp = at(makeStack({ layers: [layer(dielectric(nc * nc), d)], back: dielectric(nb * nb) }), Float64Array.of(f0));
    expect(Math.hypot(sp.R_re[0], sp.R_im[0])).toBeLessThan(TOL);
  });
});

describe('resistive sheets (physics.md; from the sheet ABCD matrix [[1, 0], [1/R_s, 1]])', () => {
  it('a sheet in free space at normal incidence: r = −η0/(η0 + 2R_s), t = 2R_s/(η0 + 2R_s), TE and TM', () => {
    for (const Rs of [50, 377, 1000]) {
      for (const polarization of ['TE', 'TM'] as const) {
        // 1 cm of air behind the sheet: T is t delayed by k0·1 cm.
        const sp = at(makeStack({ layers: [sheet(Rs), layer(AIR, 0.01)], polarization }));
        const r = -ETA0_ohm / (ETA0_ohm + 2 * Rs), t = (2 * Rs) / (ETA0_ohm + 2 * Rs);
        expect(Math.hypot(sp.R_re[0] - r, sp.R_im[0])).toBeLessThan(TOL);
        expect(Math.abs(Math.hypot(sp.T_re[0], sp.T_im[0]) - t)).toBeLessThan(TOL);
      }
    }
  });

  it('oblique sheet: r_TE = −η0/(η0 + 2R_s cos θ), r_TM = −η0 cos θ/(η0 cos θ + 2R_s) (wave admittances cos θ/η0, 1/(η0 cos θ))', () => {
    const Rs = 250, deg = 50, c = Math.cos((deg * Math.PI) / 180);
    const te = at(makeStack({ layers: [layer(AIR, 0.01), sheet(Rs), layer(AIR, 0.01)], angle_deg: deg, polarization: 'TE' }));
    const tm = at(makeStack({ layers: [layer(AIR, 0.01), sheet(Rs), layer(AIR, 0.01)], angle_deg: deg, polarization: 'TM' }));
    expect(Math.abs(Math.hypot(te.R_re[0], te.R_im[0]) - ETA0_ohm / (ETA0_ohm + 2 * Rs * c))).toBeLessThan(TOL);
    expect(Math.abs(Math.hypot(tm.R_re[0], tm.R_im[0]) - (ETA0_ohm * c) / (ETA0_ohm * c + 2 * Rs))).toBeLessThan(TOL);
  });

  it('Salisbury screen: R_s = η0 a quarter wavelength in front of a conductor gives R = 0 (Salisbury, US 2,599,944, 1952)', () => {
    const f0 = 10e9, d = C0_m_per_s / f0 / 4;
    for (const polarization of ['TE', 'TM'] as const) {
      const sp = at(makeStack({ layers: [sheet(ETA0_ohm), layer(AIR, d)], back: 'pec', polarization }), Float64Array.of(f0));
      expect(Math.hypot(sp.R_re[0], sp.R_im[0])).toBeLessThan(TOL);
    }
  });
});

describe('electrically thin films (Born & Wolf §1.6, eq. 57; Orfanidis, Electromagnetic Waves and Antennas, ch. 6)', () => {
  // A slab in air: R = r (1 − e^{−2jφ}) / (1 − r² e^{−2jφ}), T = (1 − r²) e^{−jφ} / (1 − r² e^{−2jφ}), φ = k0 n d cos θ_t,
  // r the tangential-E Fresnel coefficient of the front face. 1 − e^{−2jφ} is written 2j sin φ e^{−jφ}, so the
  // reference keeps its digits however small φ is. Thicknesses from 10 nm down to 1e-300 mm (valid in a stack
  // file, if unphysical below a nanometre); before the element matrices' row sums were formed without
  // cancellation, a 1e-9 mm film at 1 GHz missed R by 1.2e-4 and one of 1e-20 mm by 1.
  const n = Math.sqrt(6.31);
  const closed = (d_m: number, f_Hz: number, deg: number, pol: 'TE' | 'TM') => {
    const t1 = (deg * Math.PI) / 180, ct = Math.sqrt(1 - (Math.sin(t1) / n) ** 2), c1 = Math.cos(t1);
    const r = pol === 'TE' ? (c1 - n * ct) / (c1 + n * ct) : (ct - n * c1) / (ct + n * c1);
    const phi = ((2 * Math.PI * f_Hz) / C0_m_per_s) * n * d_m * ct;
    const e1 = { re: Math.cos(phi), im: -Math.sin(phi) }, e2 = { re: Math.cos(2 * phi), im: -Math.sin(2 * phi) };
    const den = { re: 1 - r * r * e2.re, im: -r * r * e2.im }, dd = den.re ** 2 + den.im ** 2;
    const div = (a: { re: number; im: number }) => ({ re: (a.re * den.re + a.im * den.im) / dd, im: (a.im * den.re - a.re * den.im) / dd });
    const s = Math.sin(phi); // 2j sin φ e^{−jφ} = 2 sin φ (sin φ + j cos φ)
    return { R: div({ re: 2 * r * s * Math.sin(phi), im: 2 * r * s * Math.cos(phi) }), T: div({ re: (1 - r * r) * e1.re, im: (1 - r * r) * e1.im }) };
  };
  for (const thickness_mm of [1e-5, 1e-9, 1e-20, 1e-300])
    for (const f_Hz of [1e6, 1e9])
      it(`${thickness_mm} mm of ε = 6.31 at ${f_Hz / 1e9} GHz, normal and 50° TE/TM: R to 1e-6 of itself (or 1e-15, the rounding of R = E(0) − 1), T to 1e-12`, () => {
        for (const [deg, pol] of [[0, 'TE'], [50, 'TE'], [50, 'TM']] as const) {
          const d = thickness_mm * 1e-3, ref = closed(d, f_Hz, deg, pol);
          const sp = at(makeStack({ layers: [layer(dielectric(6.31), d)], angle_deg: deg, polarization: pol }), Float64Array.of(f_Hz));
          const dR = Math.hypot(sp.R_re[0] - ref.R.re, sp.R_im[0] - ref.R.im), dT = Math.hypot(sp.T_re[0] - ref.T.re, sp.T_im[0] - ref.T.im);
          expect(dR).toBeLessThanOrEqual(1e-6 * Math.hypot(ref.R.re, ref.R.im) + 1e-15);
          expect(dT).toBeLessThan(1e-12);
        }
      });
});
