// The FDTD refinement study: the Yee scheme is second order in Δx at a fixed Courant number
// (Taflove & Hagness, Computational Electrodynamics, 3rd ed., ch. 4), so halving the cell size should
// quarter the error against the exact solution of the media the engine steps.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fdtdStudy } from '../../src/report/converge.ts';
import { parseStackText } from '../../src/stack/parse.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { linspace } from '../../src/units.ts';

describe('fdtd convergence study', () => {
  it('shows order ≈ 2 on a brick wall and reports the power-law fit as a separate floor', () => {
    const parsed = parseStackText(readFileSync('presets/default.stack.json', 'utf8'));
    if (!parsed.ok) throw new Error(parsed.errors.join('\n'));
    const f = linspace(parsed.stack.band_Hz[0], parsed.stack.band_Hz[1], 41);
    const study = fdtdStudy(parsed.stack, solveTmm(parsed.stack, f), [20, 40, 80]);
    expect(study.modelFloor).not.toBeNull();
    expect(study.modelFloor!.T).toBeGreaterThan(0);
    const orders = study.rows.slice(1).map((r) => r.order_obs);
    for (const p of orders) { expect(p).toBeGreaterThan(1.7); expect(p).toBeLessThan(2.3); }
  });
});
