// Where the field view puts its labels: a layer's name inside its band when it fits, else a number
// tag beside the plot and a line in the key; sheets as separate marks even when they share a place.
// Pure geometry in pixels; the caller measures text.

/**
 * Centres for marks of the given widths, as near their wanted centres as possible, in order, each
 * pair at least `gap` apart edge to edge, inside [lo, hi] when they fit there. Overlapping marks are
 * merged into clusters centred on their wanted centres' mean until no clusters overlap (the usual
 * one-dimensional label spreading; common practice, no source).
 */
export function spreadMarks(want: readonly number[], widths: readonly number[], gap: number, lo: number, hi: number): number[] {
  const order = [...want.keys()].sort((a, b) => want[a] - want[b]);
  interface Cluster { marks: number[]; start: number; size: number }
  const place = (c: Cluster): void => {
    // Centres run from `start` in order; put their mean on the mean of the wanted centres.
    let edge = 0, sumOffset = 0, sumWant = 0;
    for (const i of c.marks) { sumOffset += edge + widths[i] / 2; sumWant += want[i]; edge += widths[i] + gap; }
    c.size = edge - gap;
    c.start = Math.max(lo, Math.min(hi - c.size, (sumWant - sumOffset) / c.marks.length));
  };
  const clusters: Cluster[] = [];
  for (const i of order) {
    const c: Cluster = { marks: [i], start: 0, size: 0 };
    place(c);
    clusters.push(c);
    while (clusters.length > 1) {
      const b = clusters[clusters.length - 1], a = clusters[clusters.length - 2];
      if (a.start + a.size + gap <= b.start + 1e-9) break;
      a.marks.push(...b.marks);
      clusters.pop();
      place(a);
    }
  }
  const out = new Array<number>(want.length);
  for (const c of clusters) {
    let edge = c.start;
    for (const i of c.marks) { out[i] = edge + widths[i] / 2; edge += widths[i] + gap; }
  }
  return out;
}

export interface BandInput {
  /** Layer number shown to the user (1 = the front layer). */
  number: number;
  x0_px: number;
  x1_px: number;
  label: string;
  short: string;
}

export interface SheetInput {
  number: number;
  x_px: number;
  label: string;
}

export type BandLabel =
  | { kind: 'inside'; number: number; text: string; x_px: number; row: number }
  | { kind: 'tag'; number: number; text: string; x_px: number; anchor_px: number };

export interface SheetMark {
  number: number;
  /** Where the sheet is (its line). */
  x_px: number;
  /** Where its cap and number go (spread from neighbours). */
  cap_px: number;
  /** Its label beside the cap, when there is room; else the label is in the key. */
  label: { text: string; x_px: number } | null;
}

export interface LabelPlan {
  bands: BandLabel[];
  sheets: SheetMark[];
  /** "3 glass · 4 mm": labels that did not fit in place. */
  key: string[];
}

export interface LabelMetrics {
  measure: (text: string) => number;
  /** Width of a number tag or sheet cap. */
  tagWidth: number;
  /** Smallest gap between tags. */
  gap: number;
  /** The plot's extent in pixels. */
  left: number;
  right: number;
}

/**
 * Labels for layer bands and sheets. A band's long label, or else its short one, goes inside it
 * (alternating between two rows so neighbours do not touch); a band too thin for either gets a
 * number tag above the plot (spread so tags never overlap) and a line in the key. Sheet caps are
 * spread the same way, so two sheets at one place still show as two marks; a sheet's label goes
 * right of its cap when it reaches neither the next cap nor the plot's edge, else into the key.
 */
export function planLabels(bands: readonly BandInput[], sheets: readonly SheetInput[], m: LabelMetrics): LabelPlan {
  const out: LabelPlan = { bands: [], sheets: [], key: [] };
  const keyed = new Map<number, string>();
  const tags: BandInput[] = [];
  let row = 0;
  for (const b of bands) {
    const x0 = Math.max(m.left, b.x0_px), x1 = Math.min(m.right, b.x1_px);
    if (x1 <= x0) continue; // outside the view
    const room = x1 - x0 - 4;
    const text = m.measure(b.label) <= room ? b.label : m.measure(b.short) <= room ? b.short : null;
    if (text !== null) out.bands.push({ kind: 'inside', number: b.number, text, x_px: (x0 + x1) / 2, row: row++ % 2 });
    else tags.push({ ...b, x0_px: x0, x1_px: x1 });
  }
  // Band tags and sheet caps share the row above the plot, so they are spread together.
  const visibleSheets = sheets.filter((s) => s.x_px >= m.left - 0.5 && s.x_px <= m.right + 0.5);
  const want = [...tags.map((b) => (b.x0_px + b.x1_px) / 2), ...visibleSheets.map((s) => s.x_px)];
  const widths = want.map(() => m.tagWidth);
  const at = spreadMarks(want, widths, m.gap, m.left, m.right);
  tags.forEach((b, i) => {
    out.bands.push({ kind: 'tag', number: b.number, text: String(b.number), x_px: at[i], anchor_px: (b.x0_px + b.x1_px) / 2 });
    keyed.set(b.number, b.label);
  });
  const caps = visibleSheets.map((s, j) => ({ s, cap: at[tags.length + j] }));
  const capsSorted = [...at].sort((a, b) => a - b);
  for (const { s, cap } of caps) {
    const next = capsSorted.find((c) => c > cap + 1e-9) ?? Infinity;
    const x = cap + m.tagWidth / 2 + 3;
    const w = m.measure(s.label);
    const fits = x + w <= Math.min(m.right - 2, next - m.tagWidth / 2 - 3);
    out.sheets.push({ number: s.number, x_px: s.x_px, cap_px: cap, label: fits ? { text: s.label, x_px: x } : null });
    if (!fits) keyed.set(s.number, s.label);
  }
  out.key = [...keyed.entries()].sort((a, b) => a[0] - b[0]).map(([n, t]) => `${n} ${t}`);
  return out;
}
