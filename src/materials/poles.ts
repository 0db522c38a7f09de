// Relaxation and resonance terms shared by the permittivity and permeability models (e^{+jωt}):
// each adds its complex contribution into an accumulator, so a model is a constant plus a sum of terms.

import type { Complex } from '../complex.ts';

/** acc += Δ / (1 + jωτ) = Δ (1 − jωτ) / (1 + ω²τ²). */
export function addDebyeTerm(acc: Complex, delta: number, tau_s: number, w: number): void {
  const wt = w * tau_s, d = 1 + wt * wt;
  acc.re += delta / d;
  acc.im -= (delta * wt) / d;
}

/** acc += Δ ω0² / (ω0² − ω² + jωγ), with ω0 = 2π f0 and γ = 2π gamma (both in Hz here). */
export function addLorentzTerm(acc: Complex, delta: number, f0_Hz: number, gamma_Hz: number, w: number): void {
  const w0 = 2 * Math.PI * f0_Hz, g = 2 * Math.PI * gamma_Hz;
  const a = w0 * w0 - w * w, b = w * g, d = a * a + b * b;
  const num = delta * w0 * w0;
  acc.re += (num * a) / d;
  acc.im -= (num * b) / d;
}
