// A catalog material with two validity ranges (ITU-R P.2040-3 Table 3 lists glass and ceiling board for
// 0.1–100 / 1–100 GHz and again, with other coefficients, for 220–450 GHz): the stack uses the range that
// holds its band; a band across two ranges, or in the gap between them, is a warning naming both.
import { describe, expect, it } from 'vitest';
import { parseStackObject } from '../../src/stack/parse.ts';
import { toStackFile } from '../../src/stack/file.ts';
import { stackWarnings } from '../../src/stack/warnings.ts';

function glassStack(band_GHz: [number, number]) {
  const r = parseStackObject({ band_GHz, layers: [{ material: 'glass', thickness_mm: 1 }] });
  if (!r.ok) throw new Error(r.errors.join('\n'));
  const spec = r.stack.layers[0].material.spec;
  if (spec.model !== 'power-law') throw new Error('glass is a power law');
  return { stack: r.stack, a: spec.a, warnings: stackWarnings(r.stack).filter((w) => w.startsWith('layers[0]')) };
}

describe('validity ranges of a catalog material', () => {
  it('a band inside the first range uses a = 6.31, inside the second a = 5.79; no warning (Table 3)', () => {
    expect(glassStack([1, 6])).toMatchObject({ a: 6.31, warnings: [] });
    expect(glassStack([250, 300])).toMatchObject({ a: 5.79, warnings: [] });
    expect(glassStack([220, 450])).toMatchObject({ a: 5.79, warnings: [] });
  });

  it('a band across both ranges warns, naming both, and uses the one it overlaps most', () => {
    const low = glassStack([90, 250]); // log overlap: 90–100 (0.105) < 220–250 (0.128)
    expect(low.a).toBe(5.79);
    expect(low.warnings).toHaveLength(1);
    expect(low.warnings[0]).toMatch(/straddles two validity ranges of "glass", 0\.1–100 GHz and 220–450 GHz/);
    expect(low.warnings[0]).toMatch(/220–450 GHz coefficients are used/);
    expect(glassStack([50, 230]).a).toBe(6.31);
  });

  it('a band in the gap, or reaching into it from one range, warns naming both ranges', () => {
    const gap = glassStack([120, 200]);
    expect(gap.warnings).toHaveLength(1);
    expect(gap.warnings[0]).toMatch(/falls between the validity ranges of "glass", 0\.1–100 GHz and 220–450 GHz/);
    expect(gap.a).toBe(5.79); // 200 → 220 is nearer (in log f) than 120 → 100
    const partly = glassStack([60, 150]);
    expect(partly.a).toBe(6.31);
    expect(partly.warnings[0]).toMatch(/0\.1–100 GHz and 220–450 GHz/);
  });

  it('a band beyond the last range names only that range', () => {
    const r = glassStack([500, 600]);
    expect(r.a).toBe(5.79);
    expect(r.warnings).toEqual([expect.stringMatching(/leaves the validity range of "glass", 220–450 GHz/)]);
  });

  it('a stack file written back keeps the catalog name, so reading it picks the range again', () => {
    const { stack } = glassStack([250, 300]);
    const file = toStackFile(stack);
    expect(file.layers[0].material).toBe('glass');
    expect(Object.keys(file.materials ?? {})).toEqual([]);
    const again = parseStackObject(file as unknown as Record<string, unknown>);
    expect(again.ok && again.stack.layers[0].material.spec).toEqual(stack.layers[0].material.spec);
  });
});
