// Stage 1: the band-limited response. A record (reflected at x = 0, or transmitted at the back face) is
// divided by the incident record in the frequency domain, which gives the stack's own response R(f) or
// T(f) with the engine's pulse removed, and re-windowed with the band pulse W(f) (band-pulse.ts): the
// result is the response to a clean pulse of known shape, confined to the stack's band (the material
// tables hold only there). Delay 0 is the incident pulse's arrival at x = 0.
//
// Only the bins inside the band are kept; everything later works on these few dozen to few hundred bins.

import { dtft } from '../spectra/dtft.ts';
import { bandPulse, bandWindow } from './band-pulse.ts';
import type { UniformSpectrum } from './envelope.ts';

/** W(f)·H(f) at the bins inside the band (f = k·df): the analytic signal's whole spectrum. */
export interface BandSpectrum extends UniformSpectrum {
  /** Σ W over the same bins: the envelope peak of the incident band pulse itself (levels are relative to it). */
  peak: number;
}

/** Bins where the band window is non-zero, for bins of spacing df_Hz. */
export function bandBins(band_Hz: readonly [number, number], df_Hz: number): { first: number; count: number } {
  const first = Math.ceil(band_Hz[0] / df_Hz), last = Math.floor(band_Hz[1] / df_Hz);
  return { first, count: Math.max(0, last - first + 1) };
}

/**
 * The band spectrum W(f)·H(f) of a response H given at the bins k = first … first + count − 1
 * (f = k·df_Hz) by `response(k, out)`, which writes H's real and imaginary parts into out[0], out[1].
 */
export function bandSpectrumOf(band_Hz: readonly [number, number], df_Hz: number, response: (k: number, out: Float64Array) => void): BandSpectrum {
  const { first, count } = bandBins(band_Hz, df_Hz);
  const re = new Float64Array(count), im = new Float64Array(count), h = new Float64Array(2);
  let peak = 0;
  for (let i = 0; i < count; i++) {
    const w = bandWindow((first + i) * df_Hz, band_Hz);
    response(first + i, h);
    re[i] = w * h[0];
    im[i] = w * h[1];
    peak += w;
  }
  return { f_first_Hz: first * df_Hz, df_Hz, re, im, peak };
}

/**
 * Bin spacing for records of `count` samples: the time axis of the band response repeats every
 * 1/df, which must hold the record and the band pulse's tails on both sides (four pulse widths), so
 * one end does not fold onto the other.
 */
export function binSpacing(count: number, dt_s: number, band_Hz: readonly [number, number]): number {
  return 1 / (count * dt_s + 4 * bandPulse(band_Hz).width_s);
}

/** Incident bins weaker than this fraction of the strongest in-band bin give H = 0 (never a blown-up ratio). */
const WEAK_INCIDENT = 1e-9;

/** The band spectra of a run's records. */
export interface BandRecords {
  /** W·(incident spectrum), not divided: its envelope peak is the incident pulse's arrival at x = 0. */
  incident: BandSpectrum;
  /** W·(record / incident) for each record, in the order given. */
  responses: BandSpectrum[];
}

/**
 * The band spectra of one or more records against the same incident record (all sampled every dt_s
 * from t = 0). The records' transforms are needed at the few bins inside the band only, so they are
 * taken there directly (spectra/dtft.ts, exactly the values a zero-padded FFT would give at those
 * bins). A record that is all zero (behind a conductor) gives an all-zero spectrum.
 */
export function bandRecords(incident: Float64Array, records: readonly Float64Array[], dt_s: number, band_Hz: readonly [number, number]): BandRecords {
  const n = Math.max(incident.length, ...records.map((r) => r.length));
  const df = binSpacing(n, dt_s, band_Hz);
  const { first, count } = bandBins(band_Hz, df);
  const f_Hz = Float64Array.from({ length: count }, (_, i) => (first + i) * df);
  const I = dtft(incident, dt_s, f_Hz);
  let strongest = 0;
  for (let i = 0; i < count; i++) strongest = Math.max(strongest, Math.hypot(I.re[i], I.im[i]));
  const responses = records.map((rec) => {
    const X = dtft(rec, dt_s, f_Hz);
    return bandSpectrumOf(band_Hz, df, (k, out) => {
      const i = k - first, c = I.re[i], d = I.im[i], q = c * c + d * d;
      if (!(Math.sqrt(q) > WEAK_INCIDENT * strongest)) { out[0] = 0; out[1] = 0; return; }
      out[0] = (X.re[i] * c + X.im[i] * d) / q;
      out[1] = (X.im[i] * c - X.re[i] * d) / q;
    });
  });
  const own = bandSpectrumOf(band_Hz, df, (k, out) => { out[0] = I.re[k - first]; out[1] = I.im[k - first]; });
  return { incident: own, responses };
}
