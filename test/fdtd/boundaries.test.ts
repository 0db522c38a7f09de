// Absorbing boundary and source separation, measured (issue 3 targets: CPML ≤ −60 dB over the band,
// TF/SF leakage ≤ −100 dB). CPML: Roden & Gedney, Microwave Opt. Tech. Lett. 27(5), 2000.
// Method (common practice, no source): the same source and probe in a grid ending in the CPML and in a
// reference grid long enough that nothing returns within the record; their difference is the CPML's
// reflection, divided by the reference spectrum at the probe.
import { describe, expect, it } from 'vitest';
import { uniformGrid } from '../../src/fdtd/build.ts';
import { updateE, updateH } from '../../src/fdtd/kernel.ts';
import { type StepModel, lineMedium, refractiveIndex, stepModelFixed, stepModelPermittivity } from '../../src/fdtd/media.ts';
import { pulseForBand, pulseValue } from '../../src/fdtd/pulse.ts';
import { DEFAULT_PML_CELLS } from '../../src/fdtd/plan.ts';
import { createPulseRun, runToEndSync } from '../../src/fdtd/run.ts';
import { C0_m_per_s } from '../../src/units.ts';
import { dft } from './measure.ts';
import { fixed, stackOf } from './stacks.ts';

const band: [number, number] = [1e9, 10e9];
const freqs = Array.from({ length: 19 }, (_, i) => band[0] + ((band[1] - band[0]) * i) / 18);

function cpmlReflection_dB(model: StepModel, courant: number, cells = DEFAULT_PML_CELLS): number {
  let nMax = 0;
  for (const f of freqs) nMax = Math.max(nMax, refractiveIndex(stepModelPermittivity(model, f)));
  const dx = C0_m_per_s / band[1] / nMax / 24, dt = (courant * dx) / C0_m_per_s;
  const pulse = pulseForBand(band, dt);
  const steps = Math.ceil((3 * pulse.end_s) / dt) + 3000;
  const src = cells + 10, probe = src + 10, end = probe + 10;
  const short = uniformGrid(end + cells + 1, lineMedium(model), { courant, dt_s: dt, band_Hz: band, pmlFront: cells, pmlBack: cells });
  const long = uniformGrid(end + steps + 10, lineMedium(model), { courant, dt_s: dt, band_Hz: band, pmlFront: cells, pmlBack: 0 });
  const diff = new Float64Array(steps), ref = new Float64Array(steps);
  for (let k = 0; k < steps; k++) {
    for (const g of [short, long]) { updateH(g); updateE(g); g.e[src] += pulseValue(pulse, (k + 1) * dt); }
    diff[k] = short.e[probe] - long.e[probe];
    ref[k] = long.e[probe];
  }
  let worst = -Infinity;
  for (const f of freqs) {
    const A = dft(diff, dt, f), B = dft(ref, dt, f);
    worst = Math.max(worst, 10 * Math.log10((A.re ** 2 + A.im ** 2) / (B.re ** 2 + B.im ** 2)));
  }
  return worst;
}

describe('CPML reflection over the band (target ≤ −60 dB)', () => {
  it('air at S = 1', () => { expect(cpmlReflection_dB(stepModelFixed(1), 1)).toBeLessThan(-60); });
  it('air at S = 0.6', () => { expect(cpmlReflection_dB(stepModelFixed(1), 0.6)).toBeLessThan(-60); });
  it('lossy dielectric ε_r = 5, σ = 0.1 S/m', () => { expect(cpmlReflection_dB(stepModelFixed(5, 0.1), 1)).toBeLessThan(-60); });
  it('Debye water (Kaatze 1989 pole, from memory: ε∞ 5.2, Δε 73.16, τ 8.27 ps)', () => {
    expect(cpmlReflection_dB({ epsInf: 5.2, sigma: 0, debye: [{ deps: 73.16, tau_s: 8.27e-12 }], osc: [] }, 1)).toBeLessThan(-60);
  });
  it('Drude medium (second-order pole)', () => {
    const w = 2 * Math.PI * 3e9;
    expect(cpmlReflection_dB({ epsInf: 2, sigma: 0, debye: [], osc: [{ c: w * w, w0sq: 0, gamma: 2 * Math.PI * 1e9 }] }, 0.9)).toBeLessThan(-60);
  });
  it('a thinner CPML reflects more (the measurement can fail)', () => {
    expect(cpmlReflection_dB(stepModelFixed(1), 1, 4)).toBeGreaterThan(cpmlReflection_dB(stepModelFixed(1), 1, 24) + 20);
  });
});

describe('TF/SF leakage with no stack (target ≤ −100 dB)', () => {
  for (const [name, front] of [['air', fixed(1)], ['lossy front medium', fixed(3, 0.02)]] as const) {
    it(`${name}: the scattered-field region and total − incident at x = 0 stay empty`, () => {
      const run = createPulseRun(stackOf([], { front, back: front, band_GHz: [1, 10] }));
      runToEndSync(run);
      expect(run.doneReason).toBe('converged');
      const r = run.records();
      let worstSf = -Infinity, worstRef = -Infinity;
      for (const f of freqs) {
        const I = dft(r.incident, r.dt_s, f);
        const i2 = I.re ** 2 + I.im ** 2;
        const S = dft(r.scatteredProbe, r.dt_s, f), R = dft(r.reflected, r.dt_s, f);
        worstSf = Math.max(worstSf, 10 * Math.log10((S.re ** 2 + S.im ** 2) / i2 + 1e-300));
        worstRef = Math.max(worstRef, 10 * Math.log10((R.re ** 2 + R.im ** 2) / i2 + 1e-300));
      }
      let peak = 0;
      for (const v of r.incident) peak = Math.max(peak, Math.abs(v));
      expect(peak).toBeGreaterThan(0.1);
      expect(worstSf).toBeLessThan(-100);
      expect(worstRef).toBeLessThan(-100);
    });
  }
});
