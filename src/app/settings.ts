// View and run settings the page keeps (and stores), apart from the stack itself.

import type { TraceName } from './fieldView.ts';
import type { ClipFormat } from './clip/sinks.ts';
import type { SpacetimeField } from './spacetime/view.ts';

export type SpectrumMode = 'magnitude' | 'phase' | 'group delay';

export interface Settings {
  /** Steps of the pulse run per animation frame. */
  speed: number;
  /** Pick `speed` from the grid so the pulse crosses the view in a few seconds. */
  autoSpeed: boolean;
  traces: Record<TraceName, boolean>;
  xUnit: 'mm' | 'wavelengths';
  /** Frequency at which positions are given in wavelengths, GHz. */
  lambda_GHz: number;
  spectrumMode: SpectrumMode;
  /** Frequency axis of the spectrum. */
  freqScale: 'linear' | 'log';
  /** Magnitudes of R and T in dB or as plain ratios. */
  magnitude: 'dB' | 'linear';
  /** Draw the reflected and transmitted records as a dB envelope. */
  envelope: boolean;
  /** Pulse-run accuracy target (predicted worst phase error); null = the engine's default. */
  accuracy: number | null;
  /** Clips of the field view: file format and playing time. */
  clipFormat: ClipFormat;
  clipLength_s: number;
  /** Space–time map: which field, the colour gain (range = largest |E| / gain), the echo rays on or off. */
  spacetimeField: SpacetimeField;
  spacetimeGain: number;
  spacetimeRays: boolean;
}

export const SPACETIME_GAINS = [1, 4, 16] as const;

/** Clip frame rate (frames per second of playing time). */
export const CLIP_FPS = 30;
export const CLIP_LENGTH_LIMITS_s: [number, number] = [1, 60];

export const DEFAULT_SETTINGS: Settings = {
  speed: 10,
  autoSpeed: true,
  traces: { total: true, incident: false, reflected: true, transmitted: true },
  xUnit: 'mm',
  lambda_GHz: 5,
  spectrumMode: 'magnitude',
  freqScale: 'linear',
  magnitude: 'dB',
  envelope: false,
  accuracy: null,
  clipFormat: 'webm',
  clipLength_s: 6,
  spacetimeField: 'total',
  spacetimeGain: 1,
  spacetimeRays: true,
};

/** Stored settings merged over the defaults, each field checked. */
export function readSettings(value: unknown): Settings {
  const s: Settings = structuredClone(DEFAULT_SETTINGS);
  if (value === null || typeof value !== 'object') return s;
  const v = value as Record<string, unknown>;
  const num = (x: unknown, lo: number, hi: number): number | undefined =>
    typeof x === 'number' && Number.isFinite(x) && x >= lo && x <= hi ? x : undefined;
  s.speed = Math.round(num(v.speed, 1, 1000) ?? s.speed);
  if (typeof v.autoSpeed === 'boolean') s.autoSpeed = v.autoSpeed;
  if (v.traces !== null && typeof v.traces === 'object') {
    const t = v.traces as Record<string, unknown>;
    for (const k of Object.keys(s.traces) as TraceName[]) if (typeof t[k] === 'boolean') s.traces[k] = t[k];
  }
  if (v.xUnit === 'mm' || v.xUnit === 'wavelengths') s.xUnit = v.xUnit;
  s.lambda_GHz = num(v.lambda_GHz, 1e-3, 1e3) ?? s.lambda_GHz;
  if (v.spectrumMode === 'magnitude' || v.spectrumMode === 'phase' || v.spectrumMode === 'group delay') s.spectrumMode = v.spectrumMode;
  if (v.freqScale === 'linear' || v.freqScale === 'log') s.freqScale = v.freqScale;
  if (v.magnitude === 'dB' || v.magnitude === 'linear') s.magnitude = v.magnitude;
  if (typeof v.envelope === 'boolean') s.envelope = v.envelope;
  s.accuracy = v.accuracy === null ? null : num(v.accuracy, 1e-4, 0.5) ?? s.accuracy;
  if (v.clipFormat === 'webm' || v.clipFormat === 'mp4') s.clipFormat = v.clipFormat;
  s.clipLength_s = num(v.clipLength_s, ...CLIP_LENGTH_LIMITS_s) ?? s.clipLength_s;
  if (v.spacetimeField === 'total' || v.spacetimeField === 'scattered') s.spacetimeField = v.spacetimeField;
  if ((SPACETIME_GAINS as readonly unknown[]).includes(v.spacetimeGain)) s.spacetimeGain = v.spacetimeGain as number;
  if (typeof v.spacetimeRays === 'boolean') s.spacetimeRays = v.spacetimeRays;
  return s;
}

/** Steps per frame that carry the pulse across `cells` grid cells in about `seconds` at 60 frames/s. */
export function autoStepsPerFrame(cells: number, courant: number, seconds = 4): number {
  const steps = cells / Math.max(0.05, courant);
  return Math.max(1, Math.min(200, Math.round(steps / (60 * seconds))));
}
