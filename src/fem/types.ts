// Public option and result types of the FEM cross-check.

import type { FemOrder } from './basis.ts';

export interface FemOptions {
  /** Lagrange order 1, 2 or 3. Default: the order the a-priori estimate says is cheapest for `tolerance`. */
  order?: FemOrder;
  /** Elements per wavelength, the wavelength taken as 2π / max |k_z| of each layer over the frequencies solved.
   *  Default: the smallest density the a-priori estimate says meets `tolerance`. */
  density?: number;
  /** Accuracy the automatic choices aim at, max |R − R_exact| and |T − T_exact|; default 1e-5. */
  tolerance?: number;
}

/** The mesh a solve used, as the summary reports it. */
export interface FemMeshInfo {
  order: FemOrder;
  /** Elements per wavelength. */
  density: number;
  /** True when order / density came from the a-priori estimate rather than the caller. */
  order_auto: boolean;
  density_auto: boolean;
  /** Elements in each stack layer (0 for a sheet). */
  elements_per_layer: number[];
  elements: number;
  /** Nodal unknowns: vertices plus interior nodes (before static condensation). */
  unknowns: number;
  /** The a-priori error estimate for this mesh over the frequencies solved. */
  estimate: number;
}

export const DEFAULT_TOLERANCE = 1e-5;
/** The automatic choice aims this far below the tolerance, so the estimate's slack stays on the safe side. */
export const ESTIMATE_SAFETY = 10;
/** Refuse meshes beyond this many elements (memory ~ 100 bytes per element). */
export const MAX_ELEMENTS = 2_000_000;
