// The lossless slab of ε_r = 4 between air half-spaces, in closed form, with its derivatives in the thickness d:
// R = r(1 − u)/(1 − r²u), T = (1 − r²) e^{−jkd}/(1 − r²u), u = e^{−2jkd}, r = (1 − n)/(1 + n) (Orfanidis,
// Electromagnetic Waves and Antennas, ch. 5), so dR/dd = r(r² − 1)/(1 − r²u)² · (−2jk u) and, with
// IPD = −arg T − k0 d, dIPD/dd = k + d arg(1 − r²u)/dd − k0. For the tolerance checks and their benchmark.

import { C0_m_per_s } from '../../src/units.ts';

interface C { re: number; im: number }
const cdiv = (a: C, b: C): C => {
  const q = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / q, im: (a.im * b.re - a.re * b.im) / q };
};

/** R, dR/dd (per metre) and dIPD/dd (degrees per metre) at f (Hz) and thickness d (m), n = 2. */
export function slabAt(f: number, d: number): { R: C; dR: C; dIPD_deg: number } {
  const n = 2, r = (1 - n) / (1 + n), k = (2 * Math.PI * f * n) / C0_m_per_s, k0 = k / n;
  const u = { re: Math.cos(2 * k * d), im: -Math.sin(2 * k * d) };
  const den = { re: 1 - r * r * u.re, im: -r * r * u.im }; // 1 − r²u
  const den2 = { re: den.re * den.re - den.im * den.im, im: 2 * den.re * den.im };
  const R = cdiv({ re: r * (1 - u.re), im: -r * u.im }, den);
  const m = { re: 2 * k * u.im, im: -2 * k * u.re }; // −2jk u = du/dd
  const dR = cdiv({ re: r * (r * r - 1) * m.re, im: r * (r * r - 1) * m.im }, den2);
  const dArg = cdiv({ re: -r * r * m.re, im: -r * r * m.im }, den).im; // d arg(1 − r²u)/dd
  return { R, dR, dIPD_deg: ((k + dArg - k0) * 180) / Math.PI };
}
