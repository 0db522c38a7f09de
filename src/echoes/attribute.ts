// Stage 5: which bounce paths each detected echo is.
//   1. Every path whose own echo (paths.ts) reaches the floor goes to the nearest detected echo within
//      reach: one pulse width, or farther when a stronger echo's main lobe can hide it (the band pulse's
//      own shape, `leakBeyond`, still above half the path's level there). Paths closer than the
//      resolution thus share one row, named together in order of arrival, "(unresolved)". A path with no
//      echo within reach whose echo still merges into a neighbour's lump (the envelope holds its level
//      there and does not dip on the way) is named in that neighbour's row too.
//   2. An echo no such path reached is looked at through the paths' own band responses at its time: if
//      a path already named elsewhere holds at least half its envelope there, it is that path's echo
//      reshaped by loss or dispersion and is folded into that row (a reshaped echo is one row); if paths
//      below the floor add up to it, they are named; otherwise it is "unexplained", with the path whose
//      echo is nearest in time beside it.
//   3. An echo more than 6 dB above what all paths together predict at its time is unexplained too,
//      whatever paths lie near it (they are then named beside it, and listed as unseen).
// A path is named in at most one row.

import { leakBeyond } from './band-pulse.ts';
import { envelopeAt, type UniformSpectrum } from './envelope.ts';
import type { DetectedEcho } from './detect.ts';
import { type PredictedPaths, groupPeak, groupSpectrum, nearestPeak, pathAt } from './paths.ts';

export interface AttributedEcho {
  echo: DetectedEcho;
  /** Paths this echo is, in order of arrival (empty: unexplained). */
  paths: number[];
  /**
   * Predicted delay: where the lattice puts this echo's envelope peak (these paths' own peak, moved to
   * the peak of every path's summed response there); for an unexplained echo, the nearest path's.
   */
  predicted_t_s: number;
  /** Nearest path when unexplained, else −1. */
  nearest: number;
  /** Echoes folded into this one as its reshaping. */
  folded: DetectedEcho[];
}

export interface AttributeOptions {
  /** Floor (linear, relative to the incident band pulse's peak). */
  floor: number;
  width_s: number;
  bandWidth_Hz: number;
  /** The measured envelope at a delay, relative to the incident band pulse's peak. */
  envelope: (t_s: number) => number;
  /** Earliest delay the detection searched (s): predictions are held to the same window. */
  earliest_s: number;
}

/** Paths farther than this many pulse widths from a time contribute nothing there. */
const NEAR_WIDTHS = 3;
/** Fraction of an echo's envelope a path must hold at its time to be said to make it. */
const HOLDS = 0.5;
/** An echo more than this factor (6 dB) above the lattice's whole envelope at its time is unexplained. */
const OVERSHOOT = 2;
/** Paths holding at least this fraction of the strongest contribution are named together. */
const TOGETHER = 0.35;

/** Farthest distance at which an echo of level `host` can hide a path of level `level` under its own shape. */
function reach(host: number, level: number, o: AttributeOptions): number {
  let lo = o.width_s, hi = 8 * o.width_s;
  if (leakBeyond(lo, o.bandWidth_Hz) * host < 0.5 * level) return lo;
  for (let i = 0; i < 16; i++) { // to 1e-4 of a width
    const mid = (lo + hi) / 2;
    if (leakBeyond(mid, o.bandWidth_Hz) * host >= 0.5 * level) lo = mid; else hi = mid;
  }
  return lo;
}

const gap = (e: DetectedEcho, t: number) => Math.min(...e.members.map((m) => Math.abs(m.t_s - t)));

/** Paths whose own echoes fall within this many pulse widths of each other arrive as one (they may cancel). */
const COINCIDENT_WIDTHS = 0.1;

/**
 * The paths that make echoes of their own: those reaching the floor, grouped when their echoes coincide
 * (within a tenth of a pulse width), a group counting only when its summed echo reaches the floor too
 * (coincident paths may cancel). Paths below the floor are named only in a group that reaches the floor
 * through them alone (several weak paths adding up).
 */
function audibleGroups(P: PredictedPaths, o: AttributeOptions): { paths: number[]; t_s: number; level: number }[] {
  const order = Array.from(P.t_s.keys()).filter((p) => P.level[p] >= o.floor / 4).sort((a, b) => P.t_s[a] - P.t_s[b]);
  const groups: number[][] = [];
  for (const p of order) {
    const last = groups[groups.length - 1];
    if (last && P.t_s[p] - P.t_s[last[last.length - 1]] < COINCIDENT_WIDTHS * o.width_s) last.push(p); else groups.push([p]);
  }
  return groups.map((paths) => {
    if (paths.length === 1) return { paths, t_s: P.t_s[paths[0]], level: P.level[paths[0]] };
    // their summed echo, read at the strength-weighted mean delay (the envelope is flat that close to its peak)
    let w = 0, t = 0;
    for (const p of paths) { w += P.level[p]; t += P.level[p] * P.t_s[p]; }
    t /= w;
    let re = 0, im = 0;
    for (const p of paths) { const z = pathAt(P, p, t); re += z.re; im += z.im; }
    const loud = paths.filter((p) => P.level[p] >= o.floor);
    return { paths: loud.length ? loud : paths, t_s: t, level: Math.hypot(re, im) };
  }).filter((g) => g.level >= o.floor);
}

/**
 * Whether a path's echo at t_s lies on the lump of the echo at `from`: the measured envelope holds at
 * least half the path's level there, and does not dip 3 dB below that on the way from the echo's peak.
 */
function onLump(envelope: (t: number) => number, from: number, t_s: number, level: number, width_s: number): boolean {
  const there = envelope(t_s);
  if (!(there >= 0.5 * level)) return false;
  const n = Math.ceil(Math.abs(t_s - from) / (width_s / 20));
  for (let i = 1; i < n; i++) if (envelope(from + ((t_s - from) * i) / n) < 0.7 * there) return false;
  return true;
}

/**
 * Audible path groups, each given to the nearest echo within reach, or else to the nearest echo whose
 * lump it lies on (no separate peak: it merges into that echo); the groups no echo took.
 */
function assignPaths(echoes: readonly DetectedEcho[], P: PredictedPaths, o: AttributeOptions): { owner: Int32Array; unseen: number[] } {
  const owner = new Int32Array(P.t_s.length).fill(-1), unseen: number[] = [];
  for (const g of audibleGroups(P, o)) {
    const nearest = (ok: (e: DetectedEcho, d: number) => boolean) => {
      let best = -1, bestGap = Infinity;
      echoes.forEach((e, j) => { const d = gap(e, g.t_s); if (d < bestGap && ok(e, d)) { best = j; bestGap = d; } });
      return best;
    };
    let best = nearest((e, d) => d <= reach(e.level, g.level, o));
    if (best < 0) best = nearest((e) => onLump(o.envelope, e.t_s, g.t_s, g.level, o.width_s));
    for (const p of g.paths) owner[p] = best;
    if (best < 0) unseen.push(...g.paths);
  }
  return { owner, unseen };
}

/**
 * Paths whose own echoes lie within NEAR_WIDTHS pulse widths of t: the only ones that can reach t (the
 * band pulse is below −90 dB beyond 1.5 widths), and the only ones whose band responses, sampled at the
 * lattice's few frequencies and so periodic in time, are read without their periodic images.
 */
function pathsNear(P: PredictedPaths, t: number, width_s: number): number[] {
  const out: number[] = [];
  for (let p = 0; p < P.t_s.length; p++) if (Math.abs(P.t_s[p] - t) <= NEAR_WIDTHS * width_s) out.push(p);
  return out;
}

/** Every path near t together: the lattice's own envelope there (an empty group gives zero). */
const lattice = (P: PredictedPaths, t: number, width_s: number) => groupSpectrum(P, pathsNear(P, t, width_s));

/** Contributions |z_p(t)| of every path at time t, strongest first, with the summed response. */
function contributions(P: PredictedPaths, t: number, width_s: number): { order: number[]; c: Float64Array; total: number } {
  const n = P.t_s.length, c = new Float64Array(n);
  let re = 0, im = 0;
  for (const p of pathsNear(P, t, width_s)) { const z = pathAt(P, p, t); c[p] = Math.hypot(z.re, z.im); re += z.re; im += z.im; }
  const order = Array.from({ length: n }, (_, p) => p).sort((a, b) => c[b] - c[a]);
  return { order, c, total: Math.hypot(re, im) };
}

/**
 * Where the lattice's summed response peaks near `own`, searched like the detection: from the earliest delay
 * on. Paths that cancel (an absorber's front face and conductor, or a thin skin's two faces at a steep angle)
 * can leave a hump before delay zero; the detection then sees the window's start (where the envelope falls
 * from it) or the next hump. Of those two the prediction takes the one the detection took, the one nearer the
 * detected delay `at`: their heights can tie within the lattice's own error (a few tenths of a dB), and
 * ranking them by height could predict the other hump, a pulse width away.
 */
function predictedPeak(S: UniformSpectrum, own: number, at: number, o: AttributeOptions): number {
  const t = nearestPeak(S, own, o.width_s / 2, o.width_s)?.t ?? own;
  if (t >= o.earliest_s) return t;
  const later = nearestPeak(S, o.earliest_s + o.width_s / 2, o.width_s / 2, o.width_s);
  if (!later || later.t < o.earliest_s) return o.earliest_s;
  const startIsPeak = envelopeAt(S, o.earliest_s) > envelopeAt(S, o.earliest_s + 1e-3 * o.width_s);
  if (!startIsPeak) return later.t;
  return Math.abs(later.t - at) < Math.abs(o.earliest_s - at) ? later.t : o.earliest_s;
}

/** The hump of a group's summed response nearest t_s (within half a pulse width), else its highest within one width. */
function groupOwnPeak(P: PredictedPaths, paths: readonly number[], t_s: number, width_s: number): number {
  return nearestPeak(groupSpectrum(P, paths), t_s, width_s / 2, width_s)?.t ?? groupPeak(P, paths, t_s, width_s, width_s).t;
}

function nearestPath(P: PredictedPaths, t: number): number {
  let best = -1;
  for (let p = 0; p < P.t_s.length; p++) if (best < 0 || Math.abs(P.t_s[p] - t) < Math.abs(P.t_s[best] - t)) best = p;
  return best;
}

export function attributeEchoes(echoes: readonly DetectedEcho[], P: PredictedPaths, o: AttributeOptions): { rows: AttributedEcho[]; unseen: number[] } {
  const { owner, unseen } = assignPaths(echoes, P, o);
  const rows: AttributedEcho[] = echoes.map((echo) => ({
    echo, paths: [], predicted_t_s: echo.t_s, nearest: -1, folded: [],
  }));
  for (let p = 0; p < owner.length; p++) if (owner[p] >= 0) rows[owner[p]].paths.push(p);
  // Echoes no path reached, strongest first: reshaping, weak paths adding up, or unexplained.
  const dropped = new Set<number>();
  const unclaimed = rows.map((_, j) => j).filter((j) => rows[j].paths.length === 0).sort((a, b) => rows[b].echo.level - rows[a].echo.level);
  for (const j of unclaimed) {
    const row = rows[j], t = row.echo.t_s, env = row.echo.level;
    const { order, c, total } = contributions(P, t, o.width_s);
    const top = order[0];
    if (top === undefined || !(Math.max(c[top], total) >= HOLDS * env)) { row.nearest = nearestPath(P, t); continue; }
    const host = owner[top];
    if (host >= 0 && host !== j && !dropped.has(host)) { rows[host].folded.push(row.echo); dropped.add(j); continue; }
    const free = order.filter((p) => c[p] >= TOGETHER * c[top] && owner[p] < 0);
    if (free.length === 0) { row.nearest = nearestPath(P, t); continue; }
    for (const p of free) owner[p] = j;
    row.paths = free;
  }
  const kept = rows.filter((_, j) => !dropped.has(j));
  for (const row of kept) {
    row.paths.sort((a, b) => P.t_s[a] - P.t_s[b]);
    // An echo holding far more than every path together predicts there is not those paths' echo.
    if (row.paths.length > 0 && row.echo.level > OVERSHOOT * envelopeAt(lattice(P, row.echo.t_s, o.width_s), row.echo.t_s)) {
      row.nearest = row.paths.reduce((a, b) => (P.level[b] > P.level[a] ? b : a));
      unseen.push(...row.paths);
      row.paths = [];
    }
    if (row.paths.length === 0) { row.predicted_t_s = row.nearest >= 0 ? P.t_s[row.nearest] : row.echo.t_s; continue; }
    // where the lattice puts the envelope peak: these paths' own peak (for several, the hump of their summed
    // response nearest the detected delay, as humps of interfering paths can tie in height), then all paths'
    // summed response there
    const own = row.paths.length === 1 ? P.t_s[row.paths[0]] : groupOwnPeak(P, row.paths, row.echo.t_s, o.width_s);
    row.predicted_t_s = predictedPeak(lattice(P, own, o.width_s), own, row.echo.t_s, o);
  }
  return { rows: kept, unseen };
}
