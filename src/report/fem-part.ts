// The FEM's part of a report: spectrum and profile columns, mesh summary and its agreement row against the exact
// solution. Kept apart so solveReport stays a list of methods.

import { profileFem, femSamplePositions } from '../fem/profile.ts';
import { solveFem } from '../fem/solve.ts';
import type { FemMeshInfo, FemOptions } from '../fem/types.ts';
import { DEFAULT_TOLERANCE } from '../fem/types.ts';
import type { Spectrum } from '../results.ts';
import type { Stack } from '../stack/types.ts';
import { agreementRow, type AgreementRow } from './format-agreement.ts';
import { profileColumns } from './profile-columns.ts';
import { complexColumns, type Column } from './table.ts';

export interface FemPart {
  spectrum: Column[];
  mesh: FemMeshInfo;
  agreement: AgreementRow;
  time_ms: number;
}

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/** FEM spectrum at the exact solution's frequencies; null with a warning when the mesh is refused. */
export function femSpectrumPart(stack: Stack, tmm: Spectrum, options: FemOptions, warn: (w: string) => void): FemPart | null {
  const t0 = now();
  try {
    const { spectrum, mesh } = solveFem(stack, tmm.f_Hz, options);
    return {
      spectrum: [...complexColumns('R_fem', spectrum.R_re, spectrum.R_im), ...complexColumns('T_fem', spectrum.T_re, spectrum.T_im)],
      mesh,
      agreement: agreementRow('fem-tmm', spectrum, tmm, options.tolerance ?? DEFAULT_TOLERANCE),
      time_ms: now() - t0,
    };
  } catch (e) {
    warn(`FEM skipped: ${e instanceof Error ? e.message : String(e)}`);
    return null;
  }
}

/** The profile grid `base` merged with ≥ 10 samples in every FEM element over the same range. */
export function profileGridWithFem(stack: Stack, f_Hz: number, base: Float64Array, options: FemOptions, withH = false): Float64Array {
  if (base.length === 0) return base;
  let fem: Float64Array;
  try { fem = femSamplePositions(stack, f_Hz, base[0], base[base.length - 1], options, 10, withH); } catch { return base; }
  const all = Float64Array.from([...base, ...fem]).sort();
  const out: number[] = [];
  // Merge points closer than a nanometre (an interface both grids hold).
  for (const x of all) if (out.length === 0 || x - out[out.length - 1] > 1e-9) out.push(x);
  return Float64Array.from(out);
}

/** E_fem_re, E_fem_im (and with `withH` H_fem_re, H_fem_im) at the grid; [] when the FEM refuses the mesh. */
export function femProfileColumns(stack: Stack, f_Hz: number, x_m: Float64Array, options: FemOptions, withH = false): Column[] {
  try {
    return profileColumns('fem', profileFem(stack, f_Hz, x_m, options, withH), withH);
  } catch { return []; }
}
