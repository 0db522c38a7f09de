// Trace view: the reflected and transmitted records at the reference planes against time, with the
// echo table's echoes marked and named by their paths; optionally as a dB envelope.

import { Chart, type ChartMarker, type ChartPanel } from '../charts/chart.ts';
import { envelope } from '../../echoes/envelope.ts';
import type { WireColumn } from '../protocol.ts';
import { THEME } from '../theme.ts';
import { num, text } from '../tables.ts';

export class TraceView {
  readonly chart: Chart;
  constructor(host: HTMLElement) { this.chart = new Chart(host, 380); }

  show(trace: readonly WireColumn[] | null, echoes: readonly WireColumn[] | null, asEnvelope: boolean, note: string): void {
    const t = num(trace, 't_ns');
    const inc = num(trace, 'E_incident'), refl = num(trace, 'E_reflected'), trans = num(trace, 'E_transmitted');
    if (t === null || inc === null || refl === null || t.length === 0) {
      this.chart.set({ title: 'Echoes', xLabel: 'time t (ns)', panels: [], empty: note || 'waiting for the pulse run' });
      return;
    }
    // Echo delays are measured from the incident pulse's envelope peak at x = 0.
    const eInc = envelope(inc);
    let k0 = 0;
    for (let i = 1; i < eInc.length; i++) if (eInc[i] > eInc[k0]) k0 = i;
    const t0 = t[k0], peak = eInc[k0] > 0 ? eInc[k0] : 1;
    // Each echo is marked with its number; the key under the chart gives its delay, level and path.
    const et = num(echoes, 't_ns'), lv = num(echoes, 'level_dB'), paths = text(echoes, 'path');
    const markers: ChartMarker[] = [];
    const key: string[] = [];
    if (et !== null && et.length > 0) {
      key.push('Echoes marked above: delay after the front-face echo, level re the incident pulse, path');
      for (let i = 0; i < et.length; i++) {
        markers.push({ x: t0 + et[i], label: String(i + 1), color: THEME.reflected });
        const level = lv !== null ? `${lv[i].toFixed(1).replace('-', '−')} dB` : '';
        const delay = `${et[i] >= 0 ? '+' : '−'}${Math.abs(et[i]).toFixed(3)} ns`;
        key.push(`${String(i + 1).padStart(2)}  ${delay.padStart(10)}  ${level.padStart(9)}  ${paths?.[i] ?? ''}`);
      }
    }
    const toDb = (x: Float64Array): Float64Array => {
      const e = envelope(x);
      return e.map((v) => (v > 0 ? Math.max(-120, 20 * Math.log10(v / peak)) : -120));
    };
    const y = (x: Float64Array): Float64Array => (asEnvelope ? toDb(x) : x);
    const yLabel = asEnvelope ? 'envelope (dB re incident peak)' : 'E / E₀';
    const panels: ChartPanel[] = [{
      yLabel,
      series: [
        { label: 'incident at x = 0', x: t, y: y(inc), color: THEME.incident, width: 1 },
        { label: 'reflected at x = 0', x: t, y: y(refl), color: THEME.reflected, width: 1.5 },
      ],
      markers,
      yFloor: asEnvelope ? -90 : undefined,
    }];
    const hasT = trans !== null && trans.some((v) => v !== 0);
    if (hasT) {
      panels.push({
        yLabel,
        series: [{ label: 'transmitted at the back face', x: t, y: y(trans), color: THEME.transmitted, width: 1.5 }],
        weight: 0.7,
        yFloor: asEnvelope ? -90 : undefined,
      });
    }
    this.chart.set({ title: 'Echoes', subtitle: note, xLabel: 'time t (ns)', panels, footer: key });
  }
}
