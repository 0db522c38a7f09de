// S-parameters of a stack seen as a two-port between its half-spaces (a one-port behind a conductor), for the
// stack's angle and polarization. Each port's reference impedance is its half-space's wave impedance
// Z = E_t/H_t = 1/Y along x (TE: ωμ0μ_r/k_x, TM: k_x/(ωε0ε_r)), so a wave travelling in that half-space is
// matched and the power waves are a = E_t/√Z: S11 = R, S21 = T √(Z_front/Z_back) (physics reference: power waves
// with real reference impedances; Touchstone 2.0, IBIS Open Forum, 2009, for the file that carries them).
// S22 and S12 are the same quantities for a wave coming from the back half-space at the phase-matched angle
// (n_back sin θ_back = n_front sin θ_front), found by solving the reversed stack.
// Reference planes: x = −front_m and x = d + back_m (0, 0 = the stack's faces); moving a plane by ℓ into its
// half-space multiplies each wave through it by e^{−j k_x ℓ}.

import { permeability } from '../materials/permeability.ts';
import { permittivity } from '../materials/permittivity.ts';
import type { Spectrum } from '../results.ts';
import type { BulkMaterial, Stack } from '../stack/types.ts';
import { stackAtFrequency, type Region } from '../tmm/media.ts';
import { solveTmm } from '../tmm/solve.ts';

/** A stack whose half-spaces cannot serve as ports with one real impedance each. */
export class SParameterError extends Error {
  override name = 'SParameterError';
}

export interface SParameters {
  f_Hz: Float64Array;
  /** 2, or 1 behind a conductor (then only S11). */
  ports: 1 | 2;
  /** Reference impedance of each port, ohms. */
  Z_ref_ohm: number[];
  S11_re: Float64Array; S11_im: Float64Array;
  S21_re: Float64Array; S21_im: Float64Array;
  S12_re: Float64Array; S12_im: Float64Array;
  S22_re: Float64Array; S22_im: Float64Array;
}

/** Reference-plane shifts in metres, each positive into its half-space (away from the stack). */
export interface PlaneShift { front_m: number; back_m: number }

const NO_SHIFT: PlaneShift = Object.freeze({ front_m: 0, back_m: 0 });

/** The wave impedance of a half-space region, if it is real and positive (a lossless, propagating wave). */
function realImpedance(r: Region): number | null {
  const Y = r.Y;
  return Y.re > 0 && Math.abs(Y.im) <= 1e-12 * Y.re ? 1 / Y.re : null;
}

/** Why one half-space cannot be a port over the band, or its impedance. */
function portImpedance(stack: Stack, side: 'front' | 'back'): number {
  const at = (f: number) => {
    const saf = stackAtFrequency(stack, f);
    return realImpedance(side === 'front' ? saf.front : saf.back!);
  };
  const name = side === 'front' ? stack.front.name : (stack.back as BulkMaterial).name;
  const lo = at(stack.band_Hz[0]), hi = at(stack.band_Hz[1]);
  if (lo === null || hi === null) {
    throw new SParameterError(`${side}: "${name}" gives no real wave impedance at this angle (it is lossy, or the wave ` +
      'there is evanescent beyond the critical angle); a Touchstone port needs a lossless half-space carrying the wave');
  }
  if (Math.abs(lo - hi) > 1e-9 * lo) {
    throw new SParameterError(`${side}: the wave impedance of "${name}" changes over the band (a dispersive half-space); ` +
      'Touchstone\'s [Reference] takes one impedance per port');
  }
  return lo;
}

/** The reference impedances [front, back] (one entry behind a conductor); SParameterError when a port is unusable. */
export function portImpedances(stack: Stack): number[] {
  return stack.back === 'pec' ? [portImpedance(stack, 'front')] : [portImpedance(stack, 'front'), portImpedance(stack, 'back')];
}

/** The stack seen from its back half-space, at the phase-matched angle (needs a bulk back). */
export function reversedStack(stack: Stack): Stack {
  if (stack.back === 'pec') throw new SParameterError('back: a conductor has no second port');
  const f = stack.band_Hz[0]; // ports are lossless and non-dispersive (portImpedances), so any frequency will do
  const n2 = (m: BulkMaterial) => permittivity(m.spec, f).re * permeability(m.spec, f).re;
  const s = Math.sqrt(n2(stack.front) / n2(stack.back)) * Math.sin(stack.incidence.angle_rad);
  if (!(s < 1)) throw new SParameterError('back: beyond the critical angle no wave travels in the back half-space');
  return {
    ...stack,
    front: stack.back,
    back: stack.front,
    layers: [...stack.layers].reverse(),
    incidence: { ...stack.incidence, angle_rad: Math.asin(s) },
  };
}

/**
 * S-parameters at the frequencies of `exact` (the stack's exact spectrum), reference planes shifted by `shift`.
 * Throws SParameterError when a half-space is lossy, dispersive or evanescent (no one real impedance).
 */
export function sParameters(stack: Stack, exact: Spectrum, shift: PlaneShift = NO_SHIFT): SParameters {
  const Z = portImpedances(stack);
  const n = exact.f_Hz.length;
  const out: SParameters = {
    f_Hz: exact.f_Hz, ports: Z.length === 1 ? 1 : 2, Z_ref_ohm: Z,
    S11_re: new Float64Array(n), S11_im: new Float64Array(n), S21_re: new Float64Array(n), S21_im: new Float64Array(n),
    S12_re: new Float64Array(n), S12_im: new Float64Array(n), S22_re: new Float64Array(n), S22_im: new Float64Array(n),
  };
  const back = out.ports === 2 ? solveTmm(reversedStack(stack), exact.f_Hz) : null;
  const forward = out.ports === 2 ? Math.sqrt(Z[0] / Z[1]) : 0;
  for (let i = 0; i < n; i++) {
    const saf = stackAtFrequency(stack, exact.f_Hz[i]);
    const pf = -saf.front.kx.re * shift.front_m, pb = saf.back ? -saf.back.kx.re * shift.back_m : 0; // phase of e^{−jkℓ}
    rotate(out.S11_re, out.S11_im, i, exact.R_re[i], exact.R_im[i], 2 * pf);
    if (back === null) continue;
    rotate(out.S21_re, out.S21_im, i, exact.T_re[i] * forward, exact.T_im[i] * forward, pf + pb);
    rotate(out.S12_re, out.S12_im, i, back.T_re[i] / forward, back.T_im[i] / forward, pf + pb);
    rotate(out.S22_re, out.S22_im, i, back.R_re[i], back.R_im[i], 2 * pb);
  }
  return out;
}

/** Writes (re + j im)·e^{jφ} into row i. */
function rotate(outRe: Float64Array, outIm: Float64Array, i: number, re: number, im: number, phi: number): void {
  if (phi === 0) { outRe[i] = re; outIm[i] = im; return; }
  const c = Math.cos(phi), s = Math.sin(phi);
  outRe[i] = re * c - im * s;
  outIm[i] = re * s + im * c;
}
