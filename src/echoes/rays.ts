// The bounce paths of the echo tables as rays in the x–t plane: each path's walk through the stack, face to
// face, every crossing of bulk layer i taking the lattice's own one-way delay τ_i (delays.ts, the values the
// echo table's band-centre delays are summed from), then its way out through the front (or back) half-space
// at that medium's group slowness. Times are delays after the incident pulse's arrival at x = 0, as in the
// echo tables; positions in metres from the front face.
//
// A path is a vector of crossing counts (lattice.ts): every order of the same bounces arrives at the same time.
// The ray drawn is one such order, a walk over the faces found as an Eulerian trail of the path graph whose
// edges are the layers' rightward and leftward crossings (Hierholzer's algorithm), deeper layers tried first.

import type { Stack } from '../stack/types.ts';
import { halfSpaceSlowness_s_per_m } from './delays.ts';
import type { EchoAnalysis, EchoTable } from './table.ts';

/** One path's ray: vertices at the faces it meets, from the front face (delay 0) to where it leaves the stack. */
export interface PathRay {
  path: string;
  level_dB: number;
  /** The echo table's own delay of this path (its envelope peak), s. */
  echo_t_s: number;
  x_m: Float64Array;
  t_s: Float64Array;
}

/** The rays of one echo row (row numbers count from 1, as the tables are numbered). */
export interface RowRays { row: number; paths: PathRay[] }

export interface EchoRays {
  /** Position of each bulk interface, m: 0 (front face) … d (back face). */
  faces_m: Float64Array;
  /** The lattice's one-way delay of each bulk layer, s. */
  layerDelays_s: Float64Array;
  /** Group slowness of the front and back half-spaces along x, s/m (back null behind a conductor). */
  frontSlowness_s_per_m: number;
  backSlowness_s_per_m: number | null;
  /** Run time of delay 0 (the incident pulse at x = 0), s. */
  incidentAt_s: number;
  reflected: RowRays[];
  transmitted: RowRays[];
}

/**
 * The faces a path meets in order, interface indices from 0 (front face) to L (back face): it starts at 0
 * and ends at 0 (reflected) or at L (transmitted). A reflected path crosses each layer an even number of
 * times (half of them each way), a transmitted one an odd number (one more rightwards).
 */
export function pathWalk(crossings: ArrayLike<number>, transmitted: boolean): Int32Array {
  const L = crossings.length;
  const right = new Int32Array(L), left = new Int32Array(L);
  let edges = 0;
  for (let i = 0; i < L; i++) {
    const c = crossings[i];
    const extra = transmitted ? 1 : 0;
    if (!Number.isInteger(c) || c < 0 || (c - extra) % 2 !== 0) throw new Error(`pathWalk: layer ${i} crossed ${c} times, which no ${transmitted ? 'transmitted' : 'reflected'} path can`);
    right[i] = (c + extra) / 2; left[i] = (c - extra) / 2;
    edges += c;
  }
  // Hierholzer on the path graph of faces: layer i joins face i and face i + 1.
  const stack: number[] = [0], trail: number[] = [];
  while (stack.length > 0) {
    const v = stack[stack.length - 1];
    if (v < L && right[v] > 0) { right[v]--; stack.push(v + 1); } else if (v > 0 && left[v - 1] > 0) { left[v - 1]--; stack.push(v - 1); } else trail.push(stack.pop()!);
  }
  trail.reverse();
  if (trail.length !== edges + 1 || trail[trail.length - 1] !== (transmitted ? L : 0)) throw new Error('pathWalk: the crossings do not form one path through the stack');
  return Int32Array.from(trail);
}

/** The ray of a walk: the faces' positions, and the delays summed layer by layer. */
export function walkRay(walk: Int32Array, faces_m: Float64Array, layerDelays_s: Float64Array): { x_m: Float64Array; t_s: Float64Array } {
  const x_m = new Float64Array(walk.length), t_s = new Float64Array(walk.length);
  for (let k = 0; k < walk.length; k++) {
    x_m[k] = faces_m[walk[k]];
    t_s[k] = k === 0 ? 0 : t_s[k - 1] + layerDelays_s[Math.min(walk[k], walk[k - 1])];
  }
  return { x_m, t_s };
}

/** Positions of the bulk interfaces, m. */
export function bulkFaces_m(stack: Stack): Float64Array {
  const out = [0];
  for (const l of stack.layers) if (l.kind === 'bulk') out.push(out[out.length - 1] + l.thickness_m);
  return Float64Array.from(out);
}

function rowRays(table: EchoTable, transmitted: boolean, faces_m: Float64Array, tau: Float64Array, perRow: number): RowRays[] {
  return table.members.map((members, i) => ({
    row: i + 1,
    paths: [...members].sort((a, b) => b.level_dB - a.level_dB).slice(0, perRow).map((m) => {
      const ray = walkRay(pathWalk(m.crossings, transmitted), faces_m, tau);
      return { path: m.path, level_dB: m.level_dB, echo_t_s: m.t_s, ...ray };
    }),
  }));
}

/** The rays of every row of an analysis (the strongest `perRow` paths of each), for drawing. */
export function echoRays(stack: Stack, analysis: EchoAnalysis, perRow = 3): EchoRays {
  const faces_m = bulkFaces_m(stack), tau = analysis.layerDelays_s;
  const slow = halfSpaceSlowness_s_per_m(stack, analysis.pulse.f0_Hz);
  const usable = tau.length === faces_m.length - 1;
  return {
    faces_m, layerDelays_s: tau, frontSlowness_s_per_m: slow.front, backSlowness_s_per_m: slow.back, incidentAt_s: analysis.incidentAt_s,
    reflected: usable ? rowRays(analysis.reflected, false, faces_m, tau, perRow) : [],
    transmitted: usable && analysis.transmitted ? rowRays(analysis.transmitted, true, faces_m, tau, perRow) : [],
  };
}
