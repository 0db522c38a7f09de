// The engine's phase velocity against the 1D Yee numerical dispersion relation
// (Taflove & Hagness, Computational Electrodynamics, 3rd ed., 2005, ch. 2/4):
//   [sin(ωΔt/2)/(vΔt)]² = [sin(k̃Δx/2)/Δx]²,
// and exact propagation at S = 1 in vacuum (the "magic time step", same source).
import { describe, expect, it } from 'vitest';
import { uniformGrid } from '../../src/fdtd/build.ts';
import { discreteWave } from '../../src/fdtd/discrete.ts';
import { updateE, updateH } from '../../src/fdtd/kernel.ts';
import { lineMedium, stepModelFixed } from '../../src/fdtd/media.ts';
import { pulseForBand, pulseValue } from '../../src/fdtd/pulse.ts';
import { C0_m_per_s } from '../../src/units.ts';
import { dft } from './measure.ts';

const band: [number, number] = [2e9, 6e9];

/** Drive node 0 of a long uniform grid and record two probes D cells apart. */
function probePair(eps: number, courant: number, cellsPerWavelengthAtTop: number, D: number) {
  const n = Math.sqrt(eps);
  const dx = C0_m_per_s / band[1] / n / cellsPerWavelengthAtTop;
  const dt = (courant * dx) / C0_m_per_s;
  const pulse = pulseForBand(band, dt);
  const p1 = 10, p2 = p1 + D;
  const steps = Math.ceil((2.2 * pulse.end_s) / dt + (D * n) / courant + 50);
  // Long enough that nothing comes back from the far wall within the record.
  const g = uniformGrid(p2 + steps + 2, lineMedium(stepModelFixed(eps)), { courant, dt_s: dt, band_Hz: band, pmlFront: 0, pmlBack: 0 });
  const a = new Float64Array(steps), b = new Float64Array(steps);
  for (let k = 0; k < steps; k++) {
    updateH(g); updateE(g);
    g.e[0] = pulseValue(pulse, (k + 1) * dt);
    a[k] = g.e[p1]; b[k] = g.e[p2];
  }
  return { a, b, dx, dt, n, pulse };
}

describe('FDTD numerical dispersion (Taflove & Hagness 1D Yee relation)', () => {
  const cases: Array<[number, number, number]> = [
    // [ε_r, S, cells per wavelength at the band top]
    [1, 0.5, 10],
    [1, 0.9, 8],
    [4, 1, 10],
    [4, 1, 20],
    [9, 0.7, 12],
  ];
  for (const [eps, S, N] of cases) {
    it(`ε_r = ${eps}, S = ${S}, ${N} cells/λ: measured k̃ matches the relation`, () => {
      const D = 60;
      const { a, b, dx, dt, n } = probePair(eps, S, N, D);
      for (const f of [3e9, 4.5e9, 6e9]) {
        const A = dft(a, dt, f), B = dft(b, dt, f);
        // Phase lag from p1 to p2 is k̃ D dx (mod 2π): unwrap against the exact k.
        let lag = Math.atan2(A.im, A.re) - Math.atan2(B.im, B.re);
        const kExact = (2 * Math.PI * f * n) / C0_m_per_s;
        const twoPi = 2 * Math.PI;
        lag += twoPi * Math.round((kExact * D * dx - lag) / twoPi);
        const kMeasured = lag / (D * dx);
        const kTheory = discreteWave(lineMedium(stepModelFixed(eps)), f, dx, dt, S).k.re; // the planner's k̃
        // The scheme's own k̃, not the exact k (they differ by far more than the tolerance at 8–10 cells/λ).
        expect(Math.abs(kMeasured - kTheory) / kTheory).toBeLessThan(2e-6);
        if (!(eps === 1 && S === 1)) expect(Math.abs(kTheory - kExact) / kExact).toBeGreaterThan(1e-4);
      }
    });
  }

  it('S = 1 in vacuum propagates exactly: a probe j cells away sees the source j steps later', () => {
    const { a, b } = probePair(1, 1, 10, 60);
    let worst = 0, peak = 0;
    for (let k = 60; k < a.length; k++) { worst = Math.max(worst, Math.abs(b[k] - a[k - 60])); peak = Math.max(peak, Math.abs(a[k])); }
    expect(peak).toBeGreaterThan(0.5);
    expect(worst / peak).toBeLessThan(1e-12);
  });
});
