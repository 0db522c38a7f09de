// The field view's framing rules (src/app/field/framing.ts). These are the workbench's own layout
// rules, checked as arithmetic on spans (common practice, no source): the stack's share of the width,
// room in front for the incident pulse when the share allows, zoom about a fixed point, pan inside the grid.

import { describe, expect, it } from 'vitest';
import { BACK_SHARE, STACK_SHARE, STACK_SHARE_MIN, clampSpan, defaultSpan, isZoomed, panSpan, spanWidth, zoomSpan, type FramingFacts } from '../../src/app/field/framing.ts';

const facts = (d: number, L: number, full = { x0_m: -1, x1_m: 1 }, pec = false): FramingFacts =>
  ({ thickness_m: d, pulseLength_m: L, pec, full });

describe('default framing', () => {
  it('gives a thick stack half the width with the whole pulse in front of it', () => {
    const d = 0.3, L = 0.1;
    const s = defaultSpan(facts(d, L));
    expect(d / spanWidth(s)).toBeCloseTo(STACK_SHARE, 12);
    expect(-s.x0_m).toBeGreaterThanOrEqual(L);
    expect(s.x1_m - d).toBeCloseTo(BACK_SHARE * spanWidth(s), 12);
  });

  it('widens the front medium for a pulse a little longer than the stack', () => {
    const d = 0.1, L = 0.12;
    const s = defaultSpan(facts(d, L));
    const share = d / spanWidth(s);
    expect(share).toBeLessThan(STACK_SHARE);
    expect(share).toBeGreaterThanOrEqual(STACK_SHARE_MIN - 1e-12);
    // Exactly the pulse in front: W = (d + L) / (1 − back share).
    expect(-s.x0_m).toBeCloseTo(L, 12);
  });

  it('never lets a thin stack shrink below the smallest share, whatever the pulse', () => {
    for (const d of [1e-3, 4e-3, 0.024]) {
      const s = defaultSpan(facts(d, 0.15));
      expect(d / spanWidth(s)).toBeCloseTo(STACK_SHARE_MIN, 12);
      expect(s.x0_m).toBeLessThan(0);
      expect(s.x1_m).toBeGreaterThan(d);
    }
  });

  it('stays inside the grid, moving the excess of one side to the other while there is room', () => {
    // Behind the stack the grid ends 1 cm after it: the view keeps its width, shifted forward.
    const d = 0.3, L = 0.1;
    const s = defaultSpan(facts(d, L, { x0_m: -1, x1_m: d + 0.01 }));
    expect(s.x1_m).toBeCloseTo(d + 0.01, 12);
    expect(d / spanWidth(s)).toBeCloseTo(STACK_SHARE, 12);
    // Short on both sides: the whole grid.
    const t = defaultSpan(facts(0.1, 0.2, { x0_m: -0.05, x1_m: 0.2 }));
    expect(t).toEqual({ x0_m: -0.05, x1_m: 0.2 });
  });

  it('frames a stack of sheets only (zero thickness) around the pulse', () => {
    const s = defaultSpan(facts(0, 0.1));
    expect(-s.x0_m).toBeCloseTo(0.1, 12);
    expect(s.x1_m).toBeGreaterThan(0);
  });
});

describe('zoom and pan', () => {
  const full = { x0_m: -1, x1_m: 1 };
  it('keeps the anchor at the same place on the screen', () => {
    const s = { x0_m: -0.5, x1_m: 0.5 };
    const z = zoomSpan(s, 0.5, 0.25, full, 1e-6);
    expect(spanWidth(z)).toBeCloseTo(0.5, 12);
    expect((0.25 - z.x0_m) / spanWidth(z)).toBeCloseTo((0.25 - s.x0_m) / spanWidth(s), 12);
  });

  it('zooms out no further than the grid and in no further than the smallest width', () => {
    const s = { x0_m: -0.5, x1_m: 0.5 };
    expect(zoomSpan(s, 100, 0, full, 1e-6)).toEqual(full);
    expect(isZoomed(zoomSpan(s, 100, 0, full, 1e-6), full)).toBe(false);
    expect(spanWidth(zoomSpan(s, 1e-9, 0, full, 0.01))).toBeCloseTo(0.01, 12);
  });

  it('pans without leaving the grid', () => {
    const s = { x0_m: 0, x1_m: 0.5 };
    const p = panSpan(s, 10, full);
    expect(p.x1_m).toBe(1);
    expect(spanWidth(p)).toBeCloseTo(0.5, 12);
    expect(clampSpan({ x0_m: -3, x1_m: -2.5 }, full, 0).x0_m).toBe(-1);
  });
});
