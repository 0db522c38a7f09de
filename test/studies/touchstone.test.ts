// S-parameters and their Touchstone 2.0 files, read back with a small reader written from the format's rules.
import { describe, expect, it } from 'vitest';
import type { Complex } from '../../src/complex.ts';
import { bandFrequencies } from '../../src/results.ts';
import type { Stack } from '../../src/stack/types.ts';
import { quantitiesOf } from '../../src/studies/quantities.ts';
import { SParameterError, sParameters, type PlaneShift } from '../../src/studies/sparams.ts';
import { touchstoneExtension, touchstoneText } from '../../src/studies/touchstone.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { ETA0_ohm } from '../../src/units.ts';
import { AIR, bulk, dielectric, layer, magnetic, makeStack, sheet } from '../support/build-stack.ts';
import { readTouchstone, type TouchstoneData } from '../support/touchstone-reader.ts';

const DEG = Math.PI / 180;
const NO_SHIFT: PlaneShift = { front_m: 0, back_m: 0 };
const abs2 = (z: Complex) => z.re * z.re + z.im * z.im;

function fileOf(stack: Stack, shift = NO_SHIFT): { data: TouchstoneData; text: string; ext: string } {
  const exact = solveTmm(stack, bandFrequencies(stack));
  const s = sParameters(stack, exact, shift);
  const text = touchstoneText(stack, s, shift, 'test');
  return { data: readTouchstone(text), text, ext: touchstoneExtension(s) };
}

const CASES: Stack[] = [
  makeStack({ layers: [layer(dielectric(4.2, 0.01), 0.0008), layer(dielectric(1.1), 0.006), layer(dielectric(4.2, 0.01), 0.0008)], band_GHz: [8, 12], angle_deg: 40, polarization: 'TE' }),
  makeStack({ layers: [layer(dielectric(4.2, 0.01), 0.0008), layer(dielectric(1.1), 0.006), layer(dielectric(4.2, 0.01), 0.0008)], band_GHz: [8, 12], angle_deg: 40, polarization: 'TM' }),
  makeStack({ layers: [sheet(200), layer(magnetic(6, 0.02, 2, 0.4), 0.004), layer(dielectric(3), 0.01)], back: dielectric(2.25), angle_deg: 25, polarization: 'TM' }),
  makeStack({ layers: [layer(dielectric(5.24, 0.1), 0.2)], front: dielectric(1.5), back: AIR, band_GHz: [1, 3], angle_deg: 30, polarization: 'TE' }),
];

describe('Touchstone files', () => {
  it('read back to the solver\'s values: S11 = R, S21 = T √(Z_front/Z_back), frequencies in GHz (Touchstone 2.0)', () => {
    for (const stack of CASES) {
      const { data } = fileOf(stack);
      const f = bandFrequencies(stack), exact = solveTmm(stack, f);
      expect(data.version).toBe('2.0');
      expect(data.ports).toBe(2);
      const k = Math.sqrt(data.reference[0] / data.reference[1]);
      data.f_Hz.forEach((x, i) => {
        expect(x).toBeCloseTo(f[i], 0);
        expect(data.S[0][0][i].re).toBeCloseTo(exact.R_re[i], 11);
        expect(data.S[0][0][i].im).toBeCloseTo(exact.R_im[i], 11);
        expect(data.S[1][0][i].re).toBeCloseTo(exact.T_re[i] * k, 11);
        expect(data.S[1][0][i].im).toBeCloseTo(exact.T_im[i] * k, 11);
      });
    }
  });

  it('hold energy, |S11|² + |S21|² = 1 − absorbed, and reciprocity, S21 = S12 (Lorentz reciprocity; Pozar, Microwave Engineering §4.3)', () => {
    for (const stack of CASES) {
      const { data } = fileOf(stack);
      const q = quantitiesOf(stack, solveTmm(stack, bandFrequencies(stack)));
      data.f_Hz.forEach((_, i) => {
        expect(abs2(data.S[0][0][i]) + abs2(data.S[1][0][i])).toBeCloseTo(1 - q.absorbed[i], 10);
        expect(data.S[0][1][i].re).toBeCloseTo(data.S[1][0][i].re, 10);
        expect(data.S[0][1][i].im).toBeCloseTo(data.S[1][0][i].im, 10);
        expect(abs2(data.S[1][1][i]) + abs2(data.S[0][1][i])).toBeLessThanOrEqual(1 + 1e-10);
      });
    }
  });

  it('are unitary for a lossless stack: S^H S = I (Pozar §4.3)', () => {
    const stack = makeStack({ layers: [layer(dielectric(4), 0.01), layer(magnetic(2, 0, 3), 0.003), layer(dielectric(1.5), 0.02)], back: dielectric(2.25), angle_deg: 35, polarization: 'TE' });
    const { data } = fileOf(stack);
    const S = data.S;
    data.f_Hz.forEach((_, i) => {
      const [a, b, c, d] = [S[0][0][i], S[1][0][i], S[0][1][i], S[1][1][i]]; // S11 S21 S12 S22
      expect(abs2(a) + abs2(b)).toBeCloseTo(1, 10);
      expect(abs2(c) + abs2(d)).toBeCloseTo(1, 10);
      // column 1 orthogonal to column 2: conj(S11) S12 + conj(S21) S22 = 0
      expect(a.re * c.re + a.im * c.im + b.re * d.re + b.im * d.im).toBeCloseTo(0, 10);
      expect(a.re * c.im - a.im * c.re + b.re * d.im - b.im * d.re).toBeCloseTo(0, 10);
    });
  });

  it('give Fresnel\'s power and the wave impedances at an air–glass interface (Born & Wolf §1.5.3; Balanis ch. 5)', () => {
    for (const pol of ['TE', 'TM'] as const) {
      const theta = 40 * DEG, n = 1.5, c2 = Math.sqrt(1 - (Math.sin(theta) / n) ** 2);
      const { data } = fileOf(makeStack({ back: dielectric(n * n), angle_deg: 40, polarization: pol }));
      const Z1 = pol === 'TE' ? ETA0_ohm / Math.cos(theta) : ETA0_ohm * Math.cos(theta);
      const Z2 = pol === 'TE' ? ETA0_ohm / (n * c2) : (ETA0_ohm * c2) / n;
      expect(data.reference[0]).toBeCloseTo(Z1, 8);
      expect(data.reference[1]).toBeCloseTo(Z2, 8);
      const [r, t] = pol === 'TE'
        ? [(Math.cos(theta) - n * c2) / (Math.cos(theta) + n * c2), (2 * Math.cos(theta)) / (Math.cos(theta) + n * c2)]
        : [(n * Math.cos(theta) - c2) / (n * Math.cos(theta) + c2), (2 * Math.cos(theta)) / (n * Math.cos(theta) + c2)];
      expect(abs2(data.S[0][0][0])).toBeCloseTo(r * r, 11);
      expect(abs2(data.S[1][0][0])).toBeCloseTo(((n * c2) / Math.cos(theta)) * t * t, 11);
    }
  });

  it('moved reference planes equal the stack with that much air added in front and behind', () => {
    const layers = [layer(dielectric(4.2, 0.01), 0.0008), layer(dielectric(1.1), 0.006)];
    const shifted = fileOf(makeStack({ layers, band_GHz: [8, 12], angle_deg: 20, polarization: 'TM' }), { front_m: 0.011, back_m: 0.027 }).data;
    const padded = fileOf(makeStack({ layers: [layer(AIR, 0.011), ...layers, layer(AIR, 0.027)], band_GHz: [8, 12], angle_deg: 20, polarization: 'TM' })).data;
    for (const [i, j] of [[0, 0], [1, 0], [0, 1], [1, 1]]) {
      shifted.S[i][j].forEach((z, k) => {
        expect(z.re).toBeCloseTo(padded.S[i][j][k].re, 10);
        expect(z.im).toBeCloseTo(padded.S[i][j][k].im, 10);
      });
    }
    expect(shifted.comments.join('\n')).toMatch(/port 1: .* x = -11 mm[\s\S]*port 2: .* x = 33.8 mm/);
  });

  it('are one-port files behind a conductor, |S11| = 1 for a lossless layer', () => {
    const { data, ext } = fileOf(makeStack({ layers: [layer(dielectric(4), 0.01)], back: 'pec', angle_deg: 30 }));
    expect(ext).toBe('.s1p');
    expect(data.ports).toBe(1);
    for (const z of data.S[0][0]) expect(abs2(z)).toBeCloseTo(1, 11);
  });

  it('are ASCII only, whatever the stack\'s title', () => {
    const stack = { ...makeStack({ layers: [layer(dielectric(4), 0.01)] }), title: 'Façade – 30°' };
    const { text } = fileOf(stack);
    expect(/^[\x20-\x7e\n]*$/.test(text)).toBe(true);
  });

  it('are refused for a lossy, dispersive or evanescent half-space, naming it', () => {
    expect(() => fileOf(makeStack({ back: dielectric(4, 0.1) }))).toThrow(/^back: "eps4" gives no real wave impedance/);
    const water = bulk({ model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: 73.16, tau_ps: 8.27 }], sigma_S_per_m: 0 }, 'water');
    expect(() => fileOf(makeStack({ back: water }))).toThrow(SParameterError);
    const lorentz = bulk({ model: 'lorentz', eps_inf: 2, poles: [{ delta_eps: 1, f0_GHz: 50, gamma_GHz: 0 }], sigma_S_per_m: 0 }, 'resonant');
    expect(() => fileOf(makeStack({ back: lorentz }))).toThrow(/changes over the band/);
    expect(() => fileOf(makeStack({ front: dielectric(2.25), back: AIR, angle_deg: 60 }))).toThrow(/^back: .*evanescent/);
  });
});
