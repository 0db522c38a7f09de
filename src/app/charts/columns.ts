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
 * over the data range [x0, x1]; the nearest sample beyond each end is kept (in a column just outside)
 * so a curve reaches the edge. Non-finite samples break the line.
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
  const flush = (): void => {
    if (!open) return;
    const c = col + 0.5;
    if (lo === hi) { push(c, lo); }
    else if (iLo < iHi) { push(c, lo); push(c, hi); }
    else { push(c, hi); push(c, lo); }
    open = false;
  };
  const push = (px: number, v: number): void => {
    const k = out.count++;
    out.px[k] = px; out.y[k] = v;
  };
  for (let i = 0; i < n; i++) {
    const xi = x[i], yi = y[i];
    if (xi < x0 && i + 1 < n && x[i + 1] <= x0) continue;   // well before the range
    if (!Number.isFinite(yi) || !Number.isFinite(xi)) { flush(); broken = true; continue; }
    const c = xi < x0 ? -1 : xi >= x1 ? (xi === x1 ? cols - 1 : cols) : Math.floor((xi - x0) * scale);
    if (!open || c !== col || broken) {
      flush();
      if (broken) { out.starts[out.startCount++] = out.count; broken = false; }
      col = c; lo = hi = yi; iLo = iHi = i; open = true;
    } else {
      if (yi < lo) { lo = yi; iLo = i; }
      if (yi > hi) { hi = yi; iHi = i; }
    }
    if (xi > x1) break;                                      // first sample past the range ends it
  }
  flush();
  return out;
}
