// The FEM mesh: a chain of segments between vertices along x. A segment is either a Lagrange element of one
// region (a bulk layer, or a buffer of the front / back medium used for field profiles) or, in TM, the link a
// resistive sheet makes between the two vertices it splits (H_y jumps across a sheet; see system.ts). In TE a
// sheet is a shunt at one vertex. Every interface is a vertex; element size per region comes from the density.

import type { BulkModel } from '../materials/types.ts';
import type { Polarization, Stack } from '../stack/types.ts';
import type { FemOrder } from './basis.ts';
import { FEM_ORDERS } from './basis.ts';
import { bounceFactors } from './bounce.ts';
import { densityFor, errorEstimate, MIN_DENSITY } from './dispersion.ts';
import { freeSpaceWavenumber, indexSquared, normalWavenumber, tangentialWavenumber2 } from './media.ts';
import type { FemMeshInfo, FemOptions } from './types.ts';
import { DEFAULT_TOLERANCE, ESTIMATE_SAFETY, MAX_ELEMENTS } from './types.ts';

export interface FemRegion {
  material: BulkModel;
  /** Stack layer index; −1 for the front-medium buffer, −2 for the back-medium buffer. */
  layer: number;
  x0_m: number;
  thickness_m: number;
  elements: number;
  h_m: number;
  /** Largest |k_z| over the sizing frequencies, 1/m. */
  kMax: number;
}

export interface FemSheet { ohm_per_sq: number; layer: number; vertex: number }

export interface FemMesh {
  order: FemOrder;
  density: number;
  polarization: Polarization;
  angle_rad: number;
  front: BulkModel;
  /** Back half-space material, or null for a perfect conductor. */
  back: BulkModel | null;
  regions: FemRegion[];
  sheets: FemSheet[];
  /** Per segment: region index (≥ 0) of an element, or −1 − sheet index for a TM sheet link. */
  segRegion: Int32Array;
  segX0: Float64Array;
  segH: Float64Array;
  vertexX: Float64Array;
  /** Vertex at x = 0 on the front side of any sheet there, and at the back face behind any sheet there. */
  frontVertex: number;
  backVertex: number;
  info: FemMeshInfo;
}

/** Largest |k_z| of a medium over the frequencies, for the stack's incidence (μ_r included). */
function maxNormalWavenumber(stack: Stack, m: BulkModel, f_Hz: ArrayLike<number>): number {
  let k = 0;
  for (let i = 0; i < f_Hz.length; i++) {
    const k0 = freeSpaceWavenumber(f_Hz[i]);
    const kz = normalWavenumber(indexSquared(m, f_Hz[i]), k0, tangentialWavenumber2(stack.front.spec, f_Hz[i], stack.incidence.angle_rad));
    k = Math.max(k, Math.hypot(kz.re, kz.im));
  }
  return k;
}

export interface RegionPlan { material: BulkModel; layer: number; thickness_m: number; kMax: number }

const elementsFor = (r: RegionPlan, density: number): number =>
  Math.max(1, Math.ceil((density * r.kMax * r.thickness_m) / (2 * Math.PI) - 1e-9));

/** Throws an Error naming the field (fem.order, fem.density, fem.tolerance) for a bad option. */
export function validateFemOptions(o: FemOptions): void {
  if (o.order !== undefined && !FEM_ORDERS.includes(o.order)) throw new Error(`fem.order: must be 1, 2 or 3 (got ${o.order})`);
  if (o.density !== undefined && !(Number.isFinite(o.density) && o.density >= 3 && o.density <= 10_000))
    throw new Error(`fem.density: must be a number of elements per wavelength in [3, 10000] (got ${o.density})`);
  if (o.tolerance !== undefined && !(Number.isFinite(o.tolerance) && o.tolerance > 0 && o.tolerance < 1))
    throw new Error(`fem.tolerance: must be in (0, 1) (got ${o.tolerance})`);
}

/** Buffers of the front and back media and what the mesh is sized for (profiles). */
export interface MeshExtent {
  /** Buffer of the front medium in front of x = 0, and of the back medium behind the back face (metres). */
  front_m: number;
  back_m: number;
  /** Polarization to solve (a profile at normal incidence solves TE). */
  polarization: Polarization;
  /** Size for the field between nodes too (profiles), not just for R and T. */
  betweenNodes: boolean;
  /** Size the field between nodes for its derivative too (a field read from u'); default: TM. */
  derivative?: boolean;
}

/** The sizing stage of a mesh: order, density and element counts, before anything is built. */
export interface MeshSize {
  order: FemOrder;
  density: number;
  orderAuto: boolean;
  densityAuto: boolean;
  polarization: Polarization;
  /** Regions front to back: the front buffer (if any), the bulk layers, the back buffer (if any). */
  regions: RegionPlan[];
  hasFrontBuffer: boolean;
  hasBackBuffer: boolean;
  elements: number;
  /** The a-priori error estimate of R and T on this mesh. */
  estimate: number;
}

/**
 * Sizes the mesh for `stack` for the frequencies `sizing_Hz`, optionally with buffers of the front medium
 * (front_m in front of x = 0) and of the back medium (back_m behind the back face, open back only).
 * The a-priori estimate covers the stack's layers and any buffers. Allocates nothing per element.
 */
export function sizeMesh(stack: Stack, sizing_Hz: ArrayLike<number>, options: FemOptions = {}, extent?: MeshExtent): MeshSize {
  validateFemOptions(options);
  const pol = extent?.polarization ?? stack.incidence.polarization;
  const front_m = extent?.front_m ?? 0, back_m = extent?.back_m ?? 0;
  const plans: RegionPlan[] = [];
  // Each layer's phase counts as often as its multiple reflections can magnify an error made in it (bounce.ts).
  const bounce = bounceFactors(stack, sizing_Hz, pol);
  let phase = 0, interfaces = 1;
  stack.layers.forEach((l, i) => {
    interfaces++;
    if (l.kind !== 'bulk') return;
    const kMax = maxNormalWavenumber(stack, l.material.spec, sizing_Hz);
    plans.push({ material: l.material.spec, layer: i, thickness_m: l.thickness_m, kMax });
    phase += kMax * l.thickness_m;
  });
  const back = stack.back === 'pec' ? null : stack.back.spec;
  // Buffers (profiles only) carry the field too: their phase enters the estimate like a layer's.
  const frontPlan: RegionPlan | null = front_m > 0
    ? { material: stack.front.spec, layer: -1, thickness_m: front_m, kMax: maxNormalWavenumber(stack, stack.front.spec, sizing_Hz) } : null;
  const backPlan: RegionPlan | null = back_m > 0 && back
    ? { material: back, layer: -2, thickness_m: back_m, kMax: maxNormalWavenumber(stack, back, sizing_Hz) } : null;
  for (const b of [frontPlan, backPlan]) if (b) { phase += b.kMax * b.thickness_m; interfaces++; }
  // A resonance anywhere magnifies every phase error that feeds it: the stack's worst factor applies to all.
  const magnify = Math.max(1, ...bounce);
  phase *= magnify; interfaces *= magnify;
  const tolerance = options.tolerance ?? DEFAULT_TOLERANCE;
  const budget = tolerance / ESTIMATE_SAFETY;
  // Field between nodes (profiles): half the tolerance; TM profiles read E from H_y's derivative, and a TE
  // profile with H reads H from E_y's.
  const between = extent?.betweenNodes ? { budget: tolerance / 2, derivative: extent.derivative ?? pol === 'TM' } : undefined;
  const all: RegionPlan[] = [...(frontPlan ? [frontPlan] : []), ...plans, ...(backPlan ? [backPlan] : [])];
  const count = (density: number) => all.reduce((n, r) => n + elementsFor(r, density), 0);

  let order: FemOrder, density: number;
  const orderAuto = options.order === undefined, densityAuto = options.density === undefined;
  if (!orderAuto && !densityAuto) { order = options.order!; density = options.density!; }
  else if (!orderAuto) { order = options.order!; density = densityFor(order, budget, phase, interfaces, between); }
  else if (!densityAuto) {
    density = options.density!;
    // The lowest order whose estimate meets the budget at this density, else the highest.
    order = FEM_ORDERS.find((p) => errorEstimate(p, density, phase, interfaces) <= budget) ?? 3;
  } else {
    // Cheapest: fewest elements (the per-frequency work is one tridiagonal solve on the vertices plus one
    // condensation per region); ties go to the higher order.
    order = 3; density = densityFor(3, budget, phase, interfaces, between);
    let best = count(density);
    for (const p of [2, 1] as FemOrder[]) {
      const d = densityFor(p, budget, phase, interfaces, between), n = count(d);
      if (n < best) { best = n; order = p; density = d; }
    }
  }
  density = Math.max(density, densityAuto ? MIN_DENSITY : 3);
  return {
    order, density, orderAuto, densityAuto, polarization: pol, regions: all,
    hasFrontBuffer: frontPlan !== null, hasBackBuffer: backPlan !== null,
    elements: count(density), estimate: errorEstimate(order, density, phase, interfaces),
  };
}

/** The refusal of a mesh over MAX_ELEMENTS, in the words planMesh throws. */
export const meshTooLarge = (elements: number): string =>
  `fem: the mesh would need ${elements} elements (limit ${MAX_ELEMENTS}); lower the FEM density or the band top`;

/** Plans (sizes, then builds) the mesh; throws an Error naming the limit when it would exceed MAX_ELEMENTS. */
export function planMesh(stack: Stack, sizing_Hz: ArrayLike<number>, options: FemOptions = {}, extent?: MeshExtent): FemMesh {
  const size = sizeMesh(stack, sizing_Hz, options, extent);
  if (size.elements > MAX_ELEMENTS) throw new Error(meshTooLarge(size.elements));
  return buildMesh(stack, size, extent);
}

function buildMesh(stack: Stack, size: MeshSize, extent?: MeshExtent): FemMesh {
  const { order, density, polarization: pol, regions: all } = size;
  const front_m = extent?.front_m ?? 0;
  const frontPlan = size.hasFrontBuffer ? all[0] : null;
  const backPlan = size.hasBackBuffer ? all[all.length - 1] : null;
  const back = stack.back === 'pec' ? null : stack.back.spec;

  // Walk front to back building segments and vertices.
  const regions: FemRegion[] = [];
  const sheets: FemSheet[] = [];
  const segRegion: number[] = [], segX0: number[] = [], segH: number[] = [];
  const elementsPerLayer = stack.layers.map(() => 0);
  let x = -front_m, vertex = 0, frontVertex = 0;
  const addRegion = (r: RegionPlan) => {
    const n = elementsFor(r, density), h = r.thickness_m / n;
    regions.push({ material: r.material, layer: r.layer, x0_m: x, thickness_m: r.thickness_m, elements: n, h_m: h, kMax: r.kMax });
    for (let e = 0; e < n; e++) { segRegion.push(regions.length - 1); segX0.push(x + e * h); segH.push(h); }
    if (r.layer >= 0) elementsPerLayer[r.layer] = n;
    vertex += n;
    x += r.thickness_m;
  };
  if (frontPlan) { addRegion(frontPlan); x = 0; frontVertex = vertex; }
  let planIndex = frontPlan ? 1 : 0;
  stack.layers.forEach((l, i) => {
    if (l.kind === 'bulk') { addRegion(all[planIndex++]); return; }
    const sheet: FemSheet = { ohm_per_sq: l.material.spec.ohm_per_sq, layer: i, vertex };
    sheets.push(sheet);
    if (pol === 'TM') { segRegion.push(-sheets.length); segX0.push(x); segH.push(0); vertex++; }
  });
  const backVertex = vertex;
  if (backPlan) addRegion(backPlan);

  const vertexX = new Float64Array(vertex + 1);
  for (let s = 0; s < segX0.length; s++) { vertexX[s] = segX0[s]; vertexX[s + 1] = segX0[s] + segH[s]; }
  if (segX0.length === 0) vertexX[0] = 0;

  const elements = segRegion.filter((r) => r >= 0).length;
  const info: FemMeshInfo = {
    order, density, order_auto: size.orderAuto, density_auto: size.densityAuto,
    elements_per_layer: elementsPerLayer,
    elements,
    unknowns: vertex + 1 + elements * (order - 1),
    estimate: size.estimate,
  };
  return {
    order, density, polarization: pol, angle_rad: stack.incidence.angle_rad, front: stack.front.spec, back, regions, sheets,
    segRegion: Int32Array.from(segRegion), segX0: Float64Array.from(segX0), segH: Float64Array.from(segH),
    vertexX, frontVertex, backVertex, info,
  };
}
