// The field view: the pulse running through the stack, drawn by pixi.js 8 with its canvas renderer
// (no WebGL, no GPU). Static geometry (layer bands, sheets, conductor, absorbers, probes, axis) is
// redrawn only when the stack, the grid or the size changes; each frame redraws the traces, each
// reduced to at most two vertices per pixel column, and the time readout.

import 'pixi.js/unsafe-eval'; // strict CSP: pixi's eval-free code paths (no 'unsafe-eval' needed)
import { Application, Container, Graphics, Text, type TextStyleOptions } from 'pixi.js';
import { THEME, bandTint, hexNumber } from './theme.ts';
import { columnPolyline, reduceColumns, type ColumnPolyline } from './charts/columns.ts';
import { niceTicks, tickLabel } from './charts/ticks.ts';
import type { FieldFrame, PulseGeometry } from './protocol.ts';
import type { StackSketch } from './sketch.ts';
import { fmt } from './sketch.ts';

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

const C0 = 299_792_458;
const HEIGHT = 320;
const M = { left: 54, right: 14, top: 58, bottom: 40 };

export class FieldView {
  readonly app = new Application();
  private readonly staticLayer = new Container();
  private readonly bands = new Graphics();
  private readonly labels = new Container();
  private readonly traceLayer = new Container();
  private readonly traces: Record<TraceName, Graphics> = {
    total: new Graphics(), incident: new Graphics(), reflected: new Graphics(), transmitted: new Graphics(),
  };
  private readonly legend = new Container();
  private readonly title: Text;
  private readonly clock: Text;
  private readonly line: ColumnPolyline = columnPolyline(2048);
  private xPlot = new Float64Array(0);
  private sketch: StackSketch | null = null;
  private geometry: PulseGeometry | null = null;
  private frame: FieldFrame | null = null;
  /** Shown in place of the time readout while there is no grid. */
  private noGridNote = 'preparing the pulse run…';
  private yMax = 1.1;
  private width = 800;
  private dirty = true;

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
    this.host.appendChild(this.app.canvas);
    this.staticLayer.addChild(this.bands, this.labels);
    for (const name of TRACE_NAMES) this.traceLayer.addChild(this.traces[name]);
    this.title.position.set(M.left, 8);
    this.clock.position.set(M.left, 30);
    this.app.stage.addChild(this.staticLayer, this.traceLayer, this.legend, this.title, this.clock);
    new ResizeObserver(() => {
      const w = Math.max(320, Math.floor(this.host.clientWidth));
      if (w !== this.width) { this.width = w; this.app.renderer.resize(w, HEIGHT); this.dirty = true; this.render(); }
    }).observe(this.host);
  }

  /** Name of the renderer pixi chose (the tests check it is the canvas one). */
  get rendererName(): string { return this.app.renderer.name; }

  get canvas(): HTMLCanvasElement { return this.app.canvas; }

  setOptions(options: FieldViewOptions): void {
    this.options = options;
    this.dirty = true;
    this.render();
  }

  setStack(sketch: StackSketch): void {
    this.sketch = sketch;
    this.title.text = sketch.title;
    this.dirty = true;
  }

  /** The pulse run's grid; null while it is prepared, or with `note` when there is none. */
  setGeometry(geometry: PulseGeometry | null, note = 'preparing the pulse run…'): void {
    this.geometry = geometry;
    this.noGridNote = note;
    this.frame = null;
    this.yMax = 1.1;
    this.dirty = true;
  }

  setFrame(frame: FieldFrame | null): void {
    this.frame = frame;
  }

  private xRange(): [number, number] {
    const g = this.geometry;
    if (g !== null && g.x_m.length > 1) {
      const a = this.toPlot(g.x_m[0]), b = this.toPlot(g.x_m[g.x_m.length - 1]);
      // Behind a conductor the grid ends at its face: leave room to draw the conductor.
      return [a, this.sketch?.pec === true ? b + 0.06 * (b - a) : b];
    }
    const d = this.sketch?.thickness_m ?? 0.1;
    return [this.toPlot(-0.5 * d - 0.05), this.toPlot(1.5 * d + 0.05)];
  }

  private toPlot(x_m: number): number {
    return this.options.xUnit === 'mm' ? x_m * 1e3 : x_m / (C0 / this.options.lambdaAt_Hz);
  }

  private get plotW(): number { return this.width - M.left - M.right; }
  private get plotH(): number { return HEIGHT - M.top - M.bottom; }

  private px(xPlot: number, xr: [number, number]): number {
    return M.left + ((xPlot - xr[0]) / (xr[1] - xr[0])) * this.plotW;
  }

  private py(v: number): number {
    return M.top + this.plotH / 2 - (v / this.yMax) * (this.plotH / 2);
  }

  /** Draw the current state now. */
  render(): void {
    if (this.dirty) this.drawStatic();
    this.drawTraces();
    this.app.renderer.render(this.app.stage);
  }

  private drawStatic(): void {
    this.dirty = false;
    const g = this.bands;
    g.clear();
    for (const c of this.labels.removeChildren()) c.destroy();
    for (const c of this.legend.removeChildren()) c.destroy();
    const xr = this.xRange();
    const top = M.top, h = this.plotH, left = M.left, w = this.plotW;
    const small = (text: string, fill: string = THEME.inkSoft, size = 11): Text =>
      new Text({ text, style: { fontFamily: THEME.font, fontSize: size, fill } });
    // Plot frame.
    g.rect(left, top, w, h).fill({ color: hexNumber(THEME.panel) });
    const clampX = (x: number): number => Math.min(left + w, Math.max(left, x));
    const sk = this.sketch;
    const xFront = clampX(this.px(this.toPlot(0), xr));
    const xBack = sk === null ? left + w : clampX(this.px(this.toPlot(sk.thickness_m), xr));
    // The half-spaces in front of and behind the stack, tinted and named like the layers.
    if (sk !== null) {
      g.rect(left, top, xFront - left, h).fill({ color: hexNumber(bandTint(sk.front)) });
      if (!sk.pec) g.rect(xBack, top, left + w - xBack, h).fill({ color: hexNumber(bandTint(sk.back)) });
    }
    // Absorbing regions.
    for (const [a, b] of this.geometry?.absorbers ?? []) {
      const x0 = clampX(this.px(this.toPlot(a), xr)), x1 = clampX(this.px(this.toPlot(b), xr));
      if (x1 - x0 < 1) continue;
      g.rect(x0, top, x1 - x0, h).fill({ color: hexNumber(THEME.absorber), alpha: 0.45 });
      for (let k = x0 - h; k < x1; k += 9) {
        const a0 = Math.max(k, x0), a1 = Math.min(k + h, x1);
        if (a1 <= a0) continue;
        g.moveTo(a0, top + h - (a0 - k)).lineTo(a1, top + h - (a1 - k));
      }
      g.stroke({ width: 1, color: hexNumber(THEME.axis), alpha: 0.6 });
      const t = small('absorber', THEME.inkSoft, 10);
      if (t.width < x1 - x0 - 4) { t.position.set((x0 + x1) / 2 - t.width / 2, top + 3); this.labels.addChild(t); } else t.destroy();
    }
    if (sk !== null) {
      // Layer bands.
      let labelRow = 0;
      for (const l of sk.layers) {
        if (l.kind !== 'bulk') continue;
        const x0 = clampX(this.px(this.toPlot(l.x0_m), xr)), x1 = clampX(this.px(this.toPlot(l.x1_m), xr));
        g.rect(x0, top, Math.max(1, x1 - x0), h).fill({ color: hexNumber(bandTint(l.material)) });
        g.moveTo(x0 + 0.5, top).lineTo(x0 + 0.5, top + h).moveTo(x1 - 0.5, top).lineTo(x1 - 0.5, top + h)
          .stroke({ width: 1, color: hexNumber(THEME.axis), alpha: 0.7 });
        let t = small(l.label, THEME.ink, 11);
        if (t.width > x1 - x0 - 4) { t.destroy(); t = small(l.short, THEME.ink, 10); }
        if (t.width > x1 - x0 - 4) { t.destroy(); continue; }
        t.position.set((x0 + x1) / 2 - t.width / 2, top + h - 16 - 13 * (labelRow++ % 2));
        this.labels.addChild(t);
      }
      const front = small(sk.front, THEME.inkSoft, 11);
      if (front.width < xFront - left - 12) { front.position.set(xFront - 6 - front.width, top + h - 16); this.labels.addChild(front); } else front.destroy();
      if (!sk.pec) {
        const back = small(sk.back, THEME.inkSoft, 11);
        if (back.width < left + w - xBack - 12) { back.position.set(xBack + 6, top + h - 16); this.labels.addChild(back); } else back.destroy();
      }
      // Conductor behind the stack.
      if (sk.pec) {
        const x0 = xBack, x1 = left + w;
        g.rect(x0, top, Math.max(3, x1 - x0), h).fill({ color: hexNumber(THEME.conductor) });
        for (let k = x0 - h; k < x1; k += 6) {
          const a0 = Math.max(k, x0), a1 = Math.min(k + h, x1);
          if (a1 > a0) g.moveTo(a0, top + h - (a0 - k)).lineTo(a1, top + h - (a1 - k));
        }
        g.stroke({ width: 1, color: 0xffffff, alpha: 0.25 });
        const t = small('conductor', '#ffffff', 11);
        if (t.width < x1 - x0 - 4) { t.position.set((x0 + x1) / 2 - t.width / 2, top + 4); this.labels.addChild(t); } else t.destroy();
      }
      // Sheets: a bold line with a diamond cap.
      for (const l of sk.layers) {
        if (l.kind !== 'sheet') continue;
        const x = this.px(this.toPlot(l.x0_m), xr);
        g.moveTo(x, top).lineTo(x, top + h).stroke({ width: 3, color: hexNumber(THEME.sheet) });
        g.poly([x, top - 7, x + 5, top - 2, x, top + 3, x - 5, top - 2]).fill({ color: hexNumber(THEME.sheet) });
        // Right of the line when it fits before the conductor or the plot's edge, else left of it.
        const t = small(l.label, THEME.sheet, 10);
        const limit = sk.pec ? xBack : left + w;
        t.position.set(x + 6 + t.width <= limit - 2 ? x + 6 : Math.max(left + 2, x - 6 - t.width), top + 16);
        this.labels.addChild(t);
      }
      // Front face marker.
      g.moveTo(xFront, top).lineTo(xFront, top + h).stroke({ width: 1, color: hexNumber(THEME.ink), alpha: 0.5 });
    }
    // Probes and the source plane: a faint line with a small triangle at the top of the plot.
    for (const p of this.geometry?.probes ?? []) {
      const x = this.px(this.toPlot(p.x_m), xr);
      if (x < left || x > left + w) continue;
      const color = hexNumber(p.kind === 'source' ? THEME.source : THEME.probe);
      g.poly([x - 5, top, x + 5, top, x, top + 8]).fill({ color });
      g.moveTo(x, top).lineTo(x, top + h).stroke({ width: 1, color, alpha: 0.35 });
      const t = small(p.label, p.kind === 'source' ? THEME.source : THEME.probe, 10);
      // The probe at the front face is labelled on its front side, so it never meets the back probe's
      // label on a thin stack.
      const right = !(p.kind === 'probe' && p.x_m <= 0) && x + 7 + t.width < left + w;
      t.position.set(right ? x + 7 : x - 7 - t.width, top + 2);
      this.labels.addChild(t);
    }
    // Zero line and frame.
    g.moveTo(left, this.py(0)).lineTo(left + w, this.py(0)).stroke({ width: 1, color: hexNumber(THEME.grid) });
    g.rect(left + 0.5, top + 0.5, w - 1, h - 1).stroke({ width: 1, color: hexNumber(THEME.axis) });
    // Position axis.
    const ticks = niceTicks(xr[0], xr[1], Math.max(3, Math.floor(w / 90)));
    for (const t of ticks) {
      const x = this.px(t, xr);
      g.moveTo(x, top + h).lineTo(x, top + h + 4).stroke({ width: 1, color: hexNumber(THEME.axis) });
      const lab = small(tickLabel(t, ticks));
      lab.position.set(x - lab.width / 2, top + h + 6);
      this.labels.addChild(lab);
    }
    const unit = (this.options.xUnit === 'mm'
      ? 'position x (mm), front face at 0'
      : `position x / λ₀ at ${fmt(this.options.lambdaAt_Hz / 1e9)} GHz, front face at 0`)
      + (sk?.oblique != null ? ` · ${sk.oblique}: the field along one line normal to the faces` : '');
    const axisLabel = small(unit, THEME.inkSoft, 11);
    axisLabel.position.set(left + w / 2 - axisLabel.width / 2, HEIGHT - 17);
    this.labels.addChild(axisLabel);
    // Field axis.
    for (const v of [-1, 0, 1]) {
      const lab = small(v === 0 ? '0' : v > 0 ? '+1' : '−1');
      if (Math.abs(v) > this.yMax) continue;
      lab.position.set(left - 8 - lab.width, this.py(v) - lab.height / 2);
      this.labels.addChild(lab);
    }
    const ey = small('E / E₀', THEME.inkSoft, 11);
    ey.position.set(6, top - 16);
    this.labels.addChild(ey);
    // Legend (visible traces), top right.
    let lx = left + w;
    for (let i = TRACE_NAMES.length - 1; i >= 0; i--) {
      const name = TRACE_NAMES[i];
      if (!this.options.traces[name] || (name === 'transmitted' && sk?.pec === true)) continue;
      const t = small(TRACE_LABEL[name], THEME.ink, 12);
      lx -= t.width;
      t.position.set(lx, 12);
      this.legend.addChild(t);
      lx -= 24;
      const sw = new Graphics().moveTo(lx, 20).lineTo(lx + 18, 20)
        .stroke({ width: TRACE_WIDTH[name] + 0.5, color: hexNumber(THEME[name]) });
      this.legend.addChild(sw);
      lx -= 16;
    }
    // x of every grid node in plot units.
    const gx = this.geometry?.x_m;
    if (gx !== undefined) {
      if (this.xPlot.length !== gx.length) this.xPlot = new Float64Array(gx.length);
      for (let i = 0; i < gx.length; i++) this.xPlot[i] = this.toPlot(gx[i]);
    }
  }

  private drawTraces(): void {
    const f = this.frame, geo = this.geometry;
    for (const name of TRACE_NAMES) this.traces[name].clear();
    if (f === null || geo === null) {
      this.clock.text = geo === null ? this.noGridNote : 't = 0.000 ns · step 0';
      return;
    }
    // Grow the vertical scale if the field outgrows it (it never shrinks during a run).
    let peak = 0;
    for (let i = 0; i < f.total.length; i++) { const a = Math.abs(f.total[i]); if (a > peak) peak = a; }
    if (peak > this.yMax && Number.isFinite(peak)) { this.yMax = Math.min(1e6, peak * 1.15); this.dirty = true; this.drawStatic(); }
    const xr = this.xRange();
    const n = Math.min(this.xPlot.length, f.total.length);
    const left = M.left, top = M.top, h = this.plotH;
    const yClamp = (v: number): number => Math.min(top + h, Math.max(top, this.py(v)));
    for (const name of TRACE_NAMES) {
      if (!this.options.traces[name]) continue;
      const line = reduceColumns(this.xPlot, f[name], n, xr[0], xr[1], this.plotW, this.line);
      const gr = this.traces[name];
      let next = 0;
      for (let k = 0; k < line.count; k++) {
        const x = left + line.px[k], y = yClamp(line.y[k]);
        if (next < line.startCount && line.starts[next] === k) { gr.moveTo(x, y); next++; } else gr.lineTo(x, y);
      }
      if (line.count > 0) gr.stroke({ width: TRACE_WIDTH[name], color: hexNumber(THEME[name]), join: 'round' });
    }
    this.clock.text = `t = ${(f.time_s * 1e9).toFixed(3)} ns · step ${f.step}${f.done ? ' · finished' : ''}`;
  }
}
