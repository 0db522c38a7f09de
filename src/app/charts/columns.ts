// Per-pixel-column reduction of a sampled curve: whatever the number of samples, a curve is drawn
// with at most two vertices per pixel column (the column's extremes, in the order the data visit
// them), so a 100 000-cell grid costs no more to draw than the canvas is wide.

/** Reusable output of `reduceColumns`: polylines in pixel x and data y. */
export interface ColumnPolyline {
  /** Pixel x of each vertex (column centre). */
  px: Float64Array;
  /** Data y of each vertex. */
  y: Float64Array;
  /** Vertices in use. */
  count: number;
  /** Vertex index where each sub-path starts (a NaN sample breaks the line). */
  starts: Int32Array;
  startCount: number;
}

export function columnPolyline(width: number): ColumnPolyline {
  const n = 2 * Math.max(1, Math.ceil(width)) + 8;
  return { px: new Float64Array(n), y: new Float64Array(n), count: 0, starts: new Int32Array(n), startCount: 0 };
}

/**
 * Reduce samples (x ascending) to at most two vertices per pixel column. Columns are `width` pixels
 * over the data range [x0, x1]. Where the line crosses an end of the range it is cut there, with the
 * value interpolated linearly (one extra vertex at px 0 and at px `width`), so a curve reaches the
 * edges at the right height however far the view is zoomed in. Non-finite samples break the line.
 */
export function reduceColumns(
  x: ArrayLike<number>, y: ArrayLike<number>, n: number,
  x0: number, x1: number, width: number, out: ColumnPolyline,
): ColumnPolyline {
  const cols = Math.max(1, Math.floor(width));
  if (out.px.length < 2 * cols + 8) Object.assign(out, columnPolyline(cols));
  out.count = 0; out.startCount = 0;
  const span = x1 - x0;
  if (!(span > 0) || n <= 0) return out;
  const scale = cols / span;
  let col = 0, lo = 0, hi = 0, iLo = 0, iHi = 0, open = false, broken = true;
  const push = (px: number, v: number): void => {
    if (broken) { out.starts[out.startCount++] = out.count; broken = false; }
    const k = out.count++;
    out.px[k] = px; out.y[k] = v;
  };
  const flush = (): void => {
    if (!open) return;
    const c = col + 0.5;
    if (lo === hi) { push(c, lo); }
    else if (iLo < iHi) { push(c, lo); push(c, hi); }
    else { push(c, hi); push(c, lo); }
    open = false;
  };
  const ok = (k: number): boolean => Number.isFinite(x[k]) && Number.isFinite(y[k]);
  const lerp = (a: number, b: number, at: number): number => y[a] + ((y[b] - y[a]) * (at - x[a])) / (x[b] - x[a]);
  for (let i = 0; i < n; i++) {
    const xi = x[i], yi = y[i];
    if (!ok(i)) { flush(); broken = true; continue; }
    if (xi < x0) {
      // Before the range: only the last such sample counts, where the line enters the range.
      if (i + 1 < n && x[i + 1] > x0 && ok(i + 1)) push(0, lerp(i, i + 1, x0));
      continue;
    }
    if (xi > x1) {
      // The first sample past the range: the line leaves the range here.
      flush();
      if (i > 0 && ok(i - 1)) push(cols, lerp(i - 1, i, x1));
      break;
    }
    const c = xi === x1 ? cols - 1 : Math.floor((xi - x0) * scale);
    if (!open || c !== col) {
      flush();
      col = c; lo = hi = yi; iLo = iHi = i; open = true;
    } else {
      if (yi < lo) { lo = yi; iLo = i; }
      if (yi > hi) { hi = yi; iHi = i; }
    }
  }
  flush();
  return out;
}
