// Detection on the envelope, on band spectra of echo trains in closed form (H = Σ a e^{−j2πfτ}, the
// shift theorem): peaks at the echoes' delays and levels, the band pulse's own sidelobes not taken for
// echoes, echoes closer than the pulse width grouped into one, and interference humps before the front
// face giving way to a later one.
import { describe, expect, it } from 'vitest';
import { bandPulse } from '../../src/echoes/band-pulse.ts';
import { bandSpectrumOf } from '../../src/echoes/band-response.ts';
import { detectEchoes, EARLIEST_WIDTHS } from '../../src/echoes/detect.ts';
import { analyticSamples } from '../../src/echoes/envelope.ts';

const band: [number, number] = [2e9, 10e9];
const W = bandPulse(band).width_s;

function detect(echoes: [number, number][], floor: number) {
  const S = bandSpectrumOf(band, 1 / 64e-9, (k, out) => {
    const f = k / 64e-9;
    out[0] = echoes.reduce((v, [tau, a]) => v + a * Math.cos(2 * Math.PI * f * tau), 0);
    out[1] = echoes.reduce((v, [tau, a]) => v - a * Math.sin(2 * Math.PI * f * tau), 0);
  });
  return detectEchoes(S, analyticSamples(S, W), band, { floor, earliest_s: -EARLIEST_WIDTHS * W, latest_s: 30e-9 });
}

describe('detection on the envelope', () => {
  it('finds separated echoes at their delays and levels, down to the floor', () => {
    const echoes: [number, number][] = [[0, -0.5], [3.5 * W, 0.2], [7 * W, -0.011], [10.5 * W, 0.009]];
    const d = detect(echoes, 0.01);
    expect(d.map((e) => e.members.length)).toEqual([1, 1, 1]);
    d.forEach((e, i) => {
      expect(Math.abs(e.t_s - echoes[i][0])).toBeLessThan(5e-4 * W); // 0.17 ps: the others' sidelobes, near −100 dB, still move a weak echo a little
      expect(e.level).toBeCloseTo(Math.abs(echoes[i][1]), 5);
      expect(Math.sign(e.re)).toBe(Math.sign(echoes[i][1])); // z(τ) = a Σ W: real, with the sign of a
    });
  });

  it("does not take the band pulse's own sidelobes (near −90 dB) for echoes", () => {
    expect(detect([[1e-9, 1]], 1e-6).length).toBe(1);
  });

  it('groups echoes closer than the pulse width into one, the strongest speaking for it', () => {
    const d = detect([[0, 0.3], [0.7 * W, -0.2]], 0.01);
    expect(d.length).toBe(1);
    expect(d[0].t_s).toBeGreaterThan(-W / 2);
    expect(d[0].t_s).toBeLessThan(1.2 * W);
  });

  it('is searched from delay −width/10 on: interference humps before it are not echoes', () => {
    // two opposite copies one carrier period apart (1/f0, half a width) cancel at the band centre:
    // H = 0.5 (1 − e^{−j2π(f − f0)/f0}), a differentiator, whose envelope has two equal humps either side
    // of the pair, the first one 0.2 widths before delay 0
    const d = detect([[0, 0.5], [1 / 6e9, -0.49]], 0.001);
    expect(d.length).toBe(1);
    expect(d[0].t_s).toBeGreaterThan(0.4 * W);
  });

  it('where the envelope falls from the start of the window, the start is the peak', () => {
    // a copy centred 0.3 widths before delay 0 (as interference can make one): its flank at −width/10
    const d = detect([[-0.3 * W, 0.5]], 0.01);
    expect(d.length).toBe(1);
    expect(d[0].t_s).toBe(-EARLIEST_WIDTHS * W);
    expect(d[0].level).toBeLessThan(0.5);
  });
});
