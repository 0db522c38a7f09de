// Stack-file paths: parsing, the canonical text the parser's messages use, reading and setting values on the
// file form, and re-validation that names the path of a bad value.
import { describe, expect, it } from 'vitest';
import { parseStackObject } from '../../src/stack/parse.ts';
import type { StackFile } from '../../src/stack/file.ts';
import { formatPath, parsePath, parsePathPrefix, PathError, readAt, valueKindAt, withSettings } from '../../src/studies/paths.ts';
import { parseValueSpec, rangeValues, ValueSpecError } from '../../src/studies/values.ts';

function baseFile(): StackFile {
  const r = parseStackObject({
    title: 'Paths', band_GHz: [2, 4], points: 5,
    materials: { coat: { model: 'sheet', ohm_per_sq: 377 }, 'wet foam': { model: 'fixed', eps_r: 1.3, sigma_S_per_m: 0.01 } },
    layers: [{ material: 'wet foam', thickness_mm: 10 }, { material: 'coat' }, { material: 'brick', thickness_mm: 100 }],
  });
  if (!r.ok) throw new Error(r.errors.join('\n'));
  return r.file;
}

describe('stack-file paths', () => {
  it('parse into steps and print back in the parser\'s own form', () => {
    expect(parsePath('layers[1].thickness_mm').steps).toEqual(['layers', 1, 'thickness_mm']);
    expect(parsePath('materials["wet foam"].eps_r').steps).toEqual(['materials', 'wet foam', 'eps_r']);
    expect(parsePath('materials["coat"].ohm_per_sq').text).toBe('materials.coat.ohm_per_sq'); // canonical
    expect(formatPath(['materials', 'wet foam', 'eps_r'])).toBe('materials["wet foam"].eps_r');
    expect(parsePath('band_GHz[0]').text).toBe('band_GHz[0]');
    const { path, rest } = parsePathPrefix('layers[0].thickness_mm=1:2:0.5');
    expect(path.text).toBe('layers[0].thickness_mm');
    expect(rest).toBe('=1:2:0.5');
  });

  it('refuse malformed paths and prototype keys with the path in the message', () => {
    expect(() => parsePath('layers[x].thickness_mm')).toThrow(PathError);
    expect(() => parsePath('layers[01]')).toThrow(/list index/);
    expect(() => parsePath('1layers')).toThrow(/expected a key/);
    expect(() => parsePath('materials["open')).toThrow(/closing quote/);
    expect(() => parsePath('materials.__proto__.x')).toThrow(/"__proto__" is not allowed/);
    expect(() => parsePath('layers[0] x')).toThrow(/unexpected/);
  });

  it('read what the file holds and say what kind of value a path takes', () => {
    const f = baseFile();
    expect(readAt(f, parsePath('layers[0].thickness_mm'))).toBe(10);
    expect(readAt(f, parsePath('materials["wet foam"].eps_r'))).toBe(1.3);
    expect(valueKindAt(f, parsePath('layers[2].material'))).toBe('string');
    expect(valueKindAt(f, parsePath('incidence.angle_deg'))).toBe('number'); // a default, filled in
    expect(() => valueKindAt(f, parsePath('layers[1]'))).toThrow(/holds an object; name one number or text in it/);
  });

  it('name the path that leads nowhere, and point a catalog material to --export', () => {
    const f = baseFile();
    expect(() => readAt(f, parsePath('layers[5].thickness_mm'))).toThrow('layers[5]: no such entry (layers has 3 entries, 0 … 2)');
    expect(() => valueKindAt(f, parsePath('materials.brick.a'))).toThrow(/materials\.brick: no such user material .*materials --export brick/);
    expect(() => valueKindAt(f, parsePath('incidence.angel_deg.x'))).toThrow(/incidence\.angel_deg: no such key \(here: angle_deg, polarization\)/);
  });

  it('set values on a copy and re-validate through the parser, which names a bad value by its path', () => {
    const f = baseFile();
    const ok = withSettings(f, [{ path: parsePath('layers[0].thickness_mm'), value: 12.5 }, { path: parsePath('materials.coat.ohm_per_sq'), value: 150 }]);
    expect(ok.ok).toBe(true);
    if (ok.ok) {
      expect(ok.file.layers[0].thickness_mm).toBe(12.5);
      expect(ok.stack.layers[1].kind === 'sheet' && ok.stack.layers[1].material.spec).toEqual({ model: 'sheet', ohm_per_sq: 150 });
    }
    expect(f.layers[0].thickness_mm).toBe(10); // the base is not touched
    const bad = withSettings(f, [{ path: parsePath('layers[0].thickness_mm'), value: -1 }]);
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.errors).toEqual(['layers[0].thickness_mm: must be a number > 0 (got -1)']);
    const badName = withSettings(f, [{ path: parsePath('layers[2].material'), value: 'brik' }]);
    expect(!badName.ok && badName.errors[0]).toMatch(/^layers\[2\]\.material: unknown material "brik" \(did you mean "brick"\?\)/);
    const unknownKey = withSettings(f, [{ path: parsePath('materials.coat.ohms'), value: 3 }]);
    expect(!unknownKey.ok && unknownKey.errors[0]).toMatch(/^materials\.coat\.ohms: unknown key/);
  });

  it('move a default profile frequency with the band, and keep a chosen one', () => {
    const f = baseFile(); // profile at the band centre, 3 GHz (its default)
    const moved = withSettings(f, [{ path: parsePath('band_GHz[1]'), value: 8 }]);
    expect(moved.ok && moved.file.profile_GHz).toBe(5);
    const chosen = withSettings({ ...f, profile_GHz: 2.5 }, [{ path: parsePath('band_GHz[1]'), value: 8 }]);
    expect(chosen.ok && chosen.file.profile_GHz).toBe(2.5);
  });
});

describe('value specs', () => {
  it('ranges include the end that falls on a step and carry no binary noise', () => {
    expect(rangeValues(0, 1, 0.1)).toEqual([0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1]);
    expect(rangeValues(10, 0, -5)).toEqual([10, 5, 0]);
    expect(rangeValues(0, 1, 0.3)).toEqual([0, 0.3, 0.6, 0.9]);
    expect(() => rangeValues(0, 1, -0.1)).toThrow(/leads away/);
    expect(() => rangeValues(0, 1, 0)).toThrow(ValueSpecError);
  });

  it('lists take the kind the path holds', () => {
    expect(parseValueSpec('150,377,600', 'number')).toEqual([150, 377, 600]);
    expect(parseValueSpec('brick,concrete', 'string')).toEqual(['brick', 'concrete']);
    expect(parseValueSpec('2:4:1', 'number')).toEqual([2, 3, 4]);
    expect(() => parseValueSpec('1,x', 'number')).toThrow(/"x" is not a number/);
    expect(() => parseValueSpec('1,,2', 'number')).toThrow(/empty item/);
    expect(() => parseValueSpec('1:2', 'number')).toThrow(/A:B:STEP/);
    expect(parseValueSpec('0x10', null)).toEqual(['0x10']); // not a plain decimal: a text, which the parser then refuses
  });
});
