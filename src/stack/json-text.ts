// JSON text → value, with a parse failure located by line and column for the user.
// JSON.parse does the parsing; when it fails, a small scanner finds where and why, in the same
// words on every JavaScript engine (engines word their own messages differently, some without a position).

export type JsonResult = { ok: true; value: unknown } | { ok: false; error: string };

/** Line and column (both from 1) of a character offset in `text`. */
export function lineColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1, start = 0;
  const end = Math.min(Math.max(offset, 0), text.length);
  for (let i = 0; i < end; i++) if (text.charCodeAt(i) === 10) { line++; start = i + 1; }
  return { line, column: end - start + 1 };
}

/** UTF-8 size of a string in bytes, without allocating it. */
export function utf8Bytes(text: string): number {
  let n = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c < 0x80) n += 1;
    else if (c < 0x800) n += 2;
    else if (c >= 0xd800 && c <= 0xdbff && i + 1 < text.length) { n += 4; i++; }
    else n += 3;
  }
  return n;
}

export function parseJsonText(text: string): JsonResult {
  try {
    const value: unknown = JSON.parse(text);
    // JSON.parse keeps the last of two equal keys without a word; a hand-edited file means one of them.
    const dup = findJsonError(text, true);
    if (dup === undefined) return { ok: true, value };
    const { line, column } = lineColumn(text, dup.offset);
    return { ok: false, error: `line ${line}, column ${column}: ${dup.reason}` };
  } catch (e) {
    const found = findJsonError(text);
    if (found === undefined) return { ok: false, error: `invalid JSON: ${e instanceof Error ? e.message : String(e)}` };
    const { line, column } = lineColumn(text, found.offset);
    return { ok: false, error: `invalid JSON at line ${line}, column ${column}: ${found.reason}` };
  }
}

const NUMBER = /-?(?:0|[1-9][0-9]*)(?:\.[0-9]+)?(?:[eE][+-]?[0-9]+)?/y;
const ESCAPES = '"\\/bfnrt';
const HEX = /^[0-9a-fA-F]{4}$/;

type Want = 'value' | 'value-or-close' | 'key' | 'key-or-close' | 'colon' | 'comma-or-close' | 'end';

/**
 * Offset and reason of the first syntax error in `s`, or undefined if it is valid JSON. With
 * `refuseDuplicateKeys`, a key that appears twice in one object counts as an error too.
 * Iterative: deep nesting is fine.
 */
export function findJsonError(s: string, refuseDuplicateKeys = false): { offset: number; reason: string } | undefined {
  const n = s.length, open: string[] = [];
  /** The keys seen so far in each open object (null for a list), parallel to `open`. */
  const keys: (Set<string> | null)[] = [];
  let i = 0, want: Want = 'value';
  const fail = (offset: number, reason: string) => ({ offset, reason });
  const afterValue = (): Want => (open.length > 0 ? 'comma-or-close' : 'end');
  /** Index after the string starting at s[i] === '"', or a failure. */
  const scanString = (): number | { offset: number; reason: string } => {
    for (let j = i + 1; j < n; j++) {
      const c = s.charCodeAt(j);
      if (c === 34) return j + 1;
      if (c < 0x20) return fail(j, 'control character inside a string (write it as an escape such as \\n)');
      if (c === 92) {
        const e = s[j + 1];
        if (e === 'u') {
          if (!HEX.test(s.slice(j + 2, j + 6))) return fail(j, 'bad \\u escape (needs four hex digits)');
          j += 5;
        } else if (e !== undefined && ESCAPES.includes(e)) j++;
        else return fail(j, `bad escape \\${e ?? ''} in a string`);
      }
    }
    return fail(n, 'unterminated string (missing closing ")');
  };
  for (;;) {
    while (i < n && ' \t\n\r'.includes(s[i])) i++;
    if (i >= n) return want === 'end' ? undefined : fail(n, open.length > 0 ? `unexpected end of input (${open.length} unclosed bracket${open.length > 1 ? 's' : ''})` : 'unexpected end of input');
    const ch = s[i];
    switch (want) {
      case 'end':
        return fail(i, 'unexpected text after the end of the JSON value');
      case 'colon':
        if (ch !== ':') return fail(i, `expected ':' after a key, found ${JSON.stringify(ch)}`);
        i++; want = 'value'; break;
      case 'comma-or-close': {
        const close = open[open.length - 1] === '{' ? '}' : ']';
        if (ch === ',') { i++; want = close === '}' ? 'key' : 'value'; }
        else if (ch === close) { open.pop(); keys.pop(); i++; want = afterValue(); }
        else return fail(i, `expected ',' or '${close}', found ${JSON.stringify(ch)}`);
        break;
      }
      case 'key':
      case 'key-or-close':
        if (want === 'key-or-close' && ch === '}') { open.pop(); keys.pop(); i++; want = afterValue(); break; }
        if (ch !== '"') return fail(i, want === 'key' && ch === '}' ? "trailing comma before '}'" : `expected a double-quoted key, found ${JSON.stringify(ch)}`);
        {
          const r = scanString();
          if (typeof r !== 'number') return r;
          const seen = keys[keys.length - 1];
          if (refuseDuplicateKeys && seen) {
            const key = JSON.parse(s.slice(i, r)) as string;
            if (seen.has(key)) return fail(i, `the key ${JSON.stringify(key)} appears twice in the same object (JSON keeps only the last); remove one`);
            seen.add(key);
          }
          i = r; want = 'colon';
        }
        break;
      case 'value':
      case 'value-or-close':
        if (want === 'value-or-close' && ch === ']') { open.pop(); keys.pop(); i++; want = afterValue(); break; }
        if (ch === '{') { open.push('{'); keys.push(new Set()); i++; want = 'key-or-close'; break; }
        if (ch === '[') { open.push('['); keys.push(null); i++; want = 'value-or-close'; break; }
        if (ch === '"') {
          const r = scanString();
          if (typeof r !== 'number') return r;
          i = r; want = afterValue(); break;
        }
        if (ch === '-' || (ch >= '0' && ch <= '9')) {
          NUMBER.lastIndex = i;
          const m = NUMBER.exec(s);
          if (m === null) return fail(i, 'malformed number');
          i += m[0].length; want = afterValue(); break;
        }
        {
          const lit = ['true', 'false', 'null'].find((w) => s.startsWith(w, i));
          if (lit !== undefined) { i += lit.length; want = afterValue(); break; }
        }
        if (ch === ']' && want === 'value') return fail(i, "trailing comma before ']'");
        return fail(i, `expected a value (number, string, true, false, null, object or list), found ${JSON.stringify(ch)}`);
    }
  }
}
