// Label placement in the field view (src/app/field/marks.ts): spread marks never overlap, keep
// their order and stay where they were wanted when they have room (one-dimensional label spreading,
// common practice, no source); sheets at one place still get two marks; thin layers go to the key.

import { describe, expect, it } from 'vitest';
import { planLabels, spreadMarks } from '../../src/app/field/marks.ts';

describe('spreadMarks', () => {
  it('leaves marks with room where they are', () => {
    expect(spreadMarks([10, 50, 90], [10, 10, 10], 2, 0, 100)).toEqual([10, 50, 90]);
  });

  it('separates marks that share a place, in order, centred on it', () => {
    const at = spreadMarks([50, 50, 50], [10, 10, 10], 2, 0, 100);
    expect(at[1] - at[0]).toBeCloseTo(12, 12);
    expect(at[2] - at[1]).toBeCloseTo(12, 12);
    expect((at[0] + at[1] + at[2]) / 3).toBeCloseTo(50, 12);
  });

  it('never overlaps and stays inside the range, however crowded', () => {
    let seed = 7;
    const rand = (): number => { seed = (seed * 16807) % 2147483647; return seed / 2147483647; };
    for (let trial = 0; trial < 200; trial++) {
      const n = 1 + Math.floor(rand() * 12);
      const want = Array.from({ length: n }, () => rand() * 300);
      const widths = Array.from({ length: n }, () => 5 + rand() * 15);
      const at = spreadMarks(want, widths, 3, 0, 300);
      const order = [...want.keys()].sort((a, b) => want[a] - want[b]);
      for (let k = 1; k < n; k++) {
        const a = order[k - 1], b = order[k];
        expect(at[b] - widths[b] / 2 - (at[a] + widths[a] / 2)).toBeGreaterThanOrEqual(3 - 1e-9);
      }
      const total = widths.reduce((s, w) => s + w, 0) + 3 * (n - 1);
      if (total <= 300) for (let i = 0; i < n; i++) {
        expect(at[i] - widths[i] / 2).toBeGreaterThanOrEqual(-1e-9);
        expect(at[i] + widths[i] / 2).toBeLessThanOrEqual(300 + 1e-9);
      }
    }
  });
});

describe('planLabels', () => {
  const metrics = { measure: (t: string) => 6 * t.length, tagWidth: 15, gap: 3, left: 0, right: 600 };

  it('puts a label inside a wide band, a short label in a narrower one and a tag plus a key line for a thin one', () => {
    const plan = planLabels([
      { number: 1, x0_px: 0, x1_px: 300, label: 'glass · 4 mm', short: '4 mm' },
      { number: 2, x0_px: 300, x1_px: 340, label: 'glass · 4 mm', short: '4 mm' },
      { number: 3, x0_px: 340, x1_px: 345, label: 'water-25c · 1 mm', short: '1 mm' },
    ], [], metrics);
    const by = new Map(plan.bands.map((b) => [b.number, b]));
    expect(by.get(1)).toMatchObject({ kind: 'inside', text: 'glass · 4 mm' });
    expect(by.get(2)).toMatchObject({ kind: 'inside', text: '4 mm' });
    expect(by.get(3)).toMatchObject({ kind: 'tag', text: '3' });
    expect(plan.key).toEqual(['3 water-25c · 1 mm']);
  });

  it('gives two sheets at one place two separate caps and moves labels that would collide to the key', () => {
    const plan = planLabels([], [
      { number: 1, x_px: 200, label: 'film · 377 Ω/sq' },
      { number: 3, x_px: 200, label: 'film · 120 Ω/sq' },
    ], metrics);
    expect(plan.sheets).toHaveLength(2);
    const [a, b] = plan.sheets;
    expect(Math.abs(a.cap_px - b.cap_px)).toBeGreaterThanOrEqual(15 + 3 - 1e-9);
    expect(a.x_px).toBe(200);
    expect(b.x_px).toBe(200);
    // The first cap's label would run into the second cap: it goes to the key; the last one has room.
    expect(plan.sheets.find((s) => s.number === 1)?.label).toBeNull();
    expect(plan.sheets.find((s) => s.number === 3)?.label).not.toBeNull();
    expect(plan.key).toEqual(['1 film · 377 Ω/sq']);
  });
});
