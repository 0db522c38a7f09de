// The study view: a sweep as a map over frequency (across) and the swept value (up), one engineering quantity
// (IL_dB, R_power …) as colour on a sequential, colour-blind-safe scale (d3's cividis) with its colour bar. Each
// case is a row of the map between the midpoints to its neighbours, so uneven value lists are drawn where they
// lie. One canvas holds the picture (its PNG); a readout of the cell under the pointer sits on top.

import { interpolateCividis } from 'd3-scale-chromatic';
import type { QuantityName } from '../../studies/quantities.ts';
import type { ReadoutBox } from '../charts/readoutBox.ts';
import { nearestIndex, readoutValue } from '../charts/readout.ts';
import {
  beginMapPanel, colourTable, frameDataX, frameDataY, frameY, gridImage, mapPlotRect, overPlot, paintAxes, paintColourBarBeside, wireMapCanvas, type Frame2,
} from '../charts/heatmap.ts';
import { fitText } from '../charts/paint.ts';
import { THEME } from '../theme.ts';
import type { SweepResult } from './compute.ts';

const HEIGHT = 380;
const PAD = { left: 70, right: 100, top: 34, bottom: 44 };
const LUT = colourTable(interpolateCividis);

export const QUANTITY_LABELS: Record<QuantityName, string> = {
  R_power: 'R_power (reflected power fraction)', T_power: 'T_power (transmitted power fraction)', absorbed: 'absorbed fraction',
  IL_dB: 'IL_dB (insertion loss, dB)', RL_dB: 'RL_dB (return loss, dB)', IPD_deg: 'IPD_deg (insertion phase delay, °)',
};

export class StudyMapView {
  readonly canvas: HTMLCanvasElement;
  private readonly readout: ReadoutBox;
  private sweep: SweepResult | null = null;
  private quantity: QuantityName = 'IL_dB';
  private note = '';
  private frame: Frame2 | null = null;
  private order: number[] = [];
  private image: HTMLCanvasElement | null = null;
  private pending = 0;

  constructor(private readonly host: HTMLElement) {
    host.classList.add('chart-host');
    this.canvas = document.createElement('canvas');
    this.canvas.className = 'chart-canvas';
    host.append(this.canvas);
    this.readout = wireMapCanvas(host, this.canvas, 'study-view-readout', () => this.request(), (px, py) => this.hover(px, py));
  }

  show(sweep: SweepResult | null, quantity: QuantityName, note: string): void {
    this.sweep = sweep;
    this.quantity = quantity;
    this.note = note;
    this.request();
  }

  request(): void {
    if (this.pending !== 0) return;
    this.pending = requestAnimationFrame(() => { this.pending = 0; this.draw(); });
  }

  /** What the tests read: the shown quantity over cases × frequencies (case-major), the axes. */
  probe(): { path: string; values: number[]; f_GHz: number[]; quantity: QuantityName; data: number[] } | null {
    const s = this.sweep;
    if (s === null || this.frame === null) return null;
    return { path: s.path, values: [...s.values], f_GHz: [...s.f_GHz], quantity: this.quantity, data: [...s.quantities[this.quantity]] };
  }

  draw(): void {
    const { ctx, w, subtitleAt: at } = beginMapPanel(this.canvas, this.host, HEIGHT, 'Sweep map');
    this.frame = null;
    const s = this.sweep;
    ctx.font = `12px ${THEME.font}`;
    ctx.fillStyle = THEME.inkSoft;
    if (s === null || s.values.length === 0 || s.f_GHz.length === 0) {
      this.host.dataset.empty = this.note || 'no sweep yet';
      ctx.textAlign = 'center';
      ctx.fillText(fitText(ctx, this.note || 'no sweep yet: run one from the panel (Design studies)', w - 40), w / 2, HEIGHT / 2);
      return;
    }
    delete this.host.dataset.empty;
    ctx.fillText(fitText(ctx, `${QUANTITY_LABELS[this.quantity]} over ${s.path}${this.note ? ` · ${this.note}` : ''}`, w - at - 12), at, 20);
    const nx = s.f_GHz.length, ny = s.values.length, data = s.quantities[this.quantity];
    // Rows in increasing value order (a list may come in any order), each between the midpoints to its neighbours.
    this.order = Array.from({ length: ny }, (_, i) => i).sort((a, b) => s.values[a] - s.values[b]);
    const v = this.order.map((i) => s.values[i]);
    const edge = (k: number): number => (k <= 0 ? v[0] - (ny > 1 ? (v[1] - v[0]) / 2 : 0.5) : k >= ny ? v[ny - 1] + (ny > 1 ? (v[ny - 1] - v[ny - 2]) / 2 : 0.5) : (v[k - 1] + v[k]) / 2);
    const df = nx > 1 ? (s.f_GHz[nx - 1] - s.f_GHz[0]) / (nx - 1) : 1;
    const rect = mapPlotRect(w, HEIGHT, PAD);
    const f: Frame2 = { rect, x: [s.f_GHz[0] - df / 2, s.f_GHz[nx - 1] + df / 2], y: [edge(0), edge(ny)], yDown: false };
    this.frame = f;
    let lo = Infinity, hi = -Infinity;
    for (const x of data) if (Number.isFinite(x)) { lo = Math.min(lo, x); hi = Math.max(hi, x); }
    if (!(hi > lo)) { hi = lo + 1; lo -= 1; }
    this.image = gridImage(data, nx, ny, (x) => (x - lo) / (hi - lo), LUT, this.image);
    ctx.imageSmoothingEnabled = false;
    this.order.forEach((row, k) => {
      const top = frameY(f, edge(k + 1)), bottom = frameY(f, edge(k));
      ctx.drawImage(this.image!, 0, row, nx, 1, rect.left, top, rect.width, bottom - top);
    });
    paintAxes(ctx, f, 'frequency (GHz)', s.path);
    paintColourBarBeside(ctx, rect, LUT, lo, hi, this.quantity);
  }

  private hover(px: number, py: number): void {
    const f = this.frame, s = this.sweep;
    if (f === null || s === null || !overPlot(f, px, py)) {
      this.readout.hide();
      return;
    }
    const i = nearestIndex(s.f_GHz, frameDataX(f, px));
    const sorted = this.order.map((r) => s.values[r]);
    const k = nearestIndex(sorted, frameDataY(f, py)), row = this.order[k];
    const v = s.quantities[this.quantity][row * s.f_GHz.length + i];
    this.readout.show(`f = ${readoutValue(s.f_GHz[i])} GHz, ${s.path} = ${readoutValue(s.values[row])}`,
      [{ title: QUANTITY_LABELS[this.quantity], rows: [{ label: this.quantity, color: THEME.ink, value: readoutValue(v, this.quantity.endsWith('_dB') ? 3 : undefined) }] }],
      px, Math.max(f.rect.top, py - 20), this.canvas.clientWidth);
  }
}
