// Keys that could reach an object's prototype are refused anywhere in a stack file, and parsing never
// pollutes Object.prototype (common practice for handling untrusted JSON; no single source).
import { afterEach, describe, expect, it } from 'vitest';
import { parseStackObject, parseStackText } from '../../src/stack/parse.ts';

const clean = () => {
  for (const k of ['polluted', 'model', 'eps_r', 'thickness_mm', 'material']) {
    expect(Object.prototype.hasOwnProperty.call(Object.prototype, k), `Object.prototype.${k}`).toBe(false);
  }
  expect(({} as Record<string, unknown>).polluted).toBeUndefined();
};

describe('prototype keys', () => {
  afterEach(clean);

  const cases: [string, string][] = [
    ['{"band_GHz":[1,6],"__proto__":{"polluted":1}}', '__proto__'],
    ['{"band_GHz":[1,6],"constructor":{"prototype":{"polluted":1}}}', 'constructor'],
    ['{"band_GHz":[1,6],"prototype":1}', 'prototype'],
    ['{"band_GHz":[1,6],"materials":{"__proto__":{"model":"fixed","eps_r":2}}}', 'materials.__proto__'],
    ['{"band_GHz":[1,6],"materials":{"constructor":{"model":"fixed","eps_r":2}}}', 'materials.constructor'],
    ['{"band_GHz":[1,6],"materials":{"f":{"model":"fixed","eps_r":2,"__proto__":{"polluted":1}}}}', 'materials.f.__proto__'],
    ['{"band_GHz":[1,6],"layers":[{"material":"brick","thickness_mm":1,"__proto__":{"polluted":1}}]}', 'layers[0].__proto__'],
    ['{"band_GHz":[1,6],"incidence":{"constructor":1}}', 'incidence.constructor'],
    ['{"band_GHz":[1,6],"materials":{"d":{"model":"debye","eps_inf":2,"poles":[{"delta_eps":1,"tau_ps":1,"prototype":{}}]}}}', 'materials.d.poles[0].prototype'],
  ];
  for (const [text, path] of cases) {
    it(`refuses ${path}`, () => {
      const r = parseStackText(text);
      expect(r.ok).toBe(false);
      if (r.ok) return;
      expect(r.errors.filter((e) => e.startsWith(`${path}: `))).toHaveLength(1);
      expect(r.errors.find((e) => e.startsWith(`${path}: `))).toMatch(/is not allowed/);
    });
  }

  it('does not treat inherited names as materials or keys', () => {
    // "constructor", "toString" and "hasOwnProperty" exist on every object's prototype; as material names
    // they must be unknown, not resolved to a function.
    for (const name of ['toString', 'hasOwnProperty', 'valueOf']) {
      const r = parseStackText(`{"band_GHz":[1,6],"layers":[{"material":"${name}","thickness_mm":1}]}`);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.errors[0]).toMatch(/^layers\[0\]\.material: unknown material/);
    }
    const r = parseStackText('{"band_GHz":[1,6],"front":"constructor"}');
    expect(r.ok).toBe(false);
  });

  it('refuses an object whose prototype was set in code', () => {
    const sneaky = Object.create({ band_GHz: [1, 6] });
    const r = parseStackObject(sneaky);
    expect(r.ok).toBe(false);
  });

  it('builds user-keyed records without a prototype', () => {
    const r = parseStackText('{"band_GHz":[1,6],"materials":{"f":{"model":"fixed","eps_r":2}},"layers":[{"material":"f","thickness_mm":1}]}');
    expect(r.ok).toBe(true);
    if (r.ok) expect(Object.getPrototypeOf(r.file.materials)).toBeNull();
  });

  it('copes with deep nesting without overflowing the stack', () => {
    const deep = '['.repeat(100_000) + ']'.repeat(100_000);
    const r = parseStackText(`{"band_GHz":[1,6],"title":${deep}}`);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.join('\n')).toMatch(/nested deeper than|title: must be text/);
  });
});
