// A small canvas chart: stacked panels sharing one x axis (linear or logarithmic), line series reduced
// to at most two vertices per pixel column, vertical markers with labels, shaded x bands, a legend per
// panel. Everything that belongs to the picture (title, legend, notes) is drawn into the one canvas,
// so a PNG of it is the whole view. On top of it, not in the PNG: a cursor readout of every series
// at the sample under the pointer, and box zoom (drag; double-click or "reset zoom" to undo).

import { THEME } from '../theme.ts';
import { along, fromPx, toPx, axisTicks, type Axis, type Scale } from './axis.ts';
import { autoY, fitText, paintPanel, type PanelFrame } from './paint.ts';
import { finiteRange } from './ticks.ts';
import { attachChartInput } from './interact.ts';
import { ReadoutBox, type ReadoutGroup } from './readoutBox.ts';
import { nearestIndex, readoutValue } from './readout.ts';

export interface ChartSeries {
  label: string;
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  color: string;
  width?: number;
  dash?: number[];
  /** Drawn as dots at its samples (measured points), not as a line. */
  points?: boolean;
}

/** A shaded region between two curves sampled at the same x (a percentile band). */
export interface ChartFill {
  label: string;
  x: ArrayLike<number>;
  lo: ArrayLike<number>;
  hi: ArrayLike<number>;
  color: string;
  /** Names of the two edges in the readout ("p05", "p95"). */
  loName?: string;
  hiName?: string;
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
  /** Shaded regions under the series. */
  fills?: ChartFill[];
  /** The readout's unit for this panel's values ("dB", "°"), and its decimals (else 5 significant digits). */
  unit?: string;
  decimals?: number;
}

export interface ChartSpec {
  title: string;
  subtitle?: string;
  xLabel: string;
  xRange?: [number, number];
  /** Linear (default) or logarithmic x axis; a log axis shows x > 0 only. */
  xScale?: Scale;
  /** The readout's name, unit and decimals for x ("f", "GHz"); without a name it shows the axis title. */
  xName?: string;
  xUnit?: string;
  xDecimals?: number;
  panels: ChartPanel[];
  /** Shown centred when there is nothing to draw. */
  empty?: string;
  /** Lines of text under the x axis (e.g. the key to numbered markers); the canvas grows to fit. */
  footer?: string[];
}

const FOOTER_LINE = 15;
const PAD = { left: 62, right: 16, top: 34, bottom: 38, gap: 26 };

interface Drawn { axis: Axis; frames: PanelFrame[]; spec: ChartSpec }

export class Chart {
  readonly canvas: HTMLCanvasElement;
  private readonly ctx: CanvasRenderingContext2D;
  private readonly overlay: HTMLCanvasElement;
  private readonly octx: CanvasRenderingContext2D;
  private readonly readout: ReadoutBox;
  private readonly resetButton: HTMLButtonElement;
  private spec: ChartSpec | null = null;
  private pending = 0;
  private cssW = 0;
  private cssH = 0;
  private drawn: Drawn | null = null;
  /** Box zoom: the x range, and y ranges by panel. */
  private zoomX: [number, number] | null = null;
  private readonly zoomY = new Map<number, [number, number]>();
  private cursor: { x: number; y: number } | null = null;
  private box: { x0: number; y0: number; x1: number; y1: number } | null = null;
  private readonly along = new WeakMap<object, { scale: Scale; values: ArrayLike<number> }>();
  /** Draws done (tests and the benchmark read this). */
  draws = 0;
  onDraw: (() => void) | null = null;

  constructor(private readonly host: HTMLElement, private readonly heightPx: number) {
    host.classList.add('chart-host');
    this.canvas = document.createElement('canvas');
    this.canvas.className = 'chart-canvas';
    this.overlay = document.createElement('canvas');
    this.overlay.className = 'chart-overlay';
    this.overlay.setAttribute('aria-hidden', 'true');
    host.append(this.canvas, this.overlay);
    const ctx = this.canvas.getContext('2d'), octx = this.overlay.getContext('2d');
    if (ctx === null || octx === null) throw new Error('2D canvas unavailable');
    this.ctx = ctx;
    this.octx = octx;
    const id = host.dataset.testid ?? 'chart';
    this.readout = new ReadoutBox(host, `${id}-readout`);
    this.resetButton = document.createElement('button');
    this.resetButton.type = 'button';
    this.resetButton.className = 'small chart-reset';
    this.resetButton.textContent = 'reset zoom';
    this.resetButton.dataset.testid = `${id}-zoom-reset`;
    this.resetButton.hidden = true;
    this.resetButton.addEventListener('click', () => this.resetZoom());
    host.append(this.resetButton);
    new ResizeObserver(() => this.request()).observe(host);
    attachChartInput(this.overlay, {
      inPlot: (x, y) => this.panelAt(x, y) >= 0,
      hover: (p) => { this.cursor = p; this.paintOverlay(); },
      drag: (b) => { this.box = b; this.paintOverlay(); },
      zoomTo: (b) => this.boxZoom(b),
      reset: () => this.resetZoom(),
    });
  }

  set(spec: ChartSpec): void {
    const old = this.spec;
    // A zoom belongs to its axes: drop it when they change meaning.
    if (old !== null && (old.xLabel !== spec.xLabel || (old.xScale ?? 'linear') !== (spec.xScale ?? 'linear'))) this.zoomX = null;
    if (old !== null) {
      spec.panels.forEach((p, k) => { if (old.panels[k]?.yLabel !== p.yLabel) this.zoomY.delete(k); });
    }
    this.spec = spec;
    this.request();
  }

  /** Redraw at the next animation frame (coalesced). */
  request(): void {
    if (this.pending !== 0) return;
    this.pending = requestAnimationFrame(() => { this.pending = 0; this.draw(); });
  }

  get zoomed(): boolean { return this.zoomX !== null || this.zoomY.size > 0; }

  /** The x range shown at the last draw, or null when nothing was drawn. */
  visibleX(): [number, number] | null {
    return this.drawn === null ? null : [this.drawn.axis.lo, this.drawn.axis.hi];
  }

  /** Client (page viewport) coordinates of data x at the middle of panel `k`, for tests. */
  clientPoint(x: number, k = 0): { x: number; y: number } | null {
    const d = this.drawn;
    if (d === null || d.frames[k] === undefined) return null;
    const r = this.overlay.getBoundingClientRect();
    return { x: r.left + toPx(d.axis, x), y: r.top + d.frames[k].top + d.frames[k].height / 2 };
  }

  resetZoom(): void {
    this.zoomX = null;
    this.zoomY.clear();
    this.request();
  }

  /** Draw now. */
  draw(): void {
    const w = Math.max(200, Math.floor(this.host.clientWidth));
    const footer = this.spec?.footer ?? [];
    const h = this.heightPx + (footer.length > 0 ? 8 + FOOTER_LINE * footer.length : 0);
    const dpr = Math.min(2, window.devicePixelRatio || 1);
    for (const c of [this.canvas, this.overlay]) {
      if (w !== this.cssW || h !== this.cssH || c.width !== Math.round(w * dpr)) {
        c.width = Math.round(w * dpr);
        c.height = Math.round(h * dpr);
        c.style.width = `${w}px`;
        c.style.height = `${h}px`;
      }
    }
    this.cssW = w; this.cssH = h;
    const ctx = this.ctx;
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.fillStyle = THEME.panel;
    ctx.fillRect(0, 0, w, h);
    this.drawn = null;
    const spec = this.spec;
    if (spec !== null) this.paint(spec, w, this.heightPx);
    // What the picture says, for assistive technology (and the tests): its title, or why it is empty.
    const empty = this.drawn === null ? spec?.empty ?? 'no data yet' : null;
    if (empty !== null) this.host.dataset.empty = empty; else delete this.host.dataset.empty;
    this.canvas.setAttribute('role', 'img');
    this.canvas.setAttribute('aria-label', `${spec?.title ?? 'chart'}${empty !== null ? `: ${empty}` : ''}`);
    if (footer.length > 0) this.paintFooter(footer, w, this.heightPx);
    this.resetButton.hidden = !this.zoomed;
    this.paintOverlay();
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
    let titleEnd = 12 + ctx.measureText(spec.title).width + 12;
    if (spec.subtitle !== undefined) {
      const tw = ctx.measureText(spec.title).width;
      ctx.font = `12px ${THEME.font}`;
      ctx.fillStyle = THEME.inkSoft;
      const sub = fitText(ctx, spec.subtitle, w - 24 - tw - 10 - 90);
      ctx.fillText(sub, 12 + tw + 10, 20);
      if (sub !== '') titleEnd = 12 + tw + 10 + ctx.measureText(sub).width + 12;
    }
    const scale = spec.xScale ?? 'linear';
    const xr = this.zoomX ?? spec.xRange ?? autoX(spec.panels, scale);
    if (xr === null || spec.panels.every((p) => p.series.length === 0)) {
      ctx.fillStyle = THEME.inkSoft;
      ctx.font = `12px ${THEME.font}`;
      ctx.textAlign = 'center';
      const lines = wrapText(ctx, spec.empty ?? 'no data yet', w - 48, 4);
      lines.forEach((l, i) => ctx.fillText(l, w / 2, h / 2 + 16 * (i - (lines.length - 1) / 2)));
      return;
    }
    const axis: Axis = { scale, lo: xr[0], hi: xr[1], left: PAD.left, width: w - PAD.right - PAD.left };
    const totalWeight = spec.panels.reduce((s, p) => s + (p.weight ?? 1), 0);
    const avail = h - PAD.top - PAD.bottom - PAD.gap * (spec.panels.length - 1);
    const xTicks = axisTicks(axis, Math.max(3, Math.floor(axis.width / 90)));
    const frames: PanelFrame[] = [];
    let top = PAD.top;
    spec.panels.forEach((panel, k) => {
      const height = (avail * (panel.weight ?? 1)) / totalWeight;
      const frame: PanelFrame = { axis, xTicks, top, height, yr: this.yRangeOf(panel, k, xr), xLabel: k === spec.panels.length - 1 ? spec.xLabel : null };
      // The first panel's legend shares the title's line: it keeps clear of the title.
      paintPanel(ctx, panel, frame, (x) => this.alongOf(x, scale), k === 0 ? titleEnd : 0);
      frames.push(frame);
      top += height + PAD.gap;
    });
    this.drawn = { axis, frames, spec };
  }

  private yRangeOf(panel: ChartPanel, k: number, xr: [number, number]): [number, number] {
    const z = this.zoomY.get(k);
    if (z !== undefined) return z;
    let yr = panel.yRange ?? autoY(panel, xr);
    if (panel.yRange === undefined && panel.yFloor !== undefined && yr[0] < panel.yFloor) yr = [panel.yFloor, Math.max(yr[1], panel.yFloor + 1)];
    return yr;
  }

  private alongOf(x: ArrayLike<number>, scale: Scale): ArrayLike<number> {
    if (scale === 'linear') return x;
    const key = x as unknown as object;
    const hit = this.along.get(key);
    if (hit !== undefined && hit.scale === scale) return hit.values;
    const values = Float64Array.from(x as ArrayLike<number>, (v) => along(scale, v));
    this.along.set(key, { scale, values });
    return values;
  }

  private paintFooter(lines: string[], w: number, top: number): void {
    const ctx = this.ctx;
    ctx.font = `11px ${THEME.mono}`;
    ctx.fillStyle = THEME.ink;
    ctx.textAlign = 'left';
    ctx.textBaseline = 'alphabetic';
    lines.forEach((line, i) => ctx.fillText(fitText(ctx, line, w - 24), 12, top + FOOTER_LINE * (i + 1)));
  }

  // ---- cursor readout and box zoom ------------------------------------------------------------

  private panelAt(x: number, y: number): number {
    const d = this.drawn;
    if (d === null || x < d.axis.left || x > d.axis.left + d.axis.width) return -1;
    return d.frames.findIndex((f) => y >= f.top && y <= f.top + f.height);
  }

  private boxZoom(b: { x0: number; y0: number; x1: number; y1: number }): void {
    const d = this.drawn;
    if (d === null) return;
    const k = this.panelAt(b.x0, b.y0);
    if (k < 0) return;
    const clampX = (x: number): number => Math.min(d.axis.left + d.axis.width, Math.max(d.axis.left, x));
    const xa = fromPx(d.axis, clampX(Math.min(b.x0, b.x1))), xb = fromPx(d.axis, clampX(Math.max(b.x0, b.x1)));
    if (Math.abs(b.x1 - b.x0) >= 6 && xb > xa) this.zoomX = [xa, xb];
    const f = d.frames[k];
    const ya = Math.max(f.top, Math.min(b.y0, b.y1)), yb = Math.min(f.top + f.height, Math.max(b.y0, b.y1));
    if (yb - ya >= 12) {
      const val = (py: number): number => f.yr[0] + ((f.top + f.height - py) / f.height) * (f.yr[1] - f.yr[0]);
      this.zoomY.set(k, [val(yb), val(ya)]);
    }
    this.box = null;
    this.request();
  }

  /** The crosshair, the sample dots and the drag box on the overlay; the readout beside the pointer. */
  private paintOverlay(): void {
    const o = this.octx, dpr = Math.min(2, window.devicePixelRatio || 1);
    o.setTransform(dpr, 0, 0, dpr, 0, 0);
    o.clearRect(0, 0, this.cssW, this.cssH);
    const d = this.drawn;
    if (d !== null && this.box !== null) {
      o.fillStyle = 'rgba(36, 59, 143, 0.10)';
      o.strokeStyle = THEME.source;
      o.lineWidth = 1;
      const x = Math.min(this.box.x0, this.box.x1), y = Math.min(this.box.y0, this.box.y1);
      o.fillRect(x, y, Math.abs(this.box.x1 - this.box.x0), Math.abs(this.box.y1 - this.box.y0));
      o.strokeRect(x + 0.5, y + 0.5, Math.abs(this.box.x1 - this.box.x0), Math.abs(this.box.y1 - this.box.y0));
    }
    const c = this.cursor;
    if (d === null || c === null || this.panelAt(c.x, c.y) < 0) { this.readout.hide(); return; }
    const snap = this.snap(d, fromPx(d.axis, c.x));
    if (snap === null) { this.readout.hide(); return; }
    const px = toPx(d.axis, snap.x);
    o.strokeStyle = THEME.inkSoft;
    o.setLineDash([2, 2]);
    o.beginPath();
    for (const f of d.frames) { o.moveTo(Math.round(px) + 0.5, f.top); o.lineTo(Math.round(px) + 0.5, f.top + f.height); }
    o.stroke();
    o.setLineDash([]);
    for (const g of snap.dots) {
      o.fillStyle = g.color;
      o.beginPath(); o.arc(toPx(d.axis, g.x), g.py, 3, 0, 2 * Math.PI); o.fill();
    }
    const spec = d.spec;
    const head = spec.xName !== undefined
      ? `${spec.xName} = ${readoutValue(snap.x, spec.xDecimals)}${spec.xUnit ? ` ${spec.xUnit}` : ''}`
      : `${spec.xLabel}: ${readoutValue(snap.x, spec.xDecimals)}`;
    this.readout.show(head, snap.groups, px, d.frames[0].top, this.cssW);
  }

  /** Every series' sample nearest the pointer's x (snapped to the first series' samples). */
  private snap(d: Drawn, x: number): { x: number; groups: ReadoutGroup[]; dots: Array<{ x: number; py: number; color: string }> } | null {
    const first = d.spec.panels.flatMap((p) => p.series).find((s) => Math.min(s.x.length, s.y.length) > 0);
    if (first === undefined) return null;
    const n0 = Math.min(first.x.length, first.y.length);
    // Nearest on screen: compare along the axis (log10 x on a log axis).
    const i0 = nearestIndex(this.alongOf(first.x, d.axis.scale), along(d.axis.scale, x), n0);
    if (i0 < 0) return null;
    const at = first.x[i0];
    const groups: ReadoutGroup[] = [], dots: Array<{ x: number; py: number; color: string }> = [];
    d.spec.panels.forEach((p, k) => {
      const rows = p.series.map((s) => {
        const n = Math.min(s.x.length, s.y.length);
        const i = nearestIndex(s.x, at, n);
        const v = i >= 0 ? s.y[i] : Number.NaN;
        const off = i >= 0 && Math.abs(s.x[i] - at) > 1e-9 * Math.max(1, Math.abs(at));
        if (i >= 0 && Number.isFinite(v)) {
          const f = d.frames[k];
          const py = f.top + f.height - ((v - f.yr[0]) / (f.yr[1] - f.yr[0])) * f.height;
          if (py >= f.top && py <= f.top + f.height) dots.push({ x: s.x[i], py, color: s.color });
        }
        const value = `${readoutValue(v, p.decimals)}${p.unit && Number.isFinite(v) ? ` ${p.unit}` : ''}`;
        return { label: s.label, color: s.color, dash: s.dash, value: off ? `${value} (at ${readoutValue(s.x[i], d.spec.xDecimals)})` : value };
      });
      for (const fl of p.fills ?? []) {
        const i = nearestIndex(fl.x, at, fl.x.length);
        if (i < 0) continue;
        const text = (v: number) => `${readoutValue(v, p.decimals)}${p.unit && Number.isFinite(v) ? ` ${p.unit}` : ''}`;
        rows.push({ label: `${fl.label} ${fl.loName ?? 'low'}`, color: fl.color, dash: undefined, value: text(fl.lo[i]) });
        rows.push({ label: `${fl.label} ${fl.hiName ?? 'high'}`, color: fl.color, dash: undefined, value: text(fl.hi[i]) });
      }
      if (rows.length > 0) groups.push({ title: p.yLabel, rows });
    });
    return { x: at, groups, dots };
  }
}

/** Words of `text` in lines that fit `maxWidth` in the current font, at most `maxLines` (the last cut). */
function wrapText(ctx: CanvasRenderingContext2D, text: string, maxWidth: number, maxLines: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/)) {
    const next = line === '' ? word : `${line} ${word}`;
    if (ctx.measureText(next).width <= maxWidth || line === '') line = next;
    else { lines.push(line); line = word; }
  }
  if (line !== '') lines.push(line);
  if (lines.length <= maxLines) return lines;
  return [...lines.slice(0, maxLines - 1), fitText(ctx, lines.slice(maxLines - 1).join(' '), maxWidth)];
}

function autoX(panels: ChartPanel[], scale: Scale): [number, number] | null {
  let lo = Infinity, hi = -Infinity;
  for (const p of panels) for (const s of p.series) {
    const r = scale === 'log' ? finiteRange(Float64Array.from(s.x as ArrayLike<number>).filter((v) => v > 0)) : finiteRange(s.x);
    if (r !== null) { lo = Math.min(lo, r[0]); hi = Math.max(hi, r[1]); }
  }
  if (!(hi > lo)) return lo === hi && Number.isFinite(lo) ? (scale === 'log' ? [lo / 2, lo * 2] : [lo - 1, lo + 1]) : null;
  return [lo, hi];
}
