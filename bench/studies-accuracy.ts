// How close the studies come to their outside references, measured (the tests assert bounds, this prints the
// figures): tolerance percentiles of a half-wave slab against the first-order model over several seeds, the
// Brewster angle and the quarter-wave thickness found by sweeping, and the Touchstone energy and reciprocity.
// Run: npx tsx bench/studies-accuracy.ts

import { bandFrequencies } from '../src/results.ts';
import { parseStackObject } from '../src/stack/parse.ts';
import { solveExactWithQuantities } from '../src/studies/exact.ts';
import { quantitiesOf } from '../src/studies/quantities.ts';
import { sParameters } from '../src/studies/sparams.ts';
import { drawSamples, parseVary, runToleranceSample, SampleTable, type TolerancePlan } from '../src/studies/tolerance.ts';
import { solveTmm } from '../src/tmm/solve.ts';
import { C0_m_per_s } from '../src/units.ts';
import { dielectric, layer, magnetic, makeStack, sheet } from '../test/support/build-stack.ts';
import { slabAt } from '../test/support/half-wave-slab.ts';

const Z95 = 1.6448536269514722, Z975 = 1.959963984540054, Z525 = 0.06270677794321385; // Abramowitz & Stegun 26.2
const pct = (x: number) => `${(100 * x).toFixed(2)} %`;

function tolerance(seed: number, samples: number, sd_mm: number): Record<string, number> {
  const d0 = 25, f0 = C0_m_per_s / (4 * d0 * 1e-3), f1 = 2.25e9;
  const r = parseStackObject({ title: 'Half-wave slab', band_GHz: [f1 / 1e9, f0 / 1e9], points: 2,
    materials: { slab: { model: 'fixed', eps_r: 4 } }, layers: [{ material: 'slab', thickness_mm: d0 }] });
  if (!r.ok) throw new Error(r.errors[0]);
  const plan: TolerancePlan = { base: r.file, varies: [parseVary(`layers[0].thickness_mm:normal:${sd_mm}`, r.file)], samples, seed };
  const f = bandFrequencies(r.stack), values = drawSamples(plan), table = new SampleTable(2, samples);
  for (let s = 0; s < samples; s++) { const o = runToleranceSample(plan, values, s); table.add(s, o.quantities, o.extremes); }
  const q = Object.fromEntries(table.percentileColumns(f).map((c) => [c.name, c.data]));
  const nominal = solveExactWithQuantities(r.stack, f).quantities;
  const sd = sd_mm * 1e-3, off = slabAt(f1, d0 * 1e-3), on = slabAt(f0, d0 * 1e-3);
  const halfR = Z95 * Math.abs(2 * (off.R.re * off.dR.re + off.R.im * off.dR.im)) * sd, halfP = Z95 * Math.abs(off.dIPD_deg) * sd;
  const scale = (on.dR.re ** 2 + on.dR.im ** 2) * sd * sd;
  return {
    off_R_p05: (q.R_power_p05[0] - (nominal.R_power[0] - halfR)) / halfR,
    off_R_p95: (q.R_power_p95[0] - (nominal.R_power[0] + halfR)) / halfR,
    off_IPD_p05: (q.IPD_deg_p05[0] - (nominal.IPD_deg[0] - halfP)) / halfP,
    off_IPD_p95: (q.IPD_deg_p95[0] - (nominal.IPD_deg[0] + halfP)) / halfP,
    off_IPD_p50_in_spread: (q.IPD_deg_p50[0] - nominal.IPD_deg[0]) / halfP,
    design_R_p95: q.R_power_p95[1] / (Z975 * Z975 * scale) - 1,
    design_R_p05: q.R_power_p05[1] / (Z525 * Z525 * scale) - 1,
  };
}

console.log('Tolerance of a half-wave slab (ε_r = 4, 25 mm, SD 0.05 mm), percentile minus first-order model, relative:');
for (const [seed, samples] of [[11, 20000], [1, 20000], [2, 20000], [3, 2000]] as const) {
  const t = tolerance(seed, samples, 0.05);
  console.log(`  seed ${seed}, ${samples} samples: ` + Object.entries(t).map(([k, v]) => `${k} ${pct(v)}`).join(', '));
}

// Brewster angle by sweeping a half-space in TM at 0.005° steps, and the quarter-wave thickness at 0.001 mm steps.
{
  let best = { R: Infinity, deg: 0 };
  for (let deg = 63.3; deg <= 63.6; deg += 0.005) {
    const st = makeStack({ back: dielectric(4), angle_deg: deg, polarization: 'TM', band_GHz: [1, 2], points: 2 });
    const R = solveExactWithQuantities(st, bandFrequencies(st)).quantities.R_power[0];
    if (R < best.R) best = { R, deg };
  }
  console.log(`Brewster angle found ${best.deg.toFixed(3)}°, arctan 2 = ${(Math.atan(2) * 180 / Math.PI).toFixed(3)}° (grid 0.005°)`);
  const quarter = (C0_m_per_s / 10e9 / (4 * Math.SQRT2)) * 1e3;
  let q = { R: Infinity, d: 0 };
  for (let d = 4; d <= 6.6; d += 0.001) {
    const st = makeStack({ layers: [layer(dielectric(2), d * 1e-3)], back: dielectric(4), band_GHz: [10, 11], points: 2 });
    const R = solveExactWithQuantities(st, bandFrequencies(st)).quantities.R_power[0];
    if (R < q.R) q = { R, d };
  }
  console.log(`quarter-wave minimum at ${q.d.toFixed(4)} mm (R_power ${q.R.toExponential(1)}), λ/(4 n_c) = ${quarter.toFixed(4)} mm (grid 0.001 mm)`);
}

// Touchstone energy and reciprocity on lossy, magnetic, oblique two-ports.
{
  let energy = 0, recip = 0;
  const stacks = [
    makeStack({ layers: [layer(dielectric(4.2, 0.01), 0.0008), layer(dielectric(1.1), 0.006), layer(dielectric(4.2, 0.01), 0.0008)], band_GHz: [8, 12], angle_deg: 40, polarization: 'TM', points: 401 }),
    makeStack({ layers: [sheet(200), layer(magnetic(6, 0.02, 2, 0.4), 0.004), layer(dielectric(3), 0.01)], back: dielectric(2.25), angle_deg: 25, polarization: 'TE', points: 401 }),
  ];
  for (const st of stacks) {
    const exact = solveTmm(st, bandFrequencies(st)), s = sParameters(st, exact), q = quantitiesOf(st, exact);
    for (let i = 0; i < exact.f_Hz.length; i++) {
      energy = Math.max(energy, Math.abs(s.S11_re[i] ** 2 + s.S11_im[i] ** 2 + s.S21_re[i] ** 2 + s.S21_im[i] ** 2 - (1 - q.absorbed[i])));
      recip = Math.max(recip, Math.hypot(s.S21_re[i] - s.S12_re[i], s.S21_im[i] - s.S12_im[i]));
    }
  }
  console.log(`Touchstone: max | |S11|² + |S21|² − (1 − absorbed) | = ${energy.toExponential(1)}, max |S21 − S12| = ${recip.toExponential(1)}`);
}
