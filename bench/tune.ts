// Measured (not asserted) figures of table materials and `tune`:
//  1. a table sampled from a Debye model against the model itself, in the exact solver, the FEM and the pulse engine,
//     for 6 to 81 log-spaced rows over 2–12 GHz (the table's own share of |ΔR| and |ΔT|);
//  2. match: the coverage of the 95 % intervals of ε′ and thickness over many random slabs (nominal 0.95), the noise
//     level recovered, and the time per case;
//  3. designs: the Salisbury screen and the two-sheet absorber over 6–14 GHz against the two-sheet Jaumann
//     reference (see test/tune/design.test.ts), for several seeds, with evaluation counts and times.
// Run: nice npx tsx bench/tune.ts [--cases N]

import { createPulseRun, runToEndSync } from '../src/fdtd/run.ts';
import { solveFem } from '../src/fem/solve.ts';
import { permittivity } from '../src/materials/permittivity.ts';
import type { DebyeModel } from '../src/materials/types.ts';
import { compareSpectra } from '../src/report/agreement.ts';
import { spectrumFromRecords } from '../src/spectra/spectrum.ts';
import { Mt19937 } from '../src/studies/random.ts';
import { solveTmm } from '../src/tmm/solve.ts';
import { worstPower, type Case } from '../src/tune/goals.ts';
import { parseFree } from '../src/tune/stack-access.ts';
import { runTune } from '../src/tune/tune.ts';
import { C0_m_per_s, ETA0_ohm, linspace } from '../src/units.ts';
import { measuredOf, parsed, synthetic } from '../test/tune/support.ts';

const arg = (name: string, fallback: number): number => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const e2 = (x: number) => x.toExponential(2);
const NORMAL: Case[] = [{ angle_deg: 0, polarization: 'TE' }];

function tables(): void {
  const debye: DebyeModel = { model: 'debye', eps_inf: 2.5, poles: [{ delta_eps: 4, tau_ps: 15 }], sigma_S_per_m: 0.02 };
  const stackOf = (mat: unknown) => parsed({ band_GHz: [2, 12], points: 51, materials: { m: mat }, layers: [{ material: 'm', thickness_mm: 20 }] }).stack;
  const ref = stackOf(debye), f = linspace(2e9, 12e9, 51);
  const refRun = createPulseRun(ref); runToEndSync(refRun);
  const refFdtd = spectrumFromRecords(refRun.records(), f);
  console.log('1. Debye table (20 mm slab, 2–12 GHz): max |ΔR|, |ΔT| of the table against the model, same method');
  console.log('rows   tmm R     tmm T     fem R     fem T     fdtd R    fdtd T    fit ε\' err  fit ε\'\' err');
  for (const rows of [6, 11, 21, 41, 81]) {
    const points = Array.from({ length: rows }, (_, i) => {
      const fi = 2 * Math.pow(6, i / (rows - 1)), e = permittivity(debye, fi * 1e9);
      return [fi, e.re, -e.im];
    });
    const table = stackOf({ model: 'table', points });
    const t = compareSpectra(solveTmm(table, f), solveTmm(ref, f));
    const m = compareSpectra(solveFem(table, f).spectrum, solveFem(ref, f).spectrum);
    const run = createPulseRun(table); runToEndSync(run);
    const d = compareSpectra(spectrumFromRecords(run.records(), f), refFdtd);
    const fit = run.plan.fits[0];
    console.log([String(rows).padEnd(5), ...[t.R_max, t.T_max, m.R_max, m.T_max, d.R_max, d.T_max, fit.maxRelErr_re, fit.maxRelErr_im].map(e2)].join('  '));
  }
}

async function coverage(cases: number): Promise<void> {
  const rng = new Mt19937(99), sigma = 0.003;
  const slab = (eps_r: number, thickness_mm: number, s: number) => ({ band_GHz: [4, 8], points: 41, materials: { slab: { model: 'fixed', eps_r, sigma_S_per_m: s } }, layers: [{ material: 'slab', thickness_mm }] });
  let inE = 0, inD = 0, noise = 0, evals = 0;
  const t0 = performance.now();
  for (let c = 0; c < cases; c++) {
    const eps = 2 + 6 * rng.uniform(), d = 5 + 25 * rng.uniform(), loss = 0.05 * rng.uniform();
    const start = parsed(slab(4, 15, loss));
    const measured = measuredOf(synthetic(parsed(slab(eps, d, loss)).stack, 41, ['R', 'T'], sigma, rng), start.stack);
    const free = [parseFree('materials.slab.eps_r=1.5:10', start.file), parseFree('layers[0].thickness_mm=2:40', start.file)];
    const s = (await runTune({ file: start.file, free, goal: { name: 'match', measured }, goalText: 'match', seed: 1, budget: 200 })).summary as
      { interval_95: Record<string, [number, number]>; residual: { noise_estimate: number }; evaluations: { total: number } };
    const [ie, id] = [s.interval_95['materials.slab.eps_r'], s.interval_95['layers[0].thickness_mm']];
    if (ie[0] <= eps && eps <= ie[1]) inE++;
    if (id[0] <= d && d <= id[1]) inD++;
    noise += s.residual.noise_estimate / sigma;
    evals += s.evaluations.total;
  }
  const ms = performance.now() - t0;
  console.log(`\n2. match, ${cases} random slabs (ε′ 2–8, 5–30 mm, R and T at 41 frequencies, σ = ${sigma}):`);
  console.log(`   ε′ inside its 95 % interval: ${(inE / cases).toFixed(3)}; thickness: ${(inD / cases).toFixed(3)}; ` +
    `mean s/σ ${(noise / cases).toFixed(3)}; ${(evals / cases).toFixed(0)} evaluations and ${(ms / cases).toFixed(1)} ms per case`);
}

async function designs(): Promise<void> {
  console.log('\n3. designs (exact solver), per seed: best values, worst R_power in dB, evaluations, ms');
  const quarter = (C0_m_per_s / 10e9 / 4) * 1e3;
  const screen = parsed({ band_GHz: [9.99, 10.01], points: 5, back: 'pec', materials: { rs: { model: 'sheet', ohm_per_sq: 200 } }, layers: [{ material: 'rs' }, { material: 'air', thickness_mm: 5 }] });
  const absorber = (r1: number, r2: number, d1: number, d2: number) => parsed({
    band_GHz: [6, 14], points: 81, back: 'pec',
    materials: { front: { model: 'sheet', ohm_per_sq: r1 }, rear: { model: 'sheet', ohm_per_sq: r2 } },
    layers: [{ material: 'front' }, { material: 'air', thickness_mm: d1 }, { material: 'rear' }, { material: 'air', thickness_mm: d2 }],
  });
  const ref = worstPower(absorber(2 * ETA0_ohm, ETA0_ohm / 2, quarter, quarter).stack, 'R', NORMAL).value;
  console.log(`   Salisbury target: ${ETA0_ohm.toFixed(4)} Ω/sq, ${quarter.toFixed(5)} mm; two-sheet Jaumann reference over 6–14 GHz: ${(10 * Math.log10(ref)).toFixed(2)} dB`);
  for (const seed of [1, 2, 3, 4, 5]) {
    for (const [label, start, freeText, budget] of [
      ['screen', screen, ['materials.rs.ohm_per_sq=50:1000', 'layers[1].thickness_mm=3:12'], 400],
      ['two-sheet', absorber(500, 300, 6, 6), ['materials.front.ohm_per_sq=100:3000', 'materials.rear.ohm_per_sq=50:1000', 'layers[1].thickness_mm=2:15', 'layers[3].thickness_mm=2:15'], 800],
    ] as const) {
      const t0 = performance.now();
      const free = freeText.map((t) => parseFree(t, start.file));
      const s = (await runTune({ file: start.file, free, goal: { name: 'min-worst-R', cases: NORMAL }, goalText: 'min-worst-R', seed, budget })).summary as
        { best: Record<string, number>; objective: { dB: number | null; value: number }; evaluations: { total: number } };
      const values = Object.values(s.best).map((v) => v.toPrecision(6)).join(', ');
      console.log(`   seed ${seed} ${label.padEnd(9)} ${values}; ${s.objective.dB ?? '−∞'} dB; ${s.evaluations.total} evaluations; ${(performance.now() - t0).toFixed(0)} ms`);
    }
  }
}

tables();
await coverage(arg('cases', 200));
await designs();
