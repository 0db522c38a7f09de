// Text from a stack file that reaches a terminal, a CSV file or summary.json. Control characters (C0, DEL, C1),
// the bidirectional-text controls (embeddings, overrides, isolates, marks) and unpaired surrogates can make a
// terminal or an editor show something other than what is there, or break the UTF-8 of a file. Text fields that
// slabecho writes out (title, names, notes) refuse them; messages that quote a refused value escape them.

/** Bidirectional controls: ALM, LRM, RLM, LRE…RLO (embeddings, pop, overrides), LRI…PDI (isolates). */
const BIDI = new Set([0x061c, 0x200e, 0x200f, 0x202a, 0x202b, 0x202c, 0x202d, 0x202e, 0x2066, 0x2067, 0x2068, 0x2069]);

/** Why code point `c` is unsafe in text slabecho echoes, or undefined when it is fine. `allowLayout` lets tab and
 *  line feed through (for notes, which may span lines). */
export function unsafeKind(c: number, allowLayout = false): string | undefined {
  if (allowLayout && (c === 0x09 || c === 0x0a)) return undefined;
  if (c < 0x20 || c === 0x7f || (c >= 0x80 && c <= 0x9f)) return 'a control character';
  if (BIDI.has(c)) return 'a bidirectional-text control';
  if (c === 0x2028 || c === 0x2029) return 'a line or paragraph separator';
  if (c >= 0xd800 && c <= 0xdfff) return 'an unpaired surrogate (not a character)';
  return undefined;
}

/** The first unsafe character of `s`: its kind, code point and position (in characters, from 1). */
export function firstUnsafe(s: string, allowLayout = false): { kind: string; codePoint: number; position: number } | undefined {
  let position = 0;
  for (const ch of s) { // iterates code points; a lone surrogate comes as itself
    position++;
    const c = ch.codePointAt(0)!;
    const kind = unsafeKind(c, allowLayout);
    if (kind !== undefined) return { kind, codePoint: c, position };
  }
  return undefined;
}

const hex = (c: number): string => `U+${c.toString(16).toUpperCase().padStart(4, '0')}`;

/** A problem message for text with an unsafe character, or undefined: "contains a control character (U+0000) at character 6". */
export function unsafeTextProblem(s: string, allowLayout = false): string | undefined {
  const u = firstUnsafe(s, allowLayout);
  return u === undefined ? undefined : `contains ${u.kind} (${hex(u.codePoint)}) at character ${u.position}; use plain text`;
}

/** `s` with every unsafe character written as \u{XXXX}, so quoting it in a message shows what is there. */
export function escapeUnsafe(s: string): string {
  let out = '';
  for (const ch of s) out += unsafeKind(ch.codePointAt(0)!) === undefined ? ch : `\\u{${ch.codePointAt(0)!.toString(16).toUpperCase()}}`;
  return out;
}
