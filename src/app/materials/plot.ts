// The material editor's plot: ε′ and ε″ of a material over the stack's band (and μ′, μ″ when it is magnetic),
// evaluated by the core's own model functions (materials/permittivity.ts, permeability.ts) on the parsed file
// form, so the curve is what every solver uses.

import { permeability } from '../../materials/permeability.ts';
import { permittivity } from '../../materials/permittivity.ts';
import type { BulkModel } from '../../materials/types.ts';
import type { StackFileMaterial } from '../../stack/file.ts';
import type { ChartPanel, ChartSpec } from '../charts/chart.ts';
import { THEME } from '../theme.ts';

const SAMPLES = 161;

/** The chart of material `name` (a parsed definition) over band_GHz; a sheet or nothing gives an empty chart that says why. */
export function materialPlot(name: string, def: StackFileMaterial | null, band_GHz: [number, number]): ChartSpec {
  const base = { title: name === '' ? 'Material' : name, xLabel: 'frequency (GHz)', xName: 'f', xUnit: 'GHz' };
  if (def === null) return { ...base, panels: [], empty: 'no material chosen' };
  if (def.model === 'sheet') return { ...base, panels: [], empty: `a resistive sheet of ${def.ohm_per_sq} Ω/sq: no thickness, so no ε or μ to plot` };
  const m = def as BulkModel;
  const f = Float64Array.from({ length: SAMPLES }, (_, k) => band_GHz[0] + ((band_GHz[1] - band_GHz[0]) * k) / (SAMPLES - 1));
  const eps = f.map(() => 0), epsLoss = f.map(() => 0);
  const mu = f.map(() => 0), muLoss = f.map(() => 0);
  f.forEach((g, k) => {
    const e = permittivity(m, g * 1e9), u = permeability(m, g * 1e9);
    eps[k] = e.re; epsLoss[k] = -e.im; mu[k] = u.re; muLoss[k] = -u.im;
  });
  const panels: ChartPanel[] = [{
    yLabel: 'ε′, ε″', decimals: 4,
    series: [{ label: 'ε′', x: f, y: eps, color: THEME.total, width: 1.5 }, { label: 'ε″', x: f, y: epsLoss, color: THEME.reflected, width: 1.5, dash: [5, 3] }],
  }];
  if (mu.some((v) => v !== 1) || muLoss.some((v) => v !== 0)) {
    panels.push({
      yLabel: 'μ′, μ″', decimals: 4,
      series: [{ label: 'μ′', x: f, y: mu, color: THEME.transmitted, width: 1.5 }, { label: 'μ″', x: f, y: muLoss, color: THEME.sheet, width: 1.5, dash: [5, 3] }],
    });
  }
  return { ...base, subtitle: 'over the band', panels, empty: 'nothing to plot' };
}
