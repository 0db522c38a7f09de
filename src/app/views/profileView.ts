// Profile view: |E| and phase of the standing wave against position at one frequency, from every
// method present, over shaded layer bands. At an angle the field is the tangential E along one normal line.

import { Chart, type ChartBand, type ChartSeries } from '../charts/chart.ts';
import type { WireColumn } from '../protocol.ts';
import type { StackSketch } from '../sketch.ts';
import { THEME, bandTint } from '../theme.ts';
import { complexCol, mag, num, phaseDeg } from '../tables.ts';
import { methodsIn } from './methods.ts';

export class ProfileView {
  readonly chart: Chart;
  constructor(host: HTMLElement) { this.chart = new Chart(host, 460); }

  show(tables: Array<readonly WireColumn[] | null>, sketch: StackSketch | null, f_GHz: number, note: string, empty = 'solving…',
    incidence: { angle_deg: number; polarization: string } = { angle_deg: 0, polarization: 'TE' }): void {
    const oblique = incidence.angle_deg !== 0;
    const absE: ChartSeries[] = [], phase: ChartSeries[] = [];
    const seen = new Set<string>();
    let xMin = Infinity, xMax = -Infinity;
    for (const t of tables) {
      const x = num(t, 'x_mm');
      if (t === null || x === null || x.length === 0) continue;
      xMin = Math.min(xMin, x[0]); xMax = Math.max(xMax, x[x.length - 1]);
      for (const m of methodsIn(t, 'E')) {
        if (seen.has(m.stem)) continue;
        const E = complexCol(t, `E_${m.stem}`);
        if (E === null) continue;
        seen.add(m.stem);
        absE.push({ label: m.label, x, y: mag(E), color: m.color, width: m.width, dash: m.dash });
        phase.push({ label: m.label, x, y: phaseDeg(E), color: m.color, width: m.width, dash: m.dash });
      }
    }
    const bands: ChartBand[] = [];
    if (sketch !== null && Number.isFinite(xMin)) {
      // The half-spaces, tinted and named like the layers.
      const d = sketch.thickness_m * 1e3;
      bands.push({ x0: xMin, x1: 0, color: bandTint(sketch.front), label: sketch.front });
      if (!sketch.pec) bands.push({ x0: d, x1: xMax, color: bandTint(sketch.back), label: sketch.back });
    }
    if (sketch !== null) {
      for (const l of sketch.layers) {
        if (l.kind === 'bulk') bands.push({ x0: l.x0_m * 1e3, x1: l.x1_m * 1e3, color: bandTint(l.material), label: l.material });
      }
      if (sketch.pec && Number.isFinite(xMax)) {
        const d = sketch.thickness_m * 1e3;
        bands.push({ x0: d, x1: d + Math.max(1, 0.04 * (xMax - xMin)), color: THEME.conductor, hatch: true });
        xMax = Math.max(xMax, d + 0.04 * (xMax - xMin));
      }
    }
    const markers = (sketch?.layers ?? []).filter((l) => l.kind === 'sheet')
      .map((l) => ({ x: l.x0_m * 1e3, label: l.material, color: THEME.sheet }));
    this.chart.set({
      title: 'Standing wave',
      subtitle: `${f_GHz} GHz${oblique ? ` · ${incidence.polarization} at ${incidence.angle_deg}°` : ''}${note ? ` · ${note}` : ''}`,
      xLabel: oblique ? 'depth x (mm) along one normal line, front face at 0' : 'position x (mm), front face at 0',
      xName: 'x',
      xUnit: 'mm',
      xRange: Number.isFinite(xMin) && xMax > xMin ? [xMin, xMax] : undefined,
      panels: [
        { yLabel: oblique ? '|E tangential| / E₀' : '|E| / E₀', series: absE, bands, markers },
        { yLabel: oblique ? 'phase of E tangential (°)' : 'phase of E (°)', series: phase, bands, yRange: [-180, 180], weight: 0.8, unit: '°', decimals: 2 },
      ],
      empty,
    });
  }
}
