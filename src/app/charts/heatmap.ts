// Pieces shared by the picture views that show a value over two axes (the space–time map, a sweep's map):
// a colour table from a d3 interpolator, a grid of values as an image (one texel per value, scaled up when
// drawn), a colour bar, and the frame with its two axes' ticks. Everything goes into the view's one canvas.

import { THEME } from '../theme.ts';
import { ReadoutBox } from './readoutBox.ts';
import { niceTicks, tickLabel } from './ticks.ts';

/** 256 colours (r, g, b) sampled from an interpolator over [0, 1]. */
export function colourTable(interpolate: (t: number) => string, n = 256): Uint8ClampedArray {
  const out = new Uint8ClampedArray(3 * n);
  for (let k = 0; k < n; k++) {
    const m = /rgb\((\d+),\s*(\d+),\s*(\d+)\)/.exec(interpolate(k / (n - 1)));
    if (m !== null) { out[3 * k] = Number(m[1]); out[3 * k + 1] = Number(m[2]); out[3 * k + 2] = Number(m[3]); }
  }
  return out;
}

export const tableColour = (lut: Uint8ClampedArray, u: number): string => {
  const n = lut.length / 3, k = Math.max(0, Math.min(n - 1, Math.round(u * (n - 1))));
  return `rgb(${lut[3 * k]}, ${lut[3 * k + 1]}, ${lut[3 * k + 2]})`;
};

/** Missing values (NaN) are drawn in this colour. */
const MISSING = [0xe4, 0xe1, 0xda];

/**
 * An nx × ny image of `values` (row-major, row 0 at the top): each value mapped to [0, 1] by `unit` and coloured
 * from the table. The canvas is reused when given.
 */
export function gridImage(values: ArrayLike<number>, nx: number, ny: number, unit: (v: number) => number,
  lut: Uint8ClampedArray, reuse: HTMLCanvasElement | null = null): HTMLCanvasElement {
  const c = reuse ?? document.createElement('canvas');
  if (c.width !== nx || c.height !== ny) { c.width = nx; c.height = ny; }
  const ctx = c.getContext('2d');
  if (ctx === null) throw new Error('2D canvas unavailable');
  const img = ctx.createImageData(nx, ny), px = img.data, n = lut.length / 3;
  for (let i = 0; i < nx * ny; i++) {
    const v = values[i];
    let r = MISSING[0], g = MISSING[1], b = MISSING[2];
    if (Number.isFinite(v)) {
      const k = Math.max(0, Math.min(n - 1, Math.round(unit(v) * (n - 1))));
      r = lut[3 * k]; g = lut[3 * k + 1]; b = lut[3 * k + 2];
    }
    px[4 * i] = r; px[4 * i + 1] = g; px[4 * i + 2] = b; px[4 * i + 3] = 255;
  }
  ctx.putImageData(img, 0, 0);
  return c;
}

export interface Rect { left: number; top: number; width: number; height: number }

/** A vertical colour bar from `lo` (bottom) to `hi` (top), ticked, with its label above. */
export function paintColourBar(ctx: CanvasRenderingContext2D, r: Rect, lut: Uint8ClampedArray, lo: number, hi: number,
  label: string, unit: (v: number) => number = (v) => (v - lo) / (hi - lo)): void {
  for (let y = 0; y < r.height; y++) {
    const v = hi - ((y + 0.5) / r.height) * (hi - lo);
    ctx.fillStyle = tableColour(lut, unit(v));
    ctx.fillRect(r.left, r.top + y, r.width, 1);
  }
  ctx.strokeStyle = THEME.axis;
  ctx.lineWidth = 1;
  ctx.strokeRect(r.left + 0.5, r.top + 0.5, r.width - 1, r.height - 1);
  ctx.fillStyle = THEME.inkSoft;
  ctx.font = `10px ${THEME.font}`;
  ctx.textAlign = 'left';
  ctx.textBaseline = 'middle';
  const ticks = niceTicks(Math.min(lo, hi), Math.max(lo, hi), Math.max(2, Math.floor(r.height / 40)));
  for (const t of ticks) {
    const y = r.top + ((hi - t) / (hi - lo)) * r.height;
    ctx.fillRect(r.left + r.width, Math.round(y), 3, 1);
    ctx.fillText(tickLabel(t, ticks).replace('-', '−'), r.left + r.width + 5, y);
  }
  ctx.fillStyle = THEME.ink;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'alphabetic';
  ctx.fillText(label, r.left + r.width / 2 + 8, r.top - 8);
}

/** Data ↔ pixels of a rectangle: x to the right, y up (yDown false) or down (yDown true). */
export interface Frame2 { rect: Rect; x: [number, number]; y: [number, number]; yDown: boolean }

export const frameX = (f: Frame2, x: number): number => f.rect.left + ((x - f.x[0]) / (f.x[1] - f.x[0])) * f.rect.width;
export const frameY = (f: Frame2, y: number): number => {
  const u = (y - f.y[0]) / (f.y[1] - f.y[0]);
  return f.rect.top + (f.yDown ? u : 1 - u) * f.rect.height;
};
export const frameDataX = (f: Frame2, px: number): number => f.x[0] + ((px - f.rect.left) / f.rect.width) * (f.x[1] - f.x[0]);
export const frameDataY = (f: Frame2, py: number): number => {
  const u = (py - f.rect.top) / f.rect.height;
  return f.y[0] + (f.yDown ? u : 1 - u) * (f.y[1] - f.y[0]);
};

/** Frame, ticks and titles of both axes (x under the plot, y at its left). */
export function paintAxes(ctx: CanvasRenderingContext2D, f: Frame2, xLabel: string, yLabel: string): void {
  const r = f.rect;
  ctx.strokeStyle = THEME.axis;
  ctx.lineWidth = 1;
  ctx.strokeRect(r.left + 0.5, r.top + 0.5, r.width - 1, r.height - 1);
  ctx.fillStyle = THEME.inkSoft;
  ctx.font = `11px ${THEME.font}`;
  const xt = niceTicks(f.x[0], f.x[1], Math.max(3, Math.floor(r.width / 90)));
  ctx.textAlign = 'center';
  ctx.textBaseline = 'top';
  for (const t of xt) {
    const x = frameX(f, t);
    ctx.fillRect(Math.round(x), r.top + r.height, 1, 4);
    ctx.fillText(tickLabel(t, xt).replace('-', '−'), x, r.top + r.height + 6);
  }
  const yt = niceTicks(Math.min(...f.y), Math.max(...f.y), Math.max(2, Math.floor(r.height / 40)));
  ctx.textAlign = 'right';
  ctx.textBaseline = 'middle';
  for (const t of yt) {
    const y = frameY(f, t);
    ctx.fillRect(r.left - 4, Math.round(y), 4, 1);
    ctx.fillText(tickLabel(t, yt).replace('-', '−'), r.left - 6, y);
  }
  ctx.fillStyle = THEME.ink;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'top';
  ctx.fillText(xLabel, r.left + r.width / 2, r.top + r.height + 22);
  ctx.save();
  ctx.translate(14, r.top + r.height / 2);
  ctx.rotate(-Math.PI / 2);
  ctx.textBaseline = 'middle';
  ctx.fillText(yLabel, 0, 0);
  ctx.restore();
  ctx.textBaseline = 'alphabetic';
}

/** A canvas sized to its host's width at the device's pixel ratio (at most 2), with its 2D context set up. */
export function sizeCanvas(canvas: HTMLCanvasElement, w: number, h: number): CanvasRenderingContext2D {
  const dpr = Math.min(2, window.devicePixelRatio || 1);
  if (canvas.width !== Math.round(w * dpr) || canvas.height !== Math.round(h * dpr)) {
    canvas.width = Math.round(w * dpr);
    canvas.height = Math.round(h * dpr);
    canvas.style.width = `${w}px`;
    canvas.style.height = `${h}px`;
  }
  const ctx = canvas.getContext('2d');
  if (ctx === null) throw new Error('2D canvas unavailable');
  ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  return ctx;
}

/** The padding around a map's plot: room for the axes' labels and, on the right, the colour bar. */
export interface MapPadding { left: number; right: number; top: number; bottom: number }

/**
 * A map panel's canvas sized to its host (at least 300 px wide), cleared to the panel colour, with its title at
 * the top left; returns the context, the width and where the subtitle begins.
 */
export function beginMapPanel(canvas: HTMLCanvasElement, host: HTMLElement, height: number, title: string): { ctx: CanvasRenderingContext2D; w: number; subtitleAt: number } {
  const w = Math.max(300, Math.floor(host.clientWidth));
  const ctx = sizeCanvas(canvas, w, height);
  ctx.fillStyle = THEME.panel;
  ctx.fillRect(0, 0, w, height);
  ctx.fillStyle = THEME.ink;
  ctx.font = `600 13px ${THEME.font}`;
  ctx.textAlign = 'left';
  ctx.fillText(title, 12, 20);
  return { ctx, w, subtitleAt: 12 + ctx.measureText(title).width + 10 };
}

/** The plot's rectangle in a map panel `w` × `height` px. */
export const mapPlotRect = (w: number, height: number, pad: MapPadding): Rect =>
  ({ left: pad.left, top: pad.top, width: w - pad.left - pad.right, height: height - pad.top - pad.bottom });

/** The colour bar beside a map's plot, from `lo` (bottom) to `hi`, titled `label`. */
export function paintColourBarBeside(ctx: CanvasRenderingContext2D, plot: Rect, lut: Uint8ClampedArray, lo: number, hi: number, label: string): void {
  paintColourBar(ctx, { left: plot.left + plot.width + 22, top: plot.top + 14, width: 14, height: plot.height - 14 }, lut, lo, hi, label);
}

/** Whether a pointer at (px, py) is over the frame's plot. */
export const overPlot = (f: Frame2, px: number, py: number): boolean =>
  px >= f.rect.left && px <= f.rect.left + f.rect.width && py >= f.rect.top && py <= f.rect.top + f.rect.height;

/**
 * A map panel's host and canvas wired up: redrawn (`request`) when the host is resized, a readout box
 * (`readoutId`) shown by `hover` while the pointer moves over the canvas and hidden when it leaves.
 */
export function wireMapCanvas(host: HTMLElement, canvas: HTMLCanvasElement, readoutId: string, request: () => void,
  hover: (px: number, py: number) => void): ReadoutBox {
  const readout = new ReadoutBox(host, readoutId);
  new ResizeObserver(() => request()).observe(host);
  canvas.addEventListener('pointermove', (e) => hover(e.offsetX, e.offsetY));
  canvas.addEventListener('pointerleave', () => readout.hide());
  return readout;
}
