// The files of the workbench's views that the CLI's tables do not hold, for the export: the tolerance study's
// percentiles and the space–time map, each with its line for the export's README.

import { formatCsv, ordinal } from '../report/table.ts';
import { csvGrid, spacetimeCsv } from './spacetime/csv.ts';
import type { SpacetimeMap } from './spacetime/recorder.ts';
import type { SpacetimeField } from './spacetime/view.ts';
import type { ToleranceResult } from './studies/compute.ts';

export interface ViewText { name: string; text: string; about: string }

/** `tolerance`: the study for the current stack (null when none or out of date); `map`: the current run's map. */
export function viewTexts(tolerance: ToleranceResult | null, map: SpacetimeMap | null, field: SpacetimeField): ViewText[] {
  const out: ViewText[] = [];
  if (tolerance !== null) {
    out.push({ name: 'tolerance.csv', text: formatCsv(tolerance.columns),
      about: `tolerance.csv: the tolerance study's percentiles (${tolerance.samples} samples, seed ${tolerance.seed}, varying ${tolerance.varies.join('; ')}), as \`slabecho tolerance\` writes them` });
  }
  if (map !== null) {
    const g = csvGrid(map);
    out.push({
      name: 'spacetime.csv', text: spacetimeCsv(map, field),
      about: `spacetime.csv: the ${field} field E/E0 of the space–time map, t_ns,x_mm,E, on ${g.times} times ${+g.dt_ns.toPrecision(4)} ns apart`
        + ` × ${g.positions} positions ${+g.dx_mm.toPrecision(4)} mm apart (every ${g.every_row * map.stepsPerRow} steps of the run, every ${ordinal(g.every_column)} grid node of the view)`,
    });
  }
  return out;
}
