// The field view's header layout (src/app/field/header.ts): title and legend never overlap at any
// width, measured as boxes (common practice, no source).

import { describe, expect, it } from 'vitest';
import { headerLayout, overlaps } from '../../src/app/field/header.ts';

describe('field view header', () => {
  it('never lets the title box meet the legend box', () => {
    for (let right = 200; right <= 1400; right += 37) {
      for (const titleW of [80, 300, 430, 700]) {
        const h = { left: 54, right, titleW, legendW: 280, clockW: 300, gap: 24 };
        const lay = headerLayout(h);
        const title = { x: 54, y: 8, w: Math.min(titleW, lay.titleMaxW), h: 18 };
        const legend = { x: lay.legendX, y: lay.legendRow === 0 ? 12 : 32, w: 280, h: 16 };
        const clock = { x: 54, y: 30, w: 300, h: 17 };
        if (lay.legendRow === 0) expect(overlaps(title, legend)).toBe(false);
        else if (h.clockW + h.gap + h.legendW <= right - 54) expect(overlaps(clock, legend)).toBe(false);
      }
    }
  });

  it('keeps the legend beside the title when both fit', () => {
    expect(headerLayout({ left: 0, right: 1000, titleW: 300, legendW: 280, clockW: 300, gap: 24 }).legendRow).toBe(0);
    expect(headerLayout({ left: 0, right: 600, titleW: 430, legendW: 280, clockW: 250, gap: 24 }).legendRow).toBe(1);
  });
});
