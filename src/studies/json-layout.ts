// JSON text for study documents that may hold many thousands of entries: objects indented as usual, but a list of
// plain values on one line and each object of a list on a line of its own, so a file of 10 000 cases stays a
// file of about 10 000 lines. JSON.parse reads it back like any other JSON.

const isPlain = (v: unknown): boolean => v === null || typeof v !== 'object';

export function studyJson(value: unknown): string {
  return `${layout(value, '')}\n`;
}

function layout(v: unknown, indent: string): string {
  if (isPlain(v)) return JSON.stringify(v);
  const inner = `${indent}  `;
  if (Array.isArray(v)) {
    if (v.length === 0) return '[]';
    if (v.every(isPlain)) return JSON.stringify(v);
    return `[\n${v.map((x) => `${inner}${JSON.stringify(x)}`).join(',\n')}\n${indent}]`;
  }
  const entries = Object.entries(v as Record<string, unknown>).filter(([, x]) => x !== undefined);
  if (entries.length === 0) return '{}';
  return `{\n${entries.map(([k, x]) => `${inner}${JSON.stringify(k)}: ${layout(x, inner)}`).join(',\n')}\n${indent}}`;
}
