// The FEM standing-wave profile at one frequency, evaluated anywhere from the elements' own basis functions.
// The mesh covers the requested x range: the stack plus buffers of the front medium (the port sits at the
// buffer's front end, the incident wave still has amplitude 1 at x = 0) and of the back medium.
// The unknown u is E_y in TE (and at normal incidence, where TE and TM are one problem) and H_y in TM; the
// other tangential field is the flux a u' (a = 1/μ_r in TE, 1/ε_r in TM) over jωε0 (TM: E_t) or jωμ0 (TE: H_t),
// up to sign. Each is returned over its incident value at x = 0: u itself (u_inc(0) = 1), and the other as
//   a u' / (a_f u_inc'(0)) = j a u' / (k_z0 a_f).
// So TE gives E = u and H = j a u'/(k_z0 a_f); oblique TM gives H = u and E = j a u'/(k_z0 a_f).
// Behind a perfect conductor both are 0.

import type { Complex } from '../complex.ts';
import type { Profile } from '../results.ts';
import type { Stack } from '../stack/types.ts';
import { stackThickness_m } from '../stack/types.ts';
import { basisDerivatives, basisValues } from './basis.ts';
import type { FemMesh } from './mesh.ts';
import { planMesh, sizeMesh, type MeshExtent } from './mesh.ts';
import { type FemSystem, createFemSystem, solveAt } from './system.ts';
import type { FemOptions } from './types.ts';

/** The buffers and sizing of a profile mesh over [xLo, xHi] (metres); `withH` sizes it for the tangential H too. */
function profileExtent(stack: Stack, xLo: number, xHi: number, withH: boolean): MeshExtent {
  const L = stackThickness_m(stack);
  const pol = stack.incidence.angle_rad === 0 ? 'TE' : stack.incidence.polarization;
  const back_m = stack.back === 'pec' ? 0 : Math.max(0, xHi - L);
  // Whichever field comes from u' needs the derivative's sizing: E in TM, H in TE.
  const derivative = pol === 'TM' || withH;
  return { front_m: Math.max(0, -xLo), back_m, polarization: pol, betweenNodes: true, derivative };
}

/** The mesh a profile over [xLo, xHi] (metres) uses at f_Hz; `withH` sizes it for the tangential H too. */
export function planProfileMesh(stack: Stack, f_Hz: number, xLo: number, xHi: number, options: FemOptions = {},
  withH = false): FemMesh {
  return planMesh(stack, [f_Hz], options, profileExtent(stack, xLo, xHi, withH));
}

/** Elements of the profile mesh over [xLo, xHi], without building it. */
export const profileMeshElements = (stack: Stack, f_Hz: number, xLo: number, xHi: number, options: FemOptions = {},
  withH = false): number => sizeMesh(stack, [f_Hz], options, profileExtent(stack, xLo, xHi, withH)).elements;

/** Sample positions with `perElement` intervals in every element of the profile mesh over [xLo, xHi], sorted. */
export function femSamplePositions(stack: Stack, f_Hz: number, xLo: number, xHi: number, options: FemOptions = {},
  perElement = 10, withH = false): Float64Array {
  const mesh = planProfileMesh(stack, f_Hz, xLo, xHi, options, withH);
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

/** Total tangential E (and, with `withH`, H) at each x (metres; x = 0 the front face), each over its incident value at x = 0. */
export function profileFem(stack: Stack, f_Hz: number, x_m: Float64Array, options: FemOptions = {}, withH = false): Profile {
  let xLo = 0, xHi = stackThickness_m(stack);
  for (const x of x_m) { if (x < xLo) xLo = x; if (x > xHi) xHi = x; }
  const mesh = planProfileMesh(stack, f_Hz, xLo, xHi, options, withH);
  const sys = createFemSystem(mesh);
  solveAt(sys, f_Hz);
  const eval_ = createEvaluator(sys);
  const tm = mesh.polarization === 'TM';
  const n = x_m.length;
  const E_re = new Float64Array(n), E_im = new Float64Array(n), H_re = new Float64Array(n), H_im = new Float64Array(n);
  const [uRe, uIm, dRe, dIm] = tm ? [H_re, H_im, E_re, E_im] : [E_re, E_im, H_re, H_im];
  for (let k = 0; k < n; k++) {
    if (!eval_.at(x_m[k])) continue; // inside the conductor: 0
    uRe[k] = eval_.u.re; uIm[k] = eval_.u.im; dRe[k] = eval_.dual.re; dIm[k] = eval_.dual.im;
  }
  return withH ? { f_Hz, x_m, E_re, E_im, H_re, H_im } : { f_Hz, x_m, E_re, E_im };
}

/** Evaluates u and j a u' / (k_z0 a_f) at any x of a solved system, from the element holding x. */
function createEvaluator(sys: FemSystem): { at: (x: number) => boolean; u: Complex; dual: Complex } {
  const { mesh } = sys;
  const p = mesh.order, m = p - 1;
  const { xRe, xIm } = sys.tri;
  const phi = new Float64Array(p + 1), dphi = new Float64Array(p + 1), uRe = new Float64Array(p + 1), uIm = new Float64Array(p + 1);
  // Element segments only (TM sheet links have zero length).
  const elems: number[] = [];
  for (let s = 0; s < mesh.segRegion.length; s++) if (mesh.segRegion[s] >= 0) elems.push(s);
  // The vertex positions are sums of element lengths: allow their rounding at the conductor's face.
  const backFace = mesh.vertexX[mesh.backVertex] * (1 + 1e-12) + 1e-15;
  const u = { re: 0, im: 0 }, dual = { re: 0, im: 0 };
  const at = (x: number): boolean => {
    if (!mesh.back && x > backFace) return false; // inside the conductor
    if (elems.length === 0) {
      // No bulk layers and no buffers: the only point is x = 0. There u(0) = 1 ± R and the other field 1 ∓ R:
      // TE: u = E = 1 + R, H = 1 − R = 2 − u; TM: u = H = 1 − R, E = 2 − u.
      u.re = xRe[0]; u.im = xIm[0]; dual.re = 2 - xRe[0]; dual.im = -xIm[0];
      return true;
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
    basisValues(p, xi, phi); basisDerivatives(p, xi, dphi);
    let vr = 0, vi = 0, gr = 0, gi = 0;
    for (let i = 0; i <= p; i++) { vr += phi[i] * uRe[i]; vi += phi[i] * uIm[i]; gr += dphi[i] * uRe[i]; gi += dphi[i] * uIm[i]; }
    u.re = vr; u.im = vi;
    // j a u' / (k_z0 a_f), u' = Σ φ_i' u_i / h
    gr /= h; gi /= h;
    const ar = sys.aRe[r], ai = sys.aIm[r];
    const qr = ar * gr - ai * gi, qi = ar * gi + ai * gr; // a u'
    const jr = -qi, ji = qr; // j a u'
    const { kaRe, kaIm } = sys.port, den = kaRe * kaRe + kaIm * kaIm;
    dual.re = (jr * kaRe + ji * kaIm) / den;
    dual.im = (ji * kaRe - jr * kaIm) / den;
    return true;
  };
  return { at, u, dual };
}
