// Engineering quantities of a stack at each frequency, from the exact R and T and the half-spaces' wave
// admittances (tmm/media.ts):
//   R_power  = |R|²                                  the reflected power fraction
//   T_power  = |T|² · Re(Y_back) / Re(Y_front)       the transmitted power fraction (0 behind a conductor)
//   absorbed = 1 − R_power − T_power
//   IL_dB    = −10 log10 T_power                     insertion loss (ITU-R P.2040-3 calls it building entry /
//                                                     penetration loss for a wall)
//   RL_dB    = −10 log10 R_power                     return loss
//   IPD_deg  = −arg(T) − k_x,front · d               insertion phase delay: the transmitted phase against the
//                                                     same thickness of the front medium along the normal,
//                                                     positive when the panel delays the wave (Kozakoff,
//                                                     Analysis of Radome-Enclosed Antennas, 2nd ed., 2010)
// Y is H_t/E_t of a forward wave (TE k_x/(ωμ0μ_r), TM ωε0ε_r/k_x), so the power factor holds at any angle and
// in both polarizations. The power fractions need a lossless front medium, where incident and reflected
// powers separate (frontIsLossless).

import type { Complex } from '../complex.ts';
import { permeability } from '../materials/permeability.ts';
import { permittivity } from '../materials/permittivity.ts';
import type { Spectrum } from '../results.ts';
import type { Stack } from '../stack/types.ts';
import { stackAtFrequency, type StackAtFrequency } from '../tmm/media.ts';

/** The quantities' column names, in the order every table writes them. */
export const QUANTITY_NAMES = ['R_power', 'T_power', 'absorbed', 'IL_dB', 'RL_dB', 'IPD_deg'] as const;
export type QuantityName = typeof QUANTITY_NAMES[number];

/** One Float64Array per quantity. */
export type Quantities = Record<QuantityName, Float64Array>;

/**
 * IL_dB and RL_dB of a zero power (behind a conductor, or a perfect match) are written as this ceiling, never
 * as infinity: 400 dB is a power ratio of 1e-40, far below any figure that matters.
 */
export const DB_CEILING = 400;

export function emptyQuantities(n: number): Quantities {
  const out = {} as Quantities;
  for (const name of QUANTITY_NAMES) out[name] = new Float64Array(n);
  return out;
}

/** −10 log10 p, capped at DB_CEILING (p ≤ 0 gives the ceiling). */
export const lossDb = (p: number): number => (p > 0 ? Math.min(DB_CEILING, -10 * Math.log10(p)) : DB_CEILING);

const TWO_PI = 2 * Math.PI;
const DEG = 180 / Math.PI;

/**
 * Insertion phase delay in degrees. The principal value of −arg(T) − k_x,front d is ambiguous by whole turns;
 * the turn taken is the one nearest the phase the layers add along the normal, Σ Re(k_x,i) d_i − k_x,front d.
 * The interfaces and multiple reflections move the phase from that estimate by less than a quarter turn for
 * one lossless slab (the round-trip factor 1 − r² e^{−2jφ} has a phase below arcsin r²), so a single panel is
 * never a turn off; many strongly reflecting layers can be. 0 when T = 0 (behind a conductor).
 */
export function insertionPhaseDelay_deg(saf: StackAtFrequency, T: Complex): number {
  if (T.re === 0 && T.im === 0) return 0;
  let d = 0, layerPhase = 0;
  for (const r of saf.layers) { d += r.thickness_m; layerPhase += r.kx.re * r.thickness_m; }
  const reference = saf.front.kx.re * d;
  const estimate = layerPhase - reference;
  const principal = -Math.atan2(T.im, T.re) - reference;
  const offset = principal - estimate;
  return (estimate + offset - TWO_PI * Math.round(offset / TWO_PI)) * DEG;
}

/** Writes the quantities of one frequency (the stack evaluated there, its R and T) into row i of `out`. */
export function writeQuantities(out: Quantities, i: number, saf: StackAtFrequency, R: Complex, T: Complex): void {
  const rp = R.re * R.re + R.im * R.im;
  const tp = saf.back ? (T.re * T.re + T.im * T.im) * (saf.back.Y.re / saf.front.Y.re) + 0 : 0; // + 0: no −0
  out.R_power[i] = rp;
  out.T_power[i] = tp;
  out.absorbed[i] = 1 - rp - tp;
  out.IL_dB[i] = lossDb(tp);
  out.RL_dB[i] = lossDb(rp);
  out.IPD_deg[i] = insertionPhaseDelay_deg(saf, T);
}

/** The quantities of a spectrum of `stack` (R and T from any method, at its frequencies). */
export function quantitiesOf(stack: Stack, sp: Spectrum): Quantities {
  const n = sp.f_Hz.length, out = emptyQuantities(n);
  for (let i = 0; i < n; i++) {
    writeQuantities(out, i, stackAtFrequency(stack, sp.f_Hz[i]),
      { re: sp.R_re[i], im: sp.R_im[i] }, { re: sp.T_re[i], im: sp.T_im[i] });
  }
  return out;
}

/**
 * True when the front half-space is lossless at both band edges (the power fractions are defined there).
 * The material models are lossy at every frequency or at none, so the band edges decide.
 */
export function frontIsLossless(stack: Stack): boolean {
  return [stack.band_Hz[0], stack.band_Hz[1]].every((f) =>
    permittivity(stack.front.spec, f).im === 0 && permeability(stack.front.spec, f).im === 0);
}

/** Why the quantities are not given for this stack, or null when they are. */
export function quantitiesUnavailable(stack: Stack): string | null {
  return frontIsLossless(stack) ? null
    : `front: the power quantities (${QUANTITY_NAMES.join(', ')}) need a lossless front medium ("${stack.front.name}" is lossy)`;
}
