// Measures the unit costs behind the work estimates (src/report/rates.ts): run with
//   nice npx tsx bench/estimate-rates.ts
// and compare with the constants there. Each figure is the median of a few repeats, after a warm-up.

import { analyseEchoes } from '../src/echoes/table.ts';
import { createPulseRun, runToEndSync } from '../src/fdtd/run.ts';
import { solveFem } from '../src/fem/solve.ts';
import { profileFem } from '../src/fem/profile.ts';
import { csvChunks } from '../src/report/table.ts';
import { spectrumFromRecords } from '../src/spectra/spectrum.ts';
import type { Stack } from '../src/stack/types.ts';
import { profileTmm } from '../src/tmm/profile.ts';
import { solveTmm } from '../src/tmm/solve.ts';
import { linspace } from '../src/units.ts';
import { bulk, dielectric, layer, makeStack } from '../test/support/build-stack.ts';

const median = (f: () => void, repeats = 3): number => {
  f();
  const t: number[] = [];
  for (let i = 0; i < repeats; i++) { const t0 = performance.now(); f(); t.push((performance.now() - t0) / 1000); }
  return t.sort((a, b) => a - b)[Math.floor(t.length / 2)];
};
const show = (what: string, seconds: number, units: number, unit: string) =>
  console.log(`${what.padEnd(34)} ${(seconds * 1e9 / units).toPrecision(3).padStart(8)} ns per ${unit}`);

const concrete = bulk({ model: 'power-law', a: 5.24, b: 0, c: 0.0462, d: 0.7822 }, 'concrete');
const slab = (d: number, band: [number, number], m = dielectric(4, 0.01)): Stack =>
  makeStack({ layers: [layer(m, d)], band_GHz: band, points: 501 });

// Exact solver: one layer and 100 layers, 2001 frequencies.
for (const n of [1, 100]) {
  const st = makeStack({ layers: Array.from({ length: n }, (_, i) => layer(i % 2 ? concrete : dielectric(3), 0.01)) });
  const f = linspace(1e9, 10e9, 2001);
  show(`tmm, ${n} layer(s)`, median(() => solveTmm(st, f)), f.length * (n + 2), 'region-frequency');
}
// FEM: a thick slab (many elements, few regions) and many thin layers.
{
  const st = slab(0.5, [1, 30]), f = linspace(1e9, 30e9, 201);
  const el = solveFem(st, f).mesh.elements;
  show(`fem, ${el} elements`, median(() => solveFem(st, f)), f.length * el, 'element-frequency');
  const many = makeStack({ layers: Array.from({ length: 150 }, (_, i) => layer(i % 2 ? concrete : dielectric(3), 0.0005)) });
  const f2 = linspace(1e9, 2e9, 501);
  const el2 = solveFem(many, f2).mesh.elements;
  show(`fem, 150 thin layers (${el2} el.)`, median(() => solveFem(many, f2)), f2.length * (el2 + 150), 'element-frequency');
}
// Profiles: exact and FEM, per row.
{
  const st = slab(0.2, [5, 6]), x = linspace(-0.3, 0.25, 200_000);
  show('tmm profile', median(() => profileTmm(st, 5.5e9, x)), x.length, 'row');
  show('fem profile', median(() => profileFem(st, 5.5e9, x)), x.length, 'row');
}
// FDTD: cost per step and per cell-update, a small and a large grid, without and with poles.
for (const [name, st] of [
  ['fdtd, small grid', slab(0.01, [1, 2])], ['fdtd, large grid', slab(0.5, [1, 12])],
  ['fdtd, large grid, fitted poles', slab(0.5, [1, 12], concrete)],
] as const) {
  let cells = 0, steps = 0;
  const s = median(() => { const r = runToEndSync(createPulseRun(st)); cells = r.plan.cells + r.plan.nodes.auxTotal; steps = r.stepIndex; }, 1);
  console.log(`${name.padEnd(34)} ${steps} steps × ${cells} cells: ${(s * 1e6 / steps).toPrecision(3)} µs per step, ${(s * 1e9 / (steps * cells)).toPrecision(3)} ns per cell-update`);
}
// Spectra (DTFT) and echoes on a long record.
{
  const st = makeStack({ layers: [layer(dielectric(6), 0.006)], band_GHz: [10, 10.02], points: 101 });
  const run = runToEndSync(createPulseRun(st));
  const rec = run.records(), f = linspace(10e9, 10.02e9, 101);
  show(`dtft (${rec.count} samples)`, median(() => spectrumFromRecords(rec, f), 1), 3 * rec.count * f.length, 'sample-frequency');
  show(`echoes (${rec.count} samples)`, median(() => analyseEchoes(st, rec), 1), 1, 'analysis');
  const cols = [{ name: 't', data: rec.incident.slice(0, rec.count) }, { name: 'a', data: rec.reflected.slice(0, rec.count) }, { name: 'b', data: rec.transmitted.slice(0, rec.count) }];
  let bytes = 0;
  show('csv formatting', median(() => { bytes = 0; for (const c of csvChunks(cols)) bytes += c.length; }, 1), bytes, 'byte');
}
