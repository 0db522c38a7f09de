// The reciprocal of a stepped model as partial fractions, so that 1/ε (or 1/μ) can be stepped with the same
// auxiliary differential equations as ε itself (kernel.ts).
//
// A stepped model m(s) = m∞ + σ/(ε0 s) + Σ Δ/(1 + sτ) + Σ (c + ds)/(s² + γs + ω0²) (s = jω) is a ratio of two
// polynomials of equal degree: the poles of 1/m are the zeros of m, and since m∞ ≠ 0,
//   1/m(s) = 1/m∞ + Σ_k ρ_k/(s − z_k),   ρ_k = 1/m′(z_k)   (simple zeros; the residue theorem).
// A real zero z < 0 gives a Debye term Δ = −ρ/z, τ = −1/z; a pair z, z̄ gives a second-order term with
// ω0² = |z|², γ = −2 Re z, d = 2 Re ρ, c = −2 Re(ρ z̄). For a passive m every zero lies in Re s ≤ 0 (s m(s) is a
// positive-real admittance, so 1/(s m) is a positive-real impedance; common practice, no source), and
// −1/m then has the loss of a passive medium (Im(−1/m) = −ε″/|ε|² ≤ 0), which is what the oblique line needs.
//
// The zeros are found by the Aberth–Ehrlich simultaneous iteration (Aberth, Math. Comp. 27, 1973) on the
// numerator N = m·D, whose logarithmic derivative N′/N = m′/m + Σ 1/(s − p_j) comes from the partial-fraction
// form of m (well conditioned, no polynomial coefficients), in units of the poles' geometric mean. Every
// result is checked: the reconstruction must equal 1/m to 1e-8 (of |1/m|, or of 1/m∞ where |1/m| is smaller)
// over four decades around the poles, and no zero may lie in the right half-plane; otherwise `reciprocal` throws.

import type { Complex } from '../complex.ts';
import { EPS0_F_per_m } from '../units.ts';
import type { DebyeTerm, OscTerm, StepModel } from './media.ts';
import { stepModelPermittivity } from './media.ts';

/** A failed inversion (zeros not found, or outside the left half-plane). */
export class ReciprocalError extends Error {
  override readonly name = 'ReciprocalError';
}

type Cx = Complex;
const cmul = (a: Cx, b: Cx): Cx => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const cdiv = (a: Cx, b: Cx): Cx => { const q = b.re * b.re + b.im * b.im; return { re: (a.re * b.re + a.im * b.im) / q, im: (a.im * b.re - a.re * b.im) / q }; };
const cabs = (a: Cx): number => Math.hypot(a.re, a.im);

/** A pole of m with its order, in scaled units. */
interface Pole { p: Cx; order: number }

/** m and its scaled terms: s̃ = s/ω_s. */
interface Scaled { inf: number; sigma: number; debye: { d: number; tau: number }[]; osc: { c: number; d: number; w0sq: number; gamma: number }[] }

const ITERATIONS = 400;
const CONVERGED = 1e-15;
const REAL_TOL = 1e-9;
const CHECK_TOL = 1e-8;
const CHECK_POINTS = 81;
const SLOWEST_CONDUCTION_S = 1000;

function scaled(m: StepModel, ws: number): Scaled {
  return {
    inf: m.epsInf,
    sigma: m.sigma / (EPS0_F_per_m * ws),
    debye: m.debye.map((t) => ({ d: t.deps, tau: t.tau_s * ws })),
    osc: m.osc.map((t) => ({ c: t.c / (ws * ws), d: (t.d ?? 0) / ws, w0sq: t.w0sq / (ws * ws), gamma: t.gamma / ws })),
  };
}

/** m(s) and m′(s) at complex s (scaled). */
function evaluate(m: Scaled, s: Cx): { v: Cx; dv: Cx } {
  let v: Cx = { re: m.inf, im: 0 }, dv: Cx = { re: 0, im: 0 };
  const add = (a: Cx, b: Cx, k = 1) => { a.re += k * b.re; a.im += k * b.im; };
  if (m.sigma !== 0) {
    const inv = cdiv({ re: 1, im: 0 }, s);
    add(v, inv, m.sigma);
    add(dv, cmul(inv, inv), -m.sigma);
  }
  for (const t of m.debye) {
    const den = { re: 1 + s.re * t.tau, im: s.im * t.tau }, inv = cdiv({ re: 1, im: 0 }, den);
    add(v, inv, t.d);
    add(dv, cmul(inv, inv), -t.d * t.tau);
  }
  for (const t of m.osc) {
    const q = { re: s.re * s.re - s.im * s.im + t.gamma * s.re + t.w0sq, im: 2 * s.re * s.im + t.gamma * s.im };
    const num = { re: t.c + t.d * s.re, im: t.d * s.im };
    const inv = cdiv({ re: 1, im: 0 }, q);
    add(v, cmul(num, inv));
    // (d q − num (2s + γ))/q²
    const dq = { re: 2 * s.re + t.gamma, im: 2 * s.im };
    const top = { re: t.d * q.re - (num.re * dq.re - num.im * dq.im), im: t.d * q.im - (num.re * dq.im + num.im * dq.re) };
    add(dv, cmul(top, cmul(inv, inv)));
  }
  return { v, dv };
}

/** The poles of m (scaled), coincident ones merged at their highest order. */
function polesOf(m: Scaled): Pole[] {
  const raw: Pole[] = [];
  if (m.sigma !== 0) raw.push({ p: { re: 0, im: 0 }, order: 1 });
  for (const t of m.debye) raw.push({ p: { re: -1 / t.tau, im: 0 }, order: 1 });
  for (const t of m.osc) {
    const disc = (t.gamma * t.gamma) / 4 - t.w0sq;
    if (disc > 0) {
      const r = Math.sqrt(disc);
      // −γ/2 ± r without cancellation: the small root as ω0²/(big root).
      const big = -t.gamma / 2 - r;
      raw.push({ p: { re: big, im: 0 }, order: 1 }, { p: { re: big !== 0 ? t.w0sq / big : 0, im: 0 }, order: 1 });
    } else if (disc < 0) {
      const r = Math.sqrt(-disc);
      raw.push({ p: { re: -t.gamma / 2, im: r }, order: 1 }, { p: { re: -t.gamma / 2, im: -r }, order: 1 });
    } else raw.push({ p: { re: -t.gamma / 2, im: 0 }, order: 2 });
  }
  const out: Pole[] = [];
  for (const q of raw) {
    const same = out.find((o) => cabs({ re: o.p.re - q.p.re, im: o.p.im - q.p.im }) <= 1e-12 * Math.max(cabs(o.p), cabs(q.p), 1e-300));
    if (same) same.order = Math.max(same.order, q.order);
    else out.push({ ...q, p: { ...q.p } });
  }
  return out;
}

/** The zeros of m by Aberth–Ehrlich iteration (as many as m has poles, with their orders). */
function zerosOf(m: Scaled, poles: Pole[]): Cx[] {
  const seeds: Cx[] = [];
  const rot = { re: Math.cos(0.3), im: Math.sin(0.3) };
  let smallest = Infinity;
  for (const q of poles) if (cabs(q.p) > 0) smallest = Math.min(smallest, cabs(q.p));
  if (!Number.isFinite(smallest)) smallest = 1;
  for (const q of poles) {
    for (let k = 0; k < q.order; k++) {
      const base = cabs(q.p) > 0 ? q.p : { re: -0.1 * smallest, im: 0 };
      const z = cmul({ re: (1.3 + 0.2 * k) * base.re, im: (1.3 + 0.2 * k) * base.im }, rot);
      seeds.push(z);
    }
  }
  const z = seeds;
  for (let it = 0; it < ITERATIONS; it++) {
    let worst = 0;
    for (let k = 0; k < z.length; k++) {
      const { v, dv } = evaluate(m, z[k]);
      if (v.re === 0 && v.im === 0) continue;
      // N′/N = m′/m + Σ order/(z − p)
      const ld = cdiv(dv, v);
      for (const q of poles) {
        const inv = cdiv({ re: q.order, im: 0 }, { re: z[k].re - q.p.re, im: z[k].im - q.p.im });
        ld.re += inv.re; ld.im += inv.im;
      }
      const newton = cdiv({ re: 1, im: 0 }, ld);
      let sum: Cx = { re: 0, im: 0 };
      for (let i = 0; i < z.length; i++) {
        if (i === k) continue;
        const inv = cdiv({ re: 1, im: 0 }, { re: z[k].re - z[i].re, im: z[k].im - z[i].im });
        sum = { re: sum.re + inv.re, im: sum.im + inv.im };
      }
      const nw = cmul(newton, sum);
      const w = cdiv(newton, { re: 1 - nw.re, im: -nw.im });
      if (!Number.isFinite(w.re) || !Number.isFinite(w.im)) continue;
      z[k] = { re: z[k].re - w.re, im: z[k].im - w.im };
      worst = Math.max(worst, cabs(w) / Math.max(cabs(z[k]), 1e-300));
    }
    if (worst < CONVERGED) break;
  }
  // Newton polish on m itself.
  for (let k = 0; k < z.length; k++) {
    for (let it = 0; it < 3; it++) {
      const { v, dv } = evaluate(m, z[k]);
      const step = cdiv(v, dv);
      if (!Number.isFinite(step.re) || !Number.isFinite(step.im)) break;
      z[k] = { re: z[k].re - step.re, im: z[k].im - step.im };
    }
  }
  return z;
}

/** The terms of Σ ρ/(s − z) in the kernel's forms (physical units), from the zeros (scaled by ws). */
function termsOf(m: Scaled, zeros: Cx[], ws: number): { debye: DebyeTerm[]; osc: OscTerm[] } {
  const debye: DebyeTerm[] = [], osc: OscTerm[] = [];
  const real: number[] = [], upper: Cx[] = [];
  let lower = 0;
  for (const z of zeros) {
    if (Math.abs(z.im) <= REAL_TOL * cabs(z)) real.push(z.re);
    else if (z.im > 0) upper.push(z);
    else lower++;
  }
  if (lower !== upper.length) throw new ReciprocalError('the zeros did not come in conjugate pairs');
  for (let x of real) {
    // Re-polish on the real axis.
    for (let it = 0; it < 3; it++) { const { v, dv } = evaluate(m, { re: x, im: 0 }); const st = v.re / dv.re; if (Number.isFinite(st)) x -= st; }
    if (!(x < 0)) throw new ReciprocalError(`a real zero at s = ${(x * ws).toPrecision(3)} rad/s is not in the left half-plane`);
    const rho = 1 / evaluate(m, { re: x, im: 0 }).dv.re;
    debye.push({ deps: -rho / x, tau_s: -1 / x / ws });
  }
  for (const z of upper) {
    if (z.re > REAL_TOL * cabs(z)) throw new ReciprocalError(`a zero at s = ${(z.re * ws).toPrecision(3)} + j${(z.im * ws).toPrecision(3)} rad/s is in the right half-plane`);
    const rho = cdiv({ re: 1, im: 0 }, evaluate(m, z).dv);
    const re = z.re < 0 ? z.re : 0;
    // ρ z̄
    const rz = { re: rho.re * re + rho.im * z.im, im: rho.im * re - rho.re * z.im };
    osc.push({ c: -2 * rz.re * ws * ws, d: 2 * rho.re * ws, w0sq: (re * re + z.im * z.im) * ws * ws, gamma: re < 0 ? -2 * re * ws : 0 });
  }
  return { debye, osc };
}

/** Worst relative difference between the reconstruction and 1/m over four decades around the poles. */
function reconstructionError(m: StepModel, r: StepModel, lo_Hz: number, hi_Hz: number): number {
  let worst = 0;
  for (let i = 0; i < CHECK_POINTS; i++) {
    // Offset from the decades, so no point falls exactly on a lossless resonance.
    const f = lo_Hz * Math.pow(hi_Hz / lo_Hz, (i + 0.371) / CHECK_POINTS);
    const a = cdiv({ re: 1, im: 0 }, stepModelPermittivity(m, f)), b = stepModelPermittivity(r, f);
    // Relative to |1/m|, but never to less than the constant part 1/m∞: where 1/m is far smaller (a Drude or
    // conducting medium far below its plasma or relaxation frequency) the sum 1/m∞ + Σ terms cancels to it,
    // and its rounding, ~1e-16/m∞, is what the line sees beside its other term of order one.
    worst = Math.max(worst, cabs({ re: a.re - b.re, im: a.im - b.im }) / Math.max(cabs(a), r.epsInf));
  }
  return worst;
}

/** 1/m as a step model: ∞ part 1/m∞, no σ, Debye and second-order terms (strengths of either sign, s-terms). */
export function reciprocal(model: StepModel): StepModel {
  if (!(model.epsInf > 0)) throw new ReciprocalError(`the model's high-frequency value ${model.epsInf} is not positive`);
  // A conduction term relaxing slower than SLOWEST_CONDUCTION_S (its share of ε at 1 MHz below 1e-9) is left
  // out of the reciprocal: it would only put a pole where no pulse can reach it (and underflow the scaling).
  const m = model.sigma > 0 && (EPS0_F_per_m * model.epsInf) / model.sigma > SLOWEST_CONDUCTION_S ? { ...model, sigma: 0 } : model;
  const constant: StepModel = { epsInf: 1 / m.epsInf, sigma: 0, debye: [], osc: [] };
  if (m.sigma === 0 && m.debye.length === 0 && m.osc.length === 0) return constant;
  // The scale: the geometric mean of the poles' magnitudes, and for poles at s = 0 of the zeros they make
  // (σ/(ε0 m∞) for a conduction term, √(c/m∞) for a Drude term).
  const mags: number[] = [];
  for (const q of polesOf(scaled(m, 1))) if (cabs(q.p) > 0) mags.push(cabs(q.p));
  if (m.sigma > 0) mags.push(m.sigma / (EPS0_F_per_m * m.epsInf));
  for (const t of m.osc) if (t.w0sq === 0 && t.c > 0) mags.push(Math.sqrt(t.c / m.epsInf));
  const ws = mags.length > 0 ? Math.exp(mags.reduce((a, x) => a + Math.log(x), 0) / mags.length) : 1;
  const sm = scaled(m, ws);
  const poles = polesOf(sm);
  const zeros = zerosOf(sm, poles);
  const { debye, osc } = termsOf(sm, zeros, ws);
  const r: StepModel = { ...constant, debye, osc };
  // Four decades around every pole and zero.
  const all = [...poles.map((q) => cabs(q.p)), ...zeros.map(cabs)].filter((x) => x > 0).map((x) => (x * ws) / (2 * Math.PI));
  const lo = Math.min(...all) / 100, hi = Math.max(...all) * 100;
  const err = reconstructionError(m, r, lo, hi);
  if (!(err <= CHECK_TOL)) throw new ReciprocalError(`its partial fractions reproduce 1/m only to ${err.toPrecision(2)}`);
  return r;
}

/** a + k·b, term by term (the line's shunt or series model from a medium's own and a reciprocal). */
export function addScaled(a: StepModel, b: StepModel, k: number): StepModel {
  return {
    epsInf: a.epsInf + k * b.epsInf,
    sigma: a.sigma + k * b.sigma,
    debye: [...a.debye, ...b.debye.map((t) => ({ deps: k * t.deps, tau_s: t.tau_s }))],
    osc: [...a.osc, ...b.osc.map((t) => ({ c: k * t.c, d: k * (t.d ?? 0), w0sq: t.w0sq, gamma: t.gamma }))],
  };
}
