// Echo attribution on synthetic echo lists with known delays (the expected names follow from the
// definitions in src/echoes/attribute.ts; the delays are chosen, not measured).
import { describe, expect, it } from 'vitest';
import { attributeEchoes } from '../../src/echoes/attribute.ts';
import type { PredictedEchoes } from '../../src/echoes/lattice.ts';

const W = 0.25e-9; // pulse width, s
const predicted = (delays: number[], amps: number[], names: string[]): PredictedEchoes => ({
  delay_s: Float64Array.from(delays), amp_re: Float64Array.from(amps), amp_im: new Float64Array(delays.length),
  roundTrips: delays.map(() => new Int32Array(0)), name: names,
});

describe('attributeEchoes', () => {
  const lattice = predicted([0, 4e-9], [-0.4, 0.05], ['front face', 'back face']);

  it('names matched echoes after their path and a weak tail next to a strong echo as its reshaping', () => {
    // front face; a reshaped tail of three weak copies, each 1.1 pulse widths after the last; the back face;
    // and an isolated weak echo far from anything.
    const t = Float64Array.from([0, 1.1 * W, 2.2 * W, 3.3 * W, 4e-9, 7e-9]);
    const a = Float64Array.from([-0.4, 0.02, -0.015, 0.01, 0.05, 0.004]);
    const { path, predicted_t_s } = attributeEchoes(t, a, lattice, W);
    expect(path[0]).toBe('front face');
    expect(path.slice(1, 4)).toEqual(Array(3).fill('reshaping of the front face echo'));
    expect(path[4]).toBe('back face');
    expect(path[5]).toBe('unmatched (nearest: back face)');
    expect(predicted_t_s[4]).toBe(4e-9);
  });

  it('does not call an echo reshaping when it is not much weaker than its neighbour', () => {
    const t = Float64Array.from([0, 1.5 * W]);
    const a = Float64Array.from([-0.4, 0.2]);
    expect(attributeEchoes(t, a, lattice, W).path[1]).toMatch(/^unmatched/);
  });
});
