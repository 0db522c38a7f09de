// Tolerance studies: deterministic draws, and percentiles that converge to what a first-order (linear) model of the
// quantity in the varied value predicts, with the normal distribution's quantiles from the tables.
import { describe, expect, it } from 'vitest';
import { bandFrequencies } from '../../src/results.ts';
import { parseStackObject } from '../../src/stack/parse.ts';
import { Mt19937 } from '../../src/studies/random.ts';
import {
  drawSamples, parseVary, runToleranceSample, SampleTable, TOLERANCE_QUANTITIES, type TolerancePlan,
} from '../../src/studies/tolerance.ts';
import { C0_m_per_s } from '../../src/units.ts';
import { slabAt } from '../support/half-wave-slab.ts';

// Standard normal quantiles (Abramowitz & Stegun, Handbook of Mathematical Functions, 26.2 table):
const Z95 = 1.6448536269514722; // Φ⁻¹(0.95)
const Z975 = 1.959963984540054; // Φ⁻¹(0.975): χ²₁'s 95th percentile is its square
const Z525 = 0.06270677794321385; // Φ⁻¹(0.525): χ²₁'s 5th percentile is its square
const PHI = (z: number) => Math.exp(-z * z / 2) / Math.sqrt(2 * Math.PI);

/** A lossless ε_r = 4 slab in air, half a wave thick at f0, solved at an off-design frequency and at f0. */
const D0_MM = 25;
const F0 = C0_m_per_s / (2 * 2 * D0_MM * 1e-3); // 2.998 GHz
const F1 = 2.25e9;

function plan(vary: string, samples: number, seed = 11): { plan: TolerancePlan; f_Hz: Float64Array } {
  const r = parseStackObject({
    title: 'Half-wave slab', band_GHz: [F1 / 1e9, F0 / 1e9], points: 2,
    materials: { slab: { model: 'fixed', eps_r: 4, sigma_S_per_m: 0 } },
    layers: [{ material: 'slab', thickness_mm: D0_MM }],
  });
  if (!r.ok) throw new Error(r.errors.join('\n'));
  return { plan: { base: r.file, varies: [parseVary(vary, r.file)], samples, seed }, f_Hz: bandFrequencies(r.stack) };
}

function run(p: TolerancePlan, f_Hz: Float64Array): Record<string, Float64Array> {
  const values = drawSamples(p);
  const table = new SampleTable(f_Hz.length, p.samples);
  for (let s = 0; s < p.samples; s++) {
    const o = runToleranceSample(p, values, s);
    table.add(s, o.quantities, o.extremes);
  }
  return Object.fromEntries(table.percentileColumns(f_Hz).map((c) => [c.name, c.data]));
}

describe('tolerance draws', () => {
  it('are the generator\'s normals scaled to the SD, the same for a seed, and uniform draws stay within ±HALF', () => {
    const { plan: p } = plan('layers[0].thickness_mm:normal:0.2', 50, 5);
    const values = drawSamples(p);
    const g = new Mt19937(5);
    for (let s = 0; s < 50; s++) expect(values[s]).toBe(D0_MM + 0.2 * g.normal());
    expect(Array.from(drawSamples(p))).toEqual(Array.from(values));
    const u = drawSamples(plan('layers[0].thickness_mm:uniform:0.5', 2000).plan);
    expect(Math.min(...u)).toBeGreaterThanOrEqual(D0_MM - 0.5);
    expect(Math.max(...u)).toBeLessThanOrEqual(D0_MM + 0.5);
  });

  it('refuse paths that would change the frequencies, texts, and unset keys', () => {
    const { plan: p } = plan('layers[0].thickness_mm:normal:0.2', 2);
    expect(() => parseVary('band_GHz[0]:normal:0.1', p.base)).toThrow(/share the frequencies/);
    expect(() => parseVary('layers[0].material:normal:1', p.base)).toThrow(/holds a text/);
    expect(() => parseVary('layers[0].thickness_mm:gauss:1', p.base)).toThrow(/:normal:SD or .*:uniform:HALF/);
    expect(() => parseVary('layers[0].thickness_mm:normal:-1', p.base)).toThrow(/≥ 0/);
  });
});

describe('tolerance percentiles', () => {
  const SD = 0.05; // mm: k δ ≈ 0.006 rad, so the first-order model holds to well under a percent
  const N = 20000;
  const { plan: p, f_Hz } = plan(`layers[0].thickness_mm:normal:${SD}`, N);
  const q = run(p, f_Hz);
  const sd_m = SD * 1e-3;

  it('p50 of a small symmetric variation is the nominal value within the median\'s sampling error (off design)', () => {
    // At F1 every quantity is linear in δ to first order: the median of a + bδ is a; its standard error is
    // √(π/2) σ/√N for a normal sample (Kendall & Stuart, The Advanced Theory of Statistics, vol. 1, §10.10).
    const nominal = run({ ...p, varies: [{ ...p.varies[0], width: 0 }], samples: 2 }, f_Hz);
    const s = slabAt(F1, D0_MM * 1e-3);
    const sigma: Record<string, number> = {
      R_power: Math.abs(2 * (s.R.re * s.dR.re + s.R.im * s.dR.im)) * sd_m,
      IPD_deg: Math.abs(s.dIPD_deg) * sd_m,
    };
    for (const name of ['R_power', 'IPD_deg']) {
      const se = Math.sqrt(Math.PI / 2) * sigma[name] / Math.sqrt(N);
      expect(Math.abs(q[`${name}_p50`][0] - nominal[`${name}_p50`][0])).toBeLessThan(4 * se);
    }
    for (const name of TOLERANCE_QUANTITIES) expect(q[`${name}_p05`][0]).toBeLessThanOrEqual(q[`${name}_p95`][0]);
  });

  it('p05 and p95 off design match the linearisation a ± 1.645 b SD to a few percent of the spread', () => {
    const s = slabAt(F1, D0_MM * 1e-3);
    const slopeR = 2 * (s.R.re * s.dR.re + s.R.im * s.dR.im); // d|R|²/dd
    const R0 = s.R.re ** 2 + s.R.im ** 2;
    const halfR = Z95 * Math.abs(slopeR) * sd_m;
    expect(Math.abs(q.R_power_p95[0] - (R0 + halfR)) / halfR).toBeLessThan(0.03);
    expect(Math.abs(q.R_power_p05[0] - (R0 - halfR)) / halfR).toBeLessThan(0.03);
    const nominalIPD = run({ ...p, varies: [{ ...p.varies[0], width: 0 }], samples: 2 }, f_Hz).IPD_deg_p50[0];
    const halfIPD = Z95 * Math.abs(s.dIPD_deg) * sd_m;
    expect(Math.abs(q.IPD_deg_p95[0] - (nominalIPD + halfIPD)) / halfIPD).toBeLessThan(0.03);
    expect(Math.abs(q.IPD_deg_p05[0] - (nominalIPD - halfIPD)) / halfIPD).toBeLessThan(0.03);
  });

  it('at the half-wave design R_power is |R\'|² δ²: p95 and p05 are χ²₁ quantiles times |R\'|² SD² (Orfanidis ch. 5)', () => {
    const s = slabAt(F0, D0_MM * 1e-3);
    expect(Math.hypot(s.R.re, s.R.im)).toBeLessThan(1e-12);
    const scale = (s.dR.re ** 2 + s.dR.im ** 2) * sd_m * sd_m;
    const p95 = Z975 * Z975 * scale, p05 = Z525 * Z525 * scale;
    expect(Math.abs(q.R_power_p95[1] - p95) / p95).toBeLessThan(0.03);
    // The 5th percentile of δ² sits where |δ| is smallest: its sampling error is √(0.05·0.95/N) / (2φ(z)) in z,
    // about 2.8 % of z here, 5.5 % in z² (Kendall & Stuart §10.10): allow three standard errors.
    const seRel = (2 * Math.sqrt(0.05 * 0.95 / N)) / (2 * PHI(Z525) * Z525);
    expect(Math.abs(q.R_power_p05[1] - p05) / p05).toBeLessThan(3 * seRel);
    // T_power = 1 − R_power for a lossless slab, so its percentiles mirror R_power's
    expect(q.T_power_p05[1]).toBeCloseTo(1 - q.R_power_p95[1], 12);
    expect(q.absorbed_p95[1]).toBeLessThan(1e-12);
  });
});
