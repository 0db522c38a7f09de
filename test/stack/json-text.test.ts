import { describe, expect, it } from 'vitest';
import { findJsonError, lineColumn, parseJsonText, utf8Bytes } from '../../src/stack/json-text.ts';

describe('JSON syntax errors are located', () => {
  it('agrees with JSON.parse on what is valid (ECMA-404 grammar)', () => {
    const valid = ['{}', '[]', '0', '-0.5e+3', '"a\\u00e9\\n"', '{"a":[1,{"b":null}],"c":true,"d":false}', ' \n[ 1 , 2 ]\t'];
    const invalid = ['', '{', '{"a"}', '{"a":}', '[1,]', '{"a":1,}', '01', '1.', '.5', '+1', 'NaN', 'tru', '"\\x"', '"a', '{"a":1}}', "{'a':1}", '"\u0001"', '[1 2]'];
    for (const t of valid) { expect(() => JSON.parse(t)).not.toThrow(); expect(findJsonError(t), t).toBeUndefined(); }
    for (const t of invalid) { expect(() => JSON.parse(t)).toThrow(); expect(findJsonError(t), t).toBeDefined(); }
  });

  it('names line and column (1-based)', () => {
    expect(lineColumn('ab\ncd', 4)).toEqual({ line: 2, column: 2 });
    const r = parseJsonText('{\n  "a": 1\n  "b": 2\n}');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toBe(`invalid JSON at line 3, column 3: expected ',' or '}', found "\\""`);
  });

  it('refuses a key given twice in one object, which JSON.parse would silently resolve to the last', () => {
    // RFC 8259 §4: names within an object SHOULD be unique; with duplicates, implementations differ.
    const r = parseJsonText('{"band_GHz": [1, 3],\n "materials": {"foam": {}, "f\\u006fam": {}},\n "layers": [{"a": 1}, {"a": 2}]}');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toBe('line 2, column 28: the key "foam" appears twice in the same object (JSON keeps only the last); remove one');
    // the same key in different objects, or a key equal to a value, is fine
    expect(parseJsonText('{"a": {"a": "a"}, "b": [{"a": 1}, {"a": 2}]}').ok).toBe(true);
  });

  it('counts UTF-8 bytes', () => {
    expect(utf8Bytes('aé€😀')).toBe(1 + 2 + 3 + 4); // RFC 3629 byte lengths
  });
});
