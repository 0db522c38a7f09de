// Echo tables of lossless, non-dispersive stacks against the multiple-reflection series (Born & Wolf,
// Principles of Optics, §1.6; Orfanidis, Electromagnetic Waves and Antennas, ch. 6): each bounce path
// arrives 2 d √ε/c later per round trip in a layer, with the product of the single-interface Fresnel
// coefficients r = (n1 − n2)/(n1 + n2), t = 1 + r along it (paths of equal crossings add). Records are
// synthesized from the exact solution (support.ts), so only the echo analysis is under test.
import { describe, expect, it } from 'vitest';
import { analyseEchoes, type EchoTable } from '../../src/echoes/table.ts';
import { dielectric, layer, makeStack, sheet } from '../support/build-stack.ts';
import { exactRecords } from './support.ts';

const C0 = 299792458;
const ETA0 = 376.730313668;
const dB = (a: number) => 20 * Math.log10(Math.abs(a));
/** One-way delay of a lossless layer, d √ε / c. */
const oneWay = (d: number, eps: number) => (d * Math.sqrt(eps)) / C0;

interface Expected { path: string; t_s: number; amplitude: number }

/** Each expected path is one row of its own: delay within 0.05 %, level within 0.2 dB, sign of the amplitude. */
function expectRows(table: EchoTable, expected: Expected[]) {
  expect(table.path).toEqual(expected.map((e) => e.path));
  expected.forEach((e, i) => {
    if (e.t_s === 0) expect(Math.abs(table.t_s[i])).toBeLessThan(1e-15 + 1e-4 * 1e-9);
    else expect(Math.abs(table.t_s[i] / e.t_s - 1)).toBeLessThan(5e-4);
    expect(Math.abs(table.level_dB[i] - dB(e.amplitude))).toBeLessThan(0.2);
    expect(Math.sign(table.amplitude[i])).toBe(Math.sign(e.amplitude));
    expect(table.resolved[i]).toBe(true);
  });
}

describe('echoes of lossless stacks: one row per path above the floor, at the series delays and levels', () => {
  it('a 100 mm slab of ε = 4 in air, 1–6 GHz', () => {
    // r01 = −1/3, t01 = 2/3, r10 = 1/3, t10 = 4/3; round trip 2 d √ε / c = 1.334 ns.
    // Terms: −1/3; t01 r10 t10 = 8/27; then × r10² per extra round trip: 8/243 (−29.7 dB), 8/2187 (−48.7 dB, below −40).
    const d = 0.1, stack = makeStack({ band_GHz: [1, 6], layers: [layer(dielectric(4, 0, 'slab'), d)] });
    const a = analyseEchoes(stack, exactRecords(stack));
    const rt = 2 * oneWay(d, 4);
    expectRows(a.reflected, [
      { path: 'front face', t_s: 0, amplitude: -1 / 3 },
      { path: 'back face', t_s: rt, amplitude: 8 / 27 },
      { path: 'back face, 2 round trips in layer 1 (slab)', t_s: 2 * rt, amplitude: 8 / 243 },
    ]);
    // Transmitted: t01 t10 = 8/9 after d √ε / c, then × r10² per round trip (8/81 at −20.1 dB, 8/729 at −39.2 dB).
    expectRows(a.transmitted!, [
      { path: 'direct', t_s: rt / 2, amplitude: 8 / 9 },
      { path: '1 round trip in layer 1 (slab)', t_s: 1.5 * rt, amplitude: 8 / 81 },
      { path: '2 round trips in layer 1 (slab)', t_s: 2.5 * rt, amplitude: 8 / 729 },
    ]);
  });

  it('two layers (ε 4, 50 mm; ε 2.25, 150 mm) in air, 2–10 GHz: a path reached by two orderings adds both', () => {
    // n = 2, 1.5, 1: r01 = −1/3, r10 = 1/3, r12 = 1/7, r2b = 1/5; t01 = 2/3, t10 = 4/3, t12 = 8/7, t21 = 6/7.
    // Back face with one more round trip in layer 1: that round trip comes before or after the one in
    // layer 2, two orderings of equal product: 2 · t01 r12 r10 t12 r2b t21 t10 (−35.6 dB).
    // Two round trips in each layer (−39.3 dB): each layer-1 round trip holds one in layer 2
    // (t01 t12 r2b t21 r10 t12 r2b t21 t10), or one holds both (r21 = −1/7 between them) and the other
    // turns at r12, in either order (2 · t01 r12 r10 t12 r2b r21 r2b t21 t10).
    const stack = makeStack({ band_GHz: [2, 10], layers: [layer(dielectric(4, 0, 'a'), 0.05), layer(dielectric(2.25, 0, 'b'), 0.15)] });
    const a = analyseEchoes(stack, exactRecords(stack));
    const t1 = 2 * oneWay(0.05, 4), t2 = 2 * oneWay(0.15, 2.25);
    const backFace = (2 / 3) * (8 / 7) * (1 / 5) * (6 / 7) * (4 / 3);
    expectRows(a.reflected, [
      { path: 'front face', t_s: 0, amplitude: -1 / 3 },
      { path: 'back of layer 1 (a)', t_s: t1, amplitude: (2 / 3) * (1 / 7) * (4 / 3) },
      { path: 'back face', t_s: t1 + t2, amplitude: backFace },
      { path: 'back face, 2 round trips in layer 1 (a)', t_s: 2 * t1 + t2, amplitude: 2 * (2 / 3) * (1 / 7) * (1 / 3) * (8 / 7) * (1 / 5) * (6 / 7) * (4 / 3) },
      {
        path: 'back face, 2 round trips in layer 1 (a), 2 round trips in layer 2 (b)', t_s: 2 * t1 + 2 * t2,
        amplitude: (2 / 3) * (8 / 7) * (1 / 5) * (6 / 7) * (1 / 3) * (8 / 7) * (1 / 5) * (6 / 7) * (4 / 3)
          + 2 * (2 / 3) * (1 / 7) * (1 / 3) * (8 / 7) * (1 / 5) * (-1 / 7) * (1 / 5) * (6 / 7) * (4 / 3),
      },
    ]);
  });

  it('a resistive sheet on the front face of a slab is named by its material in the rows it causes (floor −50 dB)', () => {
    // Sheet of R_s at the air/ε = 4 face: r = (Y0 − Y1 − G)/(Y0 + Y1 + G) with Y = n/η0, G = 1/R_s (the
    // sheet's shunt admittance in the ABCD product, physics reference); from inside, r' = (Y1 − Y0 − G)/(Y0 + Y1 + G).
    const Rs = 200, d = 0.1;
    const stack = makeStack({ band_GHz: [1, 6], layers: [sheet(Rs), layer(dielectric(4, 0, 'slab'), d)] });
    const a = analyseEchoes(stack, exactRecords(stack), { floor_dB: -50 });
    const Y0 = 1 / ETA0, Y1 = 2 / ETA0, G = 1 / Rs, den = Y0 + Y1 + G;
    // −4.6 dB, −19.0 dB, then × r' r_back per round trip: −43.4 dB (above −50), −67.8 dB
    const rFront = (Y0 - Y1 - G) / den, rInside = (Y1 - Y0 - G) / den, rBack = 1 / 3;
    const back = (1 + rFront) * rBack * (1 + rInside);
    const rt = 2 * oneWay(d, 4);
    expectRows(a.reflected, [
      { path: 'sheet200 (sheet, front face)', t_s: 0, amplitude: rFront },
      { path: 'back face', t_s: rt, amplitude: back },
      { path: 'back face, 2 round trips between sheet200 (sheet, front face) and back face', t_s: 2 * rt, amplitude: back * rInside * rBack },
    ]);
  });
});
