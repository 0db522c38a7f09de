// Standing-wave profiles at 40°, TE and TM, with magnetic and lossy layers, a resistive sheet, a magnetic back
// medium or a conductor: tangential E and H along the normal line from the exact solver (to 1e-6) and the FEM
// (to 1e-4) against an independent ABCD cascade evaluated at the same points (test/support/field-reference.ts).

import { describe, expect, it } from 'vitest';
import { type Complex } from '../../src/complex.ts';
import { profileFem } from '../../src/fem/profile.ts';
import type { Profile } from '../../src/results.ts';
import type { Stack } from '../../src/stack/types.ts';
import { profilePositions, profileTmm } from '../../src/tmm/profile.ts';
import { dielectric, layer, magnetic, makeStack, prng, sheet } from '../support/build-stack.ts';
import { referenceOf, referenceProfile } from '../support/field-reference.ts';

const F = 5e9;

function stackAt40(pol: 'TE' | 'TM', back: 'pec' | 'magnetic'): Stack {
  return makeStack({
    layers: [layer(magnetic(6, 0.05, 3, 1.2), 0.004), sheet(300), layer(dielectric(2.5, 0.01), 0.01), layer(magnetic(1.5, 0, 4, 0.3), 0.003)],
    back: back === 'pec' ? 'pec' : magnetic(2, 0, 2),
    angle_deg: 40, polarization: pol, band_GHz: [2, 8], profile_GHz: F / 1e9,
  });
}

/** The profile grid plus points at random depths (not on any grid node). */
function positions(st: Stack): Float64Array {
  const base = profilePositions(st, F), rand = prng(40);
  const lo = base[0], hi = base[base.length - 1];
  return Float64Array.from([...base, ...Array.from({ length: 200 }, () => lo + (hi - lo) * rand())]).sort();
}

function worst(p: Profile, ref: { E: Complex[]; H: Complex[] }): { E: number; H: number } {
  let E = 0, H = 0;
  for (let k = 0; k < p.x_m.length; k++) {
    E = Math.max(E, Math.hypot(p.E_re[k] - ref.E[k].re, p.E_im[k] - ref.E[k].im));
    if (p.H_re && p.H_im) H = Math.max(H, Math.hypot(p.H_re[k] - ref.H[k].re, p.H_im[k] - ref.H[k].im));
  }
  return { E, H };
}

describe('profiles at 40° against the ABCD cascade at points', () => {
  for (const pol of ['TE', 'TM'] as const) for (const back of ['magnetic', 'pec'] as const) {
    it(`${pol}, ${back} back: exact solver to 1e-6 and FEM to 1e-4, tangential E and H`, () => {
      const st = stackAt40(pol, back);
      const x = positions(st);
      const ref = referenceProfile(referenceOf(st, F), F, x);
      const tmm = worst(profileTmm(st, F, x), ref);
      expect(tmm.E).toBeLessThan(1e-6);
      expect(tmm.H).toBeLessThan(1e-6);
      const femProfile = profileFem(st, F, x, {}, true);
      expect(femProfile.H_re).toBeDefined();
      const fem = worst(femProfile, ref);
      expect(fem.E).toBeLessThan(1e-4);
      expect(fem.H).toBeLessThan(1e-4);
      // The fields are not trivially small: the standing wave reaches order one somewhere.
      expect(Math.max(...ref.E.map((e) => Math.hypot(e.re, e.im)))).toBeGreaterThan(0.5);
      expect(Math.max(...ref.H.map((e) => Math.hypot(e.re, e.im)))).toBeGreaterThan(0.5);
    });
  }

  it('at x = 0 the fields are the superposition of the incident and reflected waves: E = 1 + R, H = 1 − R (common practice)', () => {
    const st = stackAt40('TM', 'magnetic');
    const p = profileTmm(st, F, Float64Array.of(0, -1e-12));
    // Just in front of x = 0 (no sheet there) both sides agree.
    expect(Math.hypot(p.E_re[0] - p.E_re[1], p.E_im[0] - p.E_im[1])).toBeLessThan(1e-9);
    expect(Math.hypot(p.H_re![0] - p.H_re![1], p.H_im![0] - p.H_im![1])).toBeLessThan(1e-9);
    expect(Math.hypot(p.E_re[0] + p.H_re![0] - 2, p.E_im[0] + p.H_im![0])).toBeLessThan(1e-12);
  });
});
