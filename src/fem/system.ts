// The per-frequency FEM system on a planned mesh, allocated once and reused for every frequency.
//
// Weak form on the mesh domain [x_p, x_e] (u = E_y in TE, H_y in TM; a = 1/μ_r in TE, 1/ε_r in TM):
//   ∫ a u' v' − a k_z² u v dx  + boundary and sheet terms = right-hand side.
// Front port at x_p (first-order absorbing condition, exact in 1D for a plane wave): in the front medium
//   u = u_inc + u_ref with u_inc = e^{−j k_z0 x}, so a u'(x_p) = −j k_z0 a_f (2 u_inc(x_p) − u(x_p)),
//   giving  + j k_z0 a_f  on the port's diagonal and  2 j k_z0 a_f u_inc(x_p)  on the right-hand side.
// Open back at x_e: u = T e^{−j k_zb (x − x_e)}, a u' = −j k_zb a_b u, giving + j k_zb a_b on its diagonal.
// Perfect conductor at the back face: tangential E = 0. TE: E_y = 0 (Dirichlet). TM: tangential E is
//   a H_y' / (jωε0), so E_t = 0 is the natural condition a H_y' = 0: nothing to add.
// Resistive sheet (R_s ohms per square, surface current J = E_t / R_s):
//   TE: E_y is continuous and H jumps by J; H_t = ∓(1/μ_r) E'/(jωμ0) = ∓ a E'/(jωμ0), so the flux jumps,
//       a E'(x+) − a E'(x−) = jωμ0 E / R_s: a shunt + j k0 η0 / R_s on the sheet's vertex.
//   TM: E_t = a H'/(jωε0) is continuous and H_y jumps, H(x+) − H(x−) = E_t / R_s. The sheet's vertex is split
//       in two and the flux a H' = jωε0 R_s (H+ − H−) couples them: a link [y, −y; −y, y] with y = j k0 R_s / η0.

import { permeability } from '../materials/permeability.ts';
import { permittivity } from '../materials/permittivity.ts';
import { ETA0_ohm } from '../units.ts';
import { createCondenser } from './condense.ts';
import type { Condenser } from './condense.ts';
import { freeSpaceWavenumber, setFormWeight, setNormalWavenumber } from './media.ts';
import { type Complex, mul } from '../complex.ts';
import type { FemMesh } from './mesh.ts';
import type { Tridiagonal } from './tridiag.ts';
import { clearTridiagonal, createTridiagonal, solveSeriesShunt } from './tridiag.ts';

export interface FemSystem {
  mesh: FemMesh;
  tri: Tridiagonal;
  condenser: Condenser;
  /** Per region: condensed vertex diagonals and coupling (complex), and the interior recovery G (m×2). */
  d0Re: Float64Array; d0Im: Float64Array; d1Re: Float64Array; d1Im: Float64Array; oRe: Float64Array; oIm: Float64Array;
  /** Per region: the condensed rows' sums (the shunt parts, computed without cancellation). */
  p0Re: Float64Array; p0Im: Float64Array; p1Re: Float64Array; p1Im: Float64Array;
  gRe: Float64Array; gIm: Float64Array;
  /** Per region: the weak form's weight a (complex), kept for field recovery (TM tangential E). */
  aRe: Float64Array; aIm: Float64Array;
  /** Port quantities at the last solved frequency: k_z0 a_f and k_zb a_b (complex). */
  port: { kaRe: number; kaIm: number; backKaRe: number; backKaIm: number };
  /** Scratch values reused every frequency. */
  scratch: { a: Complex; kz: Complex };
}

export function createFemSystem(mesh: FemMesh): FemSystem {
  const nr = mesh.regions.length, m = mesh.order - 1;
  const f = (n: number) => new Float64Array(Math.max(1, n));
  return {
    mesh, tri: createTridiagonal(mesh.vertexX.length), condenser: createCondenser(mesh.order),
    d0Re: f(nr), d0Im: f(nr), d1Re: f(nr), d1Im: f(nr), oRe: f(nr), oIm: f(nr),
    p0Re: f(nr), p0Im: f(nr), p1Re: f(nr), p1Im: f(nr),
    gRe: f(nr * m * 2), gIm: f(nr * m * 2), aRe: f(nr), aIm: f(nr),
    port: { kaRe: 0, kaIm: 0, backKaRe: 0, backKaIm: 0 },
    scratch: { a: { re: 0, im: 0 }, kz: { re: 0, im: 0 } },
  };
}

/** Assembles and solves at f_Hz; the vertex values land in sys.tri.xRe / xIm. Incident wave: amplitude 1 at x = 0.
 *  Allocates nothing itself beyond the few small {re, im} values the material models return per region. */
export function solveAt(sys: FemSystem, f_Hz: number): void {
  const { mesh, tri } = sys;
  const k0 = freeSpaceWavenumber(f_Hz);
  const epsF = permittivity(mesh.front, f_Hz), muF = permeability(mesh.front, f_Hz);
  const nF2 = mul(epsF, muF); // ε_f μ_f
  const s2 = Math.sin(mesh.angle_rad) ** 2;
  const kt2Re = k0 * k0 * nF2.re * s2, kt2Im = k0 * k0 * nF2.im * s2; // k_t² = k0² ε_front μ_front sin²θ
  const m = mesh.order - 1;
  const { a, kz } = sys.scratch;

  for (let r = 0; r < mesh.regions.length; r++) {
    const reg = mesh.regions[r];
    const eps = permittivity(reg.material, f_Hz), mu = permeability(reg.material, f_Hz);
    const n2 = mul(eps, mu); // ε_r μ_r
    const kzRe = k0 * k0 * n2.re - kt2Re, kzIm = k0 * k0 * n2.im - kt2Im; // k_z²
    setFormWeight(a, eps, mu, mesh.polarization);
    const h = reg.h_m;
    // α = a / h, β = a k_z² h
    const c = sys.condenser.condense(a.re / h, a.im / h, (a.re * kzRe - a.im * kzIm) * h, (a.re * kzIm + a.im * kzRe) * h);
    sys.d0Re[r] = c.d0Re; sys.d0Im[r] = c.d0Im; sys.d1Re[r] = c.d1Re; sys.d1Im[r] = c.d1Im; sys.oRe[r] = c.oRe; sys.oIm[r] = c.oIm;
    sys.p0Re[r] = c.p0Re; sys.p0Im[r] = c.p0Im; sys.p1Re[r] = c.p1Re; sys.p1Im[r] = c.p1Im;
    for (let k = 0; k < m * 2; k++) { sys.gRe[r * m * 2 + k] = c.gRe[k]; sys.gIm[r * m * 2 + k] = c.gIm[k]; }
    sys.aRe[r] = a.re; sys.aIm[r] = a.im;
  }

  clearTridiagonal(tri);
  // the matrix as shunt parts per vertex and series couplings per segment (tridiag.ts solveSeriesShunt)
  const { shRe, shIm, seRe, seIm, bRe, bIm } = tri;
  const n = tri.n;
  for (let s = 0; s < mesh.segRegion.length; s++) {
    const r = mesh.segRegion[s];
    if (r >= 0) {
      shRe[s] += sys.p0Re[r]; shIm[s] += sys.p0Im[r];
      shRe[s + 1] += sys.p1Re[r]; shIm[s + 1] += sys.p1Im[r];
      seRe[s] = -sys.oRe[r]; seIm[s] = -sys.oIm[r];
    } else {
      const y = (k0 * mesh.sheets[-1 - r].ohm_per_sq) / ETA0_ohm; // TM sheet link, y = j k0 R_s / η0
      seIm[s] = y; // [y, −y; −y, y]: a series coupling with no shunt part
    }
  }
  if (mesh.polarization === 'TE')
    for (const sh of mesh.sheets) shIm[sh.vertex] += (k0 * ETA0_ohm) / sh.ohm_per_sq;

  // Front port at vertex 0, position x_p.
  setNormalWavenumber(kz, nF2.re, nF2.im, k0, kt2Re, kt2Im);
  setFormWeight(a, epsF, muF, mesh.polarization);
  const kaRe = kz.re * a.re - kz.im * a.im, kaIm = kz.re * a.im + kz.im * a.re;
  const kz0Re = kz.re, kz0Im = kz.im;
  sys.port.kaRe = kaRe; sys.port.kaIm = kaIm;
  shRe[0] += -kaIm; shIm[0] += kaRe; // + j k_z0 a_f
  // u_inc(x_p) = e^{−j k_z0 x_p}
  const xp = mesh.vertexX[0];
  const mag = Math.exp(kz0Im * xp), ph = -kz0Re * xp;
  const uRe = mag * Math.cos(ph), uIm = mag * Math.sin(ph);
  // 2 j (k_z0 a_f) u_inc
  bRe[0] = -2 * (kaRe * uIm + kaIm * uRe); bIm[0] = 2 * (kaRe * uRe - kaIm * uIm);

  if (mesh.back) {
    const epsB = permittivity(mesh.back, f_Hz), muB = permeability(mesh.back, f_Hz), nB2 = mul(epsB, muB);
    setNormalWavenumber(kz, nB2.re, nB2.im, k0, kt2Re, kt2Im);
    setFormWeight(a, epsB, muB, mesh.polarization);
    const bkRe = kz.re * a.re - kz.im * a.im, bkIm = kz.re * a.im + kz.im * a.re;
    sys.port.backKaRe = bkRe; sys.port.backKaIm = bkIm;
    shRe[n - 1] += -bkIm; shIm[n - 1] += bkRe;
  } else if (mesh.polarization === 'TE') {
    // E = 0 at the last vertex: its row is the identity, and the coupling stays in the row before only
    shRe[n - 1] = 1; shIm[n - 1] = 0; bRe[n - 1] = 0; bIm[n - 1] = 0;
    if (n > 1) { shRe[n - 2] += seRe[n - 2]; shIm[n - 2] += seIm[n - 2]; seRe[n - 2] = 0; seIm[n - 2] = 0; }
  }
  solveSeriesShunt(tri);
}
