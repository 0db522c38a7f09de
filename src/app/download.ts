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

export const downloadText = (name: string, text: string, type: string): void =>
  downloadBlob(name, new Blob([text], { type }));

export function canvasPng(canvas: HTMLCanvasElement): Promise<Blob> {
  return new Promise((resolve, reject) => {
    canvas.toBlob((b) => (b === null ? reject(new Error('the canvas gave no image')) : resolve(b)), 'image/png');
  });
}

/** A file-name-safe form of a stack title ("Meeting-room partition" → "Meeting-room partition"). */
export function safeName(title: string, fallback = 'slabecho'): string {
  const s = title.replace(/[\\/:*?"<>|\u0000-\u001f]+/g, ' ').replace(/\s+/g, ' ').trim().slice(0, 80);
  return s.length > 0 && !/^\.+$/.test(s) ? s : fallback;
}
