// The small linear-program solver behind the power-law fit, against problems with known answers:
// a two-variable LP solved by hand at the intersection of its constraints (vertex of the feasible region,
// common practice, no source), and the Chebyshev (minimax) line through four points, whose error must
// equioscillate at the optimum (Chebyshev's alternation theorem, e.g. Powell, Approximation Theory and
// Methods, 1981, ch. 7).
import { describe, expect, it } from 'vitest';
import { minimizeLp } from '../../src/fdtd/simplex.ts';

describe('minimizeLp (dense simplex on the dual)', () => {
  it('min x + y s.t. x + 2y ≥ 2, 3x + y ≥ 3: the vertex (0.8, 0.6), value 1.4', () => {
    const r = minimizeLp(Float64Array.of(1, 1), Float64Array.of(1, 2, 3, 1), Float64Array.of(2, 3), 2, 2);
    expect(r.optimal).toBe(true);
    expect(r.x[0]).toBeCloseTo(0.8, 12);
    expect(r.x[1]).toBeCloseTo(0.6, 12);
    expect(r.value).toBeCloseTo(1.4, 12);
  });

  it('the minimax line a + b·x through (0,1), (1,2.2), (2,2.9), (3,4.1) equioscillates (±0.125)', () => {
    const xs = [0, 1, 2, 3], ys = [1, 2.2, 2.9, 4.1];
    const m = 8, n = 3, G = new Float64Array(m * n), h = new Float64Array(m);
    xs.forEach((x, i) => { G.set([1, x, 1], 2 * i * n); h[2 * i] = ys[i]; G.set([-1, -x, 1], (2 * i + 1) * n); h[2 * i + 1] = -ys[i]; });
    const r = minimizeLp(Float64Array.of(0, 0, 1), G, h, m, n);
    expect(r.optimal).toBe(true);
    const res = xs.map((x, i) => r.x[0] + r.x[1] * x - ys[i]);
    // Alternation: the error reaches ±t at every point with alternating signs (here: 4 points, t = 0.125).
    for (let i = 0; i < 4; i++) expect(Math.abs(Math.abs(res[i]) - r.x[2])).toBeLessThan(1e-12);
    for (let i = 1; i < 4; i++) expect(Math.sign(res[i])).toBe(-Math.sign(res[i - 1]));
    expect(r.x[2]).toBeCloseTo(0.125, 12);
  });

  it('refuses a cost with a negative entry (the dual origin would not be feasible)', () => {
    expect(() => minimizeLp(Float64Array.of(-1), Float64Array.of(1), Float64Array.of(1), 1, 1)).toThrow(/c must be ≥ 0/);
  });
});
