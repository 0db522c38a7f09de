// The echo table of a pulse run: measured echoes plus their attributed bounce paths.

import type { Stack } from '../stack/types.ts';
import type { PulseRecords } from '../spectra/records.ts';
import { trimmed } from '../spectra/records.ts';
import { attributeEchoes } from './attribute.ts';
import { type EchoOptions, measureEchoes } from './echoes.ts';
import { type LatticeOptions, predictEchoes } from './lattice.ts';

export interface EchoTable {
  t_s: Float64Array;
  level_dB: Float64Array;
  amplitude: Float64Array;
  predicted_t_s: Float64Array;
  path: string[];
  /** Incident pulse FWHM (s); echoes closer than this are not resolved. */
  pulseWidth_s: number;
  /** Frequency at which the layer group delays were evaluated (Hz). */
  centre_Hz: number;
}

export interface EchoTableOptions extends EchoOptions, LatticeOptions {
  /** Frequency for the layer group delays; default the band centre. */
  centre_Hz?: number;
}

export function echoTable(stack: Stack, records: PulseRecords, options: EchoTableOptions = {}): EchoTable {
  const centre_Hz = options.centre_Hz ?? (stack.band_Hz[0] + stack.band_Hz[1]) / 2;
  const m = measureEchoes(trimmed(records.incident, records.count), trimmed(records.reflected, records.count), records.dt_s, options);
  const predicted = predictEchoes(stack, centre_Hz, options);
  const a = attributeEchoes(m.t_s, m.amplitude, predicted, m.pulseWidth_s);
  return { t_s: m.t_s, level_dB: m.level_dB, amplitude: m.amplitude, predicted_t_s: a.predicted_t_s, path: a.path, pulseWidth_s: m.pulseWidth_s, centre_Hz };
}
