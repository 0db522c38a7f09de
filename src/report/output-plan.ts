// How a report's files share the output limit: the spectrum as asked (its points are the user's choice), a reserve
// for summary.json and echoes.csv, then the profile and the time traces, which are sampled more sparsely when they
// would not fit (the profile at fewer points per wavelength, the traces at every k-th step), with a note saying so.
// Every figure is an upper bound (CSV_CHARS_PER_NUMBER per number), so the files written never pass the limit.

import { plainBytes, plainCount } from './budget.ts';
import { CSV_CHARS_PER_NUMBER } from './table.ts';

/** How densely the profile is sampled: points per wavelength, and whether the FEM's own nodes are added. */
export interface ProfileLevel { pointsPerWavelength: number; femSamples: boolean }

/** From the full sampling down to the sparsest that still shows a standing wave (4 points per wavelength). */
export const PROFILE_LEVELS: readonly ProfileLevel[] = [
  { pointsPerWavelength: 48, femSamples: true },
  { pointsPerWavelength: 48, femSamples: false },
  { pointsPerWavelength: 24, femSamples: false },
  { pointsPerWavelength: 12, femSamples: false },
  { pointsPerWavelength: 8, femSamples: false },
  { pointsPerWavelength: 6, femSamples: false },
  { pointsPerWavelength: 4, femSamples: false },
];

export interface OutputRequest {
  /** Spectrum rows (the stack's points) and numeric columns (f_GHz plus four per method). */
  points: number;
  spectrumColumns: number;
  /** Rows of the profile at a level (an upper bound), and its numeric columns; null when there is no profile. */
  profile: { rowsAt: (level: ProfileLevel) => number; columns: number } | null;
  /** Most rows the traces could have (the run's step limit + 1) and their columns; null without a pulse run. */
  trace: { rows: number; columns: number } | null;
  /** Other files of a fixed size (a Touchstone file), as tables of rows × numbers. */
  extraTables?: readonly { rows: number; columns: number }[];
  /** Layers in the stack (summary.json grows with them). */
  layers: number;
  /** The limit on all files together, bytes, and how the user sets it (for messages). */
  maxBytes: number;
  limitName: string;
}

export interface OutputPlan {
  /** Upper bounds, bytes: the spectrum; summary.json, echoes.csv and any extra file (Touchstone). */
  spectrum_bytes: number;
  reserve_bytes: number;
  /** The profile's sampling and its bound; null when there is none (oblique incidence) or it does not fit. */
  profile: { level: ProfileLevel; rows: number; bytes: number } | null;
  /** Most rows trace.csv may have (it is decimated to this); null without a pulse run. */
  traceRowsCap: number | null;
  /** Set when even the spectrum does not fit: the command is refused with this message. */
  refusal?: string;
  /** Warnings for the report: a sparser profile, a profile left out. */
  notes: string[];
  maxBytes: number;
  limitName: string;
}

/** summary.json and echoes.csv: a fixed part and a part per layer (measured sizes, with room to spare). */
const RESERVE_FIXED_BYTES = 100_000;
const RESERVE_PER_LAYER_BYTES = 3_000;

const tableBytes = (rows: number, columns: number): number => (rows + 1) * columns * CSV_CHARS_PER_NUMBER;

export function planOutputs(q: OutputRequest): OutputPlan {
  const spectrum_bytes = tableBytes(q.points, q.spectrumColumns);
  const reserve_bytes = RESERVE_FIXED_BYTES + RESERVE_PER_LAYER_BYTES * q.layers
    + (q.extraTables ?? []).reduce((n, t) => n + tableBytes(t.rows, t.columns), 0);
  const base = { spectrum_bytes, reserve_bytes, maxBytes: q.maxBytes, limitName: q.limitName, notes: [] as string[] };
  const room = q.maxBytes - spectrum_bytes - reserve_bytes;
  if (room < 0) {
    // Per point: the spectrum's numbers and those of any extra file with a row per point.
    const perPoint = q.spectrumColumns + (q.extraTables ?? []).filter((t) => t.rows === q.points).reduce((n, t) => n + t.columns, 0);
    const fixed = RESERVE_FIXED_BYTES + RESERVE_PER_LAYER_BYTES * q.layers;
    const fit = Math.floor((q.maxBytes - fixed) / (perPoint * CSV_CHARS_PER_NUMBER)) - 2;
    return {
      ...base, profile: null, traceRowsCap: q.trace ? 0 : null,
      refusal: `spectrum.csv and summary.json${q.extraTables?.length ? ' (and the Touchstone file)' : ''} alone could take ${plainBytes(spectrum_bytes + reserve_bytes)} ` +
        `(${plainCount(q.points)} points × ${q.spectrumColumns} columns), over the output limit (${q.limitName}); ` +
        (fit >= 2 ? `lower "points" to at most ${plainCount(fit)}, or raise the limit` : 'raise the limit'),
    };
  }
  const traceBytes = q.trace ? tableBytes(q.trace.rows, q.trace.columns) : 0;
  // The profile may use what the full traces leave, and at least half of the room.
  const profileShare = q.trace ? Math.max(room - traceBytes, room / 2) : room;
  let profile: OutputPlan['profile'] = null;
  if (q.profile) {
    for (const level of PROFILE_LEVELS) {
      const rows = q.profile.rowsAt(level), bytes = tableBytes(rows, q.profile.columns);
      if (bytes <= profileShare) { profile = { level, rows, bytes }; break; }
    }
    const full = PROFILE_LEVELS[0];
    if (profile === null) {
      const sparsest = PROFILE_LEVELS[PROFILE_LEVELS.length - 1];
      const rows = q.profile.rowsAt(sparsest);
      base.notes.push(`profile.csv is left out: even at ${sparsest.pointsPerWavelength} points per wavelength it would have ` +
        `${plainCount(rows)} rows (${plainBytes(tableBytes(rows, q.profile.columns))}), more than the output limit (${q.limitName}) leaves room for; ` +
        'raise the limit, or choose a lower profile_GHz (fewer wavelengths across the stack)');
    } else if (profile.level !== full) {
      base.notes.push(`profile.csv is sampled at ${profile.level.pointsPerWavelength} points per wavelength` +
        `${full.femSamples && !profile.level.femSamples ? ' without the extra points inside each FEM element' : ''} ` +
        `(${plainCount(profile.rows)} rows) to stay within the output limit (${q.limitName})`);
    }
  }
  const traceRowsCap = q.trace
    ? Math.max(2, Math.floor((room - (profile?.bytes ?? 0)) / (q.trace.columns * CSV_CHARS_PER_NUMBER)) - 1)
    : null;
  return { ...base, profile, traceRowsCap };
}

/** The stride that brings `rows` within `cap` (every stride-th row kept, the first included). */
export const decimationStride = (rows: number, cap: number): number => (rows <= cap ? 1 : Math.ceil(rows / cap));
