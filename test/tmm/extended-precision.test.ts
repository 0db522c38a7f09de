// The exact solver against an extended-precision reference: a characteristic-matrix cascade carried out in
// double-double arithmetic (test/support/dd-cascade.ts; Born & Wolf §1.6, Orfanidis ch. 5–8), on low-loss layers
// down to ε''/ε' = 1e-12. The target is 1e-12 relative, or the double-precision limit of the layer phases where
// that is larger (a phase of |k d| radians carried in doubles is uncertain by about 1e-16 |k d|).

import { describe, expect, it } from 'vitest';
import { type Complex, decayingSqrtInto, sqrt } from '../../src/complex.ts';
import { absorption, solveTmm } from '../../src/tmm/solve.ts';
import { GHz } from '../../src/units.ts';
import { compareWithReference, randomLowLossStack, referenceCascade } from '../support/dd-cascade.ts';
import {
  cdd, cddNumber, cddSqrt, DD_HALF_PI, DD_LN2, DD_PI, DD_TWO_PI, dd, ddExpSeries, ddMul, ddNumber, ddScale, ddSinCos,
  ddSinSeries, ddSub,
} from '../support/double-double.ts';
import { dielectric, layer, makeStack, prng } from '../support/build-stack.ts';

const compare = compareWithReference;

describe('the double-double reference itself', () => {
  it('holds π, 2π, π/2 and ln 2 to 32 digits (checked by series that do not use them: sin²(π/4) = ½, e^{ln 2} = 2)', () => {
    const s = ddSinSeries(ddScale(DD_PI, 0.25));
    expect(Math.abs(ddNumber(ddSub(ddMul(s, s), dd(0.5))))).toBeLessThan(1e-31);
    expect(Math.abs(ddNumber(ddSub(ddExpSeries(DD_LN2), dd(2))))).toBeLessThan(1e-31);
    expect(ddNumber(ddSub(DD_TWO_PI, ddScale(DD_PI, 2)))).toBe(0);
    expect(ddNumber(ddSub(DD_HALF_PI, ddScale(DD_PI, 0.5)))).toBe(0);
  });

  it('agrees with the double-precision library where that is exact to its last digits', () => {
    for (const x of [0.1, 1, 2.5, -3, 100, 12345.678, 4.2e5]) {
      const { sin, cos } = ddSinCos(dd(x));
      // Math.sin/cos of a double argument are correctly rounded to within an ulp (common practice, no source).
      expect(Math.abs(ddNumber(sin) - Math.sin(x))).toBeLessThan(2.3e-16);
      expect(Math.abs(ddNumber(cos) - Math.cos(x))).toBeLessThan(2.3e-16);
      // sin² + cos² = 1 to double-double accuracy.
      const one = ddSub(ddMul(sin, sin), ddSub(dd(1), ddMul(cos, cos)));
      expect(Math.abs(ddNumber(one))).toBeLessThan(1e-28);
    }
  });
});

describe('complex square root (Kahan 1987: no cancellation in the small part)', () => {
  it('√(1.5 − 1e-8 j) keeps its imaginary part −1e-8 / (2√1.5) = −4.0825e-9', () => {
    const r = sqrt({ re: 1.5, im: -1e-8 });
    expect(r.re).toBeCloseTo(Math.sqrt(1.5), 15);
    expect(Math.abs(r.im / (-1e-8 / (2 * Math.sqrt(1.5))) - 1)).toBeLessThan(1e-15);
  });

  it('√((a + jb)²) = a + jb when b ≪ a (a closed form), to the last digit of b', () => {
    for (const b of [1e-4, 1e-8, 1e-12, 1e-15]) {
      const r = sqrt({ re: 4 - b * b, im: 4 * b });
      expect(r.re).toBe(2);
      expect(Math.abs(r.im / b - 1)).toBeLessThan(4e-16);
    }
  });

  it('every part of √z is within a few ulps of the double-double root (2000 values, parts from 1e-24 to 1e12)', () => {
    const rand = prng(1987);
    let worst = 0;
    for (let k = 0; k < 2000; k++) {
      const part = () => (rand() < 0.5 ? -1 : 1) * 10 ** (rand() * 24 - 12);
      const re = part(), im = rand() < 0.1 ? part() * 1e-12 : part();
      const got = sqrt({ re, im });
      const want = cddNumber(cddSqrt(cdd(re, im)));
      worst = Math.max(worst, Math.abs(got.re - want.re) / Math.abs(want.re), Math.abs(got.im - want.im) / Math.abs(want.im));
    }
    expect(worst).toBeLessThan(8 * 2.2e-16);
  });

  it('neither overflows nor underflows near the ends of the double range: √(4^k z) = 2^k √z exactly', () => {
    for (const z of [{ re: 3, im: -1e-9 }, { re: -2, im: 5 }, { re: 1e-3, im: -7 }]) {
      const base = sqrt(z);
      // Exponents chosen so every part stays a normal double (2^-1022 … 2^1024).
      for (const k of [500, -480, 508, -490]) {
        const s = 2 ** k * 2 ** k;
        const r = sqrt({ re: z.re * s, im: z.im * s });
        expect(r.re).toBe(base.re * 2 ** k);
        expect(r.im).toBe(base.im * 2 ** k);
      }
    }
  });

  it('the decaying branch has Im ≤ 0, also for a lossless evanescent wave (z on the negative real axis)', () => {
    const out: Complex = { re: 0, im: 0 };
    expect(decayingSqrtInto(out, -4, 0)).toEqual({ re: -0, im: -2 });
    expect(decayingSqrtInto(out, -4, -0)).toEqual({ re: -0, im: -2 });
    expect(decayingSqrtInto(out, 4, -1e-20).im).toBeLessThan(0);
    expect(decayingSqrtInto(out, -4, 1e-3).im).toBeLessThan(0);
  });
});

describe('exact solver vs the double-double cascade', () => {
  // A slab of ε_r 4 with σ = 2e-7 S/m: ε''/ε' ≈ 9e-9 at 100 GHz, 9e-10 at 1 THz (an invented low-loss dielectric).
  const lowLoss = dielectric(4, 2e-7, 'low-loss');

  it('1 m of it at 99–100 GHz: R and T to 1e-12 (or the phase limit), and the small absorption it has', () => {
    const stack = makeStack({ layers: [layer(lowLoss, 1)], band_GHz: [99, 100], points: 21 });
    const f = Float64Array.from({ length: 21 }, (_, i) => (99 + i * 0.05) * GHz);
    const A = absorption(stack, solveTmm(stack, f));
    f.forEach((fHz, i) => {
      const c = compare(stack, fHz);
      expect(c.err, `${fHz / GHz} GHz`).toBeLessThanOrEqual(c.bound);
      const ref = referenceCascade(stack, fHz);
      const Aref = 1 - (ref.R.re ** 2 + ref.R.im ** 2) - (ref.T.re ** 2 + ref.T.im ** 2);
      expect(Aref).toBeGreaterThan(1e-5); // a loss a lossless solution would miss entirely
      expect(Math.abs(A[i] - Aref)).toBeLessThan(1e-11);
    });
  });

  it('10 m of it at 1 THz (|k d| = 4.2e5 rad): to the double-precision limit of that phase', () => {
    const stack = makeStack({ layers: [layer(lowLoss, 10)], band_GHz: [999, 1000] });
    for (const fHz of [999e9, 999.5e9, 1e12]) {
      const c = compare(stack, fHz);
      expect(c.phase).toBeGreaterThan(4e5);
      expect(c.err).toBeLessThanOrEqual(c.bound);
      expect(c.bound).toBeLessThan(1e-9); // the limit is about 1e-16 |k d|, not a loose figure
    }
  });

  it('random low-loss stacks (ε\'\'/ε\' from 1e-12 to 1e-4, every bulk model, sheets, conductor, TE/TM, 1 MHz–1 THz, 1 µm–10 m)', () => {
    const rand = prng(2040);
    let worstRatio = 0;
    for (let tested = 0; tested < 400;) {
      const { stack, f_Hz } = randomLowLossStack(rand);
      const c = compare(stack, f_Hz);
      // The reference's matrix entries grow like e^{Σ|Im φ|}; keep to stacks where it stays far more precise than
      // the solver (total attenuation or evanescent decay below 30 Np).
      if (c.loss > 30) continue;
      tested++;
      expect(c.err, `stack ${tested} at ${f_Hz} Hz`).toBeLessThanOrEqual(c.bound);
      worstRatio = Math.max(worstRatio, c.err / c.bound);
    }
    expect(worstRatio).toBeGreaterThan(0); // the comparison measured something
  });
});
