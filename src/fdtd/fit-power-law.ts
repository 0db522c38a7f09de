// Fit an ITU-R P.2040 power-law material (ε' = a f^b, σ = c f^d, f in GHz) over a band with a causal
// model the kernel can step: ε∞ + Σ Δε_k/(1 + jωτ_k) − jσ/(ωε0), all coefficients ≥ 0 and ε∞ ≥ 1,
// with fixed log-spaced relaxation times (non-negative least squares, Lawson & Hanson).
// The fit's worst relative error in ε' and ε'' over the band is reported beside the results.

import type { PowerLawModel } from '../materials/types.ts';
import { permittivity } from '../materials/permittivity.ts';
import { C0_m_per_s, EPS0_F_per_m } from '../units.ts';
import type { StepModel } from './media.ts';
import { stepModelPermittivity } from './media.ts';
import { nnls } from './nnls.ts';

export interface PowerLawFit {
  /** Material name (as the stack names it). */
  material: string;
  band_Hz: [number, number];
  model: StepModel;
  /** max |ε'_fit − ε'| / ε' over the band. */
  maxRelErr_re: number;
  /** max |ε''_fit − ε''| / ε'' over the band (0 when the material is lossless). */
  maxRelErr_im: number;
  /** max |ε_fit − ε| / |ε| over the band. */
  maxRelErr_abs: number;
}

/** Broad resonances at these multiples of the fit's top frequency (Q = 1). */
const OSC_ABOVE = [1.2, 1.5, 2.2, 3];
/** Quality factors of those resonances. */
const OSC_Q = [0.5, 1, 2];
/** Drude-like terms with collision rates at these multiples of the fit's bottom frequency. */
const DRUDE_BELOW = [0.05, 0.2, 0.6, 0.9];
/** The fit covers the band widened by this factor at each end. */
const FIT_MARGIN = 1.02;
/** Rounds of minimax reweighting after the first least-squares fit. */
const REWEIGHT_ROUNDS = 16;
/** Evaluation points of the error report. */
const CHECK_POINTS = 201;

/**
 * @param thickness_m total thickness of this material in the stack (0 for a half-space): the fit then
 *   weights each frequency by the phase the material accumulates there, so the error it leaves in a
 *   thick wall's transmission is spread evenly over the band instead of piling up at the top.
 */
export function fitPowerLaw(pl: PowerLawModel, band_Hz: [number, number], material = 'power-law', thickness_m = 0): PowerLawFit {
  const [f1, f2] = band_Hz;
  // Fit slightly beyond the band: the pulse carries some energy there too.
  const lo = f1 / FIT_MARGIN, hi = f2 * FIT_MARGIN;
  const decades = Math.log10(hi / lo);
  const nPoles = Math.max(3, Math.ceil(2.5 * decades) + 3);
  // Relaxation times from 1/(2π·3 hi) to 3/(2π lo), log-spaced.
  const tMin = 1 / (2 * Math.PI * hi * 3), tMax = 3 / (2 * Math.PI * lo);
  const taus: number[] = [];
  for (let k = 0; k < nPoles; k++) taus.push(tMin * Math.pow(tMax / tMin, nPoles === 1 ? 0 : k / (nPoles - 1)));
  // Second-order terms let ε' rise with frequency inside the band (Debye poles and σ can only make it
  // fall), which a power law with constant ε' and falling ε'' needs: broad resonances above the band
  // and Drude-like terms (ω0 = 0) with collision rates below it. All passive, all stable.
  const osc: { w0sq: number; gamma: number }[] = [];
  for (const k of OSC_ABOVE) for (const q of OSC_Q) { const w0 = 2 * Math.PI * hi * k; osc.push({ w0sq: w0 * w0, gamma: w0 / q }); }
  for (const k of DRUDE_BELOW) osc.push({ w0sq: 0, gamma: 2 * Math.PI * lo * k });
  const nOsc = osc.length;
  const nf = 80;
  const n = 2 + nPoles + nOsc; // x = [ε∞ − 1, σ, Δε_1 … Δε_K, c_1 … c_M]
  const m = 2 * nf;
  const A = new Float64Array(m * n), b = new Float64Array(m);
  for (let i = 0; i < nf; i++) {
    const f = lo * Math.pow(hi / lo, i / (nf - 1)), w = 2 * Math.PI * f;
    const e = permittivity(pl, f);
    const er = e.re, ei = -e.im; // ε', ε''
    // Both parts weighted alike by 1/|ε| (a relative error in the complex ε, which is what sets the
    // face's reflection) times 1 + ½ k0 n d (the phase a relative error in ε adds across the layer).
    const g = 1 + (Math.PI * f * Math.sqrt(Math.max(er, 1)) * thickness_m) / C0_m_per_s;
    const wr = g / Math.max(Math.hypot(er, ei), 1e-6);
    const wi = wr;
    const r = 2 * i, s = 2 * i + 1;
    A[r * n + 0] = wr; b[r] = (er - 1) * wr;
    A[s * n + 1] = wi / (w * EPS0_F_per_m); b[s] = ei * wi;
    for (let k = 0; k < nPoles; k++) {
      const wt = w * taus[k], d = 1 + wt * wt;
      A[r * n + 2 + k] = wr / d;
      A[s * n + 2 + k] = (wi * wt) / d;
    }
    for (let k = 0; k < nOsc; k++) {
      const a = osc[k].w0sq - w * w, b = w * osc[k].gamma, d = a * a + b * b; // c/(a + jb)
      A[r * n + 2 + nPoles + k] = (wr * a) / d;
      A[s * n + 2 + nPoles + k] = (wi * b) / d;
    }
  }
  // Column scaling for conditioning.
  const cs = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s2 = 0;
    for (let i = 0; i < m; i++) s2 += A[i * n + j] ** 2;
    cs[j] = s2 > 0 ? 1 / Math.sqrt(s2) : 1;
    for (let i = 0; i < m; i++) A[i * n + j] *= cs[j];
  }
  // Least squares first, then a few rounds of Lawson's reweighting (row weights grow where the
  // residual is large) to push the fit toward the smallest worst-case error the report quotes.
  const u = new Float64Array(m).fill(1);
  const Aw = new Float64Array(m * n), bw = new Float64Array(m);
  let best: Float64Array | null = null, bestWorst = Infinity;
  for (let round = 0; round < REWEIGHT_ROUNDS; round++) {
    for (let i = 0; i < m; i++) {
      const s = Math.sqrt(u[i]);
      for (let j = 0; j < n; j++) Aw[i * n + j] = A[i * n + j] * s;
      bw[i] = b[i] * s;
    }
    const xs = nnls(Aw, m, n, bw);
    let worst = 0, total = 0;
    const res = new Float64Array(m);
    for (let i = 0; i < m; i++) {
      let r = b[i];
      for (let j = 0; j < n; j++) r -= A[i * n + j] * xs[j];
      res[i] = Math.abs(r);
      worst = Math.max(worst, res[i]);
    }
    if (worst < bestWorst) { bestWorst = worst; best = xs; }
    for (let i = 0; i < m; i++) { u[i] *= res[i] + 1e-6 * worst; total += u[i]; }
    for (let i = 0; i < m; i++) u[i] *= m / total;
  }
  const x = (best as Float64Array).map((v, j) => v * cs[j]);
  const model: StepModel = {
    epsInf: 1 + x[0], sigma: x[1],
    debye: taus.map((tau_s, k) => ({ deps: x[2 + k], tau_s })).filter((p) => p.deps > 0),
    osc: osc.map((o, k) => ({ c: x[2 + nPoles + k], w0sq: o.w0sq, gamma: o.gamma })).filter((o) => o.c > 0),
  };
  let eRe = 0, eIm = 0, eAbs = 0;
  for (let i = 0; i < CHECK_POINTS; i++) {
    const f = f1 + ((f2 - f1) * i) / (CHECK_POINTS - 1);
    const t = permittivity(pl, f), g = stepModelPermittivity(model, f);
    eRe = Math.max(eRe, Math.abs(g.re - t.re) / Math.abs(t.re));
    if (t.im !== 0) eIm = Math.max(eIm, Math.abs(g.im - t.im) / Math.abs(t.im));
    eAbs = Math.max(eAbs, Math.hypot(g.re - t.re, g.im - t.im) / Math.hypot(t.re, t.im));
  }
  return { material, band_Hz: [f1, f2], model, maxRelErr_re: eRe, maxRelErr_im: eIm, maxRelErr_abs: eAbs };
}
