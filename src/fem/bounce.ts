// How much a layer's multiple reflections magnify a phase error made inside it, for the FEM's a-priori estimate.
//
// A layer whose faces reflect |Γ_front| and |Γ_back| (each looking out of the layer, through everything on that side),
// with one-way amplitude loss a = e^{−|Im k_z| d}, keeps ρ = |Γ_front| |Γ_back| a² of a wave per round trip. Near a
// resonance R and T then move by up to (1 + ρ)/(1 − ρ) times the single-pass effect of a phase error (the Airy sum
// Σ ρⁿ e^{−2jnφ} differentiated at resonance; for a lossless symmetric slab |∂R/∂φ| = 2|r|/(1 − |r|²), which is
// below that). |Γ| through a substack is bounded without its phases: an interface of reflection r in front of a
// load reflecting g (after the round trip's loss) reflects at most (r + g)/(1 + r g), the value when the two add in
// phase (for a lossless line this is exact: reflections add like tanh of summed rapidities). A conductor reflects
// fully. The worst over a sample of the frequencies is kept: an upper figure, as the estimate wants.

import { permeability } from '../materials/permeability.ts';
import { permittivity } from '../materials/permittivity.ts';
import type { BulkModel } from '../materials/types.ts';
import type { Polarization, Stack } from '../stack/types.ts';
import { ETA0_ohm } from '../units.ts';
import { freeSpaceWavenumber, indexSquared, normalWavenumber, tangentialWavenumber2 } from './media.ts';

/** Round-trip retention is capped here (a lossless cavity would give an infinite factor): factors ≤ 199. */
const MAX_RETENTION = 0.99;
/** Frequencies sampled from the sizing set (evenly, ends included). */
const SAMPLES = 65;

interface Admittance { re: number; im: number }

/** w / q for complex w, q; an infinite admittance when q vanishes. */
function ratio(w: Admittance, q: Admittance): Admittance {
  const d = q.re * q.re + q.im * q.im;
  if (d === 0) return { re: Infinity, im: 0 };
  return { re: (w.re * q.re + w.im * q.im) / d, im: (w.im * q.re - w.re * q.im) / d };
}

/** Normalized wave admittance of a medium along the stack normal (TE k_z/(k0 μ), TM ε k0/k_z) and |Im k_z|. */
function medium(m: BulkModel, stack: Stack, f_Hz: number, pol: Polarization): { y: Admittance; loss_per_m: number } {
  const k0 = freeSpaceWavenumber(f_Hz);
  const kz = normalWavenumber(indexSquared(m, f_Hz), k0, tangentialWavenumber2(stack.front.spec, f_Hz, stack.incidence.angle_rad));
  const q = { re: kz.re / k0, im: kz.im / k0 };
  const loss_per_m = Math.abs(kz.im);
  if (pol === 'TE') return { y: ratio(q, permeability(m, f_Hz)), loss_per_m };
  return { y: ratio(permittivity(m, f_Hz), q), loss_per_m };
}

/** |(ya − yb)/(ya + yb)| between two admittances; 1 when either is degenerate (infinite). */
function interfaceReflection(ya: Admittance, yb: Admittance): number {
  if (!Number.isFinite(ya.re) || !Number.isFinite(yb.re)) return 1;
  const n = Math.hypot(ya.re - yb.re, ya.im - yb.im), d = Math.hypot(ya.re + yb.re, ya.im + yb.im);
  return d > 0 ? Math.min(1, n / d) : 1;
}

/** The largest reflection of an interface r in front of a load reflecting g: (r + g)/(1 + r g). */
const inPhase = (r: number, g: number): number => (r + g) / (1 + r * g);

/** Sample of at most SAMPLES frequencies of `f_Hz`, ends included. */
function sampleOf(f_Hz: ArrayLike<number>): number[] {
  const n = f_Hz.length;
  if (n <= SAMPLES) return Array.from({ length: n }, (_, i) => f_Hz[i]);
  return Array.from({ length: SAMPLES }, (_, i) => f_Hz[Math.round((i * (n - 1)) / (SAMPLES - 1))]);
}

/** Per stack layer (sheets get 1): the largest (1 + ρ)/(1 − ρ) over the sampled frequencies. */
export function bounceFactors(stack: Stack, f_Hz: ArrayLike<number>, pol: Polarization): number[] {
  const out = stack.layers.map(() => 1);
  const bulk = stack.layers.flatMap((l, i) => (l.kind === 'bulk' ? [i] : []));
  const n = bulk.length;
  if (n === 0) return out;
  // Normalized sheet conductance on each face of the bulk layers: face k lies in front of bulk layer k (k = n: back face).
  const g = new Float64Array(n + 1);
  let face = 0;
  for (const l of stack.layers) {
    if (l.kind === 'sheet') g[face] += ETA0_ohm / l.material.spec.ohm_per_sq; else face++;
  }
  const towardFront = new Float64Array(n), towardBack = new Float64Array(n);
  for (const f of sampleOf(f_Hz)) {
    const front = medium(stack.front.spec, stack, f, pol).y;
    const back = stack.back === 'pec' ? null : medium(stack.back.spec, stack, f, pol).y;
    const m = bulk.map((i) => medium((stack.layers[i] as { material: { spec: BulkModel } }).material.spec, stack, f, pol));
    const a2 = bulk.map((i, k) => Math.exp(-2 * m[k].loss_per_m * (stack.layers[i] as { thickness_m: number }).thickness_m));
    // Sheets on a face act in parallel with the medium beyond it.
    const withSheet = (y: Admittance, k: number): Admittance => ({ re: y.re + g[k], im: y.im });
    for (let k = n - 1; k >= 0; k--) {
      if (k === n - 1) towardBack[k] = back === null ? 1 : interfaceReflection(m[k].y, withSheet(back, n));
      else towardBack[k] = inPhase(interfaceReflection(m[k].y, withSheet(m[k + 1].y, k + 1)), a2[k + 1] * towardBack[k + 1]);
    }
    for (let k = 0; k < n; k++) {
      if (k === 0) towardFront[k] = interfaceReflection(m[k].y, withSheet(front, 0));
      else towardFront[k] = inPhase(interfaceReflection(m[k].y, withSheet(m[k - 1].y, k)), a2[k - 1] * towardFront[k - 1]);
    }
    for (let k = 0; k < n; k++) {
      const rho = Math.min(MAX_RETENTION, towardFront[k] * towardBack[k] * a2[k]);
      out[bulk[k]] = Math.max(out[bulk[k]], (1 + rho) / (1 - rho));
    }
  }
  return out;
}
