// Trace view: the reflected and transmitted records at the reference planes against time, with the
// echo tables' echoes marked by number; optionally the band-limited envelopes the echoes are read
// from, in dB relative to the incident band pulse's peak. A key under the chart gives each marked
// echo's delay, level and path.

import { Chart, type ChartMarker, type ChartPanel } from '../charts/chart.ts';
import type { WireColumn } from '../protocol.ts';
import { THEME } from '../theme.ts';
import { num, text } from '../tables.ts';

/** What the view draws, all from the pulse run's report. */
export interface TraceInput {
  trace: readonly WireColumn[] | null;
  echoes: readonly WireColumn[] | null;
  echoesT: readonly WireColumn[] | null;
  envelope: readonly WireColumn[] | null;
  /** Run time (ns) of delay 0: the incident pulse at x = 0. */
  delayZero_ns: number | null;
}

/** Lowest level of the dB view: the band pulse's sidelobes sit near −90 dB, so −80 dB shows clean. */
const ENVELOPE_BOTTOM_dB = -100;

const minus = (s: string) => s.replace('-', '−');

/** Markers and key lines of one echo table; `tag` prefixes the numbers ("" or "T"). */
function marked(table: readonly WireColumn[] | null, t0: number, tag: string, color: string): { markers: ChartMarker[]; key: string[] } {
  const et = num(table, 't_ns'), lv = num(table, 'level_dB'), paths = text(table, 'path'), near = text(table, 'nearest_path');
  const markers: ChartMarker[] = [], key: string[] = [];
  if (et === null) return { markers, key };
  for (let i = 0; i < et.length; i++) {
    const label = `${tag}${i + 1}`;
    markers.push({ x: t0 + et[i], label, color });
    const level = lv !== null ? `${minus(lv[i].toFixed(1))} dB` : '';
    const delay = `${et[i] >= 0 ? '+' : '−'}${Math.abs(et[i]).toFixed(3)} ns`;
    const path = near?.[i] ? `${paths?.[i] ?? ''} (nearest path: ${near[i]})` : paths?.[i] ?? '';
    key.push(`${label.padStart(3)}  ${delay.padStart(10)}  ${level.padStart(9)}  ${path}`);
  }
  return { markers, key };
}

export class TraceView {
  readonly chart: Chart;
  constructor(host: HTMLElement) { this.chart = new Chart(host, 380); }

  show(input: TraceInput, asEnvelope: boolean, note: string): void {
    const t = num(input.trace, 't_ns');
    const inc = num(input.trace, 'E_incident'), refl = num(input.trace, 'E_reflected'), trans = num(input.trace, 'E_transmitted');
    if (t === null || inc === null || refl === null || t.length === 0) {
      this.chart.set({ title: 'Echoes', xLabel: 'time t (ns)', panels: [], empty: note || 'waiting for the pulse run' });
      return;
    }
    const t0 = input.delayZero_ns ?? 0;
    const R = marked(input.echoes, t0, '', THEME.reflected), T = marked(input.echoesT, t0, 'T', THEME.transmitted);
    const key: string[] = [];
    if (R.key.length) key.push('Reflected echoes (numbered above): delay after the front-face echo, level re the incident pulse, path', ...R.key);
    if (T.key.length) key.push('Transmitted echoes (T): delay after the incident pulse at x = 0, level, path', ...T.key);
    if (key.length) key.push('Echoes of an ideal plane wave on flat, uniform layers: not a survey of a real structure (see the about panel).');
    const envT = num(input.envelope, 't_ns');
    const dB = asEnvelope && envT !== null && envT.length > 0;
    const yLabel = dB ? 'band envelope (dB)' : 'E / E₀';
    const series = (name: string, raw: Float64Array | null) => (dB ? num(input.envelope, `${name}_dB`) : raw);
    const x = dB && envT !== null ? envT : t;
    const yi = series('incident', inc), yr = series('reflected', refl), yt = series('transmitted', trans);
    const panels: ChartPanel[] = [{
      yLabel,
      series: [
        ...(yi ? [{ label: dB ? 'incident band pulse at x = 0' : 'incident at x = 0', x, y: yi, color: THEME.incident, width: 1 }] : []),
        ...(yr ? [{ label: dB ? 'reflected band response' : 'reflected at x = 0', x, y: yr, color: THEME.reflected, width: 1.5 }] : []),
      ],
      markers: R.markers,
      yRange: dB ? [ENVELOPE_BOTTOM_dB, 5] : undefined,
    }];
    const hasT = trans !== null && trans.some((v) => v !== 0);
    if (hasT && yt) {
      panels.push({
        yLabel,
        series: [{ label: dB ? 'transmitted band response' : 'transmitted at the back face', x, y: yt, color: THEME.transmitted, width: 1.5 }],
        markers: T.markers,
        weight: 0.7,
        yRange: dB ? [ENVELOPE_BOTTOM_dB, 5] : undefined,
      });
    }
    this.chart.set({ title: 'Echoes', subtitle: note, xLabel: 'time t (ns)', panels, footer: key });
  }
}
