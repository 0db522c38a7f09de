// Painting one chart panel into a 2D canvas: bands, grid, markers, series (each reduced to at most two
// vertices per pixel column), frame, axes and legend.

import { THEME } from '../theme.ts';
import { columnPolyline, reduceColumns, type ColumnPolyline } from './columns.ts';
import { along, axisTickLabel, toPx, type Axis } from './axis.ts';
import { niceTicks, tickLabel } from './ticks.ts';
import type { ChartPanel, ChartSeries } from './chart.ts';

export interface PanelFrame {
  axis: Axis;
  xTicks: number[];
  top: number;
  height: number;
  yr: [number, number];
  /** Tick labels and the x axis title under this panel (the last one). */
  xLabel: string | null;
}

/** The series' x values along the axis (log10 x on a log axis), cached per array. */
export type AlongOf = (x: ArrayLike<number>) => ArrayLike<number>;

const line: ColumnPolyline = columnPolyline(1024);

export const yToPx = (f: PanelFrame, y: number): number => f.top + f.height - ((y - f.yr[0]) / (f.yr[1] - f.yr[0])) * f.height;

export function paintPanel(ctx: CanvasRenderingContext2D, panel: ChartPanel, f: PanelFrame, alongOf: AlongOf): void {
  const { axis, top, height } = f;
  const left = axis.left, width = axis.width;
  const xToPx = (x: number): number => toPx(axis, x);
  const yTicks = niceTicks(f.yr[0], f.yr[1], Math.max(2, Math.floor(height / 34)));
  ctx.save();
  ctx.beginPath();
  ctx.rect(left, top, width, height);
  ctx.clip();
  paintBands(ctx, panel, f, xToPx);
  // Grid.
  ctx.strokeStyle = THEME.grid;
  ctx.lineWidth = 1;
  ctx.setLineDash([]);
  ctx.beginPath();
  for (const t of f.xTicks) { const p = Math.round(xToPx(t)) + 0.5; ctx.moveTo(p, top); ctx.lineTo(p, top + height); }
  for (const t of yTicks) { const p = Math.round(yToPx(f, t)) + 0.5; ctx.moveTo(left, p); ctx.lineTo(left + width, p); }
  ctx.stroke();
  paintMarkers(ctx, panel, f, xToPx);
  for (const s of panel.series) paintSeries(ctx, s, f, alongOf);
  ctx.restore();
  // Frame and axes.
  ctx.strokeStyle = THEME.axis;
  ctx.lineWidth = 1;
  ctx.strokeRect(left + 0.5, top + 0.5, width - 1, height - 1);
  ctx.fillStyle = THEME.inkSoft;
  ctx.font = `11px ${THEME.font}`;
  ctx.textAlign = 'right';
  ctx.textBaseline = 'middle';
  for (const t of yTicks) ctx.fillText(tickLabel(t, yTicks), left - 6, yToPx(f, t));
  ctx.save();
  ctx.translate(14, top + height / 2);
  ctx.rotate(-Math.PI / 2);
  ctx.textAlign = 'center';
  ctx.fillStyle = THEME.ink;
  ctx.fillText(panel.yLabel, 0, 0);
  ctx.restore();
  ctx.textBaseline = 'top';
  ctx.textAlign = 'center';
  if (f.xLabel !== null) {
    for (const t of f.xTicks) ctx.fillText(axisTickLabel(axis, t, f.xTicks), xToPx(t), top + height + 5);
    ctx.fillStyle = THEME.ink;
    ctx.fillText(f.xLabel, left + width / 2, top + height + 20);
  }
  ctx.textBaseline = 'alphabetic';
  paintLegend(ctx, panel, left + width, top);
}

function paintBands(ctx: CanvasRenderingContext2D, panel: ChartPanel, f: PanelFrame, xToPx: (x: number) => number): void {
  const left = f.axis.left, width = f.axis.width, top = f.top, height = f.height;
  for (const b of panel.bands ?? []) {
    const a = Math.max(left, xToPx(b.x0)), z = Math.min(left + width, xToPx(b.x1));
    if (!(z > a)) continue;
    ctx.fillStyle = b.color;
    ctx.fillRect(a, top, z - a, height);
    if (b.hatch === true) hatch(ctx, a, top, z - a, height, THEME.axis);
  }
  ctx.font = `10px ${THEME.font}`;
  ctx.fillStyle = THEME.inkSoft;
  ctx.textAlign = 'center';
  for (const b of panel.bands ?? []) {
    if (b.label === undefined) continue;
    const a = Math.max(left, xToPx(b.x0)), z = Math.min(left + width, xToPx(b.x1));
    if (z - a > ctx.measureText(b.label).width + 4) ctx.fillText(b.label, (a + z) / 2, top + height - 4);
  }
}

/** Markers; a label goes in the first of four rows where it does not overlap the one before it. */
function paintMarkers(ctx: CanvasRenderingContext2D, panel: ChartPanel, f: PanelFrame, xToPx: (x: number) => number): void {
  const left = f.axis.left, width = f.axis.width, top = f.top, height = f.height;
  const rowEnd = [-Infinity, -Infinity, -Infinity, -Infinity];
  ctx.font = `10px ${THEME.font}`;
  for (const m of panel.markers ?? []) {
    const p = Math.round(xToPx(m.x)) + 0.5;
    if (!(p >= left && p <= left + width)) continue;
    ctx.strokeStyle = m.color ?? THEME.inkSoft;
    ctx.setLineDash([3, 3]);
    ctx.beginPath(); ctx.moveTo(p, top); ctx.lineTo(p, top + height); ctx.stroke();
    ctx.setLineDash([]);
    if (m.label === undefined) continue;
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

function paintSeries(ctx: CanvasRenderingContext2D, s: ChartSeries, f: PanelFrame, alongOf: AlongOf): void {
  const n = Math.min(s.x.length, s.y.length);
  const a = f.axis;
  const r = reduceColumns(alongOf(s.x), s.y, n, along(a.scale, a.lo), along(a.scale, a.hi), a.width, line);
  if (r.count === 0) return;
  ctx.strokeStyle = s.color;
  ctx.lineWidth = s.width ?? 1.5;
  ctx.setLineDash(s.dash ?? []);
  ctx.lineJoin = 'round';
  ctx.beginPath();
  let next = 0;
  for (let k = 0; k < r.count; k++) {
    const px = a.left + r.px[k], py = yToPx(f, r.y[k]);
    if (next < r.startCount && r.starts[next] === k) { ctx.moveTo(px, py); next++; }
    else ctx.lineTo(px, py);
  }
  if (r.count === 1) ctx.lineTo(a.left + r.px[0] + 1, yToPx(f, r.y[0]));
  ctx.stroke();
  ctx.setLineDash([]);
}

/** Legend, right-aligned above the panel. */
function paintLegend(ctx: CanvasRenderingContext2D, panel: ChartPanel, right: number, top: number): void {
  ctx.font = `11px ${THEME.font}`;
  let x = right;
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

/** The y range of a panel's data over the visible x range, padded; [-1, 1] when there is none. */
export function autoY(panel: ChartPanel, xr: [number, number]): [number, number] {
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
export function fitText(ctx: CanvasRenderingContext2D, text: string, maxWidth: number): string {
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
