// Fit a sampled permittivity — an ITU-R P.2040 power law (ε' = a f^b, σ = c f^d, f in GHz) or a measured table —
// with a causal model the kernel can step:  ε∞ − jσ/(ωε0) + Σ c_k/(ω_k² − ω² + jωγ_k), every coefficient ≥ 0,
// ε∞ ≥ 1. The target is any ε(f) with the range where it has values (a table's rows; a power law has any).
// Each term is passive (its ε'' ≥ 0 at every frequency), so the sum is passive and obeys Kramers–Kronig
// (common practice, no source). Heavily damped terms (Q ≪ 1) act as Debye relaxations, lightly damped ones
// above the band let ε' rise with frequency as the table's flat ε' with falling ε'' needs, and with no
// Drude term (ω_k = 0) the only static conductivity is σ, which is capped at the table's own σ at the
// bottom of the fitted range (σ_eff = ωε0ε'' there): the fit invents no DC conduction the table lacks.
//
// The fit is a linear program (simplex.ts): minimize t subject to
//   |ΔR(f)|·s ≤ t and |ΔT(f)|·s ≤ t, with ΔR ≈ ∂R/∂ε'·(ε'_fit − ε') + ∂R/∂ε''·(ε''_fit − ε'') (T alike),
//   w_floor·|ε'_fit − ε'|/ε' ≤ t  and  w_floor·|ε''_fit − ε''|/ε'' ≤ t,
//   ε'_fit ≥ 1 from half the band's bottom to twice its top,  σ ≤ σ_table(bottom of the fitted range),
// over the band and the pulse's spectral support around it, as far as the target has values (every row's weight
// there falls with the pulse's content, well below the band's). ΔR and ΔT are the first-order change of the
// probes' response the fit's error makes (`probeSensitivity`, the derivatives from the exact solution of the
// stack at its angle and polarization); |·| is bounded by a hexagon (Re(e^{jθ}ΔR)·s ≤ t at six θ), s scales a
// unit relative error where the probes see most to about 1, and w_floor bounds the relative errors too, so
// neither part is ignored where the probes cannot see it (a wall that swallows a wave does not make its depth
// matter; an error of ε' that one of ε'' offsets in R and T is cheap). Without a stack (no sensitivity), the
// relative errors of ε' and ε'' alone are minimized. Kramers–Kronig forbids a flat ε' with a falling ε'',
// so for a power law a residue remains; a measured table is fitted as closely as its own causality allows.
// Either way the residue is reported beside the results (worst errors over the band).
// The same program fits a permeability the engine cannot step as it is — a fixed μ' − jμ'' with loss (constant
// over the band, not causal either) or a measured μ table — with μ∞ and μ' ≥ min(1, μ') and no conduction term.

import type { Complex } from '../complex.ts';
import type { PowerLawModel, TableModel } from '../materials/types.ts';
import { permittivity } from '../materials/permittivity.ts';
import { tableInterpolant } from '../materials/table.ts';
import { EPS0_F_per_m } from '../units.ts';
import type { StepModel } from './media.ts';
import { stepModelPermittivity } from './media.ts';
import { pulseForBand, pulseSpectrumRelative, type PulseShape } from './pulse.ts';
import type { ProbeSensitivity, ResponseDerivatives } from './probe-sensitivity.ts';
import { minimizeLp } from './simplex.ts';

/** What a fit approximates: ε_r(f) (or μ_r(f)) where it has values. */
export interface FitTarget {
  /** The model the numbers come from. */
  source: 'power-law' | 'table' | 'fixed';
  /** The permittivity (default) or the permeability. */
  quantity?: 'permittivity' | 'permeability';
  /** ε_r = ε' − jε'' at f_Hz as {re: ε', im: −ε''} (f inside `range_Hz`); μ_r for a permeability. */
  eps: (f_Hz: number) => Complex;
  /** Frequencies with values (a table's rows), or null for any. */
  range_Hz: [number, number] | null;
  /** ε∞ and ε' over the wide range stay at or above this (default 1). */
  floor?: number;
  /** False: no conduction term (a permeability). */
  conduction?: boolean;
  /** A resonant target (a magnetic material's μ): the finer dictionary of terms. */
  resonant?: boolean;
}

export const powerLawTarget = (pl: PowerLawModel): FitTarget => ({ source: 'power-law', eps: (f) => permittivity(pl, f), range_Hz: null });
export const tableTarget = (t: TableModel): FitTarget =>
  ({ source: 'table', eps: (f) => permittivity(t, f), range_Hz: [...tableInterpolant(t.points).range_Hz] as [number, number] });
/** A permeability to fit: a fixed μ with loss, or a measured μ table (`mu_points`). */
export function permeabilityTarget(source: 'fixed' | 'table', mu: (f_Hz: number) => Complex, range_Hz: [number, number] | null, lowest_mu_re: number): FitTarget {
  return { source, quantity: 'permeability', eps: mu, range_Hz, floor: Math.min(1, lowest_mu_re), conduction: false, resonant: true };
}

/** A fitted causal model (the name says where fits began; tables are fitted the same way). */
export interface PowerLawFit {
  /** Material name (as the stack names it). */
  material: string;
  /** The model fitted, and which quantity (permittivity or permeability). */
  source: FitTarget['source'];
  quantity: 'permittivity' | 'permeability';
  band_Hz: [number, number];
  model: StepModel;
  /** max |ε'_fit − ε'| / ε' over the band. */
  maxRelErr_re: number;
  /** max |ε''_fit − ε''| / ε'' over the band (0 when the material is lossless). */
  maxRelErr_im: number;
  /** max |ε_fit − ε| / |ε| over the band. */
  maxRelErr_abs: number;
  /** Smallest ε'_fit (μ') from half the band's bottom to twice its top (≥ the floor by construction). */
  minEpsRe_wide: number;
  /** Frequencies the fit covered (the band and the pulse's support around it). */
  fitRange_Hz: [number, number];
}

export interface FitOptions {
  /** How R and T at the probes change with this material's ε' and ε'' (default: none; the relative errors of
   *  ε' and ε'' alike are minimized). */
  sensitivity?: ProbeSensitivity;
  /** The run's pulse (default: the engine's pulse for the band). */
  pulse?: PulseShape;
}

/** Resonance frequencies of the terms: per decade, and how far beyond the fitted range they reach (decades). */
const TERMS_PER_DECADE = 6;
const TERMS_BELOW_DECADES = 2;
const TERMS_ABOVE_DECADES = 2;
/** Quality factors ω_k/γ_k of the terms (0.02: a Debye relaxation in all but name). */
const TERM_Q = [0.02, 0.1, 0.3, 1, 3, 10];
/** For a resonant target (a permeability: a magnetic material's natural resonance has a Q near 1), denser:
 *  a Lorentz μ of Q = 0.5 is fitted to 5e-4 with these, to 10 % with the power law's. */
const RESONANT_TERMS_PER_DECADE = 4;
const RESONANT_TERM_Q = [0.02, 0.1, 0.2, 0.3, 0.5, 0.7, 1, 2, 3, 5, 10];
/** At most this many terms per decade of the fitted range, plus TERM_BUDGET_BASE. */
const TERM_BUDGET_PER_DECADE = 3;
const TERM_BUDGET_BASE = 8;
const PRUNED_ERROR_RATIO = 1.1;
/** No term relaxes slower than this many periods of the bottom of the fitted range (the run waits for it). */
const SLOWEST_RELAXATION_PERIODS = 10 / (2 * Math.PI);
/** Samples per decade in the band (at least BAND_MIN_SAMPLES) and outside it. */
const BAND_SAMPLES_PER_DECADE = 40;
const BAND_MIN_SAMPLES = 40;
const OUTSIDE_SAMPLES_PER_DECADE = 12;
/** The fit covers the pulse's content down to this level relative to its peak … */
const SUPPORT_LEVEL = 0.01;
/** … but no lower than this fraction of the band's bottom and no higher than this multiple of its top. */
const SUPPORT_LOW_LIMIT = 0.5;
const SUPPORT_HIGH_LIMIT = 3;
/** Outside the band, weights are this fraction of the band's at its edges, falling with the pulse's content. */
const OUTSIDE_WEIGHT = 0.03;
/** With the probes' sensitivity: the relative errors of ε' and ε'' are bounded too, at this weight beside the
 *  response's (scaled by its largest sensitivity in the band), so neither part is ignored where the probes cannot see it. */
const WEIGHT_FLOOR = 0.15;
/** |ΔR| ≤ t as a polygon: Re(e^{jθ}ΔR) ≤ t at this many directions θ (a hexagon: overestimates |ΔR| by at most
 *  1/cos(π/6), 15 %; an octagon's 8 % changes the model share by a few percent and costs a third more rows). */
const DIRECTIONS = 6;
/** ε' ≥ 1 is imposed at this many points from half the band's bottom to twice its top, then wherever it fails. */
const EPS_RE_CHECKS = 40;
const EPS_RE_ROUNDS = 4;
/** Cost of a unit (scaled) coefficient beside the worst weighted error: keeps the simplex off degenerate vertices. */
const COEFFICIENT_COST = 1e-9;
/** Evaluation points of the error report and of the ε' ≥ 1 check. */
const CHECK_POINTS = 201;
const WIDE_CHECK_POINTS = 600;

interface Sample { f: number; w: number; re: number; im: number; d?: ResponseDerivatives }

const logspace = (a: number, b: number, n: number): number[] =>
  n <= 1 ? [a] : Array.from({ length: n }, (_, i) => a * Math.pow(b / a, i / (n - 1)));

/**
 * Band and out-of-band samples with their base weights (1 in the band, falling with the pulse outside), within
 * the target's range.
 */
function samples(target: FitTarget, band: [number, number], pulse: PulseShape): { list: Sample[]; range: [number, number] } {
  const [f1, f2] = band;
  const edge = Math.min(pulseSpectrumRelative(pulse, f1), pulseSpectrumRelative(pulse, f2));
  const peak = pulseSpectrumRelative(pulse, pulse.f0_Hz);
  const [loLimit, hiLimit] = target.range_Hz ?? [0, Infinity];
  let lo = f1, hi = f2;
  while (lo > f1 * SUPPORT_LOW_LIMIT && pulseSpectrumRelative(pulse, lo / 1.05) > SUPPORT_LEVEL * peak) lo /= 1.05;
  while (hi < f2 * SUPPORT_HIGH_LIMIT && pulseSpectrumRelative(pulse, hi * 1.05) > SUPPORT_LEVEL * peak) hi *= 1.05;
  lo = Math.min(f1, Math.max(lo, loLimit));
  hi = Math.max(f2, Math.min(hi, hiLimit));
  const fs: { f: number; w: number }[] = [];
  const decades = (a: number, b: number) => Math.log10(b / a);
  const nBand = Math.max(BAND_MIN_SAMPLES, Math.ceil(BAND_SAMPLES_PER_DECADE * decades(f1, f2)));
  // Log and linear spacing together: the bottom of a wide band and its top both get samples.
  for (const f of logspace(f1, f2, nBand)) fs.push({ f, w: 1 });
  for (let i = 1; i < nBand - 1; i += 2) fs.push({ f: f1 + ((f2 - f1) * i) / (nBand - 1), w: 1 });
  const outside = (a: number, b: number, skipFirst: boolean): void => {
    const n = Math.ceil(OUTSIDE_SAMPLES_PER_DECADE * decades(a, b)) + 1;
    if (n < 2) return;
    logspace(a, b, n).forEach((f, i) => {
      if ((skipFirst && i === 0) || (!skipFirst && i === n - 1)) return;
      fs.push({ f, w: OUTSIDE_WEIGHT * Math.min(1, pulseSpectrumRelative(pulse, f) / edge) });
    });
  };
  if (lo < f1) outside(lo, f1, false);
  if (hi > f2) outside(f2, hi, true);
  const list = fs.map(({ f, w }) => {
    const e = target.eps(f);
    return { f, w, re: e.re, im: -e.im };
  });
  return { list, range: [lo, hi] };
}

interface Term { w0sq: number; gamma: number }

function dictionary(range: [number, number], resonant = false): Term[] {
  const a = range[0] / 10 ** TERMS_BELOW_DECADES, b = range[1] * 10 ** TERMS_ABOVE_DECADES;
  const n = Math.ceil((resonant ? RESONANT_TERMS_PER_DECADE : TERMS_PER_DECADE) * Math.log10(b / a)) + 1;
  const out: Term[] = [];
  for (const f of logspace(a, b, n)) {
    const w0 = 2 * Math.PI * f;
    for (const q of resonant ? RESONANT_TERM_Q : TERM_Q) {
      // Slowest time constant of the term: 2Q/ω0 when it rings, 1/(Qω0) when overdamped.
      const tau = Math.max(2 * q, 1 / q) / w0;
      if (tau <= SLOWEST_RELAXATION_PERIODS / range[0]) out.push({ w0sq: w0 * w0, gamma: w0 / q });
    }
  }
  return out;
}

/** ε' and ε'' of each unknown at angular frequency w: [ε∞ − floor, σ, c_1 … c_K] (unit coefficients). */
function columns(terms: Term[], w: number, outRe: Float64Array, outIm: Float64Array): void {
  outRe[0] = 1; outIm[0] = 0;
  outRe[1] = 0; outIm[1] = 1 / (w * EPS0_F_per_m);
  for (let k = 0; k < terms.length; k++) {
    const t = terms[k], a = t.w0sq - w * w, b = w * t.gamma, d = a * a + b * b;
    outRe[2 + k] = a / d; outIm[2 + k] = b / d;
  }
}

/** The fit of a power law (see fitPermittivity). */
export const fitPowerLaw = (pl: PowerLawModel, band_Hz: [number, number], material = 'power-law', options: FitOptions = {}): PowerLawFit =>
  fitPermittivity(powerLawTarget(pl), band_Hz, material, options);

/** The causal fit of the header comment to `target` over `band_Hz` (inside the target's range). */
export function fitPermittivity(target: FitTarget, band_Hz: [number, number], material: string, options: FitOptions = {}): PowerLawFit {
  const [f1, f2] = band_Hz;
  const { list, range } = samples(target, band_Hz, options.pulse ?? pulseForBand(band_Hz));
  const terms = dictionary(range, target.resonant);
  if (options.sensitivity) for (const s of list) s.d = options.sensitivity(s.f);
  const weights = errorWeights(list, options.sensitivity !== undefined);
  // σ ≤ the target's effective conductivity ωε0ε'' at the bottom of the fitted range (no invented DC conduction).
  const sigmaMax = target.conduction === false ? 0 : Math.max(0, -target.eps(range[0]).im * 2 * Math.PI * range[0] * EPS0_F_per_m);
  const floor = target.floor ?? 1;
  // ε' ≥ floor: imposed at fixed points, then (cutting planes) wherever the fit still dips below it.
  const checks = logspace(f1 / 2, 2 * f2, EPS_RE_CHECKS);
  const solve = (dict: Term[]): { model: StepModel; t: number } => {
    let fit = solveFit(list, weights, dict, checks, sigmaMax, floor);
    for (let round = 0; round < EPS_RE_ROUNDS; round++) {
      const dips = epsReDips(fit.model, [f1 / 2, 2 * f2], floor);
      if (dips.length === 0) break;
      checks.push(...dips);
      fit = solveFit(list, weights, dict, checks, sigmaMax, floor);
    }
    return fit;
  };
  const full = solve(terms);
  let model = full.model;
  // Every term costs the run a pole update per cell and step: beyond the budget, the terms that matter least
  // (smallest largest share of ε over the samples) are dropped and the rest refitted; the refit is kept only if
  // its worst weighted error is within PRUNED_ERROR_RATIO of the full dictionary's.
  const budget = Math.ceil(TERM_BUDGET_PER_DECADE * Math.log10(range[1] / range[0])) + TERM_BUDGET_BASE;
  if (model.osc.length > budget) {
    const share = (o: StepModel['osc'][number]): number => {
      let top = 0;
      for (const s of list) {
        const w = 2 * Math.PI * s.f, a = o.w0sq - w * w, b = w * o.gamma, d = a * a + b * b;
        top = Math.max(top, (o.c * Math.hypot(a, b)) / d / Math.hypot(s.re, s.im));
      }
      return top;
    };
    const kept = model.osc.map((o) => ({ o, v: share(o) })).sort((x, y) => y.v - x.v).slice(0, budget);
    const pruned = solve(kept.map(({ o }) => ({ w0sq: o.w0sq, gamma: o.gamma })));
    if (pruned.t <= PRUNED_ERROR_RATIO * full.t) model = pruned.model;
  }
  return {
    material, source: target.source, quantity: target.quantity ?? 'permittivity', band_Hz: [f1, f2], model,
    ...fitErrors(target, model, band_Hz), fitRange_Hz: range,
  };
}

/**
 * Weights: on the relative errors of ε' and ε'' (the sample's base weight; WEIGHT_FLOOR of it when the response
 * is bounded as well), and the scale of the response rows, 1/(the largest change of R and T per unit relative
 * change of ε' or ε'' in the band), so a unit relative error where the probes see most costs about 1.
 */
function errorWeights(list: Sample[], sensed: boolean): { rel: number[]; response: number } {
  if (!sensed) return { rel: list.map((s) => s.w), response: 0 };
  let top = 1e-300;
  const lossless = list.every((s) => s.im === 0);
  for (const s of list) {
    if (s.w !== 1 || !s.d) continue;
    const d = s.d;
    top = Math.max(top, (Math.hypot(d.dR_re.re, d.dR_re.im) + Math.hypot(d.dT_re.re, d.dT_re.im)) * s.re,
      (Math.hypot(d.dR_im.re, d.dR_im.im) + Math.hypot(d.dT_im.re, d.dT_im.im)) * (lossless ? s.re : s.im));
  }
  return { rel: list.map((s) => WEIGHT_FLOOR * s.w), response: 1 / top };
}

/** Frequencies where ε'_fit dips below 1: local minima of a fine grid, refined by golden-section search. */
function epsReDips(model: StepModel, [a, b]: [number, number], floor: number): number[] {
  const fs = logspace(a, b, WIDE_CHECK_POINTS), re = (f: number) => stepModelPermittivity(model, f).re;
  const v = fs.map(re);
  const out: number[] = [];
  for (let i = 0; i < fs.length; i++) {
    if ((i > 0 && v[i] > v[i - 1]) || (i < fs.length - 1 && v[i] > v[i + 1])) continue;
    // Golden-section search for the minimum between the neighbours (in log f).
    let lo = Math.log(fs[Math.max(0, i - 1)]), hi = Math.log(fs[Math.min(fs.length - 1, i + 1)]);
    const g = (Math.sqrt(5) - 1) / 2;
    for (let it = 0; it < 40; it++) {
      const x1 = hi - g * (hi - lo), x2 = lo + g * (hi - lo);
      if (re(Math.exp(x1)) < re(Math.exp(x2))) hi = x2; else lo = x1;
    }
    const f = Math.exp((lo + hi) / 2);
    if (re(f) < floor) out.push(f);
  }
  return out;
}

/** The linear program of the header comment, solved: its unknowns as a step model, and its worst weighted error t. */
function solveFit(list: Sample[], weights: { rel: number[]; response: number }, terms: Term[], checks: number[], sigmaMax: number, floor: number): { model: StepModel; t: number } {
  const lossless = list.every((s) => s.im === 0);
  const nx = 2 + terms.length, n = nx + 1; // unknowns, then t
  // A response row binds only where the response is more sensitive than the floor rows allow: elsewhere
  // |ΔR|·scale ≤ (|∂R/∂ε'|ε' + |∂R/∂ε''|ε'')·scale·max(|e'|, |e''|) ≤ WEIGHT_FLOOR·max(|e'|, |e''|) ≤ t already.
  const sensed = (s: Sample, dRe: Complex, dIm: Complex) =>
    (Math.hypot(dRe.re, dRe.im) * s.re + Math.hypot(dIm.re, dIm.im) * (lossless ? s.re : s.im)) * weights.response > WEIGHT_FLOOR;
  let responseRows = 0;
  if (weights.response > 0) {
    for (const s of list) {
      if (s.d && sensed(s, s.d.dR_re, s.d.dR_im)) responseRows += DIRECTIONS;
      if (s.d && sensed(s, s.d.dT_re, s.d.dT_im)) responseRows += DIRECTIONS;
    }
  }
  const m = 4 * list.length + responseRows + checks.length + 1;
  const G = new Float64Array(m * n), h = new Float64Array(m);
  const cr = new Float64Array(nx), ci = new Float64Array(nx);
  // Column scales: each unknown's largest relative contribution over the samples becomes 1 (conditioning).
  const scale = new Float64Array(nx);
  for (const s of list) {
    columns(terms, 2 * Math.PI * s.f, cr, ci);
    for (let j = 0; j < nx; j++) scale[j] = Math.max(scale[j], Math.abs(cr[j]) / s.re, s.im > 0 ? Math.abs(ci[j]) / s.im : 0);
  }
  for (let j = 0; j < nx; j++) scale[j] = scale[j] > 0 ? 1 / scale[j] : 0;
  let row = 0;
  const put = (coefRe: number, coefIm: number, rhs: number, tCoef: number): void => {
    for (let j = 0; j < nx; j++) G[row * n + j] = (coefRe * cr[j] + coefIm * ci[j]) * scale[j];
    G[row * n + nx] = tCoef;
    h[row] = rhs;
    row++;
  };
  list.forEach((s, i) => {
    columns(terms, 2 * Math.PI * s.f, cr, ci);
    const ar = weights.rel[i] / s.re;
    put(ar, 0, ar * (s.re - floor), 1); //  w'(ε'_fit − ε')/ε' ≥ −t
    put(-ar, 0, -ar * (s.re - floor), 1); // w'(ε'_fit − ε')/ε' ≤ t
    const ai = weights.rel[i] / (lossless ? s.re : s.im); // a lossless table: ε'' relative to ε'
    put(0, ai, ai * s.im, 1);
    put(0, -ai, -ai * s.im, 1);
    // The response: ΔR ≈ ∂R/∂ε'·(ε'_fit − ε') + ∂R/∂ε''·(ε''_fit − ε''), Re(e^{jθ}ΔR)·w ≤ t (and T alike).
    if (weights.response === 0 || !s.d) return;
    for (const [dRe, dIm] of [[s.d.dR_re, s.d.dR_im], [s.d.dT_re, s.d.dT_im]]) {
      if (!sensed(s, dRe, dIm)) continue;
      for (let k = 0; k < DIRECTIONS; k++) {
        const c = Math.cos((2 * Math.PI * k) / DIRECTIONS), sn = Math.sin((2 * Math.PI * k) / DIRECTIONS);
        const p = (c * dRe.re - sn * dRe.im) * s.w * weights.response, q = (c * dIm.re - sn * dIm.im) * s.w * weights.response;
        put(-p, -q, -(p * (s.re - floor) + q * s.im), 1);
      }
    }
  });
  for (const f of checks) { columns(terms, 2 * Math.PI * f, cr, ci); put(1, 0, 0, 0); } // ε'_fit − floor ≥ 0
  cr.fill(0); ci.fill(0); cr[1] = -1;
  put(1, 0, -sigmaMax, 0); // −σ ≥ −σ_max
  const c = new Float64Array(n);
  for (let j = 0; j < nx; j++) c[j] = COEFFICIENT_COST * (1 + j / nx); // distinct costs: no ties
  c[nx] = 1;
  const sol = minimizeLp(c, G, h, m, n);
  const x = Array.from({ length: nx }, (_, j) => sol.x[j] * scale[j]);
  const model: StepModel = {
    epsInf: floor + x[0], sigma: x[1], debye: [],
    osc: terms.map((t, k) => ({ c: x[2 + k], w0sq: t.w0sq, gamma: t.gamma })).filter((o) => o.c > 0),
  };
  return { model, t: sol.x[nx] };
}

/** Worst relative errors over the band and the smallest ε' from half its bottom to twice its top. */
export function fitErrors(target: FitTarget, model: StepModel, band: [number, number]):
  Omit<PowerLawFit, 'material' | 'source' | 'quantity' | 'band_Hz' | 'model' | 'fitRange_Hz'> {
  const [f1, f2] = band;
  let eRe = 0, eIm = 0, eAbs = 0;
  for (let i = 0; i < CHECK_POINTS; i++) {
    // Linear and logarithmic spacing (a wide band's bottom decade gets points too).
    for (const f of [f1 + ((f2 - f1) * i) / (CHECK_POINTS - 1), f1 * Math.pow(f2 / f1, i / (CHECK_POINTS - 1))]) {
      const t = target.eps(f), g = stepModelPermittivity(model, f);
      eRe = Math.max(eRe, Math.abs(g.re - t.re) / Math.abs(t.re));
      if (t.im !== 0) eIm = Math.max(eIm, Math.abs(g.im - t.im) / Math.abs(t.im));
      eAbs = Math.max(eAbs, Math.hypot(g.re - t.re, g.im - t.im) / Math.hypot(t.re, t.im));
    }
  }
  let minRe = Infinity;
  for (const f of logspace(f1 / 2, 2 * f2, WIDE_CHECK_POINTS)) minRe = Math.min(minRe, stepModelPermittivity(model, f).re);
  for (const f of epsReDips(model, [f1 / 2, 2 * f2], target.floor ?? 1)) minRe = Math.min(minRe, stepModelPermittivity(model, f).re);
  return { maxRelErr_re: eRe, maxRelErr_im: eIm, maxRelErr_abs: eAbs, minEpsRe_wide: minRe };
}
