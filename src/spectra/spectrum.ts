// R(f) and T(f) of a pulse run from its probe records, at the exact requested frequencies.
// Reference planes are those of the exact solution: R at x = 0, T at the back face over the
// incident E at x = 0; the engine records at those planes, so no correction is applied.

import type { Spectrum } from '../results.ts';
import { dtft } from './dtft.ts';
import { type PulseRecords, trimmed } from './records.ts';
import { divideSpectra, weakMask } from './response.ts';

export interface PulseSpectrum extends Spectrum {
  /** 1 where the incident pulse's spectrum is weak (R, T unreliable there). */
  weak: Uint8Array;
  warnings: string[];
}

export function spectrumFromRecords(records: PulseRecords, f_Hz: Float64Array): PulseSpectrum {
  const { dt_s, count } = records;
  const inc = dtft(trimmed(records.incident, count), dt_s, f_Hz);
  const weak = weakMask(inc);
  const R = divideSpectra(dtft(trimmed(records.reflected, count), dt_s, f_Hz), inc, weak);
  const tr = trimmed(records.transmitted, count);
  const T = tr.length > 0
    ? divideSpectra(dtft(tr, dt_s, f_Hz), inc, weak)
    : { re: new Float64Array(f_Hz.length), im: new Float64Array(f_Hz.length) };
  const warnings: string[] = [];
  const nWeak = weak.reduce((s, v) => s + v, 0);
  if (nWeak > 0) {
    let lo = Infinity, hi = -Infinity;
    for (let k = 0; k < weak.length; k++) if (weak[k]) { lo = Math.min(lo, f_Hz[k]); hi = Math.max(hi, f_Hz[k]); }
    warnings.push(
      `pulse spectrum: incident spectrum more than 60 dB below its peak at ${nWeak} of ${f_Hz.length} frequencies ` +
      `(${(lo / 1e9).toFixed(3)}–${(hi / 1e9).toFixed(3)} GHz); R and T there are unreliable`,
    );
  }
  return { f_Hz, R_re: R.re, R_im: R.im, T_re: T.re, T_im: T.im, weak, warnings };
}
