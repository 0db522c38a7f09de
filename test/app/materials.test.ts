// The material editor's file-form helpers (src/app/materials/): every model's starting definition is one the
// parser accepts on bands across the parser's range, renaming reaches every reference, a switch to a sheet drops
// the layers' thickness, and table rows typed as text keep non-numbers as text for the parser to name. Checked
// with the core parser itself (its own rules are tested in test/stack); layout logic, common practice, no source.

import { describe, expect, it } from 'vitest';
import { renameMaterial, switchModel } from '../../src/app/materials/editor.ts';
import { freshName, rowsOf, rowsText, startingDefinition, startingMagnetic } from '../../src/app/materials/schema.ts';
import { materialPlot } from '../../src/app/materials/plot.ts';
import { isDecimalText } from '../../src/app/numberField.ts';
import { MAGNETIC_MODEL_NAMES, MODEL_NAMES } from '../../src/materials/types.ts';
import type { StackFile } from '../../src/stack/file.ts';
import { parseStackObject } from '../../src/stack/parse.ts';

const stackWith = (band: [number, number], def: Record<string, unknown>) => ({
  title: 'Editor check', band_GHz: band,
  layers: [def.model === 'sheet' ? { material: 'm' } : { material: 'm', thickness_mm: 5 }], materials: { m: def },
});

describe('material editor helpers', () => {
  it('starts every model (and every magnetic model) from values the parser accepts', () => {
    for (const band of [[0.01, 0.1], [1, 6], [6, 14], [24, 40], [200, 900]] as [number, number][]) {
      for (const model of MODEL_NAMES) {
        const r = parseStackObject(stackWith(band, startingDefinition(model, band)));
        expect(r.ok ? [] : r.errors, `${model} over ${band}`).toEqual([]);
      }
      for (const mm of MAGNETIC_MODEL_NAMES) {
        const r = parseStackObject(stackWith(band, { ...startingDefinition('fixed', band), magnetic: startingMagnetic(mm, band) }));
        expect(r.ok ? [] : r.errors, `${mm} over ${band}`).toEqual([]);
      }
    }
  });

  it('renames everywhere and switches layers between bulk and sheet', () => {
    const r = parseStackObject({ title: 'x', band_GHz: [1, 6], front: 'foam', layers: [{ material: 'foam', thickness_mm: 3 }, { material: 'brick', thickness_mm: 5 }], materials: { foam: { model: 'fixed', eps_r: 1.2 } } });
    if (!r.ok) throw new Error(r.errors.join('; '));
    const f: StackFile = structuredClone(r.file);
    renameMaterial(f, 'foam', 'light-foam');
    expect(Object.keys(f.materials)).toEqual(['light-foam']);
    expect([f.front, f.layers[0].material]).toEqual(['light-foam', 'light-foam']);
    switchModel(f, 'light-foam', 'sheet');
    f.front = 'air';
    expect(f.layers[0].thickness_mm).toBeUndefined();
    expect(parseStackObject(f).ok).toBe(true);
    switchModel(f, 'light-foam', 'debye');
    expect(f.layers[0].thickness_mm).toBe(10);
    expect(parseStackObject(f).ok).toBe(true);
  });

  it('reads table rows from text, leaving what is not a number for the parser', () => {
    expect(rowsOf('1, 2.2, 0.01\n# a note\n\n6\t2.1\t0.02', isDecimalText)).toEqual([[1, 2.2, 0.01], [6, 2.1, 0.02]]);
    const rows = rowsOf('1, 2.2, 0.01\n6, 2,1, x', isDecimalText);
    expect(rows[1]).toEqual([6, 2, 1, 'x']);
    const r = parseStackObject(stackWith([1, 6], { model: 'table', points: rowsOf('1, 2.2, 0.01\n6, 2.1, abc', isDecimalText) }));
    expect(r.ok ? [] : r.errors).toEqual([expect.stringContaining('materials.m.points[1][2]')]);
    expect(rowsOf(rowsText([[1, 2, 3], [4, 5, 6]]), isDecimalText)).toEqual([[1, 2, 3], [4, 5, 6]]);
    expect(freshName('material', (n) => ['material', 'material-2'].includes(n))).toBe('material-3');
  });

  it('plots ε′ = ε_r and ε″ = σ/(ωε0) of a fixed material (the definition), and says why a sheet has no plot', () => {
    const spec = materialPlot('m', { model: 'fixed', eps_r: 3, sigma_S_per_m: 0.1 }, [1, 6]);
    const [re, loss] = spec.panels[0].series;
    expect(re.y[0]).toBe(3);
    expect(loss.y[0]).toBeCloseTo(0.1 / (2 * Math.PI * 1e9 * 8.8541878128e-12), 9); // ε0: CODATA 2018
    expect(spec.panels).toHaveLength(1);
    expect(materialPlot('s', { model: 'sheet', ohm_per_sq: 377 }, [1, 6]).empty).toMatch(/377 Ω\/sq/);
  });
});
