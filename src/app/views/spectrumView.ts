// Spectrum view: |R| and |T| in dB (or phase, or group delay) over the band from every method
// present, with the difference of each method from the exact solution underneath.

import { Chart, type ChartFill, type ChartPanel, type ChartSeries } from '../charts/chart.ts';
import { THEME } from '../theme.ts';
import { groupDelay } from '../../spectra/groupDelay.ts';
import type { WireColumn } from '../protocol.ts';
import type { SpectrumMode } from '../settings.ts';
import type { Scale } from '../charts/axis.ts';
import { complexCol, diffDb, mag, magDb, num, phaseDeg } from '../tables.ts';
import { methodsIn, styleOf } from './methods.ts';

type Cx = { re: Float64Array; im: Float64Array };

export interface SpectrumLook {
  mode: SpectrumMode;
  /** Frequency axis. */
  freqScale: Scale;
  /** Magnitudes in dB or as plain ratios. */
  magnitude: 'dB' | 'linear';
}

/** A measured response drawn beside the methods (its columns as the measured file gives them). */
export interface MeasuredOverlay {
  name: string;
  f_GHz: Float64Array;
  R: Cx | null;
  T: Cx | null;
  R_dB: Float64Array | null;
  T_dB: Float64Array | null;
}

/** A tolerance study's percentiles of R_power and T_power over the band (tolerance.csv's columns). */
export interface ToleranceOverlay {
  samples: number;
  f_GHz: Float64Array;
  R: { p05: Float64Array; p50: Float64Array; p95: Float64Array };
  T: { p05: Float64Array; p50: Float64Array; p95: Float64Array };
  /** T_power is |T|² only when the two half-spaces are alike: otherwise no band on |T|. */
  tIsMagnitude: boolean;
}

export interface SpectrumExtras { measured?: MeasuredOverlay | null; tolerance?: ToleranceOverlay | null }

const powerDb = (p: Float64Array): Float64Array => p.map((v) => (v > 0 ? Math.max(-120, 10 * Math.log10(v)) : -120));
const powerMag = (p: Float64Array): Float64Array => p.map((v) => Math.sqrt(Math.max(0, v)));
const dbMag = (d: Float64Array): Float64Array => d.map((v) => 10 ** (v / 20));

export class SpectrumView {
  readonly chart: Chart;
  constructor(host: HTMLElement) { this.chart = new Chart(host, 460); }

  /** `tables`: the exact/FEM table and, when current, the pulse run's table (its FDTD columns are added). */
  show(tables: Array<readonly WireColumn[] | null>, look: SpectrumLook, note: string, extras: SpectrumExtras = {}): void {
    const mode = look.mode, dB = look.magnitude === 'dB';
    const series = new Map<string, { f: Float64Array; R: Cx; T: Cx | null }>();
    for (const t of tables) {
      const f = num(t, 'f_GHz');
      if (t === null || f === null) continue;
      for (const m of methodsIn(t, 'R')) {
        if (series.has(m.stem)) continue;
        const R = complexCol(t, `R_${m.stem}`);
        if (R !== null) series.set(m.stem, { f, R, T: complexCol(t, `T_${m.stem}`) });
      }
    }
    const exact = series.get('tmm');
    const hasT = exact?.T !== null && exact?.T !== undefined && exact.T.re.some((v, i) => v !== 0 || exact.T!.im[i] !== 0);
    const value = (z: Cx, f: Float64Array): Float64Array => {
      if (mode === 'magnitude') return dB ? magDb(z) : mag(z);
      if (mode === 'phase') return phaseDeg(z);
      const fHz = f.map((v) => v * 1e9);
      return groupDelay(fHz, z.re, z.im).map((s) => s * 1e9);
    };
    const yLabel = (q: 'R' | 'T'): string =>
      mode === 'magnitude' ? (dB ? `|${q}| (dB)` : `|${q}|`) : mode === 'phase' ? `phase of ${q} (°)` : `group delay of ${q} (ns)`;
    const unit = mode === 'magnitude' ? (dB ? 'dB' : '') : mode === 'phase' ? '°' : 'ns';
    const decimals = mode === 'magnitude' ? (dB ? 3 : undefined) : mode === 'phase' ? 2 : undefined;
    const floor = mode === 'magnitude' && dB ? -80 : undefined;
    const curves = (q: 'R' | 'T'): ChartSeries[] => {
      const out: ChartSeries[] = [];
      for (const [stem, s] of series) {
        const z = q === 'R' ? s.R : s.T;
        if (z === null) continue;
        const st = styleOf(stem);
        out.push({ label: st.label, x: s.f, y: value(z, s.f), color: st.color, width: st.width, dash: st.dash });
      }
      return out;
    };
    const measured = (q: 'R' | 'T'): ChartSeries[] => measuredSeries(extras.measured ?? null, q, mode, dB);
    const band = (q: 'R' | 'T'): ChartFill[] => toleranceFill(extras.tolerance ?? null, q, mode, dB);
    const panels: ChartPanel[] = [{ yLabel: yLabel('R'), series: [...curves('R'), ...measured('R')], fills: band('R'), yFloor: floor, unit, decimals }];
    if (hasT) panels.push({ yLabel: yLabel('T'), series: [...curves('T'), ...measured('T')], fills: band('T'), yFloor: floor, unit, decimals });
    const diffs: ChartSeries[] = [];
    if (exact !== undefined) {
      for (const [stem, s] of series) {
        if (stem === 'tmm') continue;
        const st = styleOf(stem);
        diffs.push({ label: `|R ${st.label} − exact|`, x: s.f, y: diffDb(s.R, exact.R), color: st.color, width: 1.5 });
        if (hasT && s.T !== null && exact.T !== null) {
          diffs.push({ label: `|T ${st.label} − exact|`, x: s.f, y: diffDb(s.T, exact.T), color: st.color, width: 1.25, dash: [5, 3] });
        }
      }
    }
    if (diffs.length > 0) panels.push({ yLabel: 'difference (dB)', series: diffs, weight: 0.75, yFloor: -160, unit: 'dB', decimals: 1 });
    this.chart.set({
      title: 'Spectrum',
      subtitle: note,
      xLabel: look.freqScale === 'log' ? 'frequency (GHz, logarithmic)' : 'frequency (GHz)',
      xScale: look.freqScale,
      xName: 'f',
      xUnit: 'GHz',
      panels,
      empty: 'solving…',
    });
  }
}

/** The measured points of R or T in the view's terms: magnitudes from R_dB (or |R| of R_re, R_im), phases from the complex columns. */
function measuredSeries(m: MeasuredOverlay | null, q: 'R' | 'T', mode: SpectrumMode, dB: boolean): ChartSeries[] {
  if (m === null || mode === 'group delay') return [];
  const z = q === 'R' ? m.R : m.T, d = q === 'R' ? m.R_dB : m.T_dB;
  let y: Float64Array | null = null;
  if (mode === 'phase') y = z !== null ? phaseDeg(z) : null;
  else if (z !== null) y = dB ? magDb(z) : mag(z);
  else if (d !== null) y = dB ? d : dbMag(d);
  return y === null ? [] : [{ label: `measured (${m.name})`, x: m.f_GHz, y, color: THEME.measured, points: true }];
}

/** The p05–p95 band of R_power (or T_power) as |R| (|T|) in dB or as a ratio; magnitudes only. */
function toleranceFill(t: ToleranceOverlay | null, q: 'R' | 'T', mode: SpectrumMode, dB: boolean): ChartFill[] {
  if (t === null || mode !== 'magnitude' || (q === 'T' && !t.tIsMagnitude)) return [];
  const p = q === 'R' ? t.R : t.T, as = dB ? powerDb : powerMag;
  return [{ label: `p05–p95 of ${t.samples} samples`, x: t.f_GHz, lo: as(p.p05), hi: as(p.p95), color: 'rgba(36, 59, 143, 0.18)', loName: 'p05', hiName: 'p95' }];
}
