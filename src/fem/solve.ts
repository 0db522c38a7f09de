// FEM spectrum: R and T at each frequency with the exact solver's reference planes.
//   R = reflected / incident tangential E at x = 0;  T = tangential E at the back face / incident at x = 0.
// TE: the unknown is E_y itself: R = E(0) − 1, T = E(L).
// TM: the unknown is H_y; tangential E is a H'/(jωε0). In the front medium E_t,inc ∝ −k_z0 a_f H_inc and
//   E_t,ref ∝ +k_z0 a_f H_ref, so R = −H_ref / H_inc = 1 − H(0); behind, E_t ∝ −k_zb a_b H, so
//   T = (k_zb a_b)/(k_z0 a_f) H(L). At normal incidence both reduce to the TE values.
// A perfect conductor behind: T = 0.

import type { Spectrum } from '../results.ts';
import { emptySpectrum } from '../results.ts';
import type { Stack } from '../stack/types.ts';
import { planMesh } from './mesh.ts';
import { createFemSystem, solveAt } from './system.ts';
import type { FemMeshInfo, FemOptions } from './types.ts';

export function solveFem(stack: Stack, f_Hz: Float64Array, options: FemOptions = {}): { spectrum: Spectrum; mesh: FemMeshInfo } {
  const mesh = planMesh(stack, f_Hz, options);
  const sys = createFemSystem(mesh);
  const sp = emptySpectrum(f_Hz);
  const { xRe, xIm } = sys.tri;
  const te = mesh.polarization === 'TE';
  for (let i = 0; i < f_Hz.length; i++) {
    solveAt(sys, f_Hz[i]);
    const u0Re = xRe[mesh.frontVertex], u0Im = xIm[mesh.frontVertex];
    sp.R_re[i] = te ? u0Re - 1 : 1 - u0Re;
    sp.R_im[i] = te ? u0Im : -u0Im;
    if (!mesh.back) continue; // T = 0 behind a conductor
    const uRe = xRe[mesh.backVertex], uIm = xIm[mesh.backVertex];
    if (te) { sp.T_re[i] = uRe; sp.T_im[i] = uIm; continue; }
    const { kaRe, kaIm, backKaRe, backKaIm } = sys.port;
    const den = kaRe * kaRe + kaIm * kaIm;
    const qRe = (backKaRe * kaRe + backKaIm * kaIm) / den, qIm = (backKaIm * kaRe - backKaRe * kaIm) / den;
    sp.T_re[i] = qRe * uRe - qIm * uIm;
    sp.T_im[i] = qRe * uIm + qIm * uRe;
  }
  return { spectrum: sp, mesh: mesh.info };
}
