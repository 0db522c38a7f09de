// The overview strip under a zoomed field view: the whole grid in miniature (media, layers, absorbers,
// the total field now) with the part the main plot shows outlined and the rest dimmed. A press or
// drag in the strip moves the view.

import { Graphics } from 'pixi.js';
import { THEME, bandTint, hexNumber } from '../theme.ts';
import type { PulseGeometry } from '../protocol.ts';
import type { StackSketch } from '../sketch.ts';
import type { Span } from './framing.ts';
import type { PlotBox } from './paint.ts';

/** Pixel column of x_m in the strip showing `full`. */
export const stripX = (box: PlotBox, full: Span, x_m: number): number =>
  box.left + ((x_m - full.x0_m) / (full.x1_m - full.x0_m)) * box.w;

/** Position under pixel column px of the strip. */
export const stripPosition = (box: PlotBox, full: Span, px: number): number =>
  full.x0_m + ((px - box.left) / box.w) * (full.x1_m - full.x0_m);

/** The strip's media and layers (under the trace). */
export function paintStripBack(g: Graphics, box: PlotBox, full: Span, sk: StackSketch, geometry: PulseGeometry | null): void {
  const x = (x_m: number): number => Math.min(box.left + box.w, Math.max(box.left, stripX(box, full, x_m)));
  const { top, h } = box;
  g.rect(box.left, top, box.w, h).fill({ color: hexNumber(THEME.panel) });
  const xf = x(0), xb = x(sk.thickness_m);
  g.rect(box.left, top, xf - box.left, h).fill({ color: hexNumber(bandTint(sk.front)) });
  if (!sk.pec) g.rect(xb, top, box.left + box.w - xb, h).fill({ color: hexNumber(bandTint(sk.back)) });
  else g.rect(xb, top, Math.max(2, box.left + box.w - xb), h).fill({ color: hexNumber(THEME.conductor) });
  for (const l of sk.layers) {
    if (l.kind === 'bulk') g.rect(x(l.x0_m), top, Math.max(1, x(l.x1_m) - x(l.x0_m)), h).fill({ color: hexNumber(bandTint(l.material)) });
  }
  for (const l of sk.layers) {
    if (l.kind === 'sheet') g.rect(x(l.x0_m) - 0.75, top, 1.5, h).fill({ color: hexNumber(THEME.sheet) });
  }
  for (const [a, b] of geometry?.absorbers ?? []) {
    g.rect(x(a), top, Math.max(1, x(b) - x(a)), h).fill({ color: hexNumber(THEME.absorber), alpha: 0.7 });
  }
}

/** The dimmed outside and the outline of the shown part (over the trace). */
export function paintStripWindow(g: Graphics, box: PlotBox, full: Span, view: Span): void {
  const a = Math.max(box.left, stripX(box, full, view.x0_m));
  const b = Math.min(box.left + box.w, stripX(box, full, view.x1_m));
  const { top, h } = box;
  if (a > box.left) g.rect(box.left, top, a - box.left, h).fill({ color: 0xffffff, alpha: 0.6 });
  if (b < box.left + box.w) g.rect(b, top, box.left + box.w - b, h).fill({ color: 0xffffff, alpha: 0.6 });
  g.rect(a, top + 0.5, Math.max(2, b - a), h - 1).stroke({ width: 1.5, color: hexNumber(THEME.source) });
  g.rect(box.left + 0.5, top + 0.5, box.w - 1, h - 1).stroke({ width: 1, color: hexNumber(THEME.axis) });
}
