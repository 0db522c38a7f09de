// Student's t distribution: the two-sided quantile that a 95 % confidence interval needs. The tail probability is
// the regularized incomplete beta function, P(|T| > t) = I_{ν/(ν+t²)}(ν/2, ½) (Abramowitz & Stegun, Handbook of
// Mathematical Functions, 1964, 26.7.1 and 26.5.27), evaluated by its continued fraction with the modified Lentz
// method (Press et al., Numerical Recipes, 3rd ed., 2007, §6.4) and ln Γ by the Lanczos series (g = 7, nine terms;
// Lanczos, SIAM J. Numer. Anal. B 1, 1964; the coefficients as commonly published). The quantile is found by
// bisection, which is exact to rounding and needs no starting guess.

const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

/** ln Γ(x) for x > 0. */
export function logGamma(x: number): number {
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x); // reflection
  const z = x - 1;
  let a = LANCZOS[0];
  const t = z + 7.5;
  for (let i = 1; i < 9; i++) a += LANCZOS[i] / (z + i);
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(a);
}

/** Continued fraction of the incomplete beta function (modified Lentz). */
function betaFraction(a: number, b: number, x: number): number {
  const TINY = 1e-300, EPS = 1e-16;
  const qab = a + b, qap = a + 1, qam = a - 1;
  let c = 1, d = 1 - (qab * x) / qap;
  if (Math.abs(d) < TINY) d = TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 500; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d; if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c; if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d; h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d; if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c; if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < EPS) break;
  }
  return h;
}

/** The regularized incomplete beta function I_x(a, b), 0 ≤ x ≤ 1. */
export function incompleteBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const front = Math.exp(logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) + b * Math.log(1 - x));
  return x < (a + 1) / (a + b + 2) ? (front * betaFraction(a, b, x)) / a : 1 - (front * betaFraction(b, a, 1 - x)) / b;
}

/** P(|T| > t) for ν degrees of freedom. */
export const studentTwoSidedTail = (t: number, nu: number): number => incompleteBeta(nu / (nu + t * t), nu / 2, 0.5);

/** t with P(|T| > t) = 1 − level (level 0.95: the 97.5 % point), ν ≥ 1 (need not be whole). */
export function studentQuantile(level: number, nu: number): number {
  const tail = 1 - level;
  let lo = 0, hi = 1;
  while (studentTwoSidedTail(hi, nu) > tail) hi *= 2;
  for (let i = 0; i < 200 && hi - lo > 1e-14 * hi; i++) {
    const mid = (lo + hi) / 2;
    if (studentTwoSidedTail(mid, nu) > tail) lo = mid; else hi = mid;
  }
  return (lo + hi) / 2;
}
