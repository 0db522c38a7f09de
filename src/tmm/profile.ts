// The exact standing-wave profile at one frequency and any incidence: tangential E and H along the
// normal line, and the positions at which every method samples it.

import { type Complex, add, cx, div, mul, sqrt, sub } from '../complex.ts';
import { permeability } from '../materials/permeability.ts';
import { permittivity } from '../materials/permittivity.ts';
import type { BulkModel } from '../materials/types.ts';
import type { Profile } from '../results.ts';
import type { Stack } from '../stack/types.ts';
import { C0_m_per_s } from '../units.ts';
import { type StackAtFrequency, stackAtFrequency } from './media.ts';
import { type Solution, fieldInLayer, solveAt, wave } from './recursion.ts';

/**
 * Total tangential E and H at each x (metres, x = 0 the front face), each over its incident value at x = 0.
 * In front: E = e^{−jkx} + R e^{+jkx}, H = e^{−jkx} − R e^{+jkx}; inside a layer from its own amplitudes
 * (H_t = Y · forward − Y · backward); behind: E = T e^{−jk(x−d)}, H = (Y_back/Y_front) E. At an interface
 * the value just behind it is given (H jumps across a resistive sheet); behind a conductor both are 0.
 */
export function profileTmm(stack: Stack, f_Hz: number, x_m: Float64Array): Profile {
  const s = stackAtFrequency(stack, f_Hz);
  const sol = solveAt(s);
  const n = x_m.length;
  const E_re = new Float64Array(n), E_im = new Float64Array(n), H_re = new Float64Array(n), H_im = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const { E, H } = fieldsAt(s, sol, x_m[k]);
    E_re[k] = E.re; E_im[k] = E.im; H_re[k] = H.re; H_im[k] = H.im;
  }
  return { f_Hz, x_m, E_re, E_im, H_re, H_im };
}

const ZERO = cx(0);

/** Tangential E and H (each over its incident value at x = 0) at x, in the region whose front face is the last ≤ x. */
function fieldsAt(s: StackAtFrequency, sol: Solution, x: number): { E: Complex; H: Complex } {
  const faces = s.interface_m, n = s.layers.length, d = faces[n];
  if (x < 0 || (x === 0 && n === 0 && s.back === null)) { // (a bare conductor at x = 0: its front side)
    const inc = wave(s.front, x), ref = mul(sol.R, wave(s.front, -x));
    return { E: add(inc, ref), H: sub(inc, ref) };
  }
  if (x >= d && (s.back !== null || n === 0 || x > d)) {
    if (s.back === null) return { E: ZERO, H: ZERO };
    const E = mul(sol.T, wave(s.back, x - d));
    return { E, H: mul(E, div(s.back.Y, s.front.Y)) };
  }
  let i = 0; // x < d here (or x = d on a conductor: the last layer's back face)
  while (i < n - 1 && x >= faces[i + 1]) i++;
  const z = x - faces[i];
  const E = fieldInLayer(s, sol, i, z);
  return { E, H: mul(currentInLayer(s, sol, i, z), div(s.layers[i].Y, s.front.Y)) };
}

/** Forward minus backward wave at depth z inside bulk layer i (the tangential H over that layer's Y). */
function currentInLayer(s: StackAtFrequency, sol: Solution, i: number, z: number): Complex {
  const L = s.layers[i];
  return mul(sol.A[i], sub(wave(L, z), mul(sol.gammaBack[i], wave(L, 2 * L.thickness_m - z))));
}

/** How far (in nepers of growth) a profile reaches into a lossy front medium. */
const FRONT_GROWTH_NP = 20;

/** A run of evenly spaced profile positions: m points from a towards b (b itself only with includeEnd). */
interface ProfileSegment { a: number; b: number; m: number; includeEnd: boolean }

/**
 * The segments behind profilePositions: at least 1.5 wavelengths of the front medium in front (and at least as
 * far as the stack is thick), the whole stack with every interface exactly and at least `minPerLayer` points per
 * layer, and half a wavelength of the back medium behind (nothing behind a conductor). Spacing at most
 * λ_local / pointsPerWavelength everywhere.
 */
function profileSegments(stack: Stack, f_Hz: number, pointsPerWavelength: number, minPerLayer: number): ProfileSegment[] {
  const lambda0 = C0_m_per_s / f_Hz;
  const lambdaIn = (spec: BulkModel) => {
    const n = sqrt(mul(permittivity(spec, f_Hz), permeability(spec, f_Hz))).re; // Re √(εμ)
    return lambda0 / Math.max(n, 1e-6);
  };
  // In a lossy front medium the total field grows towards −x (relative to the incident wave at x = 0): stop
  // where it has grown by e^FRONT_GROWTH_NP, long before it leaves the range of a double.
  const frontLoss_per_m = (2 * Math.PI / lambda0) * Math.abs(sqrt(mul(permittivity(stack.front.spec, f_Hz), permeability(stack.front.spec, f_Hz))).im);
  const out: ProfileSegment[] = [];
  const segment = (a: number, b: number, step: number, minPoints: number, includeEnd: boolean) => {
    out.push({ a, b, m: Math.max(minPoints, Math.ceil((b - a) / step)), includeEnd });
  };
  let d = 0;
  for (const l of stack.layers) if (l.kind === 'bulk') d += l.thickness_m;
  const lf = lambdaIn(stack.front.spec);
  const front = Math.max(1.5 * lf, d);
  segment(-(frontLoss_per_m > 0 ? Math.min(front, FRONT_GROWTH_NP / frontLoss_per_m) : front), 0, lf / pointsPerWavelength, 1, false);
  let x = 0;
  for (const l of stack.layers) {
    if (l.kind !== 'bulk') continue;
    segment(x, x + l.thickness_m, lambdaIn(l.material.spec) / pointsPerWavelength, minPerLayer, false);
    x += l.thickness_m;
  }
  out.push({ a: d, b: d, m: 0, includeEnd: true });
  if (stack.back !== 'pec') {
    const lb = lambdaIn(stack.back.spec);
    segment(d, d + 0.5 * lb, lb / pointsPerWavelength, 1, true);
  }
  return out;
}

export const PROFILE_POINTS_PER_WAVELENGTH = 48;
export const PROFILE_MIN_PER_LAYER = 8;

/** Sample positions for a profile at f_Hz (see profileSegments), sorted and distinct. */
export function profilePositions(
  stack: Stack,
  f_Hz: number,
  pointsPerWavelength = PROFILE_POINTS_PER_WAVELENGTH,
  minPerLayer = PROFILE_MIN_PER_LAYER,
): Float64Array {
  const xs: number[] = [];
  for (const { a, b, m, includeEnd } of profileSegments(stack, f_Hz, pointsPerWavelength, minPerLayer)) {
    for (let i = 0; i < m; i++) xs.push(a + ((b - a) * i) / m);
    if (includeEnd) xs.push(b);
  }
  return Float64Array.from(dedupeSorted(xs));
}

/** How many positions profilePositions gives at most (before merging equal ones), without making them. */
export function profilePointCount(
  stack: Stack,
  f_Hz: number,
  pointsPerWavelength = PROFILE_POINTS_PER_WAVELENGTH,
  minPerLayer = PROFILE_MIN_PER_LAYER,
): number {
  return profileSegments(stack, f_Hz, pointsPerWavelength, minPerLayer).reduce((n, s) => n + s.m + (s.includeEnd ? 1 : 0), 0);
}

/** The x range profilePositions covers, metres. */
export function profileRange(stack: Stack, f_Hz: number): [number, number] {
  const segs = profileSegments(stack, f_Hz, PROFILE_POINTS_PER_WAVELENGTH, 1);
  return [segs[0].a, segs[segs.length - 1].b];
}

function dedupeSorted(xs: number[]): number[] {
  const out: number[] = [];
  for (const x of xs) if (out.length === 0 || x > out[out.length - 1]) out.push(x);
  return out;
}
