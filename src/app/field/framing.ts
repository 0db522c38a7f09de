// Which part of the pulse run's grid the field view shows: the default framing, zoom and pan.
// Pure functions over spans in metres (x = 0 at the front face); the view maps them to pixels.

/** A range of positions, x0_m < x1_m. */
export interface Span { x0_m: number; x1_m: number }

export interface FramingFacts {
  /** Total stack thickness (sheets count zero). */
  thickness_m: number;
  /** Length along x of the incident pulse in the front medium (envelope above 10 % of its peak). */
  pulseLength_m: number;
  /** A perfect conductor behind the stack (nothing to show behind it but the conductor itself). */
  pec: boolean;
  /** Everything there is to show: the grid, absorbers included, and room to draw a conductor. */
  full: Span;
}

/** Share of the width the stack takes by default when the incident pulse fits in front of it. */
export const STACK_SHARE = 0.5;
/** The smallest share the stack is given to make room for a long pulse in front of it. */
export const STACK_SHARE_MIN = 0.4;
/** Share of the width behind the stack (the transmitted pulse leaving), or of the conductor drawn there. */
export const BACK_SHARE = 0.1;
export const CONDUCTOR_SHARE = 0.06;

export const spanWidth = (s: Span): number => s.x1_m - s.x0_m;

/**
 * The default framing: the stack fills half the width when the incident pulse fits in the front
 * medium beside it; for a pulse longer than that, the front medium grows and the stack's share falls,
 * down to STACK_SHARE_MIN (a thin stack is never lost beside a long pulse; the overview strip then shows
 * the pulse whole). A tenth of the width stays behind the stack, less when the grid ends sooner.
 */
export function defaultSpan(f: FramingFacts, minWidth_m = 0): Span {
  const d = Math.max(0, f.thickness_m);
  const back = f.pec ? CONDUCTOR_SHARE : BACK_SHARE;
  const L = Math.max(0, f.pulseLength_m);
  let width: number;
  if (d > 0) {
    // The share at which the front medium would hold the pulse exactly: d / W with W = (d + L) / (1 − back).
    const fits = (d * (1 - back)) / (d + L);
    const share = Math.min(STACK_SHARE, Math.max(STACK_SHARE_MIN, fits));
    width = d / share;
  } else {
    // Sheets only: the pulse in front of them.
    width = L > 0 ? L / (1 - back) : spanWidth(f.full);
  }
  width = Math.max(width, minWidth_m);
  const x1 = d + back * width;
  return clipTo({ x0_m: x1 - width, x1_m: x1 }, f.full);
}

/**
 * `s` inside `full`: a side that runs past the grid gives its excess to the other side while there is
 * room there (the width, and so the stack's share, is kept), and is cut only when there is none.
 */
function clipTo(s: Span, full: Span): Span {
  let x0 = s.x0_m, x1 = s.x1_m;
  if (x1 > full.x1_m) { x0 -= x1 - full.x1_m; x1 = full.x1_m; }
  if (x0 < full.x0_m) { x1 = Math.min(full.x1_m, x1 + (full.x0_m - x0)); x0 = full.x0_m; }
  return x1 > x0 ? { x0_m: x0, x1_m: x1 } : { ...full };
}

/**
 * `s` made at least `minWidth_m` wide and at most as wide as `full`, then shifted (not shrunk) to lie
 * inside `full`.
 */
export function clampSpan(s: Span, full: Span, minWidth_m: number): Span {
  const fullW = spanWidth(full);
  let w = Math.min(fullW, Math.max(Math.min(minWidth_m, fullW), spanWidth(s)));
  if (!(w > 0)) w = fullW;
  const mid = (s.x0_m + s.x1_m) / 2;
  let x0 = mid - w / 2;
  x0 = Math.min(full.x1_m - w, Math.max(full.x0_m, x0));
  return { x0_m: x0, x1_m: x0 + w };
}

/** Zoom by `factor` (< 1 zooms in) keeping the position `anchor_m` where it is on the screen. */
export function zoomSpan(s: Span, factor: number, anchor_m: number, full: Span, minWidth_m: number): Span {
  const w = spanWidth(s);
  const target = Math.min(spanWidth(full), Math.max(minWidth_m, w * factor));
  const a = Math.min(s.x1_m, Math.max(s.x0_m, anchor_m));
  const frac = w > 0 ? (a - s.x0_m) / w : 0.5;
  const x0 = a - frac * target;
  return clampSpan({ x0_m: x0, x1_m: x0 + target }, full, minWidth_m);
}

/** Move the span by dx_m (positive: the view moves towards +x), staying inside `full`. */
export function panSpan(s: Span, dx_m: number, full: Span): Span {
  return clampSpan({ x0_m: s.x0_m + dx_m, x1_m: s.x1_m + dx_m }, full, 0);
}

/** The span centred on x_m (the overview strip's click), same width. */
export function centreSpan(s: Span, x_m: number, full: Span): Span {
  const w = spanWidth(s);
  return clampSpan({ x0_m: x_m - w / 2, x1_m: x_m + w / 2 }, full, 0);
}

/** True when the span shows less than the whole grid. */
export const isZoomed = (s: Span, full: Span): boolean =>
  s.x0_m > full.x0_m + 1e-9 * spanWidth(full) || s.x1_m < full.x1_m - 1e-9 * spanWidth(full);

export const sameSpan = (a: Span, b: Span): boolean => {
  const tol = 1e-9 * Math.max(spanWidth(a), spanWidth(b));
  return Math.abs(a.x0_m - b.x0_m) <= tol && Math.abs(a.x1_m - b.x1_m) <= tol;
};

/** Everything a pulse run's grid shows: its nodes, with room to draw a conductor behind them. */
export function gridSpan(x_m: ArrayLike<number>, pec: boolean): Span {
  const a = x_m[0], b = x_m[x_m.length - 1];
  return { x0_m: a, x1_m: pec ? b + CONDUCTOR_SHARE * (b - a) : b };
}

/** The narrowest span a view of this grid zooms to: eight cells, or a 5000th of everything. */
export function minSpanWidth(x_m: ArrayLike<number>, full: Span): number {
  const dx = x_m.length > 1 ? x_m[1] - x_m[0] : 0;
  return Math.max(8 * dx, spanWidth(full) / 5000);
}
