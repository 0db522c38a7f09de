// Path names and row texts (the wording is this project's own: these are the documented forms).
import { describe, expect, it } from 'vitest';
import { MAX_PATH_CHARS, reflectedPathName, rowText, transmittedPathName } from '../../src/echoes/names.ts';
import type { Layer, SheetMaterial } from '../../src/stack/types.ts';
import { AIR, dielectric, layer, makeStack } from '../support/build-stack.ts';

const coat = (name: string): Layer => ({ kind: 'sheet', material: { name, spec: { model: 'sheet', ohm_per_sq: 15 }, source: 'test', valid_GHz: null } as SheetMaterial });
const stack = makeStack({ layers: [coat('film'), layer(dielectric(5, 0, 'concrete'), 0.1), layer(AIR, 0.02), coat('coat'), layer(dielectric(6, 0, 'glass'), 0.006)], back: 'pec' });

describe('path names', () => {
  it('names the turning point: faces, layers by stack-file number and material, sheets by their material', () => {
    expect(reflectedPathName(stack, [0, 0, 0])).toBe('film (sheet, front face)');
    expect(reflectedPathName(stack, [2, 0, 0])).toBe('back of layer 2 (concrete)');
    expect(reflectedPathName(stack, [2, 2, 0])).toBe('coat (sheet)');
    expect(reflectedPathName(stack, [2, 2, 2])).toBe('conductor');
    expect(reflectedPathName(makeStack({ layers: [layer(AIR, 0.01)] }), [0])).toBe('front face');
    expect(reflectedPathName(makeStack({ layers: [layer(AIR, 0.01)] }), [2])).toBe('back face');
  });
  it('adds the round trips made more than once, between the faces when a sheet bounds the layer', () => {
    expect(reflectedPathName(stack, [4, 2, 2])).toBe('conductor, 2 round trips between film (sheet, front face) and back of layer 2 (concrete)');
    expect(reflectedPathName(stack, [2, 4, 0])).toBe('coat (sheet), 2 round trips between back of layer 2 (concrete) and coat (sheet)');
    const plain = makeStack({ layers: [layer(dielectric(4, 0, 'slab'), 0.1)] });
    expect(reflectedPathName(plain, [6])).toBe('back face, 3 round trips in layer 1 (slab)');
    expect(reflectedPathName(plain, [6], true)).toBe('back face, 3 round trips in layer 1');
    expect(transmittedPathName(plain, [1])).toBe('direct');
    expect(transmittedPathName(plain, [3])).toBe('1 round trip in layer 1 (slab)');
  });
  it('a row of several paths is "(unresolved)", strongest named first within 80 characters, the rest counted', () => {
    const p = (full: string, t_s: number, level: number) => ({ full, compact: full.replace(/ \(.*\)$/, ''), t_s, level });
    expect(rowText([p('front face', 0, 0.3)])).toBe('front face');
    expect(rowText([p('back face', 2, 0.1), p('front face', 0, 0.3)])).toBe('front face + back face (unresolved)');
    const many = [p('front face', 0, 0.3), ...Array.from({ length: 9 }, (_, i) => p(`back of layer ${i + 2} (plasterboard)`, i + 1, 0.2 - 0.01 * i))];
    const text = rowText(many, MAX_PATH_CHARS);
    expect(text.length).toBeLessThanOrEqual(MAX_PATH_CHARS);
    expect(text).toMatch(/^front face \+ back of layer 2 \(plasterboard\) .*\+ \d+ more \(unresolved\)$/);
    // paths 20 dB below the strongest are counted, not named
    expect(rowText([p('front face', 0, 0.3), p('back face', 1, 0.02)])).toBe('front face + 1 more (unresolved)');
  });
});
