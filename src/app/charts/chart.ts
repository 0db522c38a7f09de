// A small canvas chart: stacked panels sharing one x axis, line series reduced to at most two
// vertices per pixel column, vertical markers with labels, shaded x bands, a legend per panel.
// Everything (title, legend, notes) is drawn into the one canvas so a PNG of it is the whole view.

import { THEME } from '../theme.ts';
import { columnPolyline, reduceColumns, type ColumnPolyline } from './columns.ts';
import { finiteRange, niceTicks, tickLabel } from './ticks.ts';

export interface ChartSeries {
  label: string;
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  color: string;
  width?: number;
  dash?: number[];
}

export interface ChartMarker {
  x: number;
  label?: string;
  color?: string;
}

export interface ChartBand {
  x0: number; x1: number;
  color: string;
  label?: string;
  /** Hatched (e.g. a conductor or an absorbing region). */
  hatch?: boolean;
}

export interface ChartPanel {
  yLabel: string;
  series: ChartSeries[];
  /** Fixed y range; automatic (from the visible data) when absent. */
  yRange?: [number, number];
  /** Lower limit for an automatic range (e.g. a dB floor). */
  yFloor?: number;
  /** Relative height. */
  weight?: number;
  markers?: ChartMarker[];
  bands?: ChartBand[];
}

export interface ChartSpec {
  title: string;
  subtitle?: string;
  xLabel: string;
  xRange?: [number, number];
  panels: ChartPanel[];
  /** Shown centred when there is nothing to draw. */
  empty?: string;
  /** Lines of text under the x axis (e.g. the key to numbered markers); the canvas grows to fit. */
  footer?: string[];
}

const FOOTER_LINE = 15;

const PAD = { left: 62, right: 16, top: 34, bottom: 38, gap: 26 };

export class Chart {
  readonly canvas: HTMLCanvasElement;
  private readonly ctx: CanvasRenderingContext2D;
  private spec: ChartSpec | null = null;
  private pending = 0;
  private readonly line: ColumnPolyline = columnPolyline(1024);
  private cssW = 0;
  private cssH = 0;
  /** Draws done (tests and the benchmark read this). */
  draws = 0;
  onDraw: (() => void) | null = null;

  constructor(host: HTMLElement, private readonly heightPx: number) {
    this.canvas = document.createElement('canvas');
    this.canvas.className = 'chart-canvas';
    host.appendChild(this.canvas);
    const ctx = this.canvas.getContext('2d');
    if (ctx === null) throw new Error('2D canvas unavailable');
    this.ctx = ctx;
    new ResizeObserver(() => this.request()).observe(host);
  }

  set(spec: ChartSpec): void {
    this.spec = spec;
    this.request();
  }

  /** Redraw at the next animation frame (coalesced). */
  request(): void {
    if (this.pending !== 0) return;
    this.pending = requestAnimationFrame(() => { this.pending = 0; this.draw(); });
  }

  /** Draw now. */
  draw(): void {
    const host = this.canvas.parentElement;
    if (host === null) return;
    const w = Math.max(200, Math.floor(host.clientWidth));
    const footer = this.spec?.footer ?? [];
    const h = this.heightPx + (footer.length > 0 ? 8 + FOOTER_LINE * footer.length : 0);
    const dpr = Math.min(2, window.devicePixelRatio || 1);
    if (w !== this.cssW || h !== this.cssH || this.canvas.width !== Math.round(w * dpr)) {
      this.cssW = w; this.cssH = h;
      this.canvas.width = Math.round(w * dpr);
      this.canvas.height = Math.round(h * dpr);
      this.canvas.style.width = `${w}px`;
      this.canvas.style.height = `${h}px`;
    }
    const ctx = this.ctx;
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.fillStyle = THEME.panel;
    ctx.fillRect(0, 0, w, h);
    const spec = this.spec;
    if (spec !== null) this.paint(spec, w, this.heightPx);
    if (footer.length > 0) this.paintFooter(footer, w, this.heightPx);
    this.draws++;
    this.onDraw?.();
  }

  private paint(spec: ChartSpec, w: number, h: number): void {
    const ctx = this.ctx;
    ctx.fillStyle = THEME.ink;
    ctx.font = `600 13px ${THEME.font}`;
    ctx.textBaseline = 'alphabetic';
    ctx.textAlign = 'left';
    ctx.fillText(spec.title, 12, 20);
    if (spec.subtitle !== undefined) {
      const tw = ctx.measureText(spec.title).width;
      ctx.font = `12px ${THEME.font}`;
      ctx.fillStyle = THEME.inkSoft;
      ctx.fillText(spec.subtitle, 12 + tw + 10, 20);
    }
    const xr = spec.xRange ?? autoX(spec.panels);
    const plotL = PAD.left, plotR = w - PAD.right;
    const plotW = plotR - plotL;
    if (xr === null || spec.panels.every((p) => p.series.length === 0)) {
      ctx.fillStyle = THEME.inkSoft;
      ctx.font = `12px ${THEME.font}`;
      ctx.textAlign = 'center';
      ctx.fillText(spec.empty ?? 'no data yet', w / 2, h / 2);
      return;
    }
    const totalWeight = spec.panels.reduce((s, p) => s + (p.weight ?? 1), 0);
    const avail = h - PAD.top - PAD.bottom - PAD.gap * (spec.panels.length - 1);
    let top = PAD.top;
    const xTicks = niceTicks(xr[0], xr[1], Math.max(3, Math.floor(plotW / 90)));
    const xToPx = (x: number): number => plotL + ((x - xr[0]) / (xr[1] - xr[0])) * plotW;
    spec.panels.forEach((panel, k) => {
      const ph = (avail * (panel.weight ?? 1)) / totalWeight;
      const last = k === spec.panels.length - 1;
      this.paintPanel(panel, xr, xTicks, xToPx, plotL, top, plotW, ph, last ? spec.xLabel : null);
      top += ph + PAD.gap;
    });
  }

  private paintFooter(lines: string[], w: number, top: number): void {
    const ctx = this.ctx;
    ctx.font = `11px ${THEME.mono}`;
    ctx.fillStyle = THEME.ink;
    ctx.textAlign = 'left';
    ctx.textBaseline = 'alphabetic';
    lines.forEach((line, i) => ctx.fillText(fitText(ctx, line, w - 24), 12, top + FOOTER_LINE * (i + 1)));
  }

  private paintPanel(
    panel: ChartPanel, xr: [number, number], xTicks: number[], xToPx: (x: number) => number,
    left: number, top: number, width: number, height: number, xLabel: string | null,
  ): void {
    const ctx = this.ctx;
    let yr = panel.yRange ?? autoY(panel, xr);
    if (panel.yRange === undefined && panel.yFloor !== undefined && yr[0] < panel.yFloor) yr = [panel.yFloor, Math.max(yr[1], panel.yFloor + 1)];
    const yTicks = niceTicks(yr[0], yr[1], Math.max(2, Math.floor(height / 34)));
    const yToPx = (y: number): number => top + height - ((y - yr[0]) / (yr[1] - yr[0])) * height;

    ctx.save();
    ctx.beginPath();
    ctx.rect(left, top, width, height);
    ctx.clip();
    for (const b of panel.bands ?? []) {
      const a = Math.max(left, xToPx(b.x0)), z = Math.min(left + width, xToPx(b.x1));
      if (z <= a) continue;
      ctx.fillStyle = b.color;
      ctx.fillRect(a, top, z - a, height);
      if (b.hatch === true) hatch(ctx, a, top, z - a, height, THEME.axis);
    }
    // Grid.
    ctx.strokeStyle = THEME.grid;
    ctx.lineWidth = 1;
    ctx.setLineDash([]);
    ctx.beginPath();
    for (const t of xTicks) { const p = Math.round(xToPx(t)) + 0.5; ctx.moveTo(p, top); ctx.lineTo(p, top + height); }
    for (const t of yTicks) { const p = Math.round(yToPx(t)) + 0.5; ctx.moveTo(left, p); ctx.lineTo(left + width, p); }
    ctx.stroke();
    // Band labels.
    ctx.font = `10px ${THEME.font}`;
    ctx.fillStyle = THEME.inkSoft;
    ctx.textAlign = 'center';
    for (const b of panel.bands ?? []) {
      if (b.label === undefined) continue;
      const a = Math.max(left, xToPx(b.x0)), z = Math.min(left + width, xToPx(b.x1));
      if (z - a > ctx.measureText(b.label).width + 4) ctx.fillText(b.label, (a + z) / 2, top + height - 4);
    }
    // Markers; a label goes in the first of four rows where it does not overlap the one before it.
    const rowEnd = [-Infinity, -Infinity, -Infinity, -Infinity];
    for (const m of panel.markers ?? []) {
      const p = Math.round(xToPx(m.x)) + 0.5;
      if (p < left || p > left + width) continue;
      ctx.strokeStyle = m.color ?? THEME.inkSoft;
      ctx.setLineDash([3, 3]);
      ctx.beginPath(); ctx.moveTo(p, top); ctx.lineTo(p, top + height); ctx.stroke();
      ctx.setLineDash([]);
      if (m.label !== undefined) {
        ctx.fillStyle = m.color ?? THEME.inkSoft;
        // Right of the line when it fits, else left of it; never past the plot's edge.
        const label = fitText(ctx, m.label, width - 6);
        const tw = ctx.measureText(label).width;
        const x0 = p + 3 + tw <= left + width ? p + 3 : Math.max(left + 3, p - 3 - tw);
        const free = rowEnd.findIndex((end) => x0 > end + 4);
        const row = free >= 0 ? free : rowEnd.indexOf(Math.min(...rowEnd));
        rowEnd[row] = x0 + tw;
        ctx.textAlign = 'left';
        ctx.fillText(label, x0, top + 12 + 12 * row);
      }
    }
    // Series.
    for (const s of panel.series) this.paintSeries(s, xr, yToPx, left, width);
    ctx.restore();

    // Frame and axes.
    ctx.strokeStyle = THEME.axis;
    ctx.lineWidth = 1;
    ctx.strokeRect(left + 0.5, top + 0.5, width - 1, height - 1);
    ctx.fillStyle = THEME.inkSoft;
    ctx.font = `11px ${THEME.font}`;
    ctx.textAlign = 'right';
    ctx.textBaseline = 'middle';
    for (const t of yTicks) ctx.fillText(tickLabel(t, yTicks), left - 6, yToPx(t));
    ctx.save();
    ctx.translate(14, top + height / 2);
    ctx.rotate(-Math.PI / 2);
    ctx.textAlign = 'center';
    ctx.fillStyle = THEME.ink;
    ctx.fillText(panel.yLabel, 0, 0);
    ctx.restore();
    ctx.textBaseline = 'top';
    ctx.textAlign = 'center';
    if (xLabel !== null) {
      for (const t of xTicks) ctx.fillText(tickLabel(t, xTicks), xToPx(t), top + height + 5);
      ctx.fillStyle = THEME.ink;
      ctx.fillText(xLabel, left + width / 2, top + height + 20);
    }
    ctx.textBaseline = 'alphabetic';
    // Legend, right-aligned above the panel.
    ctx.font = `11px ${THEME.font}`;
    let x = left + width;
    for (let i = panel.series.length - 1; i >= 0; i--) {
      const s = panel.series[i];
      const tw = ctx.measureText(s.label).width;
      x -= tw;
      ctx.fillStyle = THEME.ink;
      ctx.textAlign = 'left';
      ctx.fillText(s.label, x, top - 6);
      x -= 22;
      ctx.strokeStyle = s.color;
      ctx.lineWidth = s.width ?? 1.5;
      ctx.setLineDash(s.dash ?? []);
      ctx.beginPath(); ctx.moveTo(x, top - 10); ctx.lineTo(x + 18, top - 10); ctx.stroke();
      ctx.setLineDash([]);
      x -= 14;
    }
  }

  private paintSeries(s: ChartSeries, xr: [number, number], yToPx: (y: number) => number, left: number, width: number): void {
    const ctx = this.ctx;
    const n = Math.min(s.x.length, s.y.length);
    const line = reduceColumns(s.x, s.y, n, xr[0], xr[1], width, this.line);
    if (line.count === 0) return;
    ctx.strokeStyle = s.color;
    ctx.lineWidth = s.width ?? 1.5;
    ctx.setLineDash(s.dash ?? []);
    ctx.lineJoin = 'round';
    ctx.beginPath();
    let next = 0;
    for (let k = 0; k < line.count; k++) {
      const px = left + line.px[k], py = yToPx(line.y[k]);
      if (next < line.startCount && line.starts[next] === k) { ctx.moveTo(px, py); next++; }
      else ctx.lineTo(px, py);
    }
    if (line.count === 1) ctx.lineTo(left + line.px[0] + 1, yToPx(line.y[0]));
    ctx.stroke();
    ctx.setLineDash([]);
  }
}

function autoX(panels: ChartPanel[]): [number, number] | null {
  let lo = Infinity, hi = -Infinity;
  for (const p of panels) for (const s of p.series) {
    const r = finiteRange(s.x);
    if (r !== null) { lo = Math.min(lo, r[0]); hi = Math.max(hi, r[1]); }
  }
  if (!(hi > lo)) return lo === hi && Number.isFinite(lo) ? [lo - 1, lo + 1] : null;
  return [lo, hi];
}

function autoY(panel: ChartPanel, xr: [number, number]): [number, number] {
  let lo = Infinity, hi = -Infinity;
  for (const s of panel.series) {
    const n = Math.min(s.x.length, s.y.length);
    for (let i = 0; i < n; i++) {
      const x = s.x[i], y = s.y[i];
      if (x < xr[0] || x > xr[1] || !Number.isFinite(y)) continue;
      if (y < lo) lo = y;
      if (y > hi) hi = y;
    }
  }
  if (!(lo <= hi)) return [-1, 1];
  if (hi - lo < 1e-12 * Math.max(1, Math.abs(hi))) { const c = lo; return [c - 1, c + 1]; }
  const pad = 0.06 * (hi - lo);
  return [lo - pad, hi + pad];
}

/** `text`, cut with an ellipsis to fit `maxWidth` px in the current font. */
function fitText(ctx: CanvasRenderingContext2D, text: string, maxWidth: number): string {
  if (ctx.measureText(text).width <= maxWidth) return text;
  let n = text.length;
  while (n > 1 && ctx.measureText(`${text.slice(0, n)}…`).width > maxWidth) n--;
  return `${text.slice(0, n)}…`;
}

function hatch(ctx: CanvasRenderingContext2D, x: number, y: number, w: number, h: number, color: string): void {
  ctx.save();
  ctx.beginPath(); ctx.rect(x, y, w, h); ctx.clip();
  ctx.strokeStyle = color;
  ctx.lineWidth = 1;
  ctx.beginPath();
  for (let k = -h; k < w; k += 7) { ctx.moveTo(x + k, y + h); ctx.lineTo(x + k + h, y); }
  ctx.stroke();
  ctx.restore();
}
