// Per-frequency description of a stack for the exact solver: each bulk region's longitudinal
// wavenumber k_x and wave admittance, and the sheet conductance at each interface.
//
// Geometry: the wave travels along +x; x = 0 is the front face. For oblique incidence the
// transverse wavenumber k_t = k0 √(ε_front μ_front) sin θ is conserved (phase matching), and each region
// has k_x = k0 √(ε_r μ_r − ε_front μ_front sin²θ), branch chosen with Im k_x ≤ 0 so e^{−j k_x x} decays
// forward (Born & Wolf §1.6; Orfanidis ch. 7).
// Admittance Y = H_t / E_t of a forward wave: TE  Y = k_x / (ω μ0 μ_r);  TM  Y = ω ε0 ε_r / k_x.

import { type Complex, decayingSqrtInto, div, mul, scale } from '../complex.ts';
import { permeability } from '../materials/permeability.ts';
import { permittivity } from '../materials/permittivity.ts';
import type { BulkMaterial, Stack } from '../stack/types.ts';
import { C0_m_per_s, EPS0_F_per_m, MU0_H_per_m } from '../units.ts';

/** One homogeneous region at one frequency. */
export interface Region {
  eps: Complex;
  /** Relative permeability (1 for a non-magnetic medium). */
  mu: Complex;
  /** Longitudinal wavenumber, rad/m, Im ≤ 0. */
  kx: Complex;
  /** Wave admittance H_t/E_t of a forward wave, siemens. */
  Y: Complex;
  /** Thickness in metres (Infinity for the half-spaces). */
  thickness_m: number;
}

/** A stack at one frequency: front half-space, bulk layers, back half-space (null = perfect conductor). */
export interface StackAtFrequency {
  f_Hz: number;
  front: Region;
  layers: Region[];
  back: Region | null;
  /** Sheet conductance (S, = 1/R_s summed over sheets) at interface k: k = 0 front face … k = layers.length back face. */
  sheetG: Float64Array;
  /** Position of interface k in metres. */
  interface_m: Float64Array;
}

const ONE: Complex = Object.freeze({ re: 1, im: 0 });

/**
 * A region of relative permittivity `eps` (and permeability `mu`, default 1) at f_Hz, for a transverse
 * wavenumber with (k_t/k0)² = kt2_over_k02 (zero at normal incidence).
 */
export function regionOf(eps: Complex, thickness_m: number, f_Hz: number, kt2_over_k02: Complex, pol: 'TE' | 'TM',
  mu: Complex = ONE): Region {
  const w = 2 * Math.PI * f_Hz;
  const k0 = w / C0_m_per_s;
  const n2 = mul(eps, mu); // ε_r μ_r
  const q = awayFromGrazing(decayingSqrtInto({ re: 0, im: 0 }, n2.re - kt2_over_k02.re, n2.im - kt2_over_k02.im)); // k_x / k0
  const kx = scale(q, k0);
  const Y = pol === 'TE'
    ? div(kx, scale(mu, w * MU0_H_per_m))
    : div(scale(eps, w * EPS0_F_per_m), kx);
  return { eps, mu, kx, Y, thickness_m };
}

/**
 * At grazing inside a region (k_x → 0: the angle meets the critical one) the admittance vanishes (TE) or diverges
 * (TM) and the recursion's 1 ± Γ lose every digit (exactly at it, 0/0). R and T are even in k_x there, so moving
 * |k_x/k0| up to Q_MIN changes them by about (Q_MIN k0 d)², and keeps them finite.
 */
const Q_MIN = 1e-8;
function awayFromGrazing(q: Complex): Complex {
  const m = Math.hypot(q.re, q.im);
  if (m >= Q_MIN) return q;
  if (m === 0) return { re: Q_MIN, im: 0 };
  return { re: (q.re / m) * Q_MIN, im: (q.im / m) * Q_MIN };
}

const region = (material: BulkMaterial, thickness_m: number, f_Hz: number, kt2_over_k02: Complex, pol: 'TE' | 'TM'): Region =>
  regionOf(permittivity(material.spec, f_Hz), thickness_m, f_Hz, kt2_over_k02, pol, permeability(material.spec, f_Hz));

/** Evaluates every region of the stack at f_Hz for the stack's incidence. */
export function stackAtFrequency(stack: Stack, f_Hz: number): StackAtFrequency {
  const { angle_rad, polarization } = stack.incidence;
  const nFront2 = mul(permittivity(stack.front.spec, f_Hz), permeability(stack.front.spec, f_Hz)); // ε_f μ_f
  const s = Math.sin(angle_rad);
  const kt2 = scale(nFront2, s * s); // (k_t / k0)²
  const front = region(stack.front, Infinity, f_Hz, kt2, polarization);
  const layers: Region[] = [];
  const sheetG = new Float64Array(stack.layers.filter((l) => l.kind === 'bulk').length + 1);
  const interface_m = new Float64Array(sheetG.length);
  let x = 0;
  for (const l of stack.layers) {
    if (l.kind === 'sheet') {
      sheetG[layers.length] += 1 / l.material.spec.ohm_per_sq;
    } else {
      layers.push(region(l.material, l.thickness_m, f_Hz, kt2, polarization));
      x += l.thickness_m;
      interface_m[layers.length] = x;
    }
  }
  const back = stack.back === 'pec' ? null : region(stack.back, Infinity, f_Hz, kt2, polarization);
  return { f_Hz, front, layers, back, sheetG, interface_m };
}
