// Messages between the page and the engine worker (src/app/worker.ts). Typed arrays travel as
// transferables: the page hands its frame buffers back with each `advance` so no frame allocates.
//
// The page runs three workers from the same script: a "solver" (exact + FEM on every edit), a "live"
// one (the steppable pulse run the field view animates) and a "batch" one (the full pulse run with
// spectra and echoes, which shows progress and is cancelled by terminating that worker).

import type { AgreementRow } from '../report/format-agreement.ts';
import type { ClipTiming } from './clip/scout.ts';
import type { EchoRays } from '../echoes/rays.ts';
import type { SpacetimeMap } from './spacetime/recorder.ts';

/** A table column on the wire: numbers, or text (the echo table's path names). */
export interface WireColumn {
  name: string;
  data: Float64Array | string[];
}

/** Run options the page sets (the same knobs the CLI offers). */
export interface RunSettings {
  /** Accuracy target of the pulse run (predicted worst phase error, e.g. 0.01); null = engine default. */
  accuracy: number | null;
}

/** Where things are on the pulse run's grid, for drawing. Positions in metres, x = 0 at the front face. */
export interface PulseGeometry {
  cells: number;
  courant: number;
  /** Position of every E node. */
  x_m: Float64Array;
  /** Absorbing regions at the open ends, [from, to]. */
  absorbers: Array<[number, number]>;
  /** Probes and the source plane. */
  probes: Array<{ label: string; x_m: number; kind: 'probe' | 'source' }>;
}

/** One animation frame of the pulse run. Arrays have `cells` entries; NaN where a trace is not defined. */
export interface FieldFrame {
  step: number;
  time_s: number;
  done: boolean;
  total: Float64Array;
  incident: Float64Array;
  /** total − incident in front of the stack, NaN elsewhere. */
  reflected: Float64Array;
  /** total behind the stack, NaN elsewhere. */
  transmitted: Float64Array;
}

/** The full pulse-run report (the same tables the CLI writes as CSV). */
export interface WireReport {
  spectrum: WireColumn[];
  profile: WireColumn[];
  /** Echo tables (echoes.csv, echoes_T.csv): numeric columns, then the text columns path, nearest_path, resolved. */
  echoes: WireColumn[];
  echoesT: WireColumn[];
  /** Band-limited envelopes in dB (t_ns, incident_dB, reflected_dB, transmitted_dB). */
  envelope: WireColumn[];
  trace: WireColumn[];
  summary: unknown;
  warnings: string[];
  ms: number;
  /** The field over the default framing and the run's time, recorded as it ran (null when it did not run). */
  spacetime: SpacetimeMap | null;
  /** The echo rows' bounce paths as rays (null when the engine did not run). */
  rays: EchoRays | null;
  /** Why the pulse engine declined the stack (the report then holds the exact and FEM results only). */
  skipped?: string;
}

export type ToWorker =
  | { kind: 'solve'; id: number; file: unknown }
  | { kind: 'pulse'; id: number; file: unknown; settings: RunSettings }
  // Messages that produce a frame carry a tag, which the frame echoes.
  | { kind: 'advance'; id: number; tag: number; steps: number; recycle: FieldFrame | null }
  | { kind: 'rewind'; id: number; tag: number }
  | { kind: 'seek'; id: number; tag: number; step: number; recycle: FieldFrame | null }
  | { kind: 'clip-timing'; id: number; window_m: [number, number] }
  | { kind: 'report'; id: number; file: unknown; settings: RunSettings };

export type FromWorker =
  | { kind: 'solved'; id: number; spectrum: WireColumn[]; profile: WireColumn[]; agreement: AgreementRow[]; warnings: string[]; ms: number }
  | { kind: 'pulse-ready'; id: number; geometry: PulseGeometry }
  | { kind: 'frame'; id: number; tag: number; frame: FieldFrame }
  | { kind: 'clip-timing'; id: number; timing: ClipTiming }
  | { kind: 'progress'; id: number; fraction: number; note: string }
  | { kind: 'report'; id: number; report: WireReport }
  | { kind: 'failed'; id: number; stage: 'solve' | 'pulse' | 'advance' | 'clip' | 'report'; messages: string[] };

/** Typed arrays inside a message, to pass as transferables. */
export function transferablesOf(value: unknown, out: Transferable[] = []): Transferable[] {
  if (ArrayBuffer.isView(value)) {
    const buf = value.buffer;
    if (buf instanceof ArrayBuffer && !out.includes(buf)) out.push(buf);
  } else if (Array.isArray(value)) {
    for (const v of value) transferablesOf(v, out);
  } else if (value !== null && typeof value === 'object') {
    for (const v of Object.values(value)) transferablesOf(v, out);
  }
  return out;
}
