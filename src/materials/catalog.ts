// The built-in material catalog: air, the ITU-R P.2040-3 Table 3 building materials, and water.
// Coefficients are the ones in the physics reference; rows not checked against a published
// evaluation carry a note saying they come from memory.

import type { Material } from './types.ts';

const ITU = 'ITU-R P.2040-3 (08/2023) Table 3';
const FROM_MEMORY = 'coefficients from memory, verify against the Recommendation';

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
  ituRow('ceiling-board', 1.48, 0, 0.0011, 1.075, [1, 100], FROM_MEMORY),
  ituRow('chipboard', 2.58, 0, 0.0217, 0.78, [1, 100], FROM_MEMORY),
  ituRow('plywood', 2.71, 0, 0.33, 0, [1, 40], FROM_MEMORY),
  ituRow('marble', 7.074, 0, 0.0055, 0.9262, [1, 60], FROM_MEMORY),
  ituRow('floorboard', 3.66, 0, 0.0044, 1.3515, [50, 100], FROM_MEMORY),
  ituRow('metal', 1, 0, 1e7, 0, [1, 100],
    `near-perfect conductor (σ = 1e7 S/m, skin depth of microns: about 5 µm at 1 GHz, 1.6 µm at 10 GHz); ` +
    `behind a stack prefer back "pec"; ${FROM_MEMORY}`),
  ituRow('very-dry-ground', 3, 0, 0.00015, 2.52, [1, 10], FROM_MEMORY),
  ituRow('medium-dry-ground', 15, -0.1, 0.035, 1.63, [1, 10], FROM_MEMORY),
  ituRow('wet-ground', 30, -0.4, 0.15, 1.3, [1, 10], FROM_MEMORY),
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

export const CATALOG: readonly Material[] = Object.freeze(ENTRIES.map(deepFreeze));

function deepFreeze<T>(o: T): T {
  if (o !== null && typeof o === 'object' && !Object.isFrozen(o)) {
    for (const v of Object.values(o)) deepFreeze(v);
    Object.freeze(o);
  }
  return o;
}

const BY_NAME: ReadonlyMap<string, Material> = new Map(CATALOG.map((m) => [m.name, m]));

/** The catalog material with exactly this name (lowercase, hyphenated), or undefined. */
export const catalogMaterial = (name: string): Material | undefined => BY_NAME.get(name);

/** All catalog names, in catalog order. */
export const catalogNames = (): string[] => CATALOG.map((m) => m.name);
