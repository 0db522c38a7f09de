// The FEM standing-wave profile at one frequency, evaluated anywhere from the elements' own basis functions.
// The mesh covers the requested x range: the stack plus buffers of the front medium (the port sits at the
// buffer's front end, the incident wave still has amplitude 1 at x = 0) and of the back medium.
// Output is the total tangential E over the incident tangential E at x = 0:
//   TE and normal incidence: E_y from the E_y solution (at normal incidence TE and TM are the same problem);
//   oblique TM: E_t = a H_y' / (jωε0) from the basis derivatives, normalised by E_t,inc(0) = −k_z0 a_f/(ωε0), i.e.
//   E_t / E_t,inc(0) = j a H_y' / (k_z0 a_f).
// Behind a perfect conductor the field is 0.

import type { Profile } from '../results.ts';
import type { Stack } from '../stack/types.ts';
import { stackThickness_m } from '../stack/types.ts';
import { basisDerivatives, basisValues } from './basis.ts';
import type { FemMesh } from './mesh.ts';
import { planMesh, sizeMesh, type MeshExtent } from './mesh.ts';
import { createFemSystem, solveAt } from './system.ts';
import type { FemOptions } from './types.ts';

/** The buffers and sizing of a profile mesh over [xLo, xHi] (metres). */
function profileExtent(stack: Stack, xLo: number, xHi: number): MeshExtent {
  const L = stackThickness_m(stack);
  const pol = stack.incidence.angle_rad === 0 ? 'TE' : stack.incidence.polarization;
  const back_m = stack.back === 'pec' ? 0 : Math.max(0, xHi - L);
  return { front_m: Math.max(0, -xLo), back_m, polarization: pol, betweenNodes: true };
}

/** The mesh a profile over [xLo, xHi] (metres) uses at f_Hz. */
export function planProfileMesh(stack: Stack, f_Hz: number, xLo: number, xHi: number, options: FemOptions = {}): FemMesh {
  return planMesh(stack, [f_Hz], options, profileExtent(stack, xLo, xHi));
}

/** Elements of the profile mesh over [xLo, xHi], without building it. */
export const profileMeshElements = (stack: Stack, f_Hz: number, xLo: number, xHi: number, options: FemOptions = {}): number =>
  sizeMesh(stack, [f_Hz], options, profileExtent(stack, xLo, xHi)).elements;

/** Sample positions with `perElement` intervals in every element of the profile mesh over [xLo, xHi], sorted. */
export function femSamplePositions(stack: Stack, f_Hz: number, xLo: number, xHi: number, options: FemOptions = {}, perElement = 10): Float64Array {
  const mesh = planProfileMesh(stack, f_Hz, xLo, xHi, options);
  const xs: number[] = [];
  for (let s = 0; s < mesh.segRegion.length; s++) {
    if (mesh.segRegion[s] < 0) continue;
    const x0 = mesh.segX0[s], h = mesh.segH[s];
    for (let i = 0; i < perElement; i++) xs.push(x0 + (h * i) / perElement);
  }
  xs.push(mesh.vertexX[mesh.vertexX.length - 1]);
  const out: number[] = [];
  for (const x of xs) if (x >= xLo && x <= xHi && (out.length === 0 || x > out[out.length - 1])) out.push(x);
  return Float64Array.from(out);
}

/** Total tangential E at each x (metres; x = 0 the front face), incident amplitude 1 at x = 0. */
export function profileFem(stack: Stack, f_Hz: number, x_m: Float64Array, options: FemOptions = {}): Profile {
  let xLo = 0, xHi = stackThickness_m(stack);
  for (const x of x_m) { if (x < xLo) xLo = x; if (x > xHi) xHi = x; }
  const mesh = planProfileMesh(stack, f_Hz, xLo, xHi, options);
  const sys = createFemSystem(mesh);
  solveAt(sys, f_Hz);

  const p = mesh.order, m = p - 1;
  const tm = mesh.polarization === 'TM';
  const { xRe, xIm } = sys.tri;
  const phi = new Float64Array(p + 1), uRe = new Float64Array(p + 1), uIm = new Float64Array(p + 1);
  // Element segments only (TM sheet links have zero length).
  const elems: number[] = [];
  for (let s = 0; s < mesh.segRegion.length; s++) if (mesh.segRegion[s] >= 0) elems.push(s);
  const backFace = mesh.vertexX[mesh.backVertex];

  const n = x_m.length;
  const E_re = new Float64Array(n), E_im = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const x = x_m[k];
    if (!mesh.back && x > backFace) continue; // inside the conductor
    if (elems.length === 0) {
      // No bulk layers and no buffers: the only point is x = 0, where E_t = 1 + R (R = E(0) − 1 in TE,
      // 1 − H(0) in TM).
      E_re[k] = tm ? 2 - xRe[0] : xRe[0]; E_im[k] = tm ? -xIm[0] : xIm[0];
      continue;
    }
    // Last element whose left end is ≤ x.
    let lo = 0, hi = elems.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (mesh.segX0[elems[mid]] <= x) lo = mid; else hi = mid - 1;
    }
    const s = elems[lo], r = mesh.segRegion[s], h = mesh.segH[s];
    const xi = Math.min(1, Math.max(0, (x - mesh.segX0[s]) / h));
    // Local nodal values: vertices s and s+1, interior from the condensation's recovery G.
    uRe[0] = xRe[s]; uIm[0] = xIm[s]; uRe[p] = xRe[s + 1]; uIm[p] = xIm[s + 1];
    for (let i = 0; i < m; i++) {
      const g0r = sys.gRe[(r * m + i) * 2], g0i = sys.gIm[(r * m + i) * 2];
      const g1r = sys.gRe[(r * m + i) * 2 + 1], g1i = sys.gIm[(r * m + i) * 2 + 1];
      uRe[i + 1] = g0r * uRe[0] - g0i * uIm[0] + g1r * uRe[p] - g1i * uIm[p];
      uIm[i + 1] = g0r * uIm[0] + g0i * uRe[0] + g1r * uIm[p] + g1i * uRe[p];
    }
    if (tm) basisDerivatives(p, xi, phi); else basisValues(p, xi, phi);
    let vr = 0, vi = 0;
    for (let i = 0; i <= p; i++) { vr += phi[i] * uRe[i]; vi += phi[i] * uIm[i]; }
    if (!tm) { E_re[k] = vr; E_im[k] = vi; continue; }
    // E_t / E_t,inc(0) = j a u' / (k_z0 a_f), u' = Σ φ_i' u_i / h
    vr /= h; vi /= h;
    const ar = sys.aRe[r], ai = sys.aIm[r];
    const qr = ar * vr - ai * vi, qi = ar * vi + ai * vr; // a u'
    const jr = -qi, ji = qr; // j a u'
    const { kaRe, kaIm } = sys.port, den = kaRe * kaRe + kaIm * kaIm;
    E_re[k] = (jr * kaRe + ji * kaIm) / den;
    E_im[k] = (ji * kaRe - jr * kaIm) / den;
  }
  return { f_Hz, x_m, E_re, E_im };
}
