// Double-double arithmetic (a value is hi + lo, |lo| ≤ ½ ulp(hi): about 32 significant digits), enough to
// serve as an extended-precision reference for the double-precision solvers. Error-free transformations:
// Knuth's TwoSum and Dekker's TwoProduct with Veltkamp splitting (Dekker, "A floating-point technique for
// extending the available precision", Numer. Math. 18, 1971; the same building blocks as Hida, Li & Bailey's
// QD library, 2001). Elementary functions by argument reduction and Taylor series in double-double.

export interface DD { hi: number; lo: number }

export const dd = (hi: number, lo = 0): DD => ({ hi, lo });
export const ddNumber = (a: DD): number => a.hi + a.lo;

function twoSum(a: number, b: number): DD {
  const s = a + b, bb = s - a;
  return { hi: s, lo: (a - (s - bb)) + (b - bb) };
}
function quickTwoSum(a: number, b: number): DD {
  const s = a + b;
  return { hi: s, lo: b - (s - a) };
}
const SPLITTER = 134217729; // 2^27 + 1
function split(a: number): [number, number] {
  const c = SPLITTER * a, hi = c - (c - a);
  return [hi, a - hi];
}
function twoProd(a: number, b: number): DD {
  const p = a * b;
  const [ah, al] = split(a), [bh, bl] = split(b);
  return { hi: p, lo: ((ah * bh - p) + ah * bl + al * bh) + al * bl };
}

export function ddAdd(a: DD, b: DD): DD {
  const s = twoSum(a.hi, b.hi), t = twoSum(a.lo, b.lo);
  let r = quickTwoSum(s.hi, s.lo + t.hi);
  r = quickTwoSum(r.hi, r.lo + t.lo);
  return r;
}
export const ddNeg = (a: DD): DD => ({ hi: -a.hi, lo: -a.lo });
export const ddSub = (a: DD, b: DD): DD => ddAdd(a, ddNeg(b));
export function ddMul(a: DD, b: DD): DD {
  const p = twoProd(a.hi, b.hi);
  return quickTwoSum(p.hi, p.lo + (a.hi * b.lo + a.lo * b.hi));
}
export const ddScale = (a: DD, s: number): DD => ddMul(a, dd(s));
export function ddDiv(a: DD, b: DD): DD {
  const q1 = a.hi / b.hi;
  let r = ddSub(a, ddScale(b, q1));
  const q2 = r.hi / b.hi;
  r = ddSub(r, ddScale(b, q2));
  const q3 = r.hi / b.hi;
  return ddAdd(quickTwoSum(q1, q2), dd(q3));
}
/** √a for a ≥ 0: the double root and one Newton step carried out in double-double. */
export function ddSqrt(a: DD): DD {
  if (a.hi <= 0) return dd(0);
  const x = Math.sqrt(a.hi);
  const r = ddSub(a, twoProd(x, x));
  return ddAdd(dd(x), dd(r.hi / (2 * x)));
}
export const ddAbs = (a: DD): DD => (a.hi < 0 ? ddNeg(a) : a);

/** π, π/2, 2π and ln 2 to double-double (test/tmm/extended-precision.test.ts checks them by series that do not use them). */
export const DD_PI = dd(3.141592653589793, 1.2246467991473532e-16);
export const DD_HALF_PI = dd(1.5707963267948966, 6.123233995736766e-17);
export const DD_TWO_PI = dd(6.283185307179586, 2.4492935982947064e-16);
export const DD_LN2 = dd(0.6931471805599453, 2.3190468138462996e-17);

/** Taylor series Σ x^n / n! over n ≡ start (mod 2) with alternating sign when `alternate` (sin, cos), or all n (exp). */
function series(x: DD, start: 0 | 1, step: 1 | 2, alternate: boolean): DD {
  let term = start === 0 ? dd(1) : x, sum = term;
  const x2 = step === 2 ? ddMul(x, x) : x;
  for (let n = start + step; n < 60; n += step) {
    term = ddDiv(ddMul(term, x2), dd(step === 2 ? (n - 1) * n : n));
    if (alternate) term = ddNeg(term);
    sum = ddAdd(sum, term);
    if (Math.abs(term.hi) < 1e-34 * Math.abs(sum.hi)) break;
  }
  return sum;
}
/** The raw series, without argument reduction (for checking the constants). */
export const ddSinSeries = (x: DD): DD => series(x, 1, 2, true);
export const ddCosSeries = (x: DD): DD => series(x, 0, 2, true);
export const ddExpSeries = (x: DD): DD => series(x, 0, 1, false);

const ddRound = (a: DD): number => Math.round(a.hi + a.lo);

/** sin and cos of x: reduced by 2π, then by quadrant, then the series on |r| ≤ π/4. */
export function ddSinCos(x: DD): { sin: DD; cos: DD } {
  const k = ddRound(ddDiv(x, DD_TWO_PI));
  let r = ddSub(x, ddScale(DD_TWO_PI, k));
  const q = ddRound(ddDiv(r, DD_HALF_PI));
  r = ddSub(r, ddScale(DD_HALF_PI, q));
  const s = ddSinSeries(r), c = ddCosSeries(r);
  switch (((q % 4) + 4) % 4) {
    case 0: return { sin: s, cos: c };
    case 1: return { sin: c, cos: ddNeg(s) };
    case 2: return { sin: ddNeg(s), cos: ddNeg(c) };
    default: return { sin: ddNeg(c), cos: s };
  }
}

/** e^x: x = k ln 2 + r, e^r by its series on r / 2^10, squared back ten times, times 2^k. */
export function ddExp(x: DD): DD {
  const k = ddRound(ddDiv(x, DD_LN2));
  const r = ddScale(ddSub(x, ddScale(DD_LN2, k)), 1 / 1024);
  let e = ddExpSeries(r);
  for (let i = 0; i < 10; i++) e = ddMul(e, e);
  return ddScale(e, 2 ** k);
}

// Complex numbers with double-double parts.
export interface CDD { re: DD; im: DD }
export const cdd = (re: number, im = 0): CDD => ({ re: dd(re), im: dd(im) });
export const cddAdd = (a: CDD, b: CDD): CDD => ({ re: ddAdd(a.re, b.re), im: ddAdd(a.im, b.im) });
export const cddSub = (a: CDD, b: CDD): CDD => ({ re: ddSub(a.re, b.re), im: ddSub(a.im, b.im) });
export const cddMul = (a: CDD, b: CDD): CDD => ({
  re: ddSub(ddMul(a.re, b.re), ddMul(a.im, b.im)),
  im: ddAdd(ddMul(a.re, b.im), ddMul(a.im, b.re)),
});
export function cddDiv(a: CDD, b: CDD): CDD {
  const den = ddAdd(ddMul(b.re, b.re), ddMul(b.im, b.im));
  return {
    re: ddDiv(ddAdd(ddMul(a.re, b.re), ddMul(a.im, b.im)), den),
    im: ddDiv(ddSub(ddMul(a.im, b.re), ddMul(a.re, b.im)), den),
  };
}
export const cddScale = (a: CDD, s: DD): CDD => ({ re: ddMul(a.re, s), im: ddMul(a.im, s) });
/** j·a */
export const cddTimesJ = (a: CDD): CDD => ({ re: ddNeg(a.im), im: a.re });
/** Principal square root, in the same cancellation-free form as the solver's (at 32 digits it would not matter). */
export function cddSqrt(z: CDD): CDD {
  const m = ddSqrt(ddAdd(ddMul(z.re, z.re), ddMul(z.im, z.im)));
  if (m.hi === 0) return cdd(0);
  const t = ddSqrt(ddScale(ddAdd(m, ddAbs(z.re)), 0.5));
  const other = ddDiv(ddAbs(z.im), ddScale(t, 2));
  if (z.re.hi >= 0) return { re: t, im: z.im.hi < 0 ? ddNeg(other) : other };
  return { re: other, im: z.im.hi < 0 ? ddNeg(t) : t };
}
/** cos z and sin z for complex z = x + jy: cos x cosh y − j sin x sinh y, sin x cosh y + j cos x sinh y. */
export function cddCosSin(z: CDD): { cos: CDD; sin: CDD } {
  const { sin, cos } = ddSinCos(z.re);
  const ep = ddExp(z.im), em = ddDiv(dd(1), ep);
  const cosh = ddScale(ddAdd(ep, em), 0.5), sinh = ddScale(ddSub(ep, em), 0.5);
  return {
    cos: { re: ddMul(cos, cosh), im: ddNeg(ddMul(sin, sinh)) },
    sin: { re: ddMul(sin, cosh), im: ddMul(cos, sinh) },
  };
}
export const cddNumber = (a: CDD): { re: number; im: number } => ({ re: ddNumber(a.re), im: ddNumber(a.im) });
