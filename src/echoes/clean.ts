// Echo extraction by iterative subtraction (the CLEAN method, Högbom, Astron. Astrophys. Suppl. 15,
// 1974) with the incident pulse as the template:
//   1. cross-correlate the residual's analytic signal with the incident's (matched filter), by FFT;
//   2. take the strongest correlation peak; refine its delay τ to a fraction of a sample by a
//      golden-section search of |c(τ)| (c evaluated exactly as a sum over the FFT bins);
//   3. the echo's complex amplitude is the least-squares fit a = c(τ)/E_incident;
//   4. subtract a·(incident delayed by τ) in the frequency domain (exact fractional delay); repeat.
//   5. after each new echo, re-fit every echo found so far with the others subtracted (cyclic
//      relaxation, as in the RELAX algorithm of Li & Stoica, IEEE Trans. SP 44(2), 1996), so the
//      overlap of their tails does not bias delays and amplitudes.
// Subtracting each echo whole, tails included, lets weaker echoes sitting on a strong echo's slowly
// decaying tail (a wideband pulse's envelope falls off algebraically) come out as peaks of their own.

import { nextPow2, realFft, inverseFft } from '../spectra/fft.ts';

export interface CleanOptions {
  /** Stop below this amplitude (relative to the incident pulse). */
  floor: number;
  /** Minimum separation between reported echoes (s); closer components fold into the stronger one. */
  minSep_s: number;
  /** How far before the front-face echo (s) an echo may be looked for (dispersive front faces). */
  earliest_s: number;
  /** Most echoes reported. */
  maxEchoes: number;
}

export interface CleanEcho { delay_s: number; re: number; im: number }

/** One-sided spectrum of the analytic signal: bins 0 … nfft/2 (positive ones doubled). */
function analyticSpectrum(x: Float64Array, nfft: number): Spectrum1 {
  const X = realFft(x, nfft), half = nfft / 2;
  const re = X.re.slice(0, half + 1), im = X.im.slice(0, half + 1);
  for (let k = 1; k < half; k++) { re[k] *= 2; im[k] *= 2; }
  return { k0: 0, re, im };
}

/**
 * Bins where the incident pulse has content (|Z_i| ≥ 1e−9 of its peak). Every correlation is
 * weighted by conj(Z_i), so bins outside contribute below 1e−18 of the energy; a pulse sampled far
 * above its band (FDTD records) keeps only a few per cent of the bins, which keeps the fits cheap.
 */
function crop(Zi: Spectrum1, Z: Spectrum1): [Spectrum1, Spectrum1] {
  let peak = 0;
  for (let k = 0; k < Zi.re.length; k++) peak = Math.max(peak, Math.hypot(Zi.re[k], Zi.im[k]));
  let lo = 0, hi = Zi.re.length - 1;
  while (lo < hi && Math.hypot(Zi.re[lo], Zi.im[lo]) < 1e-9 * peak) lo++;
  while (hi > lo && Math.hypot(Zi.re[hi], Zi.im[hi]) < 1e-9 * peak) hi--;
  const cut = (S: Spectrum1): Spectrum1 => ({ k0: lo, re: S.re.slice(lo, hi + 1), im: S.im.slice(lo, hi + 1) });
  return [cut(Zi), cut(Z)];
}

/** c(τ) = (1/nfft) Σ_k P[k] e^{+j2πkτ/(nfft Δt)} for the cross-spectrum P, at one delay τ (in samples). */
function correlationAt(Pre: Float64Array, Pim: Float64Array, k0: number, nfft: number, lag: number): { re: number; im: number } {
  const w = (2 * Math.PI * lag) / nfft, cs = Math.cos(w), sn = Math.sin(w);
  let sr = 0, si = 0, pr = 1, pi = 0;
  for (let k = 0; k < Pre.length; k++) {
    if ((k & 255) === 0) { pr = Math.cos(w * (k + k0)); pi = Math.sin(w * (k + k0)); }
    sr += Pre[k] * pr - Pim[k] * pi;
    si += Pre[k] * pi + Pim[k] * pr;
    const t = pr * cs - pi * sn; pi = pr * sn + pi * cs; pr = t;
  }
  return { re: sr / nfft, im: si / nfft };
}

/** Adds g·a·(incident delayed by lag samples) to Z (g = −1 subtracts). */
function addTemplate(Z: Spectrum1, Zi: Spectrum1, nfft: number, lag: number, a: { re: number; im: number }, g: number): void {
  const w = (-2 * Math.PI * lag) / nfft;
  const ar = g * a.re, ai = g * a.im;
  for (let k = 0; k < Zi.re.length; k++) {
    const er = Math.cos(w * (k + Zi.k0)), ei = Math.sin(w * (k + Zi.k0));
    const sr = Zi.re[k] * er - Zi.im[k] * ei, si = Zi.re[k] * ei + Zi.im[k] * er;
    Z.re[k] += ar * sr - ai * si;
    Z.im[k] += ar * si + ai * sr;
  }
}

/** Bins k0 … k0 + length − 1 of a one-sided spectrum. */
interface Spectrum1 { k0: number; re: Float64Array; im: Float64Array }
interface Component { lag: number; amp: { re: number; im: number } }

/**
 * Best single-echo fit to Z near lag `centre` (± halfRange samples): the delay maximizing the
 * matched-filter magnitude |c(τ)| (golden-section search; |c| is an envelope, smooth and unimodal
 * within a pulse width), and the least-squares amplitude c(τ)/E.
 */
function fitOne(Z: Spectrum1, Zi: Spectrum1, nfft: number, energy: number, centre: number, halfRange: number,
  work: { bins: number } = { bins: 0 }): Component {
  const m = Zi.re.length;
  const Pre = new Float64Array(m), Pim = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    Pre[k] = Z.re[k] * Zi.re[k] + Z.im[k] * Zi.im[k];
    Pim[k] = Z.im[k] * Zi.re[k] - Z.re[k] * Zi.im[k];
  }
  const mag = (lag: number) => { work.bins += m; const v = correlationAt(Pre, Pim, Zi.k0, nfft, lag); return Math.hypot(v.re, v.im); };
  const g = (Math.sqrt(5) - 1) / 2;
  let a = centre - halfRange, b = centre + halfRange;
  let x1 = b - g * (b - a), x2 = a + g * (b - a), f1 = mag(x1), f2 = mag(x2);
  while (b - a > 1e-5) {
    if (f1 > f2) { b = x2; x2 = x1; f2 = f1; x1 = b - g * (b - a); f1 = mag(x1); }
    else { a = x1; x1 = x2; f1 = f2; x2 = a + g * (b - a); f2 = mag(x2); }
  }
  const lag = (a + b) / 2;
  const c = correlationAt(Pre, Pim, Zi.k0, nfft, lag);
  return { lag, amp: { re: c.re / energy, im: c.im / energy } };
}

/** Most sweeps of cyclic re-fitting (each echo re-fitted with all others subtracted). */
const RELAX_MAX_SWEEPS = 8;
/**
 * Re-fitting stops once the fits have evaluated this many spectrum bins (about half a second): with many
 * overlapping components on a long record the sweeps grow like components² × bins; the greedy fits go on.
 */
export const RELAX_WORK_CAP_BINS = 1e8;

export function cleanEchoes(incident: Float64Array, reflected: Float64Array, dt_s: number, o: CleanOptions): CleanEcho[] {
  const n = Math.max(incident.length, reflected.length);
  const nfft = nextPow2(2 * n), half = nfft / 2;
  const [Zi, Z] = crop(analyticSpectrum(incident, nfft), analyticSpectrum(reflected, nfft));
  const m = Zi.re.length, k0 = Zi.k0;
  let energy = 0;
  for (let k = 0; k < m; k++) energy += Zi.re[k] ** 2 + Zi.im[k] ** 2;
  energy /= nfft;
  if (!(energy > 0)) return [];
  const earliest = Math.min(Math.ceil(o.earliest_s / dt_s), half - 1);
  const sep = o.minSep_s / dt_s;
  const range = Math.max(1, sep / 4);
  const C = { re: new Float64Array(nfft), im: new Float64Array(nfft) };
  const comps: Component[] = [];
  /** RELAX: overlapping tails bias each greedy fit; re-fit every echo with the others removed. */
  const work = { bins: 0 };
  const relax = () => {
    for (let sweep = 0; sweep < RELAX_MAX_SWEEPS && work.bins < RELAX_WORK_CAP_BINS; sweep++) {
      let moved = 0;
      for (const comp of comps) {
        if (work.bins >= RELAX_WORK_CAP_BINS) break;
        addTemplate(Z, Zi, nfft, comp.lag, comp.amp, +1);
        const f = fitOne(Z, Zi, nfft, energy, comp.lag, range, work);
        moved = Math.max(moved, Math.abs(f.lag - comp.lag));
        comp.lag = f.lag; comp.amp = f.amp;
        addTemplate(Z, Zi, nfft, comp.lag, comp.amp, -1);
      }
      if (moved < 1e-4) break;
    }
  };
  // CLEAN: strongest matched-filter peak, fitted and subtracted whole, until below the floor.
  for (let iter = 0; iter < 2 * o.maxEchoes; iter++) {
    C.re.fill(0); C.im.fill(0);
    for (let k = 0; k < m; k++) {
      C.re[k + k0] = Z.re[k] * Zi.re[k] + Z.im[k] * Zi.im[k];
      C.im[k + k0] = Z.im[k] * Zi.re[k] - Z.re[k] * Zi.im[k];
    }
    const c = inverseFft(C);
    let best = 0, bestMag = -1;
    const consider = (idx: number, lag: number) => {
      const m = Math.hypot(c.re[idx], c.im[idx]);
      if (m > bestMag) { bestMag = m; best = lag; }
    };
    for (let lag = 0; lag < n; lag++) consider(lag, lag);
    for (let lag = -earliest; lag < 0; lag++) consider(nfft + lag, lag);
    if (!(bestMag / energy >= o.floor)) break;
    const comp = fitOne(Z, Zi, nfft, energy, best, 1);
    addTemplate(Z, Zi, nfft, comp.lag, comp.amp, -1);
    comps.push(comp);
    if (comps.length > 1) relax();
    if (comps.filter((p) => Math.abs(p.lag - comp.lag) >= sep).length >= o.maxEchoes) break;
  }
  // Report the strongest component of each cluster closer than the minimum separation.
  const byStrength = comps.slice().sort((p, q) => Math.hypot(q.amp.re, q.amp.im) - Math.hypot(p.amp.re, p.amp.im));
  const kept: Component[] = [];
  for (const p of byStrength) if (kept.length < o.maxEchoes && kept.every((q) => Math.abs(q.lag - p.lag) >= sep)) kept.push(p);
  return kept.map((p) => ({ delay_s: p.lag * dt_s, re: p.amp.re, im: p.amp.im })).sort((p, q) => p.delay_s - q.delay_s);
}
