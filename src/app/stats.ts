// What the page exposes for the browser tests and the benchmark (window.slabecho): running figures,
// and a probe into the drawn geometry of the charts and the field view.

import type { FieldBoxes, FieldMarks } from './fieldView.ts';
import type { SpacetimeView } from './spacetime/view.ts';
import type { StudyMapView } from './studies/mapView.ts';

/** Figures the browser tests and the benchmark read. */
export interface WorkbenchStats {
  fieldRenders: number;
  renderer: string;
  /** Edit → exact/FEM views redrawn, ms, for the latest edit. */
  lastEditToUpdate_ms: number | null;
  lastSolve_ms: number | null;
  version: number;
  solvedVersion: number;
  reportVersion: number;
  step: number;
  playing: boolean;
  recording: boolean;
  /** The latest clip: format, encoder, frames, playing time and the run's time it covers. */
  lastClip: { name: string; description: string; frames: number; fps: number; duration_s: number; bytes: number; start_ns: number; end_ns: number; arrival_ns: number; stepsPerFrame: number } | null;
  /** The field view's framing: the part of the grid shown, the default one, the stack, mm; grid: framed on the current stack's grid. */
  field: { window_mm: [number, number]; default_mm: [number, number]; stack_mm: number; zoomed: boolean; grid: boolean };
}

/** Geometry the browser tests read: where a chart draws a value, what it shows, the field view's header boxes. */
export interface WorkbenchProbe {
  chartPoint(view: ChartViewId, x: number, panel?: number): { x: number; y: number } | null;
  chartRange(view: ChartViewId): [number, number] | null;
  fieldBoxes(): FieldBoxes;
  fieldMarks(): FieldMarks;
  fieldLabels(): Array<{ text: string; x: number; y: number; w: number }>;
  /** The space–time map's grid, ranges and rays (mm, ns of run time), or null when none is drawn. */
  spacetime(): ReturnType<SpacetimeView['probe']>;
  /** The exact/FEM spectrum table of the current stack (the CLI's spectrum.csv columns), or null while solving. */
  solvedSpectrum(): Array<{ name: string; data: number[] }> | null;
  /** The sweep map's shown quantity over cases × frequencies, or null when no current sweep is drawn. */
  studyMap(): ReturnType<StudyMapView['probe']>;
  /** The latest tolerance study's percentile columns (tolerance.csv's), or null. */
  tolerance(): { samples: number; columns: Array<{ name: string; data: number[] }> } | null;
}
type ChartViewId = 'spectrum-view' | 'profile-view' | 'trace-view' | 'material-plot';

declare global {
  interface Window { slabecho?: { stats: WorkbenchStats; probe: WorkbenchProbe } }
}
