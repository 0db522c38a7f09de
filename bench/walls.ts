// Pulse engine on walls: engine error (FDTD against the exact solution of the stepped media), model share
// (stepped media against the stack's own exact solution), grid size, steps, cell-updates and time.
// A benchmark, not a test: run it under nice on a quiet machine.
//   nice npx tsx bench/walls.ts [--only TEXT] [--accuracy X] [--set none|walls|all] [--json]
// --set none: the presets and the stacks that once crashed; walls (default): plus a representative set of
// ITU-R P.2040-3 walls (20–300 mm, 1–6 to 1–40 GHz, air or a conductor behind); all: every catalog wall
// material × 20/100/300 mm × 1–6/1–20/1–40 GHz × air/conductor (hours). Planning times (first and cached)
// of an absurd stack come first.
import { readdirSync, readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { planGrid } from '../src/fdtd/plan.ts';
import { type Case, measureCases, stackFrom } from './measure-cases.ts';
import { REPRESENTATIVE_WALLS } from './wall-list.ts';

const { values } = parseArgs({ options: { only: { type: 'string' }, accuracy: { type: 'string' }, set: { type: 'string' }, json: { type: 'boolean' } } });
const accuracy = values.accuracy ? Number(values.accuracy) : undefined;

const cases: Case[] = [];
for (const f of readdirSync('presets').filter((x) => x.endsWith('.stack.json')).sort()) {
  cases.push({ name: `preset ${f.replace('.stack.json', '')}`, stack: stackFrom(JSON.parse(readFileSync(`presets/${f}`, 'utf8'))) });
}
const wall = (material: string, mm: number, band: [number, number], back: string): Case => ({
  name: `${mm} mm ${material} ${band[0]}–${band[1]} GHz on ${back}`,
  stack: stackFrom({ title: 'wall', band_GHz: band, layers: [{ material, thickness_mm: mm }], back, points: 201 }),
});
const set = values.set ?? 'walls';
if (set === 'walls' || set === 'all') {
  for (const [m, mm, band, back] of REPRESENTATIVE_WALLS) cases.push(wall(m, mm, band, back));
}
if (set === 'all') {
  for (const m of ['concrete', 'brick', 'plasterboard', 'wood', 'glass', 'marble', 'chipboard']) {
    for (const mm of [20, 100, 300]) for (const band of [[1, 6], [1, 20], [1, 40]] as [number, number][]) {
      for (const back of ['air', 'pec']) cases.push(wall(m, mm, band, back));
    }
  }
}
// Stacks that once crashed the engine.
cases.push({ name: 'Lorentz pole far above the band', stack: stackFrom({
  title: 'lorentz above', band_GHz: [1, 2.2], layers: [{ material: 'lor', thickness_mm: 30 }], back: 'air', points: 101,
  materials: { lor: { model: 'lorentz', eps_inf: 2.5, poles: [{ delta_eps: 3.56, f0_GHz: 46.5, gamma_GHz: 0.55 }], sigma_S_per_m: 0 } },
}) });
cases.push({ name: 'lossless Drude below its plasma frequency', stack: stackFrom({
  title: 'drude', band_GHz: [1, 5], layers: [{ material: 'pl', thickness_mm: 10 }], back: 'air', points: 101,
  materials: { pl: { model: 'drude', eps_inf: 1, plasma_GHz: 8, collision_GHz: 0, sigma_S_per_m: 0 } },
}) });

// Planning an absurd stack (10 m of concrete over 1–100 GHz): refused, in milliseconds.
{
  const absurd = stackFrom({ title: 'absurd', band_GHz: [1, 100], layers: [{ material: 'concrete', thickness_mm: 10000 }], back: 'air', points: 11 });
  for (const round of ['first', 'cached']) {
    const t0 = performance.now();
    let what = 'planned';
    try { planGrid(absurd); } catch (e) { what = `refused (${(e as Error).message.slice(0, 60)}…)`; }
    if (!values.json) console.log(`plan 10 m concrete 1–100 GHz, ${round}: ${(performance.now() - t0).toFixed(1)} ms, ${what}`);
  }
}

measureCases(cases, { only: values.only, accuracy, json: values.json });
