// The 1D Yee leapfrog kernel over flat Float64Arrays (Yee 1966; Taflove & Hagness, Computational
// Electrodynamics, 3rd ed., 2005, ch. 3, 7 and 9). Allocates nothing per step: a WebAssembly kernel
// can replace updateH/updateE one-for-one by working on the same arrays.
//
// Normalized fields: e = E (V/m), h = η0·H (V/m); on an oblique line, the tangential E and η0 times the
// tangential H (oblique.ts). With S = c0 Δt / Δx, both updates have the same trapezoidal (time-centred) form:
//   h[i]  (between e[i] and e[i+1]):  h[i] = da[i]·h[i] + db[i]·(e[i+1] − e[i] + ψH) + cpH·(magnetization terms)
//   e[i]:                             e[i] = ca[i]·e[i] + cb[i]·(h[i] − h[i−1] + ψE) + cp[i]·(polarization terms)
// from   ε∞ (Eⁿ⁺¹ − Eⁿ) + σΔt/(2ε0) (Eⁿ⁺¹ + Eⁿ) + (P̃ⁿ⁺¹ − P̃ⁿ) = S·curl H,  P̃ = P/ε0,
// and    μ∞ (Hⁿ⁺¹ᐟ² − Hⁿ⁻¹ᐟ²) + σ_mΔt/(2ε0) (…) + (M̃ⁿ⁺¹ᐟ² − M̃ⁿ⁻¹ᐟ²) = S·curl E   (the series model, media.ts).
// Without magnetic terms da = 1 and db = S/μ∞. Nodes 0 and n − 1 are conductor walls (never updated).
//
// Dispersive media, auxiliary differential equations (Taflove & Hagness ch. 9), every one discretized
// with the trapezoidal rule (the bilinear map s → (2/Δt)(z − 1)/(z + 1)), like σ; the same on both sides
// (F is E for the poles of the shunt model, η0H for those of the series model):
//   Debye   τ dP̃/dt + P̃ = Δ F:  P̃ⁿ⁺¹ = a P̃ⁿ + b (Fⁿ⁺¹ + Fⁿ), a = (2τ−Δt)/(2τ+Δt), b = Δ Δt/(2τ+Δt).
//   2nd order  P̃'' + γP̃' + ω0²P̃ = c F + d F'  (Lorentz and Drude have d = 0; partial fractions, inverse.ts, need d):
//           (P̃ⁿ⁺¹ − 2P̃ⁿ + P̃ⁿ⁻¹)/Δt² + γ(P̃ⁿ⁺¹ − P̃ⁿ⁻¹)/(2Δt) + ω0²(P̃ⁿ⁺¹ + 2P̃ⁿ + P̃ⁿ⁻¹)/4
//               = c(Fⁿ⁺¹ + 2Fⁿ + Fⁿ⁻¹)/4 + d(Fⁿ⁺¹ − Fⁿ⁻¹)/(2Δt),
//           P̃ⁿ⁺¹ = α P̃ⁿ + ξ P̃ⁿ⁻¹ + ζ0 Fⁿ⁺¹ + ζ1 Fⁿ + ζ2 Fⁿ⁻¹.
// Each pole's b or ζ0 multiplies Fⁿ⁺¹ and enters the denominator of the update (semi-implicit), so no pole
// is ever stepped explicitly. Stability: with every term bilinear, the von Neumann polynomial of the coupled
// scheme is s²(ε(s)μ(s) − S² sin²(k̃Δx/2)) + 4 S² sin²(k̃Δx/2)/Δt² = 0 in s = (2/Δt)(z − 1)/(z + 1); for
// S² ≤ ε∞μ∞ and passive media (sε(s), sμ(s) positive real) it has no root with Re s > 0, so |z| ≤ 1 however far
// above or below the band a pole lies (plan.ts, courantLimit; test/fdtd/stability.test.ts finds the roots).
// Subcell averaging weights every pole's strength by the fraction of the cell the material fills (`fill`):
// an E node's cell is [x − Δx/2, x + Δx/2], an H node's the span between its two E nodes.
//
// Pole state is kept node-major per material (PoleGroup), and each pole's update is done in one pass before
// the field update: what it still needs of Fⁿ⁺¹ is its b·Fⁿ⁺¹ or ζ0·Fⁿ⁺¹, which is already in the denominator,
// so the state holds P̃ⁿ⁺¹ less that term and completes itself at the next step from the F it finds there:
//   Debye: v = P̃ⁿ⁺¹ − bFⁿ⁺¹;   second order: u = P̃ⁿ⁺¹ − ζ0Fⁿ⁺¹ and P̃ⁿ (with Fⁿ kept in fOld for the next step).
// The E side's poles sit in `disp` (E nodes), the H side's in `mdisp` (H nodes), with the same layout and passes.
//
// CPML (Roden & Gedney, Microwave Opt. Tech. Lett. 27(5), 2000) with κ = 1 (1D needs no stretching):
//   ψ ← b ψ + c·(difference), b = exp(−(σ+α)Δt/ε0), c = σ/(σ+α)·(b − 1). The curl is replaced by curl + ψ,
//   so whatever medium fills the PML (lossy, dispersive, magnetic) is terminated as it is.

export interface PmlRegion {
  /** E nodes [eLo, eHi) with a ψE each. */
  eLo: number; eHi: number;
  be: Float64Array; ce: Float64Array; psiE: Float64Array;
  /** H nodes [hLo, hHi) with a ψH each. */
  hLo: number; hHi: number;
  bh: Float64Array; ch: Float64Array; psiH: Float64Array;
}

/**
 * The poles of one material over the nodes [lo, hi) of one field (E or H). Per-pole coefficients are for a full
 * cell; node k carries fill[k] of them. State, node-major: Debye v[k·nd + q]; second order u, P̃ⁿ at
 * oState[k·2no + 2q], [+1].
 */
export interface PoleGroup {
  lo: number; hi: number;
  fill: Float64Array;
  /** Debye poles: a, b; |Δ| (the energy's scale). */
  nd: number; da: Float64Array; db: Float64Array; dEps: Float64Array; dState: Float64Array;
  /** Second-order poles: α, ξ, ζ0, ζ1, ζ2; the energy's scale (c for a Lorentz or Drude term) and ω0². */
  no: number; oa: Float64Array; ox: Float64Array; oz: Float64Array; o1: Float64Array; o2: Float64Array;
  oc: Float64Array; ow0sq: Float64Array; oState: Float64Array;
  /** No second-order term has an s-numerator (ζ1 = 2ζ0 and ζ2 = ζ0 exactly): the update takes one product with f·(2Fⁿ + Fⁿ⁻¹). */
  plain: boolean;
}

/** The span of nodes of one field that carry any pole, with per-node scratch. */
export interface DispersiveSpan {
  lo: number; hi: number;
  /** Coefficient of the polarization terms (1 / denominator). */
  cp: Float64Array;
  /** The field one step back when a step begins (for the second-order poles); polarization accumulator. */
  eOld: Float64Array; acc: Float64Array;
  groups: PoleGroup[];
}

export interface KernelState {
  /** E nodes. */
  n: number;
  e: Float64Array;
  /** n − 1 H nodes; h[i] sits between e[i] and e[i+1]. */
  h: Float64Array;
  ca: Float64Array; cb: Float64Array;
  /** H coefficients (n − 1): da = 1 and db = S/μ∞ without H-side poles or σ_m (`mdisp` null means da ≡ 1). */
  da: Float64Array; db: Float64Array;
  pml: PmlRegion[];
  /** Poles on the E nodes (the shunt models) and on the H nodes (the series models). */
  disp: DispersiveSpan | null;
  mdisp: DispersiveSpan | null;
  /** Optional one-node injections (TF/SF corrections): added as db·value to h[injH], cb·value to e[injE]. */
  injH: number; injHValue: number;
  injE: number; injEValue: number;
}

/** H half step: hⁿ⁺¹ᐟ² from hⁿ⁻¹ᐟ² and eⁿ. */
export function updateH(s: KernelState): void {
  const e = s.e, h = s.h, da = s.da, db = s.db, m = h.length;
  const d = s.mdisp;
  if (d !== null) dispersivePre(d, h);
  // e[i] is carried in a register from the previous iteration (one load per cell instead of two).
  // Without H-side poles da is 1 everywhere (only σ_m and poles make it differ), so that loop skips it.
  let left = e[0];
  if (d === null) {
    for (let i = 0; i < m; i++) { const right = e[i + 1]; h[i] += db[i] * (right - left); left = right; }
  } else {
    for (let i = 0; i < m; i++) { const right = e[i + 1]; h[i] = da[i] * h[i] + db[i] * (right - left); left = right; }
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
  if (d !== null) dispersivePost(d, h);
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

/** Before a field's update: every pole advanced but for its Fⁿ⁺¹ term, the polarization terms gathered, Fⁿ saved. */
function dispersivePre(d: DispersiveSpan, e: Float64Array): void {
  const lo = d.lo, len = d.hi - d.lo, acc = d.acc, eOld = d.eOld;
  for (let k = 0; k < len; k++) acc[k] = 0;
  const groups = d.groups;
  for (let g = 0; g < groups.length; g++) {
    const G = groups[g], fill = G.fill, n = G.hi - G.lo, off = G.lo - lo;
    const nd = G.nd, da = G.da, db = G.db, v = G.dState;
    const no = G.no, oa = G.oa, ox = G.ox, oz = G.oz, o1 = G.o1, o2 = G.o2, st = G.oState;
    for (let k = 0; k < n; k++) {
      const E = e[G.lo + k], f = fill[k];
      // The node's share of Fⁿ, formed once for all its poles.
      const fE = f * E;
      let sum = 0;
      for (let q = 0, j = k * nd; q < nd; q++, j++) {
        const bE = db[q] * fE;
        const P = v[j] + bE; // P̃ⁿ
        sum += (1 - da[q]) * P;
        v[j] = da[q] * P + bE;
      }
      if (G.plain) {
        // Every term without an s-numerator (ζ1 = 2ζ0, ζ2 = ζ0): one product per term with f·(2Eⁿ + Eⁿ⁻¹).
        const fE2 = f * (2 * E + eOld[off + k]);
        for (let q = 0, j = 2 * k * no; q < no; q++, j += 2) {
          const P = st[j] + oz[q] * fE; // P̃ⁿ
          const partial = oa[q] * P + ox[q] * st[j + 1] + oz[q] * fE2;
          sum -= partial - P;
          st[j] = partial;
          st[j + 1] = P;
        }
      } else {
        const fEold = f * eOld[off + k];
        for (let q = 0, j = 2 * k * no; q < no; q++, j += 2) {
          const P = st[j] + oz[q] * fE; // P̃ⁿ
          const partial = oa[q] * P + ox[q] * st[j + 1] + (o1[q] * fE + o2[q] * fEold);
          sum -= partial - P;
          st[j] = partial;
          st[j + 1] = P;
        }
      }
      acc[off + k] += sum;
    }
  }
  for (let k = 0; k < len; k++) eOld[k] = e[lo + k];
}

/** After a field's update: add the polarization terms. */
function dispersivePost(d: DispersiveSpan, e: Float64Array): void {
  const lo = d.lo, len = d.hi - d.lo, acc = d.acc, cp = d.cp;
  for (let k = 0; k < len; k++) e[lo + k] += cp[k] * acc[k];
}

/** A bare state of n E nodes (all coefficients zero); builders fill the coefficients. */
export function emptyKernelState(n: number): KernelState {
  return {
    n, e: new Float64Array(n), h: new Float64Array(n - 1),
    ca: new Float64Array(n), cb: new Float64Array(n), da: new Float64Array(n - 1), db: new Float64Array(n - 1),
    pml: [], disp: null, mdisp: null, injH: -1, injHValue: 0, injE: -1, injEValue: 0,
  };
}
