// The search's parts against closed forms: Halton's radical inverse (Halton, Numer. Math. 2, 1960: base 2 gives
// 1/2, 1/4, 3/4, 1/8 …, base 3 gives 1/3, 2/3, 1/9 …), Nelder–Mead and Levenberg–Marquardt on Rosenbrock's
// function (Rosenbrock, Computer J. 3, 1960: minimum 0 at (1, 1)), a minimum on a bound, and the search's
// contract: deterministic for a seed, within its budget, progress reported, stopped when asked.
import { describe, expect, it } from 'vitest';
import { haltonPoints, radicalInverse } from '../../src/tune/halton.ts';
import { search, type SearchProblem } from '../../src/tune/search.ts';

const rosenbrock = (leastSquares: boolean): SearchProblem => ({
  dims: 2, leastSquares, starts: [],
  evaluate(u) {
    const x = -2 + 4 * u[0], y = -2 + 4 * u[1]; // the cube [0, 1]² is [−2, 2]²
    const r = new Float64Array([10 * (y - x * x), 1 - x]);
    const f = r[0] ** 2 + r[1] ** 2;
    return { cost: f, objective: f, residuals: r };
  },
});

describe('Halton points', () => {
  it('radical inverses in bases 2 and 3', () => {
    expect([1, 2, 3, 4, 5, 6].map((i) => radicalInverse(i, 2))).toEqual([1 / 2, 1 / 4, 3 / 4, 1 / 8, 5 / 8, 3 / 8]);
    expect([1, 2, 3, 4].map((i) => radicalInverse(i, 3))).toEqual([1 / 3, 2 / 3, 1 / 9, 4 / 9]);
  });
  it('the same seed gives the same points, another seed others; every point in [0, 1)', () => {
    const a = haltonPoints(50, 3, 7), b = haltonPoints(50, 3, 7), c = haltonPoints(50, 3, 8);
    expect(a).toEqual(b);
    expect(a).not.toEqual(c);
    for (const p of a) for (const x of p) { expect(x).toBeGreaterThanOrEqual(0); expect(x).toBeLessThan(1); }
  });
  it('evenly spread: each of 10 slabs of each coordinate holds 10 ± 2 of 100 points', () => {
    for (const seed of [1, 2]) {
      const pts = haltonPoints(100, 4, seed);
      for (let k = 0; k < 4; k++) {
        const counts = new Array(10).fill(0);
        for (const p of pts) counts[Math.floor(p[k] * 10)]++;
        for (const c of counts) expect(Math.abs(c - 10)).toBeLessThanOrEqual(2);
      }
    }
  });
});

describe('search', () => {
  it('Nelder–Mead finds Rosenbrock’s minimum at (1, 1)', async () => {
    const r = await search(rosenbrock(false), { seed: 1, budget: 600 });
    expect(r.converged).toBe(true);
    expect(Math.abs(-2 + 4 * r.best!.u[0] - 1)).toBeLessThan(1e-4);
    expect(Math.abs(-2 + 4 * r.best!.u[1] - 1)).toBeLessThan(1e-4);
    expect(r.records.length).toBeLessThanOrEqual(600);
  });

  it('Levenberg–Marquardt finds it from its residuals, and the Jacobian there is the analytic one', async () => {
    const r = await search(rosenbrock(true), { seed: 1, budget: 300 });
    const x = -2 + 4 * r.best!.u[0];
    expect(Math.abs(x - 1)).toBeLessThan(1e-5);
    // ∂r/∂u = 4 ∂r/∂(x, y): r1 = 10(y − x²) → (−20x, 10); r2 = 1 − x → (−1, 0).
    expect(Array.from(r.jacobian!, (v) => v / 4)).toEqual([expect.closeTo(-20 * x, 4), expect.closeTo(10, 6), expect.closeTo(-1, 6), expect.closeTo(0, 6)]);
    expect(r.counts.jacobian).toBe(4);
  });

  it('stays in the bounds: a minimum outside the cube is found on its face', async () => {
    const p: SearchProblem = { dims: 2, leastSquares: false, starts: [], evaluate: (u) => { const f = (u[0] - 1.5) ** 2 + (u[1] - 0.3) ** 2; return { cost: f, objective: f }; } };
    const r = await search(p, { seed: 3, budget: 300 });
    expect(r.best!.u[0]).toBe(1);
    expect(r.best!.u[1]).toBeCloseTo(0.3, 5);
    for (const rec of r.records) for (const x of rec.u) { expect(x).toBeGreaterThanOrEqual(0); expect(x).toBeLessThanOrEqual(1); }
  });

  it('deterministic for a seed: the same evaluations in the same order', async () => {
    const a = await search(rosenbrock(false), { seed: 5, budget: 200 }), b = await search(rosenbrock(false), { seed: 5, budget: 200 });
    expect(a.records).toEqual(b.records);
  });

  it('reports progress and stops when asked, between batches', async () => {
    const slow: SearchProblem = { ...rosenbrock(false), evaluate(u) { const t = performance.now(); while (performance.now() - t < 2); return rosenbrock(false).evaluate(u); } };
    let reports = 0;
    const r = await search(slow, { seed: 1, budget: 10_000, onProgress: () => { reports++; }, shouldStop: () => reports >= 2 });
    expect(r.stopped).toBe(true);
    expect(reports).toBeGreaterThanOrEqual(2);
    expect(r.records.length).toBeLessThan(10_000);
  });
});
