// Echoes of a pulse run, timed against the incident pulse. Both records are taken at x = 0, so the
// front-face echo sits at delay 0 and every other echo's delay is measured from it. Echoes are
// found by CLEAN (clean.ts): peaks of the matched-filter envelope above a threshold, each
// subtracted whole before the next is looked for. Levels are relative to the incident pulse.

import { envelope } from './envelope.ts';
import { cleanEchoes } from './clean.ts';
import { widthAtHalf } from './peaks.ts';

export interface MeasuredEchoes {
  /** Delay after the front-face echo (s). */
  t_s: Float64Array;
  /** |a| in dB: the echo's amplitude relative to the incident pulse. */
  level_dB: Float64Array;
  /** Signed amplitude: |a| with the sign of Re a (a = complex fit of the delayed incident pulse). */
  amplitude: Float64Array;
  /** Incident envelope full width at half maximum (s). */
  pulseWidth_s: number;
}

export interface EchoOptions {
  /** Keep echoes within this many dB of the strongest. Default −40. */
  relative_dB?: number;
  /** Ignore anything below this level relative to the incident pulse (numerical floor). Default −70. */
  floor_dB?: number;
  /** Minimum separation between echoes, in incident-envelope widths (FWHM). Default 1. */
  separationWidths?: number;
  /** Most echoes reported. Default 24. */
  maxEchoes?: number;
}

function argmax(x: Float64Array): number {
  let k = 0;
  for (let i = 1; i < x.length; i++) if (x[i] > x[k]) k = i;
  return k;
}

export function measureEchoes(incident: Float64Array, reflected: Float64Array, dt_s: number, options: EchoOptions = {}): MeasuredEchoes {
  const none = (w: number): MeasuredEchoes => ({ t_s: new Float64Array(0), level_dB: new Float64Array(0), amplitude: new Float64Array(0), pulseWidth_s: w });
  if (incident.length < 3 || reflected.length < 3 || !(dt_s > 0)) return none(0);
  const ei = envelope(incident);
  const iPeak = argmax(ei);
  if (!(ei[iPeak] > 0) || !Number.isFinite(ei[iPeak])) return none(0);
  const width_s = widthAtHalf(ei, iPeak) * dt_s;
  const minSep_s = width_s * (options.separationWidths ?? 1);
  const found = cleanEchoes(incident, reflected, dt_s, {
    floor: 10 ** ((options.floor_dB ?? -70) / 20),
    minSep_s,
    earliest_s: width_s,
    maxEchoes: options.maxEchoes ?? 24,
  });
  if (found.length === 0) return none(width_s);
  const strongest = Math.max(...found.map((e) => Math.hypot(e.re, e.im)));
  const keep = found.filter((e) => Math.hypot(e.re, e.im) >= strongest * 10 ** ((options.relative_dB ?? -40) / 20));
  const t_s = Float64Array.from(keep, (e) => e.delay_s);
  const level_dB = Float64Array.from(keep, (e) => 20 * Math.log10(Math.hypot(e.re, e.im)));
  const amplitude = Float64Array.from(keep, (e) => (e.re >= 0 ? 1 : -1) * Math.hypot(e.re, e.im));
  return { t_s, level_dB, amplitude, pulseWidth_s: width_s };
}
