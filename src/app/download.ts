// Downloads from the page (no server): a Blob through an object URL and a temporary link.

export function downloadBlob(name: string, blob: Blob): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.rel = 'noopener';
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 30_000);
}

export function canvasPng(canvas: HTMLCanvasElement): Promise<Blob> {
  return new Promise((resolve, reject) => {
    canvas.toBlob((b) => (b === null ? reject(new Error('the canvas gave no image')) : resolve(b)), 'image/png');
  });
}

/**
 * A file name made from a stack title: letters without accents, digits, "-", "_" and "." only, words
 * joined by "-", at most 60 characters ("Office double glazing / 12 Ω" → "Office-double-glazing-12").
 */
export function fileStem(title: string, fallback = 'slabecho-stack'): string {
  const s = title.normalize('NFKD').replace(/[\u0300-\u036f]/g, '')
    .replace(/[^A-Za-z0-9._-]+/g, '-').replace(/-{2,}/g, '-').replace(/^[-.]+|[-.]+$/g, '')
    .slice(0, 60).replace(/[-.]+$/, '');
  return s.length > 0 ? s : fallback;
}

/** "2025-03-07": the local date, for file names. */
export function dateStamp(d: Date): string {
  const p = (n: number): string => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())}`;
}
