// Causal fits, measured (not asserted): per wall, the fit's worst relative errors in ε' and ε'' over the band,
// the error of the group index through the material (n_g = d(ωn)/dω, what sets echo timing), the model share
// (exact response of the stepped media against the stack's own exact response, 201 frequencies, R and T)
// and the fit time (first planning, the fit is cached afterwards). No pulse runs: fast.
//   nice npx tsx bench/fits.ts [--only TEXT] [--set walls|all]
// walls (default): the walls of bench/walls.ts plus oblique ones; all: every catalog power law with a validity
// range reaching 1 GHz × 20/150/300 mm × 1–6/1–40/24–40 GHz × air/conductor.
import { parseArgs } from 'node:util';
import { resolveStack } from '../src/fdtd/effective.ts';
import { stepModelPermittivity } from '../src/fdtd/media.ts';
import { atIncidence } from '../src/fdtd/oblique.ts';
import { solveEffective } from '../src/fdtd/stepped-exact.ts';
import { permittivity } from '../src/materials/permittivity.ts';
import type { BulkModel } from '../src/materials/types.ts';
import { compareSpectra } from '../src/report/agreement.ts';
import { parseStackObject } from '../src/stack/parse.ts';
import type { Stack } from '../src/stack/types.ts';
import { solveTmm } from '../src/tmm/solve.ts';
import { linspace } from '../src/units.ts';
import { REPRESENTATIVE_WALLS } from './wall-list.ts';

const { values } = parseArgs({ options: { only: { type: 'string' }, set: { type: 'string' } } });

interface Case { name: string; stack: Stack }
const wall = (material: string, mm: number, band: [number, number], back: string, angle_deg = 0, pol = 'TE'): Case => {
  const r = parseStackObject({
    title: 'wall', band_GHz: band, layers: [{ material, thickness_mm: mm }], back, points: 201,
    ...(angle_deg ? { incidence: { angle_deg, polarization: pol } } : {}),
  });
  if (!r.ok) throw new Error(r.errors.join('; '));
  return { name: `${mm} mm ${material} ${band[0]}–${band[1]} GHz on ${back}${angle_deg ? ` ${angle_deg}° ${pol}` : ''}`, stack: r.stack };
};

const cases: Case[] = [];
if ((values.set ?? 'walls') === 'walls') {
  for (const [m, mm, band, back] of REPRESENTATIVE_WALLS) cases.push(wall(m, mm, band, back));
  cases.push(wall('concrete', 150, [1, 6], 'pec', 45, 'TE'), wall('concrete', 150, [1, 6], 'pec', 60, 'TM'));
  cases.push(wall('brick', 120, [1, 4], 'medium-dry-ground'), wall('plywood', 18, [1, 20], 'air', 30, 'TM'));
} else {
  for (const m of ['concrete', 'brick', 'plasterboard', 'wood', 'glass', 'ceiling-board', 'chipboard', 'plywood', 'marble']) {
    for (const mm of [20, 150, 300]) for (const band of [[1, 6], [1, 40], [24, 40]] as [number, number][]) {
      if (m === 'brick' && band[1] > 40) continue;
      for (const back of ['air', 'pec']) cases.push(wall(m, mm, band, back));
    }
  }
}

/** Group index n + ω dn/dω of ε(f), by a central difference. */
function groupIndex(eps: (f: number) => { re: number; im: number }, f: number): number {
  const n = (x: number) => { const e = eps(x), m = Math.hypot(e.re, e.im); return Math.sqrt((m + e.re) / 2); };
  const h = 1e-4 * f;
  return n(f) + (f * (n(f + h) - n(f - h))) / (2 * h);
}

const pct = (x: number) => `${(100 * x).toFixed(2)}`.padStart(6);
console.log('case                                              fit ε\'/ε\'\' %   n_g err % (min…max)   model R / T       fit ms');
for (const c of cases) {
  if (values.only && !c.name.includes(values.only)) continue;
  const t0 = performance.now();
  const { effective, fits } = resolveStack(c.stack);
  const fit_ms = performance.now() - t0;
  const f = linspace(c.stack.band_Hz[0], c.stack.band_Hz[1], 201);
  const share = compareSpectra(solveEffective(atIncidence(effective, c.stack.incidence, c.stack.band_Hz), f), solveTmm(c.stack, f));
  const spec = c.stack.layers[0].kind === 'bulk' ? c.stack.layers[0].material.spec as BulkModel : null;
  const fit = fits.find((x) => x.quantity === 'permittivity' && x.material === (c.stack.layers[0].kind === 'bulk' ? c.stack.layers[0].material.name : ''));
  let lo = Infinity, hi = -Infinity;
  if (fit && spec) {
    for (const x of f) {
      const g = groupIndex((y) => stepModelPermittivity(fit.model, y), x), t = groupIndex((y) => permittivity(spec, y), x);
      lo = Math.min(lo, g / t - 1); hi = Math.max(hi, g / t - 1);
    }
  }
  const e = (x: number) => x.toExponential(1);
  console.log(`${c.name.padEnd(50)}${fit ? `${pct(fit.maxRelErr_re)} ${pct(fit.maxRelErr_im)}` : '     —      —'}   ${fit ? `${pct(lo)} … ${pct(hi)}` : '        —        '}   ${e(share.R_max)} / ${e(share.T_max)}   ${fit_ms.toFixed(0).padStart(5)}`);
}
