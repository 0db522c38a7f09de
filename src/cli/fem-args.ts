// --fem-order and --fem-density, shared by the commands that run the FEM.

import type { FemOrder } from '../fem/basis.ts';
import { validateFemOptions } from '../fem/mesh.ts';
import type { FemOptions } from '../fem/types.ts';
import { UsageError, type ParsedArgs } from './command.ts';

export const FEM_ARG_OPTIONS = {
  'fem-order': { type: 'string' },
  'fem-density': { type: 'string' },
} as const;

export const FEM_ARG_USAGE = `  --fem-order P      FEM element order 1, 2 or 3 (default: the cheapest that meets 1e-5 by its error estimate)
  --fem-density N    FEM elements per wavelength, >= 3 (default: from the error estimate)`;

/** FEM options from parsed arguments; a UsageError (exit 2) naming the option for a bad value. */
export function femOptionsFromArgs(values: ParsedArgs['values']): FemOptions {
  const out: FemOptions = {};
  const order = values['fem-order'];
  if (typeof order === 'string') {
    if (!/^[123]$/.test(order.trim())) throw new UsageError(`--fem-order: must be 1, 2 or 3 (got "${order}")`);
    out.order = Number(order) as FemOrder;
  }
  const density = values['fem-density'];
  if (typeof density === 'string') {
    const n = Number(density);
    if (density.trim() === '' || !Number.isFinite(n)) throw new UsageError(`--fem-density: must be a number (got "${density}")`);
    out.density = n;
  }
  try { validateFemOptions(out); } catch (e) {
    throw new UsageError((e instanceof Error ? e.message : String(e)).replace('fem.density', '--fem-density').replace('fem.order', '--fem-order'));
  }
  return out;
}
