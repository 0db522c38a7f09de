// Pulse engine on the phase-matched line: TM at 30°, 50° and 70° on a radome sandwich with lossy skins, a
// Debye water film, an ITU-R P.2040-3 glass pane and a magnetic absorber; TE with μ ≠ 1 (Lorentz, Debye and a
// fixed lossy μ, which is fitted) at 0°, 45° and 70°; ITU walls in TM; and the kernel's speed with poles on the
// H nodes beside a plain grid. A benchmark, not a test: run it under nice on a quiet machine.
//   nice npx tsx bench/oblique.ts [--only TEXT] [--accuracy X] [--json]
import { parseArgs } from 'node:util';
import { cellsPerStep, lineBenchRun } from '../src/fdtd/bench.ts';
import type { EngineKind } from '../src/fdtd/engine.ts';
import { type LineMedium, lineMedium, stepModelFixed } from '../src/fdtd/media.ts';
import { planGrid } from '../src/fdtd/plan.ts';
import type { Stack } from '../src/stack/types.ts';
import { type Case, measureCases, stackFrom } from './measure-cases.ts';

const { values } = parseArgs({ options: { only: { type: 'string' }, accuracy: { type: 'string' }, json: { type: 'boolean' } } });
const accuracy = values.accuracy ? Number(values.accuracy) : undefined;

const materials = {
  skin: { model: 'debye', eps_inf: 3.9, poles: [{ delta_eps: 0.4, tau_ps: 12 }], sigma_S_per_m: 0.02 },
  foam: { model: 'fixed', eps_r: 1.1, sigma_S_per_m: 0.0005 },
  water: { model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: 73.16, tau_ps: 8.27 }], sigma_S_per_m: 0 },
  loaded: { model: 'fixed', eps_r: 12, sigma_S_per_m: 0.05, magnetic: { model: 'lorentz', mu_inf: 1, poles: [{ delta_mu: 3, f0_GHz: 2.5, gamma_GHz: 5 }] } },
  relaxing: { model: 'fixed', eps_r: 4, sigma_S_per_m: 0.01, magnetic: { model: 'debye', mu_inf: 1.3, poles: [{ delta_mu: 2, tau_ps: 60 }] } },
  tile: { model: 'fixed', eps_r: 8, sigma_S_per_m: 0, magnetic: { model: 'fixed', mu_r: 2, mu_loss: 0.6 } },
};
const stack = (band: [number, number], layers: [string, number][], back: string, deg: number, polarization: 'TE' | 'TM'): Stack => stackFrom({
  title: 'bench', band_GHz: band, back, points: 201, materials, incidence: { angle_deg: deg, polarization },
  layers: layers.map(([material, thickness_mm]) => ({ material, thickness_mm })),
});

const cases: Case[] = [];
const tm: [string, [number, number], [string, number][], string][] = [
  ['radome sandwich', [8, 12], [['skin', 0.8], ['foam', 8], ['skin', 0.8]], 'air'],
  ['water film 1 mm', [1, 6], [['water', 1]], 'air'],
  ['ITU glass 6 mm', [1, 6], [['glass', 6]], 'air'],
  ['magnetic absorber 4 mm on pec', [2, 6], [['loaded', 4]], 'pec'],
];
for (const [name, band, layers, back] of tm) for (const deg of [30, 50, 70]) cases.push({ name: `TM ${deg}° ${name}`, stack: stack(band, layers, back, deg, 'TM') });
const te: [string, [number, number], [string, number][], string][] = [
  ['Lorentz-μ absorber 4 mm on pec', [2, 6], [['loaded', 4]], 'pec'],
  ['Debye-μ layer 6.3 mm', [1, 5], [['relaxing', 6.3]], 'air'],
  ['fixed lossy μ tile 3 mm on pec', [2, 6], [['tile', 3]], 'pec'],
];
for (const [name, band, layers, back] of te) for (const deg of [0, 45, 70]) cases.push({ name: `TE ${deg}° ${name}`, stack: stack(band, layers, back, deg, 'TE') });
for (const [m, mm, band, back, deg] of [
  ['concrete', 150, [1, 6], 'pec', 50], ['brick', 100, [1, 6], 'air', 70], ['glass', 20, [1, 40], 'pec', 50], ['wood', 50, [1, 20], 'air', 30],
] as [string, number, [number, number], string, number][]) {
  cases.push({ name: `TM ${deg}° ${mm} mm ${m} ${band[0]}–${band[1]} GHz on ${back}`, stack: stack(band, [[m, mm]], back, deg, 'TM') });
}

if (!values.json) {
  // Planning cost of a TM stack with a fitted wall (partial fractions of a dozen-term fit, cached after the first).
  const wall = stack([1, 40], [['concrete', 150]], 'pec', 50, 'TM');
  for (const round of ['first', 'cached']) {
    const t0 = performance.now();
    planGrid(wall);
    console.log(`plan TM 50° 150 mm concrete 1–40 GHz, ${round}: ${(performance.now() - t0).toFixed(1)} ms`);
  }
}
measureCases(cases, { only: values.only, accuracy, json: values.json });

/** Mcell/s of the production step (bench's uniform grid, both grids counted) of this medium on an engine. */
function stepSpeed(m: LineMedium, engine: EngineKind, cells = 200_000, steps = 1500): number {
  const run = lineBenchRun(cells, m, steps + 50, engine);
  run.step(50);
  const t0 = performance.now();
  run.step(steps);
  return (cellsPerStep(run) * steps) / ((performance.now() - t0) / 1000) / 1e6;
}
if (!values.json) {
  const w = 2 * Math.PI * 3e9;
  const lorentz = { epsInf: 1, sigma: 0, debye: [], osc: [{ c: 3 * w * w, w0sq: w * w, gamma: 2 * w }] };
  for (const engine of ['wasm-simd', 'js'] as const) {
    const f = (m: LineMedium) => stepSpeed(m, engine).toFixed(0);
    console.log(`production step (${engine}): plain ${f(lineMedium(stepModelFixed(4, 0.01)))} Mcell/s, ` +
      `one Lorentz pole on E ${f(lineMedium(lorentz))}, on H ${f(lineMedium(stepModelFixed(4, 0.01), lorentz))}, on both ${f(lineMedium(lorentz, lorentz))}`);
  }
}
