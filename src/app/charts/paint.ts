// Painting one chart panel into a 2D canvas: bands, grid, markers, series (each reduced to at most two
// vertices per pixel column), frame, axes and legend.

import { THEME } from '../theme.ts';
import { columnPolyline, reduceColumns, type ColumnPolyline } from './columns.ts';
import { along, axisTickLabel, toPx, type Axis } from './axis.ts';
import { niceTicks, tickLabel } from './ticks.ts';
import type { ChartFill, ChartPanel, ChartSeries } from './chart.ts';

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

export function paintPanel(ctx: CanvasRenderingContext2D, panel: ChartPanel, f: PanelFrame, alongOf: AlongOf, legendFrom = 0): void {
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
  for (const fl of panel.fills ?? []) paintFill(ctx, fl, f, alongOf);
  for (const s of panel.series) (s.points === true ? paintDots : paintSeries)(ctx, s, f, alongOf);
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
  paintLegend(ctx, panel, left + width, top, Math.max(left, legendFrom));
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

/** Dots at the samples inside the shown range (measured points: a few hundred at most). */
function paintDots(ctx: CanvasRenderingContext2D, s: ChartSeries, f: PanelFrame, alongOf: AlongOf): void {
  const n = Math.min(s.x.length, s.y.length), u = alongOf(s.x), a = f.axis;
  const u0 = along(a.scale, a.lo), u1 = along(a.scale, a.hi);
  ctx.fillStyle = s.color;
  for (let i = 0; i < n; i++) {
    if (!(u[i] >= u0 && u[i] <= u1) || !Number.isFinite(s.y[i])) continue;
    ctx.beginPath();
    ctx.arc(a.left + ((u[i] - u0) / (u1 - u0)) * a.width, yToPx(f, s.y[i]), 2.2, 0, 2 * Math.PI);
    ctx.fill();
  }
}

/** A band between two curves: the polygon along lo and back along hi, every sample inside the shown range. */
function paintFill(ctx: CanvasRenderingContext2D, fl: ChartFill, f: PanelFrame, alongOf: AlongOf): void {
  const n = Math.min(fl.x.length, fl.lo.length, fl.hi.length), u = alongOf(fl.x), a = f.axis;
  const u0 = along(a.scale, a.lo), u1 = along(a.scale, a.hi);
  const px = (i: number) => a.left + ((u[i] - u0) / (u1 - u0)) * a.width;
  const idx: number[] = [];
  for (let i = 0; i < n; i++) {
    const inside = u[i] >= u0 && u[i] <= u1, near = (i + 1 < n && u[i + 1] >= u0 && u[i] <= u0) || (i > 0 && u[i - 1] <= u1 && u[i] >= u1);
    if ((inside || near) && Number.isFinite(fl.lo[i]) && Number.isFinite(fl.hi[i])) idx.push(i);
  }
  if (idx.length < 2) return;
  ctx.fillStyle = fl.color;
  ctx.beginPath();
  idx.forEach((i, k) => (k === 0 ? ctx.moveTo(px(i), yToPx(f, fl.lo[i])) : ctx.lineTo(px(i), yToPx(f, fl.lo[i]))));
  for (let k = idx.length - 1; k >= 0; k--) ctx.lineTo(px(idx[k]), yToPx(f, fl.hi[idx[k]]));
  ctx.closePath();
  ctx.fill();
}

/** One legend entry: a line, a row of dots or a filled swatch, then its label. */
interface LegendEntry { label: string; draw(ctx: CanvasRenderingContext2D, x: number, y: number): void }

function legendEntries(panel: ChartPanel): LegendEntry[] {
  const series = panel.series.map((s): LegendEntry => ({
    label: s.label,
    draw: (ctx, x, y) => {
      if (s.points === true) {
        ctx.fillStyle = s.color;
        for (const d of [3, 9, 15]) { ctx.beginPath(); ctx.arc(x + d, y, 2.2, 0, 2 * Math.PI); ctx.fill(); }
        return;
      }
      ctx.strokeStyle = s.color;
      ctx.lineWidth = s.width ?? 1.5;
      ctx.setLineDash(s.dash ?? []);
      ctx.beginPath(); ctx.moveTo(x, y); ctx.lineTo(x + 18, y); ctx.stroke();
      ctx.setLineDash([]);
    },
  }));
  const fills = (panel.fills ?? []).map((f): LegendEntry => ({ label: f.label, draw: (ctx, x, y) => { ctx.fillStyle = f.color; ctx.fillRect(x, y - 4, 18, 8); } }));
  return [...series, ...fills];
}

/**
 * Legend, right-aligned above the panel, within [minX, right]: in order, as many entries as fit (at 11 px, or
 * 10 px when that fits them all), then "+N more" (every series is in the readout too).
 */
function paintLegend(ctx: CanvasRenderingContext2D, panel: ChartPanel, right: number, top: number, minX: number): void {
  const entries = legendEntries(panel);
  if (entries.length === 0) return;
  const SWATCH = 22, GAP = 14;
  const widthAt = (font: number, list: LegendEntry[], more: number): number => {
    ctx.font = `${font}px ${THEME.font}`;
    const w = list.reduce((sum, e) => sum + SWATCH + ctx.measureText(e.label).width + GAP, 0) - GAP;
    return more > 0 ? w + GAP + ctx.measureText(`+${more} more`).width : w;
  };
  const room = right - minX;
  let font = 11, shown = entries.length;
  if (widthAt(11, entries, 0) > room) {
    font = 10;
    while (shown > 1 && widthAt(10, entries.slice(0, shown), entries.length - shown) > room) shown--;
  }
  const list = entries.slice(0, shown), more = entries.length - shown;
  let x = right - widthAt(font, list, more);
  ctx.font = `${font}px ${THEME.font}`;
  ctx.textAlign = 'left';
  for (const e of list) {
    e.draw(ctx, x, top - 10);
    x += SWATCH;
    ctx.fillStyle = THEME.ink;
    ctx.fillText(e.label, x, top - 6);
    x += ctx.measureText(e.label).width + GAP;
  }
  if (more > 0) { ctx.fillStyle = THEME.inkSoft; ctx.fillText(`+${more} more`, x, top - 6); }
}

/** The y range of a panel's data over the visible x range, padded; [-1, 1] when there is none. */
export function autoY(panel: ChartPanel, xr: [number, number]): [number, number] {
  let lo = Infinity, hi = -Infinity;
  const take = (xs: ArrayLike<number>, ys: ArrayLike<number>): void => {
    const n = Math.min(xs.length, ys.length);
    for (let i = 0; i < n; i++) {
      const x = xs[i], y = ys[i];
      if (x < xr[0] || x > xr[1] || !Number.isFinite(y)) continue;
      if (y < lo) lo = y;
      if (y > hi) hi = y;
    }
  };
  for (const s of panel.series) take(s.x, s.y);
  for (const f of panel.fills ?? []) { take(f.x, f.lo); take(f.x, f.hi); }
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
