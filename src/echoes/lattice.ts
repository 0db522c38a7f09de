// Stage 4a: the lattice of bounce paths, over a set of frequencies at once. A wave entering the front
// face splits at every interface it meets into a reflected and a transmitted wave, with the exact
// interface coefficients (region admittances Y from tmm/media.ts, sheets included, a conductor reflects
// −1), and crossing layer i multiplies it by the layer's exact propagator e^{−j k_x,i d_i}. Waves that
// have crossed every layer the same number of times share their delay and are merged (summed): a path
// is a vector of crossing counts. Waves leaving through the front face are reflected paths; through
// the back face, transmitted paths. Summed over all paths, the amplitudes are the exact R(f) and T(f)
// (the multiple-reflection series of Born & Wolf §1.6 and Orfanidis ch. 6).

import { type StackAtFrequency, stackAtFrequency } from '../tmm/media.ts';
import type { Stack } from '../stack/types.ts';
import { layerGroupDelays_s } from './delays.ts';

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

interface Wave { medium: number; right: boolean; crossings: Int32Array; key: string; delay: number; re: Float64Array; im: Float64Array }

/** Accumulates waves (or paths) by identity, summing amplitudes of equal identities. */
class Pool {
  readonly map = new Map<string, Wave>();
  private readonly tre: Float64Array;
  private readonly tim: Float64Array;
  constructor(private readonly F: number, private readonly minAmp: number) {
    this.tre = new Float64Array(F); this.tim = new Float64Array(F);
  }
  /** Adds amplitude × coefficient of wave w as a wave in `medium` going right or left (identity `id`). */
  add(w: Wave, medium: number, right: boolean, cr: Float64Array, ci: Float64Array, id: string): void {
    const F = this.F, tre = this.tre, tim = this.tim;
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
    } else {
      this.map.set(id, { medium, right, crossings: w.crossings, key: w.key, delay: w.delay, re: tre.slice(), im: tim.slice() });
    }
  }
}

function strongest(waves: Wave[], keep: number): Wave[] {
  const peak = (w: Wave) => { let m = 0; for (let l = 0; l < w.re.length; l++) m = Math.max(m, w.re[l] ** 2 + w.im[l] ** 2); return m; };
  return waves.map((w) => ({ w, p: peak(w) })).sort((a, b) => b.p - a.p).slice(0, keep).map((x) => x.w);
}

function pathSet(f_Hz: Float64Array, paths: Map<string, Wave>): PathSet {
  const list = [...paths.values()].sort((a, b) => a.delay - b.delay);
  const F = f_Hz.length, re = new Float64Array(list.length * F), im = new Float64Array(list.length * F);
  list.forEach((w, p) => { re.set(w.re, p * F); im.set(w.im, p * F); });
  return { f_Hz, crossings: list.map((w) => w.crossings), re, im, delay0_s: Float64Array.from(list, (w) => w.delay) };
}

/** Reflected and transmitted bounce paths of the stack at the frequencies f_Hz (group delays at centre_Hz). */
export function latticePaths(stack: Stack, f_Hz: Float64Array, centre_Hz: number, o: LatticeOptions): { reflected: PathSet; transmitted: PathSet } {
  const F = f_Hz.length;
  const s = Array.from(f_Hz, (f) => stackAtFrequency(stack, f));
  const L = s[0].layers.length;
  const tau = layerGroupDelays_s(stack, centre_Hz);
  const fromLeft = Array.from({ length: L + 1 }, (_, k) => interfaceCoefficients(s, k, true));
  const fromRight = Array.from({ length: L + 1 }, (_, k) => interfaceCoefficients(s, k, false));
  // e^{−j k_x d} of each layer at each frequency
  const prop = Array.from({ length: L }, (_, i) => {
    const re = new Float64Array(F), im = new Float64Array(F);
    for (let l = 0; l < F; l++) {
      const r = s[l].layers[i], a = Math.exp(r.kx.im * r.thickness_m), ph = r.kx.re * r.thickness_m;
      re[l] = a * Math.cos(ph); im[l] = -a * Math.sin(ph);
    }
    return { re, im };
  });
  const reflected = new Pool(F, o.minAmplitude), transmitted = new Pool(F, o.minAmplitude);
  const maxWaves = o.maxWaves ?? 3000, maxCrossings = o.maxCrossings ?? 400;
  /** Wave w arrives at interface k, travelling towards the back or the front; splits into the pools. */
  const split = (next: Pool, w: Wave, k: number, towardsBack: boolean) => {
    const c = towardsBack ? fromLeft[k] : fromRight[k];
    if (towardsBack) {
      if (k === 0) reflected.add(w, 0, false, c.r_re, c.r_im, w.key);
      else next.add(w, k, false, c.r_re, c.r_im, `${k}<${w.key}`);
      if (k < L) next.add(w, k + 1, true, c.t_re, c.t_im, `${k + 1}>${w.key}`);
      else if (s[0].back) transmitted.add(w, L + 1, true, c.t_re, c.t_im, w.key);
    } else {
      next.add(w, k + 1, true, c.r_re, c.r_im, `${k + 1}>${w.key}`);
      if (k === 0) reflected.add(w, 0, false, c.t_re, c.t_im, w.key);
      else next.add(w, k, false, c.t_re, c.t_im, `${k}<${w.key}`);
    }
  };
  let level = new Pool(F, o.minAmplitude);
  const start = new Int32Array(L);
  split(level, { medium: 0, right: true, crossings: start, key: start.join(','), delay: 0, re: new Float64Array(F).fill(1), im: new Float64Array(F) }, 0, true);
  const moved: Wave = { medium: 0, right: true, crossings: start, key: '', delay: 0, re: new Float64Array(F), im: new Float64Array(F) };
  for (let n = 1; n <= maxCrossings && level.map.size > 0; n++) {
    const next = new Pool(F, o.minAmplitude);
    const waves = level.map.size > maxWaves ? strongest([...level.map.values()], maxWaves) : level.map.values();
    for (const w of waves) {
      const i = w.medium - 1;
      const delay = w.delay + tau[i];
      if (delay > o.maxDelay_s) continue;
      const crossings = w.crossings.slice();
      crossings[i] += 1;
      moved.medium = w.medium; moved.right = w.right; moved.crossings = crossings; moved.key = crossings.join(','); moved.delay = delay;
      const p = prop[i];
      for (let l = 0; l < F; l++) {
        moved.re[l] = w.re[l] * p.re[l] - w.im[l] * p.im[l];
        moved.im[l] = w.re[l] * p.im[l] + w.im[l] * p.re[l];
      }
      // crossing medium m rightwards reaches interface m from the left; leftwards, interface m − 1 from the right
      if (w.right) split(next, moved, w.medium, true); else split(next, moved, w.medium - 1, false);
    }
    level = next;
  }
  return { reflected: pathSet(f_Hz, reflected.map), transmitted: pathSet(f_Hz, transmitted.map) };
}
