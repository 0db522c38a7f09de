// An independent reference for layered stacks with ε and μ at any angle, written for the tests apart from the
// solver's recursion: the textbook cascade of ABCD (transfer) matrices, evaluated at points.
//   layer  [V; I]_front = [[cos φ, jZ sin φ], [j sin φ / Z, cos φ]] [V; I]_back,  φ = k_z d
//   sheet  I_front = I_back + V / R_s
// (Orfanidis, Electromagnetic Waves and Antennas, ch. 5–8; ITU-R P.2040-3 Attachment 1), with V, I the
// tangential E and H, k_z = k0 √(εμ − ε_f μ_f sin²θ) (Im k_z ≤ 0), and the transverse wave impedances
// Z_TE = ωμ0μ/k_z, Z_TM = k_z/(ωε0ε) (Balanis, Advanced Engineering Electromagnetics, 2nd ed., ch. 5;
// physics reference). Plain complex arithmetic on {re, im}, fine for moderate stacks (no overflow guard).

import { type Complex, add, cx, div, exp, mul, scale, sqrt, sub } from '../../src/complex.ts';
import type { BulkMaterial, Polarization, Stack } from '../../src/stack/types.ts';
import { C0_m_per_s, EPS0_F_per_m, ETA0_ohm } from '../../src/units.ts';

export interface Medium { eps: Complex; mu: Complex }
export type RefLayer = { medium: Medium; d_m: number } | { sheet_ohm: number };
export interface RefStack { front: Medium; layers: RefLayer[]; back: Medium | 'pec'; angle_rad: number; polarization: Polarization }

const J = cx(0, 1);
const ccos = (z: Complex) => cx(Math.cos(z.re) * Math.cosh(z.im), -Math.sin(z.re) * Math.sinh(z.im));
const csin = (z: Complex) => cx(Math.sin(z.re) * Math.cosh(z.im), Math.cos(z.re) * Math.sinh(z.im));

/** k_z / k0 = √(εμ − s²) on the decaying branch (Im ≤ 0; Re ≥ 0 when undamped). */
export function kzOverK0(m: Medium, s2: Complex): Complex {
  let q = sqrt(sub(mul(m.eps, m.mu), s2));
  if (q.im > 0 || (q.im === 0 && q.re < 0)) q = scale(q, -1);
  return q;
}

/** Transverse wave impedance E_t/H_t of a forward wave, ohms. */
export function waveImpedance(m: Medium, q: Complex, pol: Polarization): Complex {
  return pol === 'TE' ? div(scale(m.mu, ETA0_ohm), q) : div(scale(q, ETA0_ohm), m.eps);
}

interface Prepared { k0: number; s2: Complex; kz: Complex[]; Z: Complex[]; faces: number[]; backVI: [Complex, Complex][] }

/** Per bulk layer its k_z, Z, front-face position and [V, I] just inside its back face; the back medium's last. */
function prepare(st: RefStack, f_Hz: number): Prepared & { a: Complex; R: Complex; Zf: Complex; kzf: Complex; kzb: Complex; Zb: Complex | null } {
  const k0 = (2 * Math.PI * f_Hz) / C0_m_per_s;
  const sin = Math.sin(st.angle_rad);
  const s2 = scale(mul(st.front.eps, st.front.mu), sin * sin);
  const qf = kzOverK0(st.front, s2), Zf = waveImpedance(st.front, qf, st.polarization);
  let V: Complex, I: Complex, Zb: Complex | null = null, kzb = cx(0);
  if (st.back === 'pec') { V = cx(0); I = cx(1); } else {
    const qb = kzOverK0(st.back, s2);
    Zb = waveImpedance(st.back, qb, st.polarization);
    kzb = scale(qb, k0);
    V = cx(1); I = div(V, Zb);
  }
  const bulk = st.layers.filter((l): l is { medium: Medium; d_m: number } => 'medium' in l);
  const kz: Complex[] = [], Z: Complex[] = [], faces: number[] = [], backVI: [Complex, Complex][] = [];
  let x = 0;
  for (const l of bulk) { faces.push(x); x += l.d_m; }
  faces.push(x);
  for (let i = st.layers.length - 1, b = bulk.length - 1; i >= 0; i--) {
    const l = st.layers[i];
    if ('sheet_ohm' in l) { I = add(I, scale(V, 1 / l.sheet_ohm)); continue; }
    const q = kzOverK0(l.medium, s2), z = waveImpedance(l.medium, q, st.polarization);
    kz[b] = scale(q, k0); Z[b] = z; backVI[b] = [V, I];
    const phi = scale(kz[b], l.d_m);
    [V, I] = [add(mul(ccos(phi), V), mul(mul(J, mul(z, csin(phi))), I)), add(mul(div(mul(J, csin(phi)), z), V), mul(ccos(phi), I))];
    b--;
  }
  const a = scale(add(V, mul(Zf, I)), 0.5), b = scale(sub(V, mul(Zf, I)), 0.5);
  return { k0, s2, kz, Z, faces, backVI, a, R: div(b, a), Zf, kzf: scale(qf, k0), kzb, Zb };
}

/** R (tangential E at x = 0) and T (tangential E at the back face over the incident E at x = 0). */
export function referenceRT(st: RefStack, f_Hz: number): { R: Complex; T: Complex } {
  const p = prepare(st, f_Hz);
  return { R: p.R, T: st.back === 'pec' ? cx(0) : div(cx(1), p.a) };
}

/** Tangential E and H at each x, each over its incident value at x = 0; at an interface, the value just behind it. */
export function referenceProfile(st: RefStack, f_Hz: number, x_m: ArrayLike<number>): { E: Complex[]; H: Complex[] } {
  const p = prepare(st, f_Hz);
  const n = p.kz.length, d = p.faces[n];
  const E: Complex[] = [], H: Complex[] = [];
  const push = (V: Complex, I: Complex) => { E.push(div(V, p.a)); H.push(div(mul(I, p.Zf), p.a)); };
  const ejkx = (k: Complex, x: number) => exp(mul(cx(0, -x), k)); // e^{−j k x}
  for (let k = 0; k < x_m.length; k++) {
    const x = x_m[k];
    if (x < 0 || (x === 0 && n === 0 && st.back === 'pec')) { // (a bare conductor at x = 0: its front side)
      const inc = mul(p.a, ejkx(p.kzf, x)), ref = mul(mul(p.a, p.R), ejkx(p.kzf, -x));
      push(add(inc, ref), div(sub(inc, ref), p.Zf));
    } else if (x >= d && (st.back !== 'pec' || x > d || n === 0)) {
      if (st.back === 'pec' || p.Zb === null) { push(cx(0), cx(0)); continue; }
      const V = ejkx(p.kzb, x - d);
      push(V, div(V, p.Zb));
    } else {
      let i = 0;
      while (i < n - 1 && x >= p.faces[i + 1]) i++;
      const phi = scale(p.kz[i], p.faces[i + 1] - x), [Vb, Ib] = p.backVI[i], z = p.Z[i];
      push(add(mul(ccos(phi), Vb), mul(mul(J, mul(z, csin(phi))), Ib)), add(mul(div(mul(J, csin(phi)), z), Vb), mul(ccos(phi), Ib)));
    }
  }
  return { E, H };
}

/**
 * The reference form of a Stack whose materials are all `fixed` (ε_r − jσ/(ωε0), μ_r − j mu_loss), evaluated here
 * from the model's own formula, not through the solver's material code.
 */
export function referenceOf(stack: Stack, f_Hz: number): RefStack {
  const medium = (m: BulkMaterial): Medium => {
    const s = m.spec;
    if (s.model !== 'fixed') throw new Error(`referenceOf: ${m.name} is not a fixed model`);
    const mu = s.magnetic === undefined ? cx(1) : s.magnetic.model === 'fixed' ? cx(s.magnetic.mu_r, -s.magnetic.mu_loss) : null;
    if (mu === null) throw new Error(`referenceOf: ${m.name} has a dispersive permeability`);
    return { eps: cx(s.eps_r, -s.sigma_S_per_m / (2 * Math.PI * f_Hz * EPS0_F_per_m)), mu };
  };
  return {
    front: medium(stack.front),
    layers: stack.layers.map((l) => (l.kind === 'sheet' ? { sheet_ohm: l.material.spec.ohm_per_sq } : { medium: medium(l.material), d_m: l.thickness_m })),
    back: stack.back === 'pec' ? 'pec' : medium(stack.back),
    angle_rad: stack.incidence.angle_rad,
    polarization: stack.incidence.polarization,
  };
}
