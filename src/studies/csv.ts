// A text field of a CSV line (RFC 4180): quoted when it holds a comma, a quote or a line end, quotes doubled.

export function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
