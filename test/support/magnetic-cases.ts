// Closed-form cases with μ ≠ 1, shared by the exact solver's and the FEM's tests. Each case is a stack, a
// frequency and the R and T a closed form gives; the source is named beside each.

import { type Complex, add, cx, div, exp, mul, scale, sqrt, sub } from '../../src/complex.ts';
import type { BulkMaterial, Polarization, Stack } from '../../src/stack/types.ts';
import { C0_m_per_s, EPS0_F_per_m } from '../../src/units.ts';
import { AIR, layer, magnetic, makeStack } from './build-stack.ts';

export interface ClosedFormCase { name: string; stack: Stack; f_Hz: number; R: Complex; T: Complex | null }

const F = 3e9;
const K0 = (2 * Math.PI * F) / C0_m_per_s;
const J = cx(0, 1);
const ccos = (z: Complex) => cx(Math.cos(z.re) * Math.cosh(z.im), -Math.sin(z.re) * Math.sinh(z.im));
const csin = (z: Complex) => cx(Math.sin(z.re) * Math.cosh(z.im), Math.cos(z.re) * Math.sinh(z.im));
const ctan = (z: Complex) => div(csin(z), ccos(z));

/** ε and μ of a fixed-model material at F (ε_r − jσ/(ωε0) with σ = 0 here, μ_r − j mu_loss). */
function constants(m: BulkMaterial): { eps: Complex; mu: Complex } {
  const s = m.spec;
  if (s.model !== 'fixed' || s.sigma_S_per_m !== 0) throw new Error('cases use lossless-ε fixed materials');
  return { eps: cx(s.eps_r), mu: s.magnetic?.model === 'fixed' ? cx(s.magnetic.mu_r, -s.magnetic.mu_loss) : cx(1) };
}

/** k_z / k0 = √(εμ − ε1μ1 sin²θ), Im ≤ 0. */
function kz(m: { eps: Complex; mu: Complex }, s2: Complex): Complex {
  const q = sqrt(sub(mul(m.eps, m.mu), s2));
  return q.im > 0 ? scale(q, -1) : q;
}

/**
 * Fresnel with μ (Balanis, Advanced Engineering Electromagnetics, 2nd ed., ch. 5, oblique incidence on a
 * planar interface; physics reference): r_TE = (μ2 k1z − μ1 k2z)/(μ2 k1z + μ1 k2z) and, as a tangential-E
 * ratio, r_TM = (ε1 k2z − ε2 k1z)/(ε1 k2z + ε2 k1z); the tangential E is continuous, t = 1 + r.
 * Realised as a layer of the back medium (thickness d) on that medium, so a mesh holds it too:
 * R = r, T = (1 + r) e^{−j k2z d}.
 */
function fresnelCase(front: BulkMaterial, back: BulkMaterial, angle_deg: number, pol: Polarization): ClosedFormCase {
  const m1 = constants(front), m2 = constants(back);
  const sin = Math.sin((angle_deg * Math.PI) / 180), s2 = scale(mul(m1.eps, m1.mu), sin * sin);
  const k1 = kz(m1, s2), k2 = kz(m2, s2);
  const [a, b] = pol === 'TE' ? [mul(m2.mu, k1), mul(m1.mu, k2)] : [mul(m1.eps, k2), mul(m2.eps, k1)];
  const r = div(sub(a, b), add(a, b));
  const d = 0.013;
  const T = mul(add(cx(1), r), exp(mul(cx(0, -K0 * d), k2)));
  return { name: `Fresnel ${pol} ${front.name} → ${back.name} at ${angle_deg}°`, stack: makeStack({ front, layers: [layer(back, d)], back, angle_deg, polarization: pol, band_GHz: [1, 6] }), f_Hz: F, R: r, T };
}

export function fresnelCases(): ClosedFormCase[] {
  const out: ClosedFormCase[] = [];
  const pairs: [BulkMaterial, BulkMaterial][] = [
    [AIR, magnetic(4, 0, 2)],
    [AIR, magnetic(2.5, 0, 3, 1)], // lossy magnetic half-space
    [magnetic(2, 0, 1.5), magnetic(3, 0, 5)], // a magnetic front medium
    [magnetic(3, 0, 5), AIR], // denser to thinner: total reflection past the critical angle (≈ 15°)
  ];
  for (const [front, back] of pairs) for (const pol of ['TE', 'TM'] as const) for (const deg of [0, 20, 40, 60, 80]) out.push(fresnelCase(front, back, deg, pol));
  return out;
}

/**
 * A medium with ε = μ has the wave impedance of vacuum, so it is matched to air at normal incidence
 * (physics reference, checks; Balanis ch. 5, η = η0 √(μ/ε)): a half-space reflects nothing, and a slab of
 * thickness d transmits T = e^{−j k0 n d} with n = √(εμ) = ε.
 */
export function matchedCases(): ClosedFormCase[] {
  const out: ClosedFormCase[] = [];
  for (const [e, loss] of [[3, 0], [4, 1.5], [9, 6]]) {
    // ε = μ in the loss too, at the case's frequency: ε'' = σ/(ωε0) = loss needs σ = loss ω ε0.
    const same = magnetic(e, loss * 2 * Math.PI * F * EPS0_F_per_m, e, loss, `matched ${e}-j${loss}`);
    const d = 0.02, n = cx(e, -loss);
    out.push({ name: `matched half-space ε = μ = ${e} − j${loss}`, stack: makeStack({ back: same }), f_Hz: F, R: cx(0), T: cx(1) });
    out.push({ name: `matched slab ε = μ = ${e} − j${loss}, 20 mm`, stack: makeStack({ layers: [layer(same, d)] }), f_Hz: F, R: cx(0), T: exp(mul(cx(0, -K0 * d), n)) });
  }
  return out;
}

/**
 * A layer of ε, μ on a perfect conductor is a shorted line: Z_in = j Z tan(k_z d), R = (Z_in − Z_f)/(Z_in + Z_f),
 * with Z = ωμ0μ/k_z (TE) or k_z/(ωε0ε) (TM) (Orfanidis ch. 7–8; Pozar, Microwave Engineering, the shorted
 * transmission line). Impedances here are in units of η0.
 */
export function shortedLayerCases(): ClosedFormCase[] {
  const out: ClosedFormCase[] = [];
  const m = magnetic(7, 0, 2.2, 1.4);
  const c = constants(m);
  for (const pol of ['TE', 'TM'] as const) for (const deg of [0, 40, 70]) {
    const sin = Math.sin((deg * Math.PI) / 180), s2 = cx(sin * sin);
    const q = kz(c, s2), qf = cx(Math.cos((deg * Math.PI) / 180));
    const Z = pol === 'TE' ? div(c.mu, q) : div(q, c.eps), Zf = pol === 'TE' ? div(cx(1), qf) : qf;
    const d = 0.0063;
    const Zin = mul(J, mul(Z, ctan(scale(q, K0 * d))));
    out.push({ name: `lossy magnetic layer on a conductor, ${pol} at ${deg}°`, stack: makeStack({ layers: [layer(m, d)], back: 'pec', angle_deg: deg, polarization: pol }), f_Hz: F, R: div(sub(Zin, Zf), add(Zin, Zf)), T: null });
  }
  return out;
}

/**
 * The quarter-wave magnetic absorber: a layer of permittivity ε and thickness d on a conductor is matched
 * (Z_in = η0 at normal incidence) when j √(μ/ε) tan(k0 √(εμ) d) = 1. With t = k0 √(εμ) d this is
 * t tan t = −j ε k0 d, whose root near t = π/2 − jπ/(2 ε k0 d) is the quarter-wave design; μ = (t/(k0 d))²/ε.
 * Solved here by Newton's method on that equation (shorted-line input impedance; common practice for
 * single-layer magnetic absorbers, no single source).
 */
export function quarterWaveAbsorber(eps_r: number, d_m: number): { mu: Complex; t: Complex } {
  const k0d = K0 * d_m, c = eps_r * k0d;
  let t = cx(Math.PI / 2, -Math.PI / (2 * c));
  for (let i = 0; i < 60; i++) {
    const tn = ctan(t);
    const f = add(mul(t, tn), cx(0, c)), df = add(tn, mul(t, add(cx(1), mul(tn, tn))));
    t = sub(t, div(f, df));
  }
  const n = scale(t, 1 / k0d);
  return { mu: scale(mul(n, n), 1 / eps_r), t };
}

export const CASE_FREQUENCY_Hz = F;
