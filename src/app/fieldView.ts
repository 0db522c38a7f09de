// The field view: the pulse running through the stack, drawn by pixi.js 8 with its canvas renderer
// (no WebGL, no GPU). By default the stack fills about half the width (field/framing.ts); the view
// zooms and pans (wheel, pinch, drag, the zoom buttons) and then shows an overview strip of the whole
// grid. Static geometry is redrawn only when the stack, the grid, the framing or the size changes;
// each frame redraws the traces, each reduced to at most two vertices per pixel column.

import 'pixi.js/unsafe-eval'; // strict CSP: pixi's eval-free code paths (no 'unsafe-eval' needed)
import { Application, Container, Graphics, Text, type TextStyleOptions } from 'pixi.js';
import { THEME, hexNumber } from './theme.ts';
import { columnPolyline, reduceColumns, type ColumnPolyline } from './charts/columns.ts';
import { niceTicks, tickLabel } from './charts/ticks.ts';
import type { FieldFrame, PulseGeometry } from './protocol.ts';
import type { StackSketch } from './sketch.ts';
import { fmt } from './sketch.ts';
import { centreSpan, clampSpan, defaultSpan, gridSpan, isZoomed, minSpanWidth, panSpan, sameSpan, spanWidth, zoomSpan, type FramingFacts, type Span } from './field/framing.ts';
import { headerLayout, type Box } from './field/header.ts';
import { paintAbsorbers, paintHalfSpaces, paintProbes, paintStack, TAG_ROW, TAG_W, type PlotBox, type Scene } from './field/paint.ts';
import type { LabelPlan } from './field/marks.ts';
import { paintStripBack, paintStripWindow, stripPosition } from './field/overview.ts';
import { attachGestures, type Region } from './field/gestures.ts';
import { TextPool } from './field/textPool.ts';

export type TraceName = 'total' | 'incident' | 'reflected' | 'transmitted';
export const TRACE_NAMES: readonly TraceName[] = ['total', 'incident', 'reflected', 'transmitted'];
const TRACE_LABEL: Record<TraceName, string> = {
  total: 'total field', incident: 'incident', reflected: 'reflected', transmitted: 'transmitted',
};
const TRACE_WIDTH: Record<TraceName, number> = { total: 2, incident: 1.25, reflected: 1.75, transmitted: 1.75 };

export interface FieldViewOptions {
  /** Position axis: millimetres, or wavelengths in vacuum at `lambdaAt_Hz`. */
  xUnit: 'mm' | 'wavelengths';
  lambdaAt_Hz: number;
  traces: Record<TraceName, boolean>;
}

/** Where the header's parts are, in CSS pixels of the canvas (for the layout test). */
export interface FieldBoxes { title: Box; legend: Box; clock: Box }

/** Where the layer tags and sheet caps went at the last redraw (for the tests), with the width of one. */
export interface FieldMarks { plan: LabelPlan; tagWidth: number }

const C0 = 299_792_458;
const HEIGHT = 392;
const M = { left: 54, right: 14, top: 68 };
/** Tick labels, axis title and the key line under the plot. */
const BELOW = 56;
const STRIP_H = 28;
const ZOOM_STEP = 1.5;
/** Room kept for the time readout to grow (more digits, "finished") before the header is laid out again. */
const CLOCK_SLACK = 48;

export class FieldView {
  readonly app = new Application();
  private readonly staticLayer = new Container();
  private readonly bands = new Graphics();
  private readonly labels = new Container();
  private readonly texts = new TextPool(this.labels);
  private readonly traceLayer = new Container();
  private readonly traces: Record<TraceName, Graphics> = {
    total: new Graphics(), incident: new Graphics(), reflected: new Graphics(), transmitted: new Graphics(),
  };
  private readonly stripTrace = new Graphics();
  private readonly stripFront = new Graphics();
  private readonly legend = new Container();
  private readonly legendTexts = new TextPool(this.legend);
  private readonly swatches = new Graphics();
  private readonly title: Text;
  private readonly clock: Text;
  private readonly line: ColumnPolyline = columnPolyline(2048);
  private xPlot = new Float64Array(0);
  private xMetres: Float64Array = new Float64Array(0);
  private sketch: StackSketch | null = null;
  private geometry: PulseGeometry | null = null;
  private frame: FieldFrame | null = null;
  /** Shown in place of the time readout while there is no grid. */
  private noGridNote = 'preparing the pulse run…';
  private yMax = 1.1;
  private width = 800;
  private dirty = true;
  /** The user's framing; null follows the default. */
  private userSpan: Span | null = null;
  private plot: PlotBox = { left: M.left, top: M.top, w: 100, h: 100 };
  private strip: PlotBox | null = null;
  private boxes: FieldBoxes = { title: { x: 0, y: 0, w: 0, h: 0 }, legend: { x: 0, y: 0, w: 0, h: 0 }, clock: { x: 0, y: 0, w: 0, h: 0 } };
  private marks: LabelPlan = { bands: [], sheets: [], key: [] };
  /** Width the header keeps for the time readout. */
  private clockRoom = 0;
  /** Called when the framing changes (zoom, pan, reset, a new grid). */
  onFraming: (() => void) | null = null;

  static async create(host: HTMLElement, options: FieldViewOptions): Promise<FieldView> {
    const v = new FieldView(host, options);
    await v.init();
    return v;
  }

  private constructor(private readonly host: HTMLElement, private options: FieldViewOptions) {
    const style = (size: number, fill: string, weight: TextStyleOptions['fontWeight'] = 'normal'): TextStyleOptions =>
      ({ fontFamily: THEME.font, fontSize: size, fill, fontWeight: weight });
    this.title = new Text({ text: '', style: style(14, THEME.ink, '600') });
    this.clock = new Text({ text: '', style: { ...style(13, THEME.ink), fontFamily: THEME.mono } });
  }

  private async init(): Promise<void> {
    this.width = Math.max(320, Math.floor(this.host.clientWidth));
    await this.app.init({
      preference: 'canvas',
      width: this.width,
      height: HEIGHT,
      background: THEME.panel,
      antialias: true,
      autoStart: false,
      sharedTicker: false,
      resolution: Math.min(2, window.devicePixelRatio || 1),
      autoDensity: true,
    });
    this.app.ticker.stop();
    this.app.canvas.classList.add('field-canvas');
    this.host.appendChild(this.app.canvas);
    this.staticLayer.addChild(this.bands, this.labels);
    this.legend.addChild(this.swatches);
    for (const name of TRACE_NAMES) this.traceLayer.addChild(this.traces[name]);
    this.title.position.set(M.left, 8);
    this.clock.position.set(M.left, 30);
    this.app.stage.addChild(this.staticLayer, this.stripTrace, this.stripFront, this.traceLayer, this.legend, this.title, this.clock);
    new ResizeObserver(() => {
      const w = Math.max(320, Math.floor(this.host.clientWidth));
      if (w !== this.width) { this.width = w; this.app.renderer.resize(w, HEIGHT); this.dirty = true; this.render(); }
    }).observe(this.host);
    attachGestures(this.app.canvas, {
      regionAt: (x, y) => this.regionAt(x, y),
      zoomAt: (factor, x) => this.zoom(factor, this.positionAt(x)),
      panBy: (dx) => this.setSpan(panSpan(this.span(), -(dx / this.plot.w) * spanWidth(this.span()), this.full())),
      stripTo: (x) => { if (this.strip !== null) this.setSpan(centreSpan(this.span(), stripPosition(this.strip, this.full(), x), this.full())); },
      reset: () => this.resetFraming(),
    });
  }

  /** Name of the renderer pixi chose (the tests check it is the canvas one). */
  get rendererName(): string { return this.app.renderer.name; }

  get canvas(): HTMLCanvasElement { return this.app.canvas; }

  /** Where the title, legend and time readout are drawn (CSS pixels within the canvas). */
  get layoutBoxes(): FieldBoxes { return structuredClone(this.boxes); }

  get layoutMarks(): FieldMarks { return { plan: structuredClone(this.marks), tagWidth: TAG_W }; }

  /** The static labels drawn now, with where they are (for the tests). */
  get labelTexts(): Array<{ text: string; x: number; y: number; w: number }> {
    return this.labels.children.filter((c): c is Text => c instanceof Text && c.visible)
      .map((t) => ({ text: t.text, x: t.x, y: t.y, w: t.width }));
  }

  setOptions(options: FieldViewOptions): void {
    this.options = options;
    this.dirty = true;
    this.render();
  }

  setStack(sketch: StackSketch): void {
    this.sketch = sketch;
    this.title.text = sketch.title;
    this.dirty = true;
    this.onFraming?.();
  }

  /** The pulse run's grid; null while it is prepared, or with `note` when there is none. */
  setGeometry(geometry: PulseGeometry | null, note = 'preparing the pulse run…'): void {
    this.geometry = geometry;
    this.noGridNote = note;
    this.frame = null;
    this.yMax = 1.1;
    this.dirty = true;
    if (geometry !== null) {
      this.xMetres = geometry.x_m;
      if (this.userSpan !== null) this.userSpan = clampSpan(this.userSpan, this.full(), this.minWidth());
    }
    this.onFraming?.();
  }

  setFrame(frame: FieldFrame | null): void {
    this.frame = frame;
  }

  // ---- framing -------------------------------------------------------------------------------

  /** Everything there is to show, in metres. */
  full(): Span {
    const g = this.geometry, sk = this.sketch;
    const d = sk?.thickness_m ?? 0.1, L = sk?.pulseLength_m ?? 0.1;
    // Behind a conductor the grid ends at its face: leave room to draw the conductor.
    if (g !== null && g.x_m.length > 1) return gridSpan(g.x_m, sk?.pec === true);
    return { x0_m: -(L + 0.25 * d), x1_m: d + 0.25 * (d + L) };
  }

  private minWidth(): number {
    return minSpanWidth(this.geometry?.x_m ?? [], this.full());
  }

  private facts(): FramingFacts {
    const sk = this.sketch;
    return { thickness_m: sk?.thickness_m ?? 0, pulseLength_m: sk?.pulseLength_m ?? 0, pec: sk?.pec ?? false, full: this.full() };
  }

  /** The default framing for this stack and grid. */
  defaultSpan(): Span { return defaultSpan(this.facts(), this.minWidth()); }

  /** The part of the grid shown now, metres. */
  span(): Span { return this.userSpan ?? this.defaultSpan(); }

  get zoomed(): boolean { return isZoomed(this.span(), this.full()); }

  get hasGrid(): boolean { return this.geometry !== null; }

  /** Zoom by `factor` (< 1 zooms in) about `anchor_m` (the middle of the view by default). */
  zoom(factor: number, anchor_m?: number): void {
    const s = this.span();
    this.setSpan(zoomSpan(s, factor, anchor_m ?? (s.x0_m + s.x1_m) / 2, this.full(), this.minWidth()));
  }

  zoomIn(): void { this.zoom(1 / ZOOM_STEP); }
  zoomOut(): void { this.zoom(ZOOM_STEP); }

  resetFraming(): void {
    this.userSpan = null;
    this.dirty = true;
    this.render();
    this.onFraming?.();
  }

  private setSpan(s: Span): void {
    if (sameSpan(s, this.span())) return;
    this.userSpan = sameSpan(s, this.defaultSpan()) ? null : s;
    this.dirty = true;
    this.render();
    this.onFraming?.();
  }

  private regionAt(x: number, y: number): Region {
    const p = this.plot, st = this.strip;
    if (x >= p.left && x <= p.left + p.w && y >= p.top && y <= p.top + p.h) return 'plot';
    if (st !== null && x >= st.left && x <= st.left + st.w && y >= st.top - 2 && y <= st.top + st.h + 2) return 'strip';
    return null;
  }

  private positionAt(px: number): number {
    const s = this.span();
    return s.x0_m + ((px - this.plot.left) / this.plot.w) * spanWidth(s);
  }

  private toPlot(x_m: number): number {
    return this.options.xUnit === 'mm' ? x_m * 1e3 : x_m / (C0 / this.options.lambdaAt_Hz);
  }

  private xOf(x_m: number, s: Span): number {
    return this.plot.left + ((x_m - s.x0_m) / spanWidth(s)) * this.plot.w;
  }

  private py(v: number): number {
    return this.plot.top + this.plot.h / 2 - (v / this.yMax) * (this.plot.h / 2);
  }

  // ---- drawing -------------------------------------------------------------------------------

  /** Draw the current state now. */
  render(): void {
    if (this.dirty) this.drawStatic();
    this.drawTraces();
    // The time readout outgrew the room the header kept for it: lay the header out again.
    if (this.clock.width > this.clockRoom) this.drawStatic();
    this.app.renderer.render(this.app.stage);
  }

  private layout(zoomed: boolean): void {
    const w = this.width - M.left - M.right;
    const h = HEIGHT - M.top - BELOW - (zoomed ? STRIP_H + 10 : 0) - 6;
    this.plot = { left: M.left, top: M.top, w, h };
    this.strip = zoomed ? { left: M.left, top: M.top + h + BELOW, w, h: STRIP_H } : null;
  }

  private drawStatic(): void {
    this.dirty = false;
    const g = this.bands;
    g.clear();
    this.stripFront.clear();
    this.texts.begin();
    this.legendTexts.begin();
    this.swatches.clear();
    const s = this.span(), full = this.full();
    this.layout(isZoomed(s, full));
    const box = this.plot;
    g.rect(box.left, box.top, box.w, box.h).fill({ color: hexNumber(THEME.panel) });
    this.marks = { bands: [], sheets: [], key: [] };
    const sk = this.sketch;
    if (sk !== null) {
      const scene: Scene = { g, texts: this.texts, box, xOf: (x) => this.xOf(x, s), sketch: sk, geometry: this.geometry };
      paintHalfSpaces(scene);
      paintAbsorbers(scene);
      this.marks = paintStack(scene);
      paintProbes(scene);
      if (this.strip !== null) {
        paintStripBack(g, this.strip, full, sk, this.geometry);
        paintStripWindow(this.stripFront, this.strip, full, s);
      }
    }
    // Zero line and frame.
    g.moveTo(box.left, this.py(0)).lineTo(box.left + box.w, this.py(0)).stroke({ width: 1, color: hexNumber(THEME.grid) });
    g.rect(box.left + 0.5, box.top + 0.5, box.w - 1, box.h - 1).stroke({ width: 1, color: hexNumber(THEME.axis) });
    this.drawAxes(s, this.marks.key);
    this.drawHeader();
    // x of every grid node in plot units.
    const gx = this.geometry?.x_m;
    if (gx !== undefined) {
      if (this.xPlot.length !== gx.length) this.xPlot = new Float64Array(gx.length);
      for (let i = 0; i < gx.length; i++) this.xPlot[i] = this.toPlot(gx[i]);
    }
    this.texts.sweep();
    this.legendTexts.sweep();
  }

  private drawAxes(s: Span, key: string[]): void {
    const g = this.bands, box = this.plot;
    const a = this.toPlot(s.x0_m), b = this.toPlot(s.x1_m);
    const ticks = niceTicks(a, b, Math.max(3, Math.floor(box.w / 90)));
    for (const t of ticks) {
      const x = box.left + ((t - a) / (b - a)) * box.w;
      g.moveTo(x, box.top + box.h).lineTo(x, box.top + box.h + 4).stroke({ width: 1, color: hexNumber(THEME.axis) });
      const lab = this.texts.get(tickLabel(t, ticks));
      lab.position.set(x - lab.width / 2, box.top + box.h + 6);
    }
    const sk = this.sketch;
    const unit = (this.options.xUnit === 'mm'
      ? 'position x (mm), front face at 0'
      : `position x / λ₀ at ${fmt(this.options.lambdaAt_Hz / 1e9)} GHz, front face at 0`)
      + (sk?.oblique != null ? ` · ${sk.oblique}: the field along one line normal to the faces` : '');
    const axisLabel = this.texts.get(unit, THEME.inkSoft, 11);
    axisLabel.position.set(box.left + box.w / 2 - axisLabel.width / 2, box.top + box.h + 21);
    if (key.length > 0) {
      const t = this.texts.get(fitWords(`layers by number: ${key.join('   ')}`, box.w, (x) => this.measure(x, 11)), THEME.ink, 11);
      t.position.set(box.left, box.top + box.h + 37);
    }
    for (const v of [-1, 0, 1]) {
      if (Math.abs(v) > this.yMax) continue;
      const lab = this.texts.get(v === 0 ? '0' : v > 0 ? '+1' : '−1');
      lab.position.set(box.left - 8 - lab.width, this.py(v) - lab.height / 2);
    }
    const ey = this.texts.get('E / E₀', THEME.inkSoft, 11);
    ey.position.set(6, box.top - TAG_ROW - 2);
  }

  private measure(text: string, size: number, font: string = THEME.font): number {
    const t = this.texts.get(text, THEME.ink, size, font);
    const w = t.width;
    this.texts.drop(t);
    return w;
  }

  /** Title (cut to fit), time readout and legend, laid out so none overprints another. */
  private drawHeader(): void {
    const right = this.width - M.right;
    const items: Array<{ name: TraceName; text: Text }> = [];
    for (const name of TRACE_NAMES) {
      if (!this.options.traces[name] || (name === 'transmitted' && this.sketch?.pec === true)) continue;
      items.push({ name, text: this.legendTexts.get(TRACE_LABEL[name], THEME.ink, 12) });
    }
    const SWATCH = 24, SEP = 16;
    const legendW = items.reduce((w, it) => w + SWATCH + it.text.width, 0) + SEP * Math.max(0, items.length - 1);
    const fullTitle = this.sketch?.title ?? '';
    this.title.text = fullTitle;
    this.clockRoom = this.clock.width + CLOCK_SLACK;
    const lay = headerLayout({ left: M.left, right, titleW: this.title.width, legendW, clockW: this.clockRoom, gap: 24 });
    if (this.title.width > lay.titleMaxW) this.title.text = fitWords(fullTitle, lay.titleMaxW, (t) => { this.title.text = t; return this.title.width; });
    const y = lay.legendRow === 0 ? 12 : 32;
    let x = lay.legendX;
    for (const it of items) {
      this.swatches.moveTo(x, y + 8).lineTo(x + 18, y + 8)
        .stroke({ width: TRACE_WIDTH[it.name] + 0.5, color: hexNumber(THEME[it.name]) });
      it.text.position.set(x + SWATCH, y);
      x += SWATCH + it.text.width + SEP;
    }
    this.boxes = {
      title: { x: M.left, y: 8, w: this.title.width, h: this.title.height },
      legend: { x: lay.legendX, y, w: legendW, h: 16 },
      clock: { x: M.left, y: 30, w: this.clock.width, h: 17 },
    };
  }

  private drawTraces(): void {
    const f = this.frame, geo = this.geometry;
    for (const name of TRACE_NAMES) this.traces[name].clear();
    this.stripTrace.clear();
    if (f === null || geo === null) {
      this.clock.text = geo === null ? this.noGridNote : 't = 0.000 ns · step 0';
      return;
    }
    // Grow the vertical scale if the field outgrows it (it never shrinks during a run).
    let peak = 0;
    for (let i = 0; i < f.total.length; i++) { const a = Math.abs(f.total[i]); if (a > peak) peak = a; }
    if (peak > this.yMax && Number.isFinite(peak)) { this.yMax = Math.min(1e6, peak * 1.15); this.dirty = true; this.drawStatic(); }
    const s = this.span();
    const x0 = this.toPlot(s.x0_m), x1 = this.toPlot(s.x1_m);
    const n = Math.min(this.xPlot.length, f.total.length);
    const box = this.plot;
    const yClamp = (v: number): number => Math.min(box.top + box.h, Math.max(box.top, this.py(v)));
    for (const name of TRACE_NAMES) {
      if (!this.options.traces[name]) continue;
      const line = reduceColumns(this.xPlot, f[name], n, x0, x1, box.w, this.line);
      this.strokeLine(this.traces[name], line, box.left, yClamp, TRACE_WIDTH[name], THEME[name]);
    }
    if (this.strip !== null) this.drawStripTrace(f, n);
    this.clock.text = `t = ${(f.time_s * 1e9).toFixed(3)} ns · step ${f.step}${f.done ? ' · finished' : ''}`;
  }

  private drawStripTrace(f: FieldFrame, n: number): void {
    const st = this.strip!, full = this.full();
    const y = (v: number): number => Math.min(st.top + st.h, Math.max(st.top, st.top + st.h / 2 - (v / this.yMax) * (st.h / 2 - 1)));
    const line = reduceColumns(this.xMetres, f.total, n, full.x0_m, full.x1_m, st.w, this.line);
    this.strokeLine(this.stripTrace, line, st.left, y, 1, THEME.total);
  }

  private strokeLine(gr: Graphics, line: ColumnPolyline, left: number, y: (v: number) => number, width: number, color: string): void {
    let next = 0;
    for (let k = 0; k < line.count; k++) {
      const x = left + line.px[k], yy = y(line.y[k]);
      if (next < line.startCount && line.starts[next] === k) { gr.moveTo(x, yy); next++; } else gr.lineTo(x, yy);
    }
    if (line.count > 0) gr.stroke({ width, color: hexNumber(color), join: 'round' });
  }
}

/** `text` cut at a word (or a character) with an ellipsis to fit `maxW` as measured. */
export function fitWords(text: string, maxW: number, measure: (t: string) => number): string {
  if (measure(text) <= maxW) return text;
  let lo = 0, hi = text.length;
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2);
    if (measure(`${text.slice(0, mid).trimEnd()}…`) <= maxW) lo = mid; else hi = mid - 1;
  }
  return lo > 0 ? `${text.slice(0, lo).trimEnd()}…` : '';
}
