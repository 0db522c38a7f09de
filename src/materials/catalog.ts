// The built-in material catalog: air, the ITU-R P.2040-3 Table 3 building materials, and water.
// Every Table 3 row was checked against two independent copies of the table (P.2040-3, and
// P.2040-2, whose coefficients for these materials are the same). A material may have more than one
// validity range, each with its own coefficients (glass and ceiling board have a sub-millimetre row):
// a stack picks the range that holds its band (`pickRange`).

import type { Material } from './types.ts';

const ITU = 'ITU-R P.2040-3 (08/2023) Table 3';
/** Which edition the coefficients follow, for listings and the README. */
export const CATALOG_EDITION = 'ITU-R P.2040-3 (08/2023), Table 3; the coefficients of these materials are unchanged from P.2040-2';

/** ITU-R P.2040 power-law row: ε' = a f^b, σ = c f^d (S/m), f in GHz. */
function ituRow(name: string, a: number, b: number, c: number, d: number,
  valid_GHz: [number, number], note?: string): Material {
  const m: Material = { name, spec: { model: 'power-law', a, b, c, d }, source: ITU, valid_GHz };
  if (note !== undefined) m.note = note;
  return m;
}

const ENTRIES: Material[] = [
  {
    name: 'air',
    spec: { model: 'fixed', eps_r: 1, sigma_S_per_m: 0 },
    source: 'vacuum value ε_r = 1 (ITU-R P.2040-3 Table 3 lists vacuum ≈ air)',
    valid_GHz: null,
    note: 'dry air is ε_r ≈ 1.0006; taken as exactly 1 (common practice)',
  },
  ituRow('concrete', 5.24, 0, 0.0462, 0.7822, [1, 100]),
  ituRow('brick', 3.91, 0, 0.0238, 0.16, [1, 40]),
  ituRow('plasterboard', 2.73, 0, 0.0085, 0.9395, [1, 100]),
  ituRow('wood', 1.99, 0, 0.0047, 1.0718, [0.001, 100]),
  ituRow('glass', 6.31, 0, 0.0036, 1.3394, [0.1, 100]),
  ituRow('ceiling-board', 1.48, 0, 0.0011, 1.075, [1, 100]),
  ituRow('chipboard', 2.58, 0, 0.0217, 0.78, [1, 100]),
  ituRow('plywood', 2.71, 0, 0.33, 0, [1, 40]),
  ituRow('marble', 7.074, 0, 0.0055, 0.9262, [1, 60]),
  ituRow('floorboard', 3.66, 0, 0.0044, 1.3515, [50, 100]),
  ituRow('metal', 1, 0, 1e7, 0, [1, 100],
    'near-perfect conductor (σ = 1e7 S/m, skin depth of microns: about 5 µm at 1 GHz, 1.6 µm at 10 GHz); ' +
    'behind a stack prefer back "pec"'),
  ituRow('very-dry-ground', 3, 0, 0.00015, 2.52, [1, 10]),
  ituRow('medium-dry-ground', 15, -0.1, 0.035, 1.63, [1, 10]),
  ituRow('wet-ground', 30, -0.4, 0.15, 1.3, [1, 10]),
  {
    name: 'water-25c',
    // ε_s = 78.36, ε∞ = 5.2 → Δε = 73.16; τ = 8.27 ps.
    spec: { model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: 73.16, tau_ps: 8.27 }], sigma_S_per_m: 0 },
    source: 'Kaatze, J. Chem. Eng. Data 34 (1989): pure water at 25 °C, single Debye pole',
    valid_GHz: [0.1, 50],
    note: 'parameters and validity range from memory, verify against the publication; ' +
      'pure water (no ionic conductivity)',
  },
];

/** Further validity ranges of a material, each with its own coefficients (Table 3's sub-millimetre rows). */
const MORE_RANGES: Material[] = [
  ituRow('glass', 5.79, 0, 0.0004, 1.658, [220, 450]),
  ituRow('ceiling-board', 1.52, 0, 0.0029, 1.029, [220, 450]),
];

/** One entry per material name, with its first (lowest) validity range. */
export const CATALOG: readonly Material[] = Object.freeze(ENTRIES.map(deepFreeze));

/** Every validity range of every material, one row each, in catalog order (a name's ranges ascending). */
export const CATALOG_ROWS: readonly Material[] = Object.freeze(
  CATALOG.flatMap((m) => [m, ...MORE_RANGES.filter((r) => r.name === m.name).map(deepFreeze)]),
);

function deepFreeze<T>(o: T): T {
  if (o !== null && typeof o === 'object' && !Object.isFrozen(o)) {
    for (const v of Object.values(o)) deepFreeze(v);
    Object.freeze(o);
  }
  return o;
}

const BY_NAME: ReadonlyMap<string, Material> = new Map(CATALOG.map((m) => [m.name, m]));
const RANGES_BY_NAME: ReadonlyMap<string, readonly Material[]> = new Map(
  CATALOG.map((m) => [m.name, CATALOG_ROWS.filter((r) => r.name === m.name)]),
);

/** The catalog material with exactly this name (lowercase, hyphenated), or undefined; its first range. */
export const catalogMaterial = (name: string): Material | undefined => BY_NAME.get(name);

/** All validity ranges of a catalog material (one Material each, ascending), empty for an unknown name. */
export const catalogRanges = (name: string): readonly Material[] => RANGES_BY_NAME.get(name) ?? [];

/** How a band [lo, hi] (GHz) sits among a material's validity ranges; `range` is the one it uses. */
export type RangeFit =
  | { kind: 'inside'; range: Material }
  /** Overlaps two ranges (the two it overlaps most, ascending). */
  | { kind: 'straddles'; range: Material; between: [Material, Material] }
  /** Reaches into the gap between two neighbouring ranges (and overlaps at most one of them). */
  | { kind: 'gap'; range: Material; between: [Material, Material] }
  /** Leaves the outermost range(s), with no other range on that side. */
  | { kind: 'outside'; range: Material };

type Bounded = Material & { valid_GHz: [number, number] };
const logOverlap = (m: Bounded, lo: number, hi: number): number =>
  Math.max(0, Math.log(Math.min(m.valid_GHz[1], hi)) - Math.log(Math.max(m.valid_GHz[0], lo)));
const logDistance = (m: Bounded, lo: number, hi: number): number =>
  hi < m.valid_GHz[0] ? Math.log(m.valid_GHz[0] / hi) : lo > m.valid_GHz[1] ? Math.log(lo / m.valid_GHz[1]) : 0;

/**
 * The range a band uses: the one that holds it; else the one it overlaps most (in log frequency); else the
 * nearest. A material with a single range (or none) always uses it.
 */
export function pickRange(ranges: readonly Material[], lo_GHz: number, hi_GHz: number): RangeFit {
  const bounded = ranges.filter((r): r is Bounded => r.valid_GHz !== null).sort((a, b) => a.valid_GHz[0] - b.valid_GHz[0]);
  if (bounded.length === 0) return { kind: 'inside', range: ranges[0] };
  const holding = bounded.find((r) => r.valid_GHz[0] <= lo_GHz && hi_GHz <= r.valid_GHz[1]);
  if (holding) return { kind: 'inside', range: holding };
  const score = (r: Bounded) => logOverlap(r, lo_GHz, hi_GHz) - logDistance(r, lo_GHz, hi_GHz);
  const range = bounded.slice().sort((a, b) => score(b) - score(a))[0];
  const overlapping = bounded.filter((r) => logOverlap(r, lo_GHz, hi_GHz) > 0);
  if (overlapping.length >= 2) {
    const two = overlapping.slice().sort((a, b) => score(b) - score(a)).slice(0, 2).sort((a, b) => a.valid_GHz[0] - b.valid_GHz[0]);
    return { kind: 'straddles', range, between: [two[0], two[1]] };
  }
  for (let i = 0; i + 1 < bounded.length; i++) {
    const gapLo = bounded[i].valid_GHz[1], gapHi = bounded[i + 1].valid_GHz[0];
    if (gapHi > gapLo && lo_GHz < gapHi && hi_GHz > gapLo) return { kind: 'gap', range, between: [bounded[i], bounded[i + 1]] };
  }
  return { kind: 'outside', range };
}

/** All catalog names, in catalog order. */
export const catalogNames = (): string[] => CATALOG.map((m) => m.name);
