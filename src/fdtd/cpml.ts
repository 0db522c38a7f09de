// Grading of the convolutional PML (Roden & Gedney, Microwave Opt. Tech. Lett. 27(5), 2000) in the
// kernel's normalized units. Polynomial grading of order m, σ_max from the usual optimum
// σ_opt ≈ 0.8 (m + 1) / (η Δx) (Taflove & Hagness ch. 7, from memory) scaled by a factor tuned by
// test (test/fdtd/cpml.test.ts), κ = 1, and a small CFS α decreasing into the layer for late-time
// stability at low frequencies.

import type { PmlRegion } from './kernel.ts';

export interface PmlGrading {
  cells: number;
  order: number;
  /** Multiplier on σ_opt. */
  sigmaFactor: number;
  /** α_max Δt / ε0. */
  alphaN: number;
  /** Refractive index of the medium filling the PML (Re √ε at band centre). */
  n: number;
  courant: number;
}

export const PML_ORDER = 3;
export const PML_SIGMA_FACTOR = 1.0;

function coeffs(rho: number, g: PmlGrading): [number, number] {
  if (rho <= 0) return [1, 0];
  const sN = PML_SIGMA_BASE(g) * Math.pow(rho, g.order);
  const aN = g.alphaN * (1 - rho);
  const b = Math.exp(-(sN + aN));
  const c = (sN / (sN + aN)) * (b - 1);
  return [b, c];
}

/**
 * σ_max Δt / ε0 = 0.8 (m+1) S / n · factor. With σ normalized to ε0 (the stretch is
 * s = 1 + σ/(α + jωε0) whatever fills the PML), the attenuation per metre is n η0 σ, so the
 * profile that matches σ_opt in air is divided by the medium's index n.
 */
const PML_SIGMA_BASE = (g: PmlGrading): number => (0.8 * (g.order + 1) * g.courant * g.sigmaFactor) / g.n;

/**
 * A PML whose outer wall is E node `wall` and whose inner face is E node `face` (σ = 0 there).
 * Works for either end (face < wall: back end; face > wall: front end).
 */
export function pmlRegion(face: number, wall: number, g: PmlGrading): PmlRegion {
  const dir = wall > face ? 1 : -1;
  const P = Math.abs(wall - face);
  // E nodes strictly between face and wall; H nodes between them (H node i sits at i + 1/2).
  const eLo = Math.min(face, wall) + 1, eHi = Math.max(face, wall);
  const hLo = Math.min(face, wall), hHi = Math.max(face, wall);
  const ne = eHi - eLo, nh = hHi - hLo;
  const be = new Float64Array(ne), ce = new Float64Array(ne);
  const bh = new Float64Array(nh), ch = new Float64Array(nh);
  for (let i = eLo; i < eHi; i++) {
    const [b, c] = coeffs((dir * (i - face)) / P, g);
    be[i - eLo] = b; ce[i - eLo] = c;
  }
  for (let i = hLo; i < hHi; i++) {
    const [b, c] = coeffs((dir * (i + 0.5 - face)) / P, g);
    bh[i - hLo] = b; ch[i - hLo] = c;
  }
  return { eLo, eHi, be, ce, psiE: new Float64Array(ne), hLo, hHi, bh, ch, psiH: new Float64Array(nh) };
}
