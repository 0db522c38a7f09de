// The steppable run's contract (used by the report pipeline and the browser worker), the planner's
// grid rules, the guards, and the standing-wave profile against the exact one (src/tmm/profile.ts).
import { describe, expect, it } from 'vitest';
import { FdtdInstabilityError, PlanError } from '../../src/fdtd/errors.ts';
import { planGrid } from '../../src/fdtd/plan.ts';
import { pulseForBand, pulseSpectrumRelative } from '../../src/fdtd/pulse.ts';
import { createPulseRun, runToEnd, runToEndSync } from '../../src/fdtd/run.ts';
import { profileTmm } from '../../src/tmm/profile.ts';
import { C0_m_per_s } from '../../src/units.ts';
import { air, bulk, fixed, material, sheet, stackOf } from './stacks.ts';

describe('grid plan', () => {
  it('puts the front and back faces on E nodes and reports per-layer figures', () => {
    const stack = stackOf([bulk(fixed(4), 12.345), bulk(fixed(2), 7.77)]);
    const p = planGrid(stack);
    const cells = (12.345e-3 + 7.77e-3) / p.dx_m;
    expect(Math.abs(cells - Math.round(cells))).toBeLessThan(1e-6);
    expect(p.nodes.back - p.nodes.front).toBe(Math.round(cells));
    expect(p.courant).toBe(1);
    expect(p.dt_s).toBeCloseTo(p.dx_m / C0_m_per_s, 20);
    expect(p.layers).toHaveLength(2);
    expect(p.layers[0].cellsPerWavelength).toBeGreaterThanOrEqual(20);
    expect(p.predictedError).toBeLessThanOrEqual(0.5 * p.accuracyTarget);
    expect(p.memory_bytes).toBeGreaterThan(p.cells * 8);
  });

  it('a tighter accuracy asks for more cells per wavelength; an explicit figure overrides', () => {
    const stack = stackOf([bulk(fixed(9), 100)]);
    const loose = planGrid(stack, { accuracy: 0.05 }), tight = planGrid(stack, { accuracy: 0.002 });
    expect(tight.cellsPerWavelength).toBeGreaterThan(loose.cellsPerWavelength);
    expect(tight.predictedError).toBeLessThanOrEqual(0.001 + 1e-12);
    const fixedN = planGrid(stack, { cellsPerWavelength: 15 });
    expect(fixedN.cellsPerWavelength).toBeGreaterThanOrEqual(15);
    expect(fixedN.cellsPerWavelength).toBeLessThan(15.1);
  });

  it('the pulse covers the band: edges well within −20 dB of the peak (−12 dB lobe, less its image), no DC', () => {
    const p = pulseForBand([1e9, 10e9]);
    const peak = pulseSpectrumRelative(p, p.f0_Hz);
    expect(20 * Math.log10(pulseSpectrumRelative(p, 1e9) / peak)).toBeGreaterThan(-20);
    expect(20 * Math.log10(pulseSpectrumRelative(p, 10e9) / peak)).toBeGreaterThan(-20);
    expect(pulseSpectrumRelative(p, 0)).toBe(0);
  });

  it('a metal layer becomes a conductor wall at its front face, with a warning', () => {
    const metal = material('metal', { model: 'power-law', a: 1, b: 0, c: 1e7, d: 0 });
    const p = planGrid(stackOf([bulk(fixed(3), 10), bulk(metal, 2), bulk(fixed(2), 5)], { back: air }));
    expect(p.effective.back).toBe('pec');
    expect(p.effective.thickness_m).toBeCloseTo(0.01, 12);
    expect(p.warnings.some((w) => w.includes('perfect conductor'))).toBe(true);
  });

  it('a thin conductor film closes the layer in front of it, like the sheet it is stepped as', () => {
    // Bookkeeping (common practice, no source): the film becomes a sheet of 1/(σd) = 0.2 Ω at its centre,
    // 0.25 µm behind the slab's back face; the slab must then ring like a slab closed by that sheet (long
    // ring-down, the same run length) and the grid's predicted error must be that of the bare sheet.
    const metal = material('metal', { model: 'fixed', eps_r: 1, sigma_S_per_m: 1e7 });
    const film = planGrid(stackOf([bulk(fixed(4), 5), bulk(metal, 0.0005)]));
    const bare = planGrid(stackOf([bulk(fixed(4), 5), sheet(1 / (1e7 * 0.5e-6))]));
    const open = planGrid(stackOf([bulk(fixed(4), 5)]));
    expect(bare.expectedSteps).toBeGreaterThan(open.expectedSteps);
    expect(Math.abs(film.expectedSteps - bare.expectedSteps)).toBeLessThan(0.1 * bare.expectedSteps);
    expect(Math.abs(film.predictedError - bare.predictedError)).toBeLessThan(0.2 * bare.predictedError);
  });
});

describe('guards', () => {
  it('refuses a grid over the cell limit with figures, before allocating (a 1e12-cell grid could not be allocated)', () => {
    const stack = stackOf([bulk(fixed(10), 5000)], { band_GHz: [1, 3000] });
    let err: unknown;
    try { createPulseRun(stack); } catch (e) { err = e; }
    expect(err).toBeInstanceOf(PlanError);
    const pe = err as PlanError;
    expect(pe.code).toBe('too-many-cells');
    expect(pe.figures.cells).toBeGreaterThan(2e7);
    expect(pe.message).toMatch(/narrow the band/);
  });

  it('refuses a run over the work budget', () => {
    const stack = stackOf([bulk(fixed(4), 200)], { band_GHz: [1, 10] });
    expect(() => planGrid(stack, { maxWork: 1e6 })).toThrow(PlanError);
  });

  it('refuses an unstable Courant number', () => {
    const s = stackOf([bulk(fixed(4), 10)]);
    expect(() => planGrid(s, { courant: 1.2 })).toThrow(/courant/);
  });

  it('a NaN in the grid stops the run at once, naming the step and place', () => {
    const run = createPulseRun(stackOf([bulk(fixed(4), 10)]));
    run.step(40);
    run.totalField()[run.plan.nodes.front + 3] = Number.NaN;
    let err: unknown;
    try { run.step(100); } catch (e) { err = e; }
    expect(err).toBeInstanceOf(FdtdInstabilityError);
    const fe = err as FdtdInstabilityError;
    expect(fe.step).toBeGreaterThan(40);
    expect(fe.step).toBeLessThanOrEqual(40 + 32); // the energy is summed every 32 steps
    expect(fe.message).toMatch(/step \d+/);
    expect(Number.isFinite(fe.x_m)).toBe(true);
    expect(run.done).toBe(true);
  });

  it('energy growing after the source stopped is a blow-up', () => {
    const run = createPulseRun(stackOf([bulk(fixed(4), 10)]));
    while (run.time_s <= run.plan.pulse.end_s + 10 * run.plan.dt_s) run.step(1);
    const e = run.totalField();
    for (let i = run.plan.nodes.front; i < run.plan.nodes.back; i++) e[i] = 1e6;
    expect(() => run.step(50)).toThrow(FdtdInstabilityError);
  });
});

describe('steppable run', () => {
  it('steps, records views of the right length, stops at the step limit with a warning', () => {
    const run = createPulseRun(stackOf([bulk(fixed(4), 20)]), { maxSteps: 300 });
    expect(run.step(100)).toBe(100);
    expect(run.stepIndex).toBe(100);
    expect(run.time_s).toBeCloseTo(100 * run.plan.dt_s, 20);
    const r = run.records();
    expect(r.count).toBe(101);
    expect(r.incident.length).toBe(101);
    expect(run.totalField().length).toBe(run.plan.cells);
    expect(run.x_m()[run.plan.nodes.front]).toBe(0);
    expect(run.step(1000)).toBe(200);
    expect(run.done).toBe(true);
    expect(run.doneReason).toBe('step-limit');
    expect(run.warnings.some((w) => w.includes('step limit'))).toBe(true);
    expect(run.step(10)).toBe(0);
  });

  it('records do not depend on how the run is chunked, also past the expected step count (common practice, no source)', () => {
    const stack = stackOf([bulk(fixed(4), 20)]);
    const options = { decay_dB: 400 }; // never reached: both runs go on to the step limit, 3× the expected steps
    const whole = runToEndSync(createPulseRun(stack, options), { chunk: 1e9 });
    const single = createPulseRun(stack, options);
    while (!single.done) single.step(1);
    const a = whole.records(), b = single.records();
    expect(single.doneReason).toBe('step-limit');
    expect(b.count).toBeGreaterThan(2 * single.plan.expectedSteps);
    expect(b.count).toBe(a.count);
    for (const key of ['incident', 'reflected', 'transmitted'] as const) expect(Array.from(b[key])).toEqual(Array.from(a[key]));
    expect(Math.max(...a.reflected.map(Math.abs))).toBeGreaterThan(0.1);
  });

  it('incidentField matches the incident record at x = 0 and is zero ahead of the wave', () => {
    const run = createPulseRun(stackOf([bulk(fixed(4), 20)]), { forView: true });
    run.step(150);
    const inc = run.incidentField(new Float64Array(run.plan.cells));
    const r = run.records();
    expect(inc[run.plan.nodes.front]).toBe(r.incident[r.count - 1]);
    expect(inc[run.plan.cells - 2]).toBe(0);
    // In the total-field region in front of the stack, total = incident + reflected; before any reflection, equal.
    const run2 = createPulseRun(stackOf([bulk(fixed(4), 20)]), { forView: true });
    run2.step(20);
    const inc2 = run2.incidentField(new Float64Array(run2.plan.cells));
    const tot2 = run2.totalField();
    for (let i = run2.plan.nodes.tfsf; i < run2.plan.nodes.front - 5; i++) expect(tot2[i]).toBeCloseTo(inc2[i], 14);
  });

  it('runToEnd reports progress and can be cancelled', async () => {
    const run = createPulseRun(stackOf([bulk(fixed(4), 20)]));
    const seen: number[] = [];
    await runToEnd(run, { chunk: 50, onProgress: (f) => seen.push(f), shouldStop: () => seen.length >= 3 });
    expect(run.doneReason).toBe('stopped');
    expect(seen.length).toBe(3);
    expect(seen.every((f) => f >= 0 && f <= 1)).toBe(true);
    const run2 = createPulseRun(stackOf([bulk(fixed(4), 20)]));
    await runToEnd(run2, { chunk: 200 });
    expect(run2.doneReason).toBe('converged');
    expect(run2.energy().level_dB).toBeLessThanOrEqual(-60);
  });

  it('the standing-wave profile (running DFT) matches the exact profile, on the view\'s grid and on the lean one', () => {
    const stack = stackOf([bulk(fixed(4, 0.02), 17.3)], { back: 'pec', profile_GHz: 4 });
    for (const forView of [true, false]) {
      const run = runToEndSync(createPulseRun(stack, { forView }));
      const p = run.profile();
      const exact = profileTmm(stack, stack.profile_Hz, p.x_m);
      let worst = 0;
      for (let i = 0; i < p.x_m.length; i++) worst = Math.max(worst, Math.hypot(p.E_re[i] - exact.E_re[i], p.E_im[i] - exact.E_im[i]));
      // The view's grid shows 1.5 wavelengths in front (37 mm at 4 GHz, more for the stack's thickness); the lean one ten cells.
      if (forView) expect(p.x_m[0]).toBeLessThan(-0.05);
      else expect(p.x_m[0]).toBeCloseTo(-10 * run.plan.dx_m, 12);
      expect(worst).toBeLessThan(0.02);
    }
  });
});
