// The space–time view: the pulse run's field over the default framing (x across) and the run's time (t down),
// as colour on a diverging scale (d3's purple–orange, perceptually ordered: orange positive, purple negative,
// pale at zero); the stack's interfaces as vertical lines, sheets in violet; the echo rows' bounce paths as rays,
// numbered like the rows of the echo tables (T for transmitted). One canvas holds the whole picture (its PNG is
// the view); a readout and a line marking the animation's current time sit on top, outside the picture.

import { interpolatePuOr } from 'd3-scale-chromatic';
import type { EchoRays } from '../../echoes/rays.ts';
import type { ReadoutBox } from '../charts/readoutBox.ts';
import { nearestIndex, readoutValue } from '../charts/readout.ts';
import {
  beginMapPanel, colourTable, frameDataX, frameDataY, frameX, frameY, gridImage, mapPlotRect, overPlot, paintAxes, paintColourBarBeside, wireMapCanvas, type Frame2,
} from '../charts/heatmap.ts';
import { fitText } from '../charts/paint.ts';
import type { StackSketch } from '../sketch.ts';
import { THEME } from '../theme.ts';
import type { SpacetimeMap } from './recorder.ts';
import { drawnRays, type DrawnRay } from './rays.ts';

export type SpacetimeField = 'total' | 'scattered';

export interface SpacetimeLook {
  field: SpacetimeField;
  /** The colour range is ± the map's largest |E| divided by this (values beyond are shown at the ends). */
  gain: number;
  rays: boolean;
}

export interface SpacetimeInput {
  map: SpacetimeMap | null;
  rays: EchoRays | null;
  sketch: StackSketch;
  /** Why the view is empty, when it is. */
  note: string;
}

const HEIGHT = 470;
const PAD = { left: 62, right: 96, top: 34, bottom: 44 };
const LUT = colourTable(interpolatePuOr); // d3's order: purple at 0 (−range) … orange at 1 (+range)

export class SpacetimeView {
  readonly canvas: HTMLCanvasElement;
  private readonly now: HTMLDivElement;
  private readonly readout: ReadoutBox;
  private image: HTMLCanvasElement | null = null;
  private imageKey = '';
  private input: SpacetimeInput | null = null;
  private look: SpacetimeLook = { field: 'total', gain: 1, rays: true };
  private frame: Frame2 | null = null;
  private rays: DrawnRay[] = [];
  private pending = 0;
  draws = 0;

  constructor(private readonly host: HTMLElement) {
    host.classList.add('chart-host');
    this.canvas = document.createElement('canvas');
    this.canvas.className = 'chart-canvas spacetime-canvas';
    this.now = document.createElement('div');
    this.now.className = 'spacetime-now';
    this.now.hidden = true;
    host.append(this.canvas, this.now);
    this.readout = wireMapCanvas(host, this.canvas, 'spacetime-view-readout', () => this.request(), (px, py) => this.hover(px, py));
  }

  show(input: SpacetimeInput, look: SpacetimeLook): void {
    this.input = input;
    this.look = look;
    this.request();
  }

  request(): void {
    if (this.pending !== 0) return;
    this.pending = requestAnimationFrame(() => { this.pending = 0; this.draw(); });
  }

  /** Mark the animation's time on the map (a DOM line, so the picture is not redrawn per frame). */
  setNow(t_ns: number | null): void {
    const f = this.frame;
    if (f === null || t_ns === null || t_ns < f.y[0] || t_ns > f.y[1]) { if (!this.now.hidden) this.now.hidden = true; return; }
    this.now.hidden = false;
    this.now.style.left = `${f.rect.left}px`;
    this.now.style.width = `${f.rect.width}px`;
    this.now.style.top = `${Math.round(frameY(f, t_ns))}px`;
  }

  /** What the tests read: the map's grid and ranges and every ray drawn, in mm and ns of run time. */
  probe(): { rows: number; columns: number; x_mm: [number, number]; t_ns: [number, number]; field: SpacetimeField; rays: DrawnRay[] } | null {
    const m = this.input?.map, f = this.frame;
    if (m === null || m === undefined || f === null) return null;
    return { rows: m.t_ns.length, columns: m.x_mm.length, x_mm: f.x, t_ns: f.y, field: this.look.field, rays: this.look.rays ? this.rays : [] };
  }

  draw(): void {
    const { ctx, w, subtitleAt } = beginMapPanel(this.canvas, this.host, HEIGHT, 'Space–time map');
    const input = this.input, m = input?.map ?? null;
    this.frame = null;
    this.rays = [];
    if (input === null || m === null) {
      const why = input?.note || 'waiting for the pulse run';
      this.host.dataset.empty = why;
      ctx.fillStyle = THEME.inkSoft;
      ctx.font = `12px ${THEME.font}`;
      ctx.textAlign = 'center';
      ctx.fillText(fitText(ctx, why, w - 40), w / 2, HEIGHT / 2);
      this.now.hidden = true;
      this.draws++;
      return;
    }
    delete this.host.dataset.empty;
    const look = this.look;
    ctx.font = `12px ${THEME.font}`;
    ctx.fillStyle = THEME.inkSoft;
    const what = look.field === 'total' ? 'total field' : 'scattered field (total − incident)';
    ctx.fillText(fitText(ctx, `${what} · ${m.t_ns.length} × ${m.x_mm.length} samples, every ${m.stepsPerRow} steps${input.note ? ` · ${input.note}` : ''}`, w - subtitleAt - 12), subtitleAt, 20);
    const nx = m.x_mm.length, nt = m.t_ns.length;
    const dx = nx > 1 ? (m.x_mm[nx - 1] - m.x_mm[0]) / (nx - 1) : 1, dt = nt > 1 ? (m.t_ns[nt - 1] - m.t_ns[0]) / (nt - 1) : 1;
    const rect = mapPlotRect(w, HEIGHT, PAD);
    const f: Frame2 = { rect, x: [m.x_mm[0] - dx / 2, m.x_mm[nx - 1] + dx / 2], y: [m.t_ns[0] - dt / 2, m.t_ns[nt - 1] + dt / 2], yDown: true };
    this.frame = f;
    const values = look.field === 'total' ? m.total : m.scattered;
    const range = rangeOf(values) / Math.max(1, look.gain);
    const key = `${look.field}|${look.gain}|${nt}|${nx}|${m.t_ns[0]}`;
    if (key !== this.imageKey || this.image === null) {
      this.image = gridImage(values, nx, nt, (v) => (v / range + 1) / 2, LUT, this.image);
      this.imageKey = key;
    }
    ctx.imageSmoothingEnabled = true;
    ctx.drawImage(this.image, rect.left, rect.top, rect.width, rect.height);
    ctx.save();
    ctx.beginPath();
    ctx.rect(rect.left, rect.top, rect.width, rect.height);
    ctx.clip();
    paintFaces(ctx, f, input.sketch);
    if (look.rays && input.rays !== null) this.rays = paintRays(ctx, f, drawnRays(input.rays, f.x[0], f.x[1]));
    ctx.restore();
    paintAxes(ctx, f, 'position x (mm), front face at 0', 'run time t (ns)');
    paintColourBarBeside(ctx, rect, LUT, -range, range, 'E / E₀');
    this.draws++;
  }

  private hover(px: number, py: number): void {
    const f = this.frame, m = this.input?.map;
    if (f === null || m === null || m === undefined || !overPlot(f, px, py)) {
      this.readout.hide();
      return;
    }
    const x = frameDataX(f, px), t = frameDataY(f, py);
    const c = nearestIndex(m.x_mm, x), r = nearestIndex(m.t_ns, t);
    const v = (this.look.field === 'total' ? m.total : m.scattered)[r * m.x_mm.length + c];
    this.readout.show(`x = ${readoutValue(m.x_mm[c])} mm, t = ${readoutValue(m.t_ns[r], 4)} ns`,
      [{ title: this.look.field === 'total' ? 'total field' : 'scattered field', rows: [{ label: 'E / E₀', color: THEME.total, value: readoutValue(v) }] }],
      px, Math.max(f.rect.top, py - 20), this.canvas.clientWidth);
  }
}

/** Largest |v| (1 when there is none). */
function rangeOf(values: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < values.length; i++) { const a = Math.abs(values[i]); if (a > m) m = a; }
  return m > 0 ? m : 1;
}

/** The interfaces: bulk faces as dark lines, sheets violet, a conductor hatched. */
function paintFaces(ctx: CanvasRenderingContext2D, f: Frame2, sk: StackSketch): void {
  const top = f.rect.top, bottom = f.rect.top + f.rect.height;
  const line = (x_mm: number, colour: string, width: number): void => {
    const x = Math.round(frameX(f, x_mm)) + 0.5;
    ctx.strokeStyle = colour;
    ctx.lineWidth = width;
    ctx.beginPath(); ctx.moveTo(x, top); ctx.lineTo(x, bottom); ctx.stroke();
  };
  const faces = new Set<number>([0, sk.thickness_m * 1e3]);
  for (const l of sk.layers) if (l.kind === 'bulk') { faces.add(l.x0_m * 1e3); faces.add(l.x1_m * 1e3); }
  for (const x of faces) line(x, 'rgba(29, 34, 48, 0.55)', 1);
  for (const l of sk.layers) if (l.kind === 'sheet') line(l.x0_m * 1e3, THEME.sheet, 2);
  if (sk.pec) {
    const x = frameX(f, sk.thickness_m * 1e3);
    ctx.fillStyle = THEME.conductor;
    ctx.fillRect(x, top, f.rect.left + f.rect.width - x, bottom - top);
  }
}

/** Rays over the map; the labelled ones carry their row's number where they leave the map. */
function paintRays(ctx: CanvasRenderingContext2D, f: Frame2, rays: DrawnRay[]): DrawnRay[] {
  ctx.lineJoin = 'round';
  ctx.font = `600 10px ${THEME.font}`;
  for (const r of rays) {
    ctx.strokeStyle = r.kind === 'incident' ? 'rgba(29, 34, 48, 0.5)' : r.kind === 'reflected' ? 'rgba(29, 34, 48, 0.85)' : 'rgba(15, 110, 100, 0.9)';
    ctx.lineWidth = r.label !== '' || r.kind === 'incident' ? 1.3 : 0.8;
    ctx.setLineDash(r.kind === 'incident' ? [4, 3] : []);
    ctx.beginPath();
    r.x_mm.forEach((x, k) => { const px = frameX(f, x), py = frameY(f, r.t_ns[k]); if (k === 0) ctx.moveTo(px, py); else ctx.lineTo(px, py); });
    ctx.stroke();
  }
  ctx.setLineDash([]);
  // Labels at the ray's far end, or where it leaves the plot, kept inside the frame.
  for (const r of rays) {
    if (r.label === '') continue;
    const k = r.x_mm.length - 1;
    let px = frameX(f, r.x_mm[k]), py = frameY(f, r.t_ns[k]);
    const bottom = f.rect.top + f.rect.height;
    if (py > bottom) {
      // Cut where it crosses the bottom edge.
      const j = r.t_ns.findIndex((t) => frameY(f, t) > bottom);
      const a = Math.max(0, j - 1);
      const u = (bottom - frameY(f, r.t_ns[a])) / (frameY(f, r.t_ns[j]) - frameY(f, r.t_ns[a]));
      px = frameX(f, r.x_mm[a] + u * (r.x_mm[j] - r.x_mm[a])); py = bottom - 4;
    }
    const tw = ctx.measureText(r.label).width;
    const x = Math.min(f.rect.left + f.rect.width - tw - 6, Math.max(f.rect.left + 3, r.kind === 'reflected' ? px + 3 : px - tw - 5));
    ctx.fillStyle = 'rgba(255, 255, 255, 0.85)';
    ctx.fillRect(x - 2, py - 11, tw + 4, 13);
    ctx.fillStyle = r.kind === 'reflected' ? THEME.ink : '#0f6e64';
    ctx.fillText(r.label, x, py);
  }
  return rays;
}
