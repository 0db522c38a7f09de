// The WebAssembly engine against the TypeScript reference kernel: the same operations in the same order on
// every node, so the same numbers to the last bit (IEEE 754 arithmetic is exact per operation and WebAssembly
// forbids fused multiply-add; common practice, no source). Checked on every preset and on stacks that reach the
// corners of the arena: dispersive media in the front (poles on the source node and in both grids' CPML), in
// the back CPML, pole groups of odd and even length sharing nodes, layers thinner than a cell, sheets, a
// conductor behind, oblique TE.
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadStackFile } from '../../src/cli/io.ts';
import { createPulseRun, runToEndSync } from '../../src/fdtd/run.ts';
import type { PulseRun } from '../../src/fdtd/types.ts';
import type { Stack } from '../../src/stack/types.ts';
import { useWasmStep } from '../support/wasm.ts';
import { bulk, fixed, material, sheet, stackOf } from './stacks.ts';

const PRESETS = join(import.meta.dirname, '..', '..', 'presets');

function presets(): Array<[string, Stack]> {
  return readdirSync(PRESETS).filter((f) => f.endsWith('.stack.json')).sort().map((f) => {
    const r = loadStackFile(join(PRESETS, f));
    if (!r.ok) throw new Error(`${f}: ${r.errors.join('; ')}`);
    return [f, r.stack];
  });
}

const water = material('water-like', { model: 'debye', eps_inf: 4.9, sigma_S_per_m: 0.01, poles: [{ delta_eps: 73, tau_ps: 8.3 }, { delta_eps: 2, tau_ps: 0.5 }, { delta_eps: 1, tau_ps: 40 }] });
const resonant = material('resonant', { model: 'lorentz', eps_inf: 2.2, sigma_S_per_m: 0, poles: [{ delta_eps: 1.5, f0_GHz: 7, gamma_GHz: 0.8 }, { delta_eps: 0.4, f0_GHz: 30, gamma_GHz: 5 }] });
const plasma = material('plasma', { model: 'drude', eps_inf: 1, plasma_GHz: 4, collision_GHz: 2, sigma_S_per_m: 0 });

const ferrite = material('ferrite-like', { model: 'fixed', eps_r: 6, sigma_S_per_m: 0.02, magnetic: { model: 'lorentz', mu_inf: 1.5, poles: [{ delta_mu: 3, f0_GHz: 4, gamma_GHz: 2 }] } });
const lossyMu = material('lossy-mu', { model: 'debye', eps_inf: 3, sigma_S_per_m: 0, poles: [{ delta_eps: 2, tau_ps: 30 }], magnetic: { model: 'debye', mu_inf: 1.2, poles: [{ delta_mu: 1.5, tau_ps: 40 }] } });
const tm = (st: Stack, deg: number): Stack => ({ ...st, incidence: { angle_rad: (deg * Math.PI) / 180, polarization: 'TM' } });

const corners: Array<[string, Stack]> = [
  ['dispersive front and back media', stackOf([bulk(fixed(3), 7.3)], { front: water, back: resonant, band_GHz: [2, 8] })],
  ['groups sharing nodes, a layer thinner than a cell, a sheet', stackOf([bulk(water, 3.31), bulk(resonant, 0.07), sheet(377), bulk(plasma, 4.9), bulk(fixed(4, 0.02), 2.2)], { band_GHz: [1, 12] })],
  ['dispersive wall on a conductor', stackOf([bulk(resonant, 11.1), bulk(water, 2.05)], { back: 'pec', band_GHz: [3, 9] })],
  ['oblique TE through a Drude layer', { ...stackOf([bulk(plasma, 6), bulk(fixed(2.5), 3.3)], { band_GHz: [2, 10] }), incidence: { angle_rad: 0.6, polarization: 'TE' } }],
  ['magnetic poles on the H nodes, a magnetic front and back medium', stackOf([bulk(ferrite, 4.1), bulk(fixed(3), 2.2)], { front: lossyMu, back: ferrite, band_GHz: [1, 8] })],
  ['TM at 50° through lossy and dispersive layers (the reciprocal\'s terms, with s-numerators)', tm(stackOf([bulk(fixed(4, 0.05), 5.3), bulk(water, 1.9), bulk(resonant, 3.1)], { band_GHz: [2, 9] }), 50)],
  ['TM at 30° with a magnetic layer on a conductor', tm(stackOf([bulk(lossyMu, 6.7)], { back: 'pec', band_GHz: [1, 6] }), 30)],
];

/** Largest |a − b| over equal-length arrays (0 when they are bit-for-bit equal but for the sign of zero). */
function worst(a: Float64Array, b: Float64Array): number {
  expect(a.length).toBe(b.length);
  let w = 0;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) w = Math.max(w, Math.abs(a[i] - b[i]), Number.isNaN(a[i] - b[i]) ? Infinity : 0);
  return w;
}

function compare(js: PulseRun, wasm: PulseRun): void {
  expect(js.engine).toBe('js');
  expect(wasm.engine).toBe('wasm-simd');
  expect(wasm.stepIndex).toBe(js.stepIndex);
  expect(wasm.doneReason).toBe(js.doneReason);
  const a = js.records(), b = wasm.records();
  for (const k of ['incident', 'reflected', 'transmitted', 'scatteredProbe'] as const) expect(worst(a[k], b[k])).toBe(0);
  expect(worst(js.totalField(), wasm.totalField())).toBe(0);
  const pa = js.profile(), pb = wasm.profile();
  expect(worst(pa.E_re, pb.E_re)).toBe(0);
  expect(worst(pa.E_im, pb.E_im)).toBe(0);
  expect(wasm.energy().current).toBe(js.energy().current);
  const n = js.plan.nodes.total;
  expect(worst(js.incidentField(new Float64Array(n)), wasm.incidentField(new Float64Array(n)))).toBe(0);
}

describe('WebAssembly engine against the TypeScript kernel', () => {
  beforeAll(async () => { await useWasmStep(); });

  it.each(presets())('preset %s: bit-for-bit the same run', (_name, stack) => {
    compare(runToEndSync(createPulseRun(stack, { engine: 'js' })), runToEndSync(createPulseRun(stack, { engine: 'wasm-simd' })));
  });

  it.each(corners)('%s: bit-for-bit the same run', (_name, stack) => {
    compare(runToEndSync(createPulseRun(stack, { engine: 'js' })), runToEndSync(createPulseRun(stack, { engine: 'wasm-simd' })));
  });

  it('the corner stacks reach what they are named for: poles on the H nodes, terms with s-numerators, fused pairs', async () => {
    const { buildGrids } = await import('../../src/fdtd/build.ts');
    const { planGrid } = await import('../../src/fdtd/plan.ts');
    const grids = (st: Stack) => buildGrids(planGrid(st), st.band_Hz);
    const magnetic = grids(corners[4][1]);
    expect(magnetic.main.mdisp?.groups.length).toBeGreaterThan(0);
    expect(magnetic.aux.mdisp).not.toBeNull();
    const oblique = grids(corners[5][1]);
    const all = [...(oblique.main.disp?.groups ?? []), ...(oblique.main.mdisp?.groups ?? [])];
    expect(all.some((g) => !g.plain)).toBe(true);
    expect(grids(corners[1][1]).main.disp!.groups.length).toBe(3);
  });

  it('the same when stepped in uneven pieces (batches cut anywhere)', () => {
    const stack = corners[1][1];
    const js = createPulseRun(stack, { engine: 'js' }), wasm = createPulseRun(stack, { engine: 'wasm-simd' });
    const pieces = [1, 7, 31, 32, 33, 100, 5];
    for (let i = 0; i < 40 && !js.done; i++) { const k = pieces[i % pieces.length]; expect(wasm.step(k)).toBe(js.step(k)); }
    expect(worst(js.records().reflected, wasm.records().reflected)).toBe(0);
    expect(worst(js.totalField(), wasm.totalField())).toBe(0);
    expect(wasm.energy().current).toBe(js.energy().current);
  });

  it('without a provided module a run steps with the TypeScript kernel and says why', async () => {
    const { withdrawStepModule } = await import('../../src/fdtd/wasm/module.ts');
    withdrawStepModule();
    try {
      const run = createPulseRun(corners[0][1]);
      expect(run.engine).toBe('js');
      expect(run.engineFallback).toMatch(/WebAssembly/);
      expect(() => createPulseRun(corners[0][1], { engine: 'wasm-simd' })).toThrow(/wasm-simd/);
    } finally { await useWasmStep(); }
  });

  it('a module that does not compile (as where SIMD is missing) falls back to the TypeScript kernel', async () => {
    const { provideStepModule } = await import('../../src/fdtd/wasm/module.ts');
    provideStepModule(new Uint8Array([0, 97, 115, 109, 1, 0, 0, 0, 99]));
    try {
      const run = createPulseRun(corners[0][1]);
      expect(run.engine).toBe('js');
      expect(run.engineFallback).toMatch(/did not compile/);
    } finally { await useWasmStep(); }
  });
});

describe('production step details', () => {
  beforeAll(async () => { await useWasmStep(); });

  it('the uniform bench grids with 4 Debye + 2 Lorentz poles per node: the same fields from both engines', async () => {
    const { uniformBenchRun } = await import('../../src/fdtd/bench.ts');
    for (const [cells, d, l] of [[997, 4, 2], [1000, 3, 1], [1200, 0, 0]]) {
      const js = uniformBenchRun(cells, d, l, 400, 'js'), wasm = uniformBenchRun(cells, d, l, 400, 'wasm-simd');
      js.step(400);
      wasm.step(400);
      expect(worst(js.totalField(), wasm.totalField())).toBe(0);
      expect(worst(js.records().reflected, wasm.records().reflected)).toBe(0);
      expect(wasm.energy().current).toBe(js.energy().current);
    }
  });

  it('the profile DFT taken every k-th step (as aliasing allows) equals the every-step sum to 1e-7 of the field (measured 1e-8)', async () => {
    // Sampling theorem (common practice, no source): the record holds nothing above fMax, so the sum over every
    // k-th sample aliases nothing onto the profile frequency when 1/(kΔt) > fMax + f_profile.
    const { createRunOfPlan, profileStride } = await import('../../src/fdtd/run.ts');
    const { planGrid } = await import('../../src/fdtd/plan.ts');
    const stack = corners[1][1], plan = planGrid(stack);
    expect(profileStride(plan.pulse, plan.profile_Hz, plan.dt_s)).toBeGreaterThan(3);
    const sparse = runToEndSync(createRunOfPlan(stack.band_Hz, plan));
    const every = runToEndSync(createRunOfPlan(stack.band_Hz, plan, { profileStride: 1 }));
    const a = sparse.profile(), b = every.profile();
    let peak = 0, diff = 0;
    for (let i = 0; i < a.E_re.length; i++) {
      peak = Math.max(peak, Math.hypot(b.E_re[i], b.E_im[i]));
      diff = Math.max(diff, Math.hypot(a.E_re[i] - b.E_re[i], a.E_im[i] - b.E_im[i]));
    }
    expect(diff / peak).toBeLessThan(1e-7);
  });
});
