// --fem-order and --fem-density, shared by the commands that run the FEM.

import type { FemOrder } from '../fem/basis.ts';
import { validateFemOptions } from '../fem/mesh.ts';
import type { FemOptions } from '../fem/types.ts';
import { numberOption, UsageError, type ParsedArgs } from './command.ts';

export const FEM_ARG_OPTIONS = {
  'fem-order': { type: 'string' },
  'fem-density': { type: 'string' },
} as const;

export const FEM_ARG_USAGE = `  --fem-order P      FEM element order 1, 2 or 3 (default: the cheapest that meets 1e-5 by its error estimate)
  --fem-density N    FEM elements per wavelength, >= 3 (default: from the error estimate)`;

/** --fem-order, or undefined when not given; a UsageError (exit 2) for anything but 1, 2 or 3. */
export function femOrderFromArgs(values: ParsedArgs['values']): FemOrder | undefined {
  const order = numberOption(values, 'fem-order', 'must be 1, 2 or 3', (p) => p === 1 || p === 2 || p === 3);
  return order as FemOrder | undefined;
}

/** FEM options from parsed arguments; a UsageError (exit 2) naming the option for a bad value. */
export function femOptionsFromArgs(values: ParsedArgs['values']): FemOptions {
  const out: FemOptions = {};
  const order = femOrderFromArgs(values);
  if (order !== undefined) out.order = order;
  const density = numberOption(values, 'fem-density', 'must be a number');
  if (density !== undefined) out.density = density;
  try { validateFemOptions(out); } catch (e) {
    throw new UsageError((e instanceof Error ? e.message : String(e)).replace('fem.density', '--fem-density').replace('fem.order', '--fem-order'));
  }
  return out;
}
