// The lattice of predicted echoes: every bounce path a pulse can take through the layers and back
// out of the front face, up to a number of layer traversals, with its delay (sum of the layer group
// delays it crosses) and its amplitude (product of the interface reflection/transmission
// coefficients and the one-way attenuation of each layer crossed, all at one frequency).
// Paths that cross each layer the same number of times arrive together and are merged (summed).

import { type Complex, add, div, mul, scale } from '../complex.ts';
import { type StackAtFrequency, stackAtFrequency } from '../tmm/media.ts';
import type { Stack } from '../stack/types.ts';
import { layerGroupDelays_s } from './delays.ts';
import { pathName } from './names.ts';

export interface PredictedEchoes {
  delay_s: Float64Array;
  amp_re: Float64Array;
  amp_im: Float64Array;
  /** Round trips made inside each bulk layer (row per echo). */
  roundTrips: Int32Array[];
  name: string[];
}

export interface LatticeOptions {
  /** Most round trips in total (all layers together) a path may make. Default 6. */
  maxRoundTrips?: number;
  /** Paths whose amplitude falls below this are dropped. Default 1e-4 (−80 dB). */
  minAmplitude?: number;
  /** Most waves in flight kept per traversal (the weakest are dropped beyond). Default 4000. */
  maxWaves?: number;
}

interface Wave { medium: number; right: boolean; counts: number[]; amp: Complex }

/** Reflection and transmission at interface k for a wave arriving from the left (fromLeft) or the right. */
function coefficients(s: StackAtFrequency, k: number, fromLeft: boolean): { r: Complex; t: Complex } {
  const L = s.layers.length;
  const left = k === 0 ? s.front : s.layers[k - 1];
  const right = k === L ? s.back : s.layers[k];
  if (!right) return fromLeft ? { r: { re: -1, im: 0 }, t: { re: 0, im: 0 } } : { r: { re: 0, im: 0 }, t: { re: 0, im: 0 } };
  const [ya, yb] = fromLeft ? [left.Y, right.Y] : [right.Y, left.Y];
  const G = s.sheetG[k];
  const den = { re: ya.re + yb.re + G, im: ya.im + yb.im };
  const r = div({ re: ya.re - yb.re - G, im: ya.im - yb.im }, den);
  return { r, t: add({ re: 1, im: 0 }, r) };
}

/** The `keep` strongest waves of a level. */
function strongest(level: Map<string, Wave>, keep: number): Map<string, Wave> {
  const sorted = [...level.entries()].sort((a, b) => Math.hypot(b[1].amp.re, b[1].amp.im) - Math.hypot(a[1].amp.re, a[1].amp.im));
  return new Map(sorted.slice(0, keep));
}

/** All echoes arriving back at the front face, in order of delay, at frequency f_Hz. */
export function predictEchoes(stack: Stack, f_Hz: number, options: LatticeOptions = {}): PredictedEchoes {
  const maxTrav = 2 * (options.maxRoundTrips ?? 6);
  const minAmp = options.minAmplitude ?? 1e-4;
  const maxWaves = options.maxWaves ?? 4000;
  const s = stackAtFrequency(stack, f_Hz);
  const L = s.layers.length;
  const tau = layerGroupDelays_s(stack, f_Hz);
  const att = s.layers.map((l) => Math.exp(l.kx.im * l.thickness_m)); // |e^{−j k_x d}|, Im k_x ≤ 0
  const out = new Map<string, { counts: number[]; amp: Complex }>();
  const collect = (counts: number[], amp: Complex) => {
    const key = counts.join(',');
    const prev = out.get(key);
    out.set(key, { counts, amp: prev ? add(prev.amp, amp) : amp });
  };
  // Waves sitting at an interface, about to cross the medium they are in.
  const merge = (into: Map<string, Wave>, w: Wave) => {
    if (Math.hypot(w.amp.re, w.amp.im) < minAmp) return;
    const key = `${w.medium}${w.right ? '>' : '<'}${w.counts.join(',')}`;
    const prev = into.get(key);
    if (prev) prev.amp = add(prev.amp, w.amp); else into.set(key, w);
  };
  /** A wave arriving at interface k splits into a reflected and a transmitted wave. */
  const split = (into: Map<string, Wave>, k: number, fromLeft: boolean, counts: number[], amp: Complex) => {
    const { r, t } = coefficients(s, k, fromLeft);
    if (fromLeft) {
      if (k === 0) collect(counts, mul(amp, r)); else merge(into, { medium: k, right: false, counts, amp: mul(amp, r) });
      if (k < L) merge(into, { medium: k + 1, right: true, counts, amp: mul(amp, t) });
    } else {
      merge(into, { medium: k + 1, right: true, counts, amp: mul(amp, r) });
      if (k === 0) collect(counts, mul(amp, t)); else merge(into, { medium: k, right: false, counts, amp: mul(amp, t) });
    }
  };
  let level = new Map<string, Wave>();
  split(level, 0, true, new Array(L).fill(0), { re: 1, im: 0 });
  for (let trav = 1; trav <= maxTrav && level.size > 0; trav++) {
    const next = new Map<string, Wave>();
    for (const w of level.values()) {
      const counts = w.counts.slice();
      counts[w.medium - 1] += 1;
      const amp = scale(w.amp, att[w.medium - 1]);
      // crossing medium j rightwards reaches interface j from the left; leftwards, interface j − 1 from the right
      if (w.right) split(next, w.medium, true, counts, amp); else split(next, w.medium - 1, false, counts, amp);
    }
    level = next.size > maxWaves ? strongest(next, maxWaves) : next;
  }
  const rows = [...out.values()]
    .filter((e) => Math.hypot(e.amp.re, e.amp.im) >= minAmp || e.counts.every((c) => c === 0))
    .map((e) => ({ ...e, delay: e.counts.reduce((sum, c, i) => sum + c * tau[i], 0) }))
    .sort((a, b) => a.delay - b.delay);
  return {
    delay_s: Float64Array.from(rows, (e) => e.delay),
    amp_re: Float64Array.from(rows, (e) => e.amp.re),
    amp_im: Float64Array.from(rows, (e) => e.amp.im),
    roundTrips: rows.map((e) => Int32Array.from(e.counts, (c) => c / 2)),
    name: rows.map((e) => pathName(stack, e.counts.map((c) => c / 2))),
  };
}
