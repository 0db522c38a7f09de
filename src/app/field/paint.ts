// The field view's static scene, drawn with pixi Graphics: the half-spaces, layer bands and their
// labels, sheets, the conductor, the absorbing regions, probes and the source plane. Each function
// draws one kind of thing into the plot box; positions come through `xOf` (metres → pixels).

import { Graphics } from 'pixi.js';
import { THEME, bandTint, hexNumber } from '../theme.ts';
import type { PulseGeometry } from '../protocol.ts';
import type { StackSketch } from '../sketch.ts';
import { planLabels, type LabelPlan } from './marks.ts';
import type { TextPool } from './textPool.ts';

export interface PlotBox { left: number; top: number; w: number; h: number }

export interface Scene {
  g: Graphics;
  texts: TextPool;
  box: PlotBox;
  /** Pixel column of a position (not clamped). */
  xOf: (x_m: number) => number;
  sketch: StackSketch;
  geometry: PulseGeometry | null;
}

/** Height of the row of tags and sheet caps above the plot. */
export const TAG_ROW = 16;
export const TAG_W = 15;

const clampTo = (b: PlotBox, x: number): number => Math.min(b.left + b.w, Math.max(b.left, x));

function hatch(g: Graphics, x0: number, x1: number, top: number, h: number, pitch: number): void {
  for (let k = x0 - h; k < x1; k += pitch) {
    const a0 = Math.max(k, x0), a1 = Math.min(k + h, x1);
    if (a1 > a0) g.moveTo(a0, top + h - (a0 - k)).lineTo(a1, top + h - (a1 - k));
  }
}

/** The front and back media, tinted like layers, and their names beside the stack. */
export function paintHalfSpaces(s: Scene): void {
  const { g, box, sketch: sk } = s;
  const xFront = clampTo(box, s.xOf(0)), xBack = clampTo(box, s.xOf(sk.thickness_m));
  g.rect(box.left, box.top, xFront - box.left, box.h).fill({ color: hexNumber(bandTint(sk.front)) });
  if (!sk.pec) g.rect(xBack, box.top, box.left + box.w - xBack, box.h).fill({ color: hexNumber(bandTint(sk.back)) });
  const front = s.texts.get(sk.front, THEME.inkSoft, 11);
  if (front.width < xFront - box.left - 12) front.position.set(xFront - 6 - front.width, box.top + box.h - 16);
  else s.texts.drop(front);
  if (!sk.pec) {
    const back = s.texts.get(sk.back, THEME.inkSoft, 11);
    if (back.width < box.left + box.w - xBack - 12) back.position.set(xBack + 6, box.top + box.h - 16);
    else s.texts.drop(back);
  }
}

export function paintAbsorbers(s: Scene): void {
  const { g, box } = s;
  for (const [a, b] of s.geometry?.absorbers ?? []) {
    const x0 = clampTo(box, s.xOf(a)), x1 = clampTo(box, s.xOf(b));
    if (x1 - x0 < 1) continue;
    g.rect(x0, box.top, x1 - x0, box.h).fill({ color: hexNumber(THEME.absorber), alpha: 0.45 });
    hatch(g, x0, x1, box.top, box.h, 9);
    g.stroke({ width: 1, color: hexNumber(THEME.axis), alpha: 0.6 });
    const t = s.texts.get('absorber', THEME.inkSoft, 10);
    if (t.width < x1 - x0 - 4) t.position.set((x0 + x1) / 2 - t.width / 2, box.top + 3); else s.texts.drop(t);
  }
}

/** Layer bands, the conductor, sheets and every label; returns where the labels went (the key: those that did not fit). */
export function paintStack(s: Scene): LabelPlan {
  const { g, box, sketch: sk } = s;
  const top = box.top, h = box.h;
  for (const l of sk.layers) {
    if (l.kind !== 'bulk') continue;
    const a = s.xOf(l.x0_m), b = s.xOf(l.x1_m);
    if (b < box.left || a > box.left + box.w) continue;
    const x0 = clampTo(box, a), x1 = clampTo(box, b);
    g.rect(x0, top, Math.max(1, x1 - x0), h).fill({ color: hexNumber(bandTint(l.material)) });
    g.moveTo(x0 + 0.5, top).lineTo(x0 + 0.5, top + h).moveTo(x1 - 0.5, top).lineTo(x1 - 0.5, top + h)
      .stroke({ width: 1, color: hexNumber(THEME.axis), alpha: 0.7 });
  }
  const xBack = clampTo(box, s.xOf(sk.thickness_m));
  if (sk.pec && xBack < box.left + box.w) {
    const x1 = box.left + box.w;
    g.rect(xBack, top, Math.max(3, x1 - xBack), h).fill({ color: hexNumber(THEME.conductor) });
    hatch(g, xBack, x1, top, h, 6);
    g.stroke({ width: 1, color: 0xffffff, alpha: 0.25 });
    const t = s.texts.get('conductor', '#ffffff', 11);
    if (t.width < x1 - xBack - 4) t.position.set((xBack + x1) / 2 - t.width / 2, top + 4); else s.texts.drop(t);
  }
  const plan = planLabels(
    sk.layers.filter((l) => l.kind === 'bulk').map((l) => ({ number: l.index + 1, x0_px: s.xOf(l.x0_m), x1_px: s.xOf(l.x1_m), label: l.label, short: l.short })),
    sk.layers.filter((l) => l.kind === 'sheet').map((l) => ({ number: l.index + 1, x_px: s.xOf(l.x0_m), label: l.label })),
    { measure: (t) => measure(s, t, 11), tagWidth: TAG_W, gap: 3, left: box.left, right: box.left + box.w },
  );
  paintLabels(s, plan);
  const xFront = s.xOf(0);
  if (xFront >= box.left && xFront <= box.left + box.w) {
    g.moveTo(xFront, top).lineTo(xFront, top + h).stroke({ width: 1, color: hexNumber(THEME.ink), alpha: 0.5 });
  }
  return plan;
}

function measure(s: Scene, text: string, size: number): number {
  const t = s.texts.get(text, THEME.ink, size);
  const w = t.width;
  s.texts.drop(t);
  return w;
}

function paintLabels(s: Scene, plan: LabelPlan): void {
  const { g, box } = s;
  const top = box.top, h = box.h, tagY = top - TAG_ROW;
  for (const b of plan.bands) {
    if (b.kind === 'inside') {
      const t = s.texts.get(b.text, THEME.ink, 11);
      t.position.set(b.x_px - t.width / 2, top + h - 16 - 13 * b.row);
      continue;
    }
    // A numbered tag above the plot, with a leader to the band it names.
    g.roundRect(b.x_px - TAG_W / 2, tagY, TAG_W, TAG_ROW - 3, 3).fill({ color: 0xffffff }).stroke({ width: 1, color: hexNumber(THEME.axis) });
    g.moveTo(b.x_px, tagY + TAG_ROW - 3).lineTo(b.anchor_px, top).stroke({ width: 1, color: hexNumber(THEME.axis) });
    const t = s.texts.get(b.text, THEME.ink, 10);
    t.position.set(b.x_px - t.width / 2, tagY + 0.5);
  }
  // Sheets: a line where the sheet is; a violet numbered cap above the plot, spread from its neighbours.
  const close = (x: number): boolean => plan.sheets.some((o) => o.x_px !== x && Math.abs(o.x_px - x) < 5);
  for (const sh of plan.sheets) {
    const x = sh.x_px;
    g.moveTo(x, top).lineTo(x, top + h).stroke({ width: close(x) ? 1.5 : 3, color: hexNumber(THEME.sheet) });
    g.moveTo(sh.cap_px, tagY + TAG_ROW - 3).lineTo(x, top).stroke({ width: 1.5, color: hexNumber(THEME.sheet) });
    g.roundRect(sh.cap_px - TAG_W / 2, tagY, TAG_W, TAG_ROW - 3, 3).fill({ color: hexNumber(THEME.sheet) });
    const n = s.texts.get(String(sh.number), '#ffffff', 10);
    n.position.set(sh.cap_px - n.width / 2, tagY + 0.5);
    if (sh.label !== null) {
      const t = s.texts.get(sh.label.text, THEME.sheet, 11);
      t.position.set(sh.label.x_px, tagY);
    }
  }
}

/** Probes and the source plane: a faint line with a small triangle at the top of the plot. */
export function paintProbes(s: Scene): void {
  const { g, box } = s;
  for (const p of s.geometry?.probes ?? []) {
    const x = s.xOf(p.x_m);
    if (x < box.left || x > box.left + box.w) continue;
    const color = p.kind === 'source' ? THEME.source : THEME.probe;
    g.poly([x - 5, box.top, x + 5, box.top, x, box.top + 8]).fill({ color: hexNumber(color) });
    g.moveTo(x, box.top).lineTo(x, box.top + box.h).stroke({ width: 1, color: hexNumber(color), alpha: 0.35 });
    const t = s.texts.get(p.label, color, 10);
    // The probe at the front face is labelled on its front side, so it never meets the back probe's
    // label on a thin stack.
    const right = !(p.kind === 'probe' && p.x_m <= 0) && x + 7 + t.width < box.left + box.w;
    const left = x - 7 - t.width;
    if (!right && left < box.left) { s.texts.drop(t); continue; }
    t.position.set(right ? x + 7 : left, box.top + 2);
  }
}
