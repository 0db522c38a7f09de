// An extended-precision reference for the exact solver: the characteristic-matrix cascade of a layered stack
// (Born & Wolf, Principles of Optics, §1.6; Orfanidis, Electromagnetic Waves and Antennas, ch. 5–8; ITU-R
// P.2040-3 Attachment 1), every step after the material evaluation in double-double arithmetic. It reads the
// Stack directly (not the solver's per-frequency media) and works with admittances normalized to free space.
//
// State (E, H̃) with H̃ = η0 H tangential; a forward wave has H̃ = y E. Layer of phase φ = k0 q d:
//   [E, H̃]_front = [[cos φ, j sin φ / y], [j y sin φ, cos φ]] [E, H̃]_back
// Resistive sheet of R_s: [[1, 0], [η0/R_s, 1]]. q = √(ε − ε_front sin²θ) with Im q ≤ 0; y = q (TE), ε/q (TM).
// The matrix entries grow like e^{|Im φ|}, so the reference is meant for stacks with modest total loss.

import { permittivity } from '../../src/materials/permittivity.ts';
import type { BulkModel } from '../../src/materials/types.ts';
import type { Layer, Stack } from '../../src/stack/types.ts';
import { tmmAt } from '../../src/tmm/solve.ts';
import { C0_m_per_s, EPS0_F_per_m, ETA0_ohm, GHz } from '../../src/units.ts';
import { AIR, bulk, dielectric, layer, makeStack, sheet } from './build-stack.ts';
import {
  type CDD, cdd, cddAdd, cddCosSin, cddDiv, cddMul, cddNumber, cddScale, cddSqrt, cddSub, cddTimesJ,
  DD_TWO_PI, dd, ddAdd, ddDiv, ddMul, ddNeg,
} from './double-double.ts';

type M2 = [CDD, CDD, CDD, CDD];
const matMul = (a: M2, b: M2): M2 => [
  cddAdd(cddMul(a[0], b[0]), cddMul(a[1], b[2])), cddAdd(cddMul(a[0], b[1]), cddMul(a[1], b[3])),
  cddAdd(cddMul(a[2], b[0]), cddMul(a[3], b[2])), cddAdd(cddMul(a[2], b[1]), cddMul(a[3], b[3])),
];

export interface ReferenceResult {
  R: { re: number; im: number };
  T: { re: number; im: number };
  /** Σ |k0 q d| over the layers (radians), the size of the phases double precision must carry. */
  phase_rad: number;
  /** Σ |Im k0 q d|: how much the matrix entries grow. */
  loss_np: number;
}

/**
 * R and T of the stack at f_Hz. `stretch` (optional) multiplies the phase of bulk layer `layer` (counting
 * bulk layers only) by 1 + `by`, for the sensitivity below.
 */
export function referenceCascade(stack: Stack, f_Hz: number, stretch?: { layer: number; by: number }): ReferenceResult {
  const s = Math.sin(stack.incidence.angle_rad);
  const epsFront = permittivity(stack.front.spec, f_Hz);
  // ε_front sin²θ, exactly from the doubles the stack holds.
  const s2 = ddMul(dd(s), dd(s));
  const kt2: CDD = { re: ddMul(dd(epsFront.re), s2), im: ddMul(dd(epsFront.im), s2) };
  const tm = stack.incidence.polarization === 'TM';
  const medium = (spec: BulkModel): { q: CDD; y: CDD } => {
    const e = permittivity(spec, f_Hz), eps = cdd(e.re, e.im);
    let q = cddSqrt(cddSub(eps, kt2));
    if (q.im.hi > 0) q = { re: ddNeg(q.re), im: ddNeg(q.im) };
    return { q, y: tm ? cddDiv(eps, q) : q };
  };
  const k0 = ddDiv(ddMul(DD_TWO_PI, dd(f_Hz)), dd(C0_m_per_s));
  let M: M2 = [cdd(1), cdd(0), cdd(0), cdd(1)];
  let phase = 0, loss = 0, bulkIndex = 0;
  for (const l of stack.layers) {
    if (l.kind === 'sheet') {
      M = matMul(M, [cdd(1), cdd(0), cdd(ETA0_ohm / l.material.spec.ohm_per_sq), cdd(1)]);
      continue;
    }
    const { q, y } = medium(l.material.spec);
    let phi = cddScale(q, ddMul(k0, dd(l.thickness_m)));
    if (stretch && stretch.layer === bulkIndex) phi = cddScale(phi, ddAdd(dd(1), dd(stretch.by)));
    bulkIndex++;
    const p = cddNumber(phi);
    phase += Math.hypot(p.re, p.im);
    loss += Math.abs(p.im);
    const { cos, sin } = cddCosSin(phi);
    M = matMul(M, [cos, cddTimesJ(cddDiv(sin, y)), cddTimesJ(cddMul(y, sin)), cos]);
  }
  const yf = medium(stack.front.spec).y;
  // Front-face field and input admittance for the load behind: a conductor (E = 0) or the back medium.
  let E: CDD, H: CDD;
  if (stack.back === 'pec') { E = M[1]; H = M[3]; } else {
    const yb = medium(stack.back.spec).y;
    E = cddAdd(M[0], cddMul(M[1], yb)); H = cddAdd(M[2], cddMul(M[3], yb));
  }
  // R = (y_f − y_in)/(y_f + y_in) with y_in = H̃/E, written without dividing by E (a sheet on a conductor has E = 0).
  const yfE = cddMul(yf, E);
  const R = cddDiv(cddSub(yfE, H), cddAdd(yfE, H));
  const T = stack.back === 'pec' ? cdd(0) : cddDiv(cddAdd(cdd(1), R), E);
  return { R: cddNumber(R), T: cddNumber(T), phase_rad: phase, loss_np: loss };
}

/** |Δ| of two complex values, computed without overflow. */
export const complexDistance = (a: { re: number; im: number }, b: { re: number; im: number }): number =>
  Math.hypot(a.re - b.re, a.im - b.im);


/**
 * How far R and T move when every layer's phase is off by one part in 1e16, each layer on its own and the
 * effects added: Σ_i |∂(R, T)/∂φ_i| |φ_i| × 1e-16, from central differences of the reference. A solver that
 * carries each phase to double precision cannot do better than a small multiple of this (for a lossless,
 * non-resonant slab it is about 1e-16 |k d|; a resonance multiplies it by its bounce factor).
 */
export function phaseLimit(stack: Stack, f_Hz: number): number {
  const h = 1e-9;
  const bulk = stack.layers.filter((l) => l.kind === 'bulk').length;
  let sum = 0;
  for (let i = 0; i < bulk; i++) {
    const up = referenceCascade(stack, f_Hz, { layer: i, by: h }), dn = referenceCascade(stack, f_Hz, { layer: i, by: -h });
    sum += Math.max(complexDistance(up.R, dn.R), complexDistance(up.T, dn.T)) / (2 * h);
  }
  return 1e-16 * sum;
}

/**
 * The solver's phases pass through about five roundings (2π f, / c0, × q, × d, and the square root that gives q),
 * each ≤ 1.1e-16 relative, so its error may reach that many times the phase limit (measured: up to 3.5×).
 */
export const PHASE_ROUNDINGS = 6;

/** The exact solver against the reference: worst of |ΔR|, |ΔT| over max(|R|, |T|), and the bound it must meet. */
export function compareWithReference(stack: Stack, f_Hz: number): { err: number; bound: number; phase: number; loss: number } {
  const got = tmmAt(stack, f_Hz), ref = referenceCascade(stack, f_Hz);
  const size = Math.max(Math.hypot(ref.R.re, ref.R.im), Math.hypot(ref.T.re, ref.T.im));
  const err = Math.max(complexDistance(got.R, ref.R), complexDistance(got.T, ref.T)) / size;
  return { err, bound: Math.max(1e-12, (PHASE_ROUNDINGS * phaseLimit(stack, f_Hz)) / size), phase: ref.phase_rad, loss: ref.loss_np };
}

/**
 * A random stack of low-loss layers (ε''/ε' from 1e-12 to 1e-4 at the frequency drawn, fixed, Debye, Lorentz and
 * power-law models), sheets, a conductor or a dielectric behind, TE/TM at 0–80°, 1 MHz–1 THz, 1 µm–10 m.
 */
export function randomLowLossStack(rand: () => number): { stack: Stack; f_Hz: number } {
  const f = 10 ** (6 + rand() * 6);
  const w = 2 * Math.PI * f;
  const layers: Layer[] = [];
  const n = 1 + Math.floor(rand() * 5);
  for (let i = 0; i < n; i++) {
    if (rand() < 0.15) { layers.push(sheet(10 ** (1 + rand() * 3))); continue; }
    const eps = 1 + rand() * 9, t = 10 ** (-12 + rand() * 8);
    const sigma = t * eps * w * EPS0_F_per_m;
    const pickModel = rand();
    let spec: BulkModel;
    if (pickModel < 0.4) spec = { model: 'fixed', eps_r: eps, sigma_S_per_m: sigma };
    // A Debye pole far below f (ωτ ≫ 1): ε'' ≈ Δε/(ωτ), chosen to give the loss tangent drawn.
    else if (pickModel < 0.6) spec = { model: 'debye', eps_inf: eps, poles: [{ delta_eps: 1, tau_ps: 1e12 / (w * t * eps) }], sigma_S_per_m: 0 };
    // A Lorentz pole far above f with a small damping: ε'' ≈ Δε ωγ/ω0².
    else if (pickModel < 0.8) {
      const f0 = 10 * f, gamma = (t * eps * f0 * f0) / f;
      spec = { model: 'lorentz', eps_inf: eps, poles: [{ delta_eps: 1, f0_GHz: f0 / GHz, gamma_GHz: gamma / GHz }], sigma_S_per_m: 0 };
    } else spec = { model: 'power-law', a: eps, b: 0, c: sigma * (f / GHz) ** -0.5, d: 0.5 };
    layers.push(layer(bulk(spec), 10 ** (-6 + rand() * 7)));
  }
  const front = rand() < 0.7 ? AIR : dielectric(1 + rand() * 3);
  const stack = makeStack({
    layers, front, back: rand() < 0.2 ? 'pec' : dielectric(1 + rand() * 5),
    angle_deg: rand() < 0.4 ? 0 : rand() * 80, polarization: rand() < 0.5 ? 'TE' : 'TM',
  });
  return { stack, f_Hz: f };
}
