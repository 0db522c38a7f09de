// When a run ends: its running probe spectra must have settled at every band frequency, the bottom
// included, and its stored energy (pole states included) must have decayed. References: the closed-form
// DFT of an exponential tail (a geometric series, common practice), the exact layered solution (src/tmm) of a
// Debye slab (Debye's closed form, src/materials) and of the stepped ITU-R P.2040-3 concrete.
import { describe, expect, it } from 'vitest';
import { SpectraWatch } from '../../src/fdtd/convergence.ts';
import { pulseForBand, pulseValue } from '../../src/fdtd/pulse.ts';
import { createPulseRun, runToEndSync } from '../../src/fdtd/run.ts';
import { solveEffective } from '../../src/fdtd/stepped-exact.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { linspace } from '../../src/units.ts';
import { dft, maxDiff, runSpectrum } from './measure.ts';
import { bulk, material, stackOf } from './stacks.ts';

describe('SpectraWatch', () => {
  it('waits for a slowly decaying tail at the band’s bottom, and what it leaves is below a few thresholds', () => {
    const band: [number, number] = [1e9, 6e9], dt = 2e-12, threshold = 1e-4;
    const pulse = pulseForBand(band, dt), tau = 1.5e-9, a = 0.02, t1 = pulse.end_s;
    const n = Math.ceil(30e-9 / dt);
    const inc = new Float64Array(n), ref = new Float64Array(n), tra = new Float64Array(n);
    for (let k = 0; k < n; k++) {
      const t = k * dt;
      inc[k] = pulseValue(pulse, t);
      ref[k] = -0.3 * pulseValue(pulse, t - 0.2e-9) + (t >= t1 ? a * Math.exp(-(t - t1) / tau) : 0);
    }
    const watch = new SpectraWatch(band, dt, threshold);
    let settledAt = -1;
    for (let k = watch.every; k < n; k += watch.every) {
      watch.feed(inc, ref, tra, k);
      if (watch.check()) { settledAt = k; break; }
    }
    expect(settledAt).toBeGreaterThan(0);
    // The tail left after the stop, exactly: a Σ_{k ≥ K} r^k e^{−jωkΔt} = a r^K e^{−jωKΔt}/(1 − r e^{−jωΔt}), r = e^{−Δt/τ}.
    let worstLeft = 0;
    for (const f of linspace(band[0], band[1], 24)) {
      const I = dft(inc, dt, f), w = 2 * Math.PI * f * dt, r = Math.exp(-dt / tau), K = settledAt;
      const rk = a * Math.exp(-(K * dt - t1) / tau);
      const num = { re: rk * Math.cos(w * K), im: -rk * Math.sin(w * K) }, den = { re: 1 - r * Math.cos(w), im: r * Math.sin(w) };
      const left = Math.hypot(num.re, num.im) / Math.hypot(den.re, den.im);
      worstLeft = Math.max(worstLeft, left / Math.hypot(I.re, I.im));
    }
    expect(worstLeft).toBeLessThan(5 * threshold);
    // …and it did wait: a stop one window earlier would have left more than the threshold.
    expect(settledAt * dt - t1).toBeGreaterThan(3 * tau);
  });
});

describe('runs end on convergence, the band’s bottom included', () => {
  it('a Debye slab relaxing below the band (τ = 0.5 ns): within 0.3 × target at 1 GHz', () => {
    const slow = material('slow', { model: 'debye', eps_inf: 4, poles: [{ delta_eps: 6, tau_ps: 500 }], sigma_S_per_m: 0 });
    const stack = stackOf([bulk(slow, 15)], { band_GHz: [1, 6] });
    const run = runToEndSync(createPulseRun(stack));
    expect(run.doneReason).toBe('converged');
    const f = linspace(1e9, 6e9, 26);
    const err = maxDiff(runSpectrum(run, f), solveTmm(stack, f));
    expect(Math.max(err.R, err.T)).toBeLessThan(0.3 * run.plan.accuracyTarget);
    const bottom = maxDiff(runSpectrum(run, f.subarray(0, 1)), solveTmm(stack, f.subarray(0, 1)));
    expect(Math.max(bottom.R, bottom.T)).toBeLessThan(0.3 * run.plan.accuracyTarget);
    expect(run.energy().level_dB).toBeLessThanOrEqual(-run.plan.decay_dB);
  });

  it('ITU concrete, 20 mm, 1–10 GHz: the engine within 0.3 × target of the stepped media at every frequency', () => {
    const concrete = material('concrete', { model: 'power-law', a: 5.24, b: 0, c: 0.0462, d: 0.7822 });
    const stack = stackOf([bulk(concrete, 20)], { band_GHz: [1, 10] });
    const run = runToEndSync(createPulseRun(stack));
    expect(run.doneReason).toBe('converged');
    const f = linspace(1e9, 10e9, 37);
    const err = maxDiff(runSpectrum(run, f), solveEffective(run.plan.effective, f));
    expect(Math.max(err.R, err.T)).toBeLessThan(0.3 * run.plan.accuracyTarget);
  });

});
