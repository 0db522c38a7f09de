// The 1D Yee leapfrog kernel over flat Float64Arrays (Yee 1966; Taflove & Hagness, Computational
// Electrodynamics, 3rd ed., 2005, ch. 3, 7 and 9). Allocates nothing per step: a WebAssembly kernel
// can replace updateH/updateE one-for-one by working on the same arrays.
//
// Normalized fields: e = E (V/m), h = η0·H (V/m). With S = c0 Δt / Δx:
//   h[i]  (between e[i] and e[i+1]):  h[i] += db[i]·(e[i+1] − e[i] + ψH)          (db = S for μ = μ0)
//   e[i]:  e[i] = ca[i]·e[i] + cb[i]·(h[i] − h[i−1] + ψE) + cp[i]·(polarization terms)
// where ca, cb, cp come from the trapezoidal (time-centred) Ampère law with ε∞, σ and the poles:
//   ε∞ (Eⁿ⁺¹ − Eⁿ) + σΔt/(2ε0) (Eⁿ⁺¹ + Eⁿ) + (P̃ⁿ⁺¹ − P̃ⁿ) = S·curl,  P̃ = P/ε0.
// Nodes 0 and n − 1 are conductor walls (never updated).
//
// Dispersive media, auxiliary differential equations (Taflove & Hagness ch. 9):
//   Debye   τ dP̃/dt + P̃ = Δε E, trapezoidal: P̃ⁿ⁺¹ = a P̃ⁿ + b (Eⁿ⁺¹ + Eⁿ), a = (2τ−Δt)/(2τ+Δt),
//           b = Δε Δt/(2τ+Δt). Its b enters ca/cb/cp (semi-implicit, unconditionally stable pole).
//   2nd order (Lorentz, Drude)  P̃'' + γP̃' + ω0²P̃ = c E, central differences, explicit:
//           P̃ⁿ⁺¹ = α P̃ⁿ + ξ P̃ⁿ⁻¹ + ζ Eⁿ.
// Subcell averaging weights every pole's strength by the fraction of the cell the material fills.
//
// CPML (Roden & Gedney, Microwave Opt. Tech. Lett. 27(5), 2000) with κ = 1 (1D needs no stretching):
//   ψ ← b ψ + c·(difference), b = exp(−(σ+α)Δt/ε0), c = σ/(σ+α)·(b − 1). The curl is replaced by curl + ψ,
//   so whatever medium fills the PML (lossy, dispersive) is terminated as it is.

export interface PmlRegion {
  /** E nodes [eLo, eHi) with a ψE each. */
  eLo: number; eHi: number;
  be: Float64Array; ce: Float64Array; psiE: Float64Array;
  /** H nodes [hLo, hHi) with a ψH each. */
  hLo: number; hHi: number;
  bh: Float64Array; ch: Float64Array; psiH: Float64Array;
}

/** One Debye pole over the E nodes [lo, hi). */
export interface DebyeArrays { lo: number; hi: number; a: number; b: Float64Array; p: Float64Array }
/** One second-order pole over the E nodes [lo, hi). */
export interface OscArrays {
  lo: number; hi: number; alpha: number; xi: number;
  zeta: Float64Array; p: Float64Array; pOld: Float64Array;
}

/** The span of E nodes that carry any pole, with per-node scratch. */
export interface DispersiveSpan {
  lo: number; hi: number;
  /** Coefficient of the polarization terms (1 / denominator). */
  cp: Float64Array;
  /** Eⁿ saved for the Debye update; polarization accumulator. */
  eOld: Float64Array; acc: Float64Array;
  debye: DebyeArrays[];
  osc: OscArrays[];
}

export interface KernelState {
  /** E nodes. */
  n: number;
  e: Float64Array;
  /** n − 1 H nodes; h[i] sits between e[i] and e[i+1]. */
  h: Float64Array;
  ca: Float64Array; cb: Float64Array; db: Float64Array;
  pml: PmlRegion[];
  disp: DispersiveSpan | null;
  /** Optional one-node injections (TF/SF corrections): added as db·value to h[injH], cb·value to e[injE]. */
  injH: number; injHValue: number;
  injE: number; injEValue: number;
}

/** H half step: hⁿ⁺¹ᐟ² from hⁿ⁻¹ᐟ² and eⁿ. */
export function updateH(s: KernelState): void {
  const e = s.e, h = s.h, db = s.db, m = h.length;
  // e[i] is carried in a register from the previous iteration (one load per cell instead of two).
  let left = e[0];
  for (let i = 0; i < m; i++) {
    const right = e[i + 1];
    h[i] += db[i] * (right - left);
    left = right;
  }
  const pml = s.pml;
  for (let r = 0; r < pml.length; r++) {
    const p = pml[r], bh = p.bh, ch = p.ch, psi = p.psiH, lo = p.hLo, hi = p.hHi;
    for (let i = lo; i < hi; i++) {
      const k = i - lo;
      const v = bh[k] * psi[k] + ch[k] * (e[i + 1] - e[i]);
      psi[k] = v;
      h[i] += db[i] * v;
    }
  }
  if (s.injH >= 0) h[s.injH] += db[s.injH] * s.injHValue;
}

/** E step: eⁿ⁺¹ from eⁿ and hⁿ⁺¹ᐟ². */
export function updateE(s: KernelState): void {
  const e = s.e, h = s.h, ca = s.ca, cb = s.cb, m = h.length;
  const d = s.disp;
  if (d !== null) dispersivePre(d, e);
  let hl = h[0];
  for (let i = 1; i < m; i++) {
    const hr = h[i];
    e[i] = ca[i] * e[i] + cb[i] * (hr - hl);
    hl = hr;
  }
  const pml = s.pml;
  for (let r = 0; r < pml.length; r++) {
    const p = pml[r], be = p.be, ce = p.ce, psi = p.psiE, lo = p.eLo, hi = p.eHi;
    for (let i = lo; i < hi; i++) {
      const k = i - lo;
      const v = be[k] * psi[k] + ce[k] * (h[i] - h[i - 1]);
      psi[k] = v;
      e[i] += cb[i] * v;
    }
  }
  if (s.injE >= 0) e[s.injE] += cb[s.injE] * s.injEValue;
  if (d !== null) dispersivePost(d, e);
}

/** Before the E update: advance the second-order poles (they need Eⁿ), gather the polarization terms. */
function dispersivePre(d: DispersiveSpan, e: Float64Array): void {
  const lo = d.lo, len = d.hi - d.lo, acc = d.acc, eOld = d.eOld;
  for (let k = 0; k < len; k++) { acc[k] = 0; eOld[k] = e[lo + k]; }
  const osc = d.osc;
  for (let q = 0; q < osc.length; q++) {
    const o = osc[q], p = o.p, pOld = o.pOld, zeta = o.zeta, alpha = o.alpha, xi = o.xi;
    const off = o.lo - lo, n = o.hi - o.lo;
    for (let k = 0; k < n; k++) {
      const pNew = alpha * p[k] + xi * pOld[k] + zeta[k] * e[o.lo + k];
      acc[off + k] -= pNew - p[k];
      pOld[k] = p[k];
      p[k] = pNew;
    }
  }
  const deb = d.debye;
  for (let q = 0; q < deb.length; q++) {
    const g = deb[q], p = g.p, oneMinusA = 1 - g.a;
    const off = g.lo - lo, n = g.hi - g.lo;
    for (let k = 0; k < n; k++) acc[off + k] += oneMinusA * p[k];
  }
}

/** After the E update: add the polarization terms, then advance the Debye poles (they need Eⁿ⁺¹). */
function dispersivePost(d: DispersiveSpan, e: Float64Array): void {
  const lo = d.lo, len = d.hi - d.lo, acc = d.acc, cp = d.cp, eOld = d.eOld;
  for (let k = 0; k < len; k++) e[lo + k] += cp[k] * acc[k];
  const deb = d.debye;
  for (let q = 0; q < deb.length; q++) {
    const g = deb[q], p = g.p, b = g.b, a = g.a;
    const off = g.lo - lo, n = g.hi - g.lo;
    for (let k = 0; k < n; k++) p[k] = a * p[k] + b[k] * (e[g.lo + k] + eOld[off + k]);
  }
}

/** A bare state of n E nodes (all coefficients zero); builders fill the coefficients. */
export function emptyKernelState(n: number): KernelState {
  return {
    n, e: new Float64Array(n), h: new Float64Array(n - 1),
    ca: new Float64Array(n), cb: new Float64Array(n), db: new Float64Array(n - 1),
    pml: [], disp: null, injH: -1, injHValue: 0, injE: -1, injEValue: 0,
  };
}
