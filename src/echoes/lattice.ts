// Stage 4a: the lattice of bounce paths, over a set of frequencies at once. A wave entering the front
// face splits at every interface it meets into a reflected and a transmitted wave, with the exact
// interface coefficients (region admittances Y from tmm/media.ts, sheets included, a conductor reflects
// −1), and crossing layer i multiplies it by the layer's exact propagator e^{−j k_x,i d_i}. Waves that
// have crossed every layer the same number of times share their delay and are merged (summed): a path
// is a vector of crossing counts. Waves leaving through the front face are reflected paths; through
// the back face, transmitted paths. Summed over all paths, the amplitudes are the exact R(f) and T(f)
// (the multiple-reflection series of Born & Wolf §1.6 and Orfanidis ch. 6).
//
// Layers of one delay make many paths of each delay: a quarter-wave mirror of 12 layers has more than any number
// of waves in flight could hold, and the waves kept then sum to nothing like R. When waves overflow, or the paths
// kept miss more than ten floors of the exact R or T, and layers of equal delay (within `sameDelay_s`) exist, the
// lattice is built again with a path identified by its crossings of each class of such layers: the paths of one
// class vector arrive together, and are summed (merging waves is exact for the sum, whatever their history),
// the sum named by its first member. The lattice that leaves less out is kept.

import { type StackAtFrequency, stackAtFrequency } from '../tmm/media.ts';
import type { Stack } from '../stack/types.ts';
import { layerGroupDelays_s } from './delays.ts';
import { tmmAt } from '../tmm/solve.ts';

/** Paths leaving through one face, amplitudes at every frequency of the lattice. */
export interface PathSet {
  f_Hz: Float64Array;
  /** Crossings of each bulk layer, one Int32Array per path. */
  crossings: Int32Array[];
  /** Amplitude of path p at frequency l: re[p · F + l], im[p · F + l] (F = f_Hz.length). */
  re: Float64Array;
  im: Float64Array;
  /** Σ crossings × layer group delay at the band centre (s): where to look for the path's echo. */
  delay0_s: Float64Array;
  /**
   * How far the paths fall short of the whole response: max over the frequencies of |Σ paths − exact R (or T)|,
   * a bound on the envelope of every path dropped.
   */
  residual: number;
}

export interface LatticeOptions {
  /** Waves whose largest amplitude over the frequencies falls below this are dropped. */
  minAmplitude: number;
  /** Waves whose band-centre delay exceeds this are dropped (the record cannot hold them). */
  maxDelay_s: number;
  /** Most waves in flight (the weakest are dropped beyond). Default 3000. */
  maxWaves?: number;
  /** Most layer crossings in total. Default 400. */
  maxCrossings?: number;
  /**
   * Layers whose delays differ by at most this are one class when the lattice must merge paths (below).
   * Default 0: equal delays only.
   */
  sameDelay_s?: number;
}

/** Interface coefficients at every frequency, for each interface and direction. */
interface Coefficients { r_re: Float64Array; r_im: Float64Array; t_re: Float64Array; t_im: Float64Array }

function interfaceCoefficients(s: StackAtFrequency[], k: number, fromLeft: boolean): Coefficients {
  const F = s.length;
  const c: Coefficients = { r_re: new Float64Array(F), r_im: new Float64Array(F), t_re: new Float64Array(F), t_im: new Float64Array(F) };
  for (let l = 0; l < F; l++) {
    const sl = s[l], L = sl.layers.length;
    const left = k === 0 ? sl.front : sl.layers[k - 1];
    const right = k === L ? sl.back : sl.layers[k];
    if (!right) { if (fromLeft) c.r_re[l] = -1; continue; } // a conductor: r = −1 from the left, nothing from behind
    const [ya, yb] = fromLeft ? [left.Y, right.Y] : [right.Y, left.Y];
    const G = sl.sheetG[k];
    // r = (Ya − Yb − G)/(Ya + Yb + G), t = 1 + r (tangential E continuous across a sheet)
    const nr = ya.re - yb.re - G, ni = ya.im - yb.im, dr = ya.re + yb.re + G, di = ya.im + yb.im;
    const q = dr * dr + di * di;
    c.r_re[l] = (nr * dr + ni * di) / q;
    c.r_im[l] = (ni * dr - nr * di) / q;
    c.t_re[l] = 1 + c.r_re[l];
    c.t_im[l] = c.r_im[l];
  }
  return c;
}

/** A path's identity: its crossings vector, as one number (mixed radix) when that is exact, else as text. */
type Key = number | string;
interface Wave { medium: number; right: boolean; crossings: Int32Array; key: Key; delay: number; re: Float64Array; im: Float64Array }

/** The wave a parent becomes after crossing layer `layer` and meeting an interface there. */
interface Step { parent: Wave; layer: number; key: Key; delay: number }

/** Accumulates waves (or paths) by identity, summing amplitudes of equal identities. */
class Pool {
  readonly map = new Map<Key, Wave>();
  private readonly tre: Float64Array;
  private readonly tim: Float64Array;
  constructor(private readonly F: number, private readonly minAmp: number) {
    this.tre = new Float64Array(F); this.tim = new Float64Array(F);
  }
  /** Adds the parent's amplitude × c (a coefficient times the crossed layer's propagator) as the wave `id`. */
  add(st: Step, medium: number, right: boolean, c: Complexes, id: Key): void {
    const F = this.F, tre = this.tre, tim = this.tim, w = st.parent, cr = c.re, ci = c.im;
    let peak = 0;
    for (let l = 0; l < F; l++) {
      const a = w.re[l] * cr[l] - w.im[l] * ci[l], b = w.re[l] * ci[l] + w.im[l] * cr[l];
      tre[l] = a; tim[l] = b;
      const m = a * a + b * b;
      if (m > peak) peak = m;
    }
    if (peak < this.minAmp * this.minAmp) return;
    const into = this.map.get(id);
    if (into) {
      for (let l = 0; l < F; l++) { into.re[l] += tre[l]; into.im[l] += tim[l]; }
      return;
    }
    const crossings = w.crossings.slice();
    if (st.layer >= 0) crossings[st.layer] += 1;
    this.map.set(id, { medium, right, crossings, key: st.key, delay: st.delay, re: tre.slice(), im: tim.slice() });
  }
}

interface Complexes { re: Float64Array; im: Float64Array }

/** a·b at every frequency. */
function times(a: Complexes, b: Complexes): Complexes {
  const F = a.re.length, re = new Float64Array(F), im = new Float64Array(F);
  for (let l = 0; l < F; l++) { re[l] = a.re[l] * b.re[l] - a.im[l] * b.im[l]; im[l] = a.re[l] * b.im[l] + a.im[l] * b.re[l]; }
  return { re, im };
}

function strongest(waves: Wave[], keep: number): Wave[] {
  const peak = (w: Wave) => { let m = 0; for (let l = 0; l < w.re.length; l++) m = Math.max(m, w.re[l] ** 2 + w.im[l] ** 2); return m; };
  return waves.map((w) => ({ w, p: peak(w) })).sort((a, b) => b.p - a.p).slice(0, keep).map((x) => x.w);
}

function pathSet(f_Hz: Float64Array, paths: Map<Key, Wave>): PathSet {
  const list = [...paths.values()].sort((a, b) => a.delay - b.delay);
  const F = f_Hz.length, re = new Float64Array(list.length * F), im = new Float64Array(list.length * F);
  list.forEach((w, p) => { re.set(w.re, p * F); im.set(w.im, p * F); });
  return { f_Hz, crossings: list.map((w) => w.crossings), re, im, delay0_s: Float64Array.from(list, (w) => w.delay), residual: 0 };
}

/** max_l |Σ_p A_p(f_l) − exact(f_l)|. */
function residualOf(set: PathSet, exact: { re: number; im: number }[]): number {
  const F = set.f_Hz.length, n = set.crossings.length;
  let worst = 0;
  for (let l = 0; l < F; l++) {
    let re = 0, im = 0;
    for (let p = 0; p < n; p++) { re += set.re[p * F + l]; im += set.im[p * F + l]; }
    worst = Math.max(worst, Math.hypot(re - exact[l].re, im - exact[l].im));
  }
  return worst;
}

/** Per layer, the first layer whose delay is within `tol_s` of its own (itself if none). */
function equalLayers(tau: Float64Array, tol_s: number): Int32Array {
  const same = (i: number, j: number) => Math.abs(tau[i] - tau[j]) <= Math.max(tol_s, 1e-12 * Math.max(tau[i], tau[j]));
  return Int32Array.from(tau, (_, i) => { for (let j = 0; j < i; j++) if (same(i, j)) return j; return i; });
}

/** Reflected and transmitted bounce paths of the stack at the frequencies f_Hz (group delays at centre_Hz). */
export function latticePaths(stack: Stack, f_Hz: Float64Array, centre_Hz: number, o: LatticeOptions):
  { reflected: PathSet; transmitted: PathSet; layerDelays_s: Float64Array } {
  const F = f_Hz.length;
  const s = Array.from(f_Hz, (f) => stackAtFrequency(stack, f));
  const L = s[0].layers.length;
  const tau = layerGroupDelays_s(stack, centre_Hz);
  // e^{−j k_x d} of each layer at each frequency
  const prop = Array.from({ length: L }, (_, i) => {
    const re = new Float64Array(F), im = new Float64Array(F);
    for (let l = 0; l < F; l++) {
      const r = s[l].layers[i], a = Math.exp(r.kx.im * r.thickness_m), ph = r.kx.re * r.thickness_m;
      re[l] = a * Math.cos(ph); im[l] = -a * Math.sin(ph);
    }
    return { re, im };
  });
  const exact = Array.from(f_Hz, (f) => tmmAt(stack, f));
  const measured = (r: { reflected: PathSet; transmitted: PathSet; overflowed: boolean }) => {
    r.reflected.residual = residualOf(r.reflected, exact.map((e) => e.R));
    r.transmitted.residual = s[0].back ? residualOf(r.transmitted, exact.map((e) => e.T)) : 0;
    return r;
  };
  const first = measured(follow(s, f_Hz, tau, prop, Int32Array.from({ length: L }, (_, i) => i), o));
  // Waves dropped for room, or paths missing more than ten floors (100 × the smallest wave kept): follow equal
  // layers as one class, and keep whichever lattice leaves less out.
  const short = Math.max(first.reflected.residual, first.transmitted.residual) > RESIDUAL_WAVES * o.minAmplitude;
  const classes = equalLayers(tau, o.sameDelay_s ?? 0);
  let paths = first;
  if ((first.overflowed || short) && classes.some((c, i) => c !== i)) {
    const merged = measured(follow(s, f_Hz, tau, prop, classes, o));
    if (Math.max(merged.reflected.residual, merged.transmitted.residual) < Math.max(first.reflected.residual, first.transmitted.residual)) paths = merged;
  }
  // The per-layer delays go out too: the space–time view draws each path's rays from exactly these.
  return { reflected: paths.reflected, transmitted: paths.transmitted, layerDelays_s: tau };
}

/** Paths missing more than this many times the smallest wave kept make the lattice try classes of equal layers. */
const RESIDUAL_WAVES = 100;

/**
 * The waves through the lattice, a path identified by its crossings of each class of layers (`cls[i]`, the class
 * of layer i: each layer its own, or the first of its equal layers); `overflowed` when more waves were in flight
 * than `maxWaves` and the weakest were dropped.
 */
function follow(s: StackAtFrequency[], f_Hz: Float64Array, tau: Float64Array, prop: Complexes[], cls: Int32Array, o: LatticeOptions):
  { reflected: PathSet; transmitted: PathSet; overflowed: boolean } {
  const F = f_Hz.length, L = s[0].layers.length;
  let overflowed = false;
  const fromLeft = Array.from({ length: L + 1 }, (_, k) => interfaceCoefficients(s, k, true));
  const fromRight = Array.from({ length: L + 1 }, (_, k) => interfaceCoefficients(s, k, false));
  const reflected = new Pool(F, o.minAmplitude), transmitted = new Pool(F, o.minAmplitude);
  const maxWaves = o.maxWaves ?? 3000, maxCrossings = o.maxCrossings ?? 400;
  // Keys: Σ crossings_i · radix^i, exact while radix^L stays below 2^52; a wave's identity adds where it is.
  const radix = maxCrossings + 1, numeric = L * Math.log2(radix) + Math.log2(2 * L + 4) < 52;
  const place = Array.from({ length: L }, (_, i) => radix ** i);
  const identity = (medium: number, right: boolean, key: Key): Key =>
    (typeof key === 'number' ? key * (2 * L + 4) + 2 * medium + (right ? 1 : 0) : `${medium}${right ? '>' : '<'}${key}`);
  // Crossing layer m (1-based medium) rightwards meets interface m from the left, leftwards interface
  // m − 1 from the right; its coefficients times the layer's propagator, once per layer and direction.
  const ahead = (m: number, right: boolean) => {
    const c = right ? fromLeft[m] : fromRight[m - 1], p = prop[m - 1];
    return { r: times({ re: c.r_re, im: c.r_im }, p), t: times({ re: c.t_re, im: c.t_im }, p), k: right ? m : m - 1 };
  };
  const rightwards = Array.from({ length: L + 1 }, (_, m) => (m === 0 ? null : ahead(m, true)));
  const leftwards = Array.from({ length: L + 1 }, (_, m) => (m === 0 ? null : ahead(m, false)));
  /** The parent crosses its layer and splits at the interface beyond into the pools. */
  const split = (next: Pool, st: Step, right: boolean) => {
    const m = st.parent.medium, c = (right ? rightwards : leftwards)[m]!, k = c.k;
    if (right) {
      next.add(st, k, false, c.r, identity(k, false, st.key));
      if (k < L) next.add(st, k + 1, true, c.t, identity(k + 1, true, st.key));
      else if (s[0].back) transmitted.add(st, L + 1, true, c.t, st.key);
    } else {
      next.add(st, k + 1, true, c.r, identity(k + 1, true, st.key));
      if (k === 0) reflected.add(st, 0, false, c.t, st.key);
      else next.add(st, k, false, c.t, identity(k, false, st.key));
    }
  };
  // The incident wave at the front face: reflected out, or into layer 1.
  const start = new Int32Array(L), key0 = numeric ? 0 : start.join(',');
  const incident: Step = { parent: { medium: 0, right: true, crossings: start, key: key0, delay: 0, re: new Float64Array(F).fill(1), im: new Float64Array(F) }, layer: -1, key: key0, delay: 0 };
  let level = new Pool(F, o.minAmplitude);
  reflected.add(incident, 0, false, { re: fromLeft[0].r_re, im: fromLeft[0].r_im }, key0);
  if (L > 0) level.add(incident, 1, true, { re: fromLeft[0].t_re, im: fromLeft[0].t_im }, identity(1, true, key0));
  else if (s[0].back) transmitted.add(incident, 1, true, { re: fromLeft[0].t_re, im: fromLeft[0].t_im }, key0);
  const st: Step = { parent: incident.parent, layer: 0, key: key0, delay: 0 };
  for (let n = 1; n <= maxCrossings && level.map.size > 0; n++) {
    const next = new Pool(F, o.minAmplitude);
    if (level.map.size > maxWaves) overflowed = true;
    const waves = level.map.size > maxWaves ? strongest([...level.map.values()], maxWaves) : level.map.values();
    for (const w of waves) {
      const i = w.medium - 1;
      st.parent = w; st.layer = i; st.delay = w.delay + tau[i];
      if (st.delay > o.maxDelay_s) continue;
      if (typeof w.key === 'number') st.key = w.key + place[cls[i]];
      else st.key = classCounts(w.crossings, cls, i).join(',');
      split(next, st, w.right);
    }
    level = next;
  }
  return { reflected: pathSet(f_Hz, reflected.map), transmitted: pathSet(f_Hz, transmitted.map), overflowed };
}

/** Crossings per class of layers after one more crossing of layer i (the text key of a path). */
function classCounts(crossings: Int32Array, cls: Int32Array, i: number): Int32Array {
  const c = new Int32Array(crossings.length);
  for (let k = 0; k < crossings.length; k++) c[cls[k]] += crossings[k];
  c[cls[i]] += 1;
  return c;
}
