// The FDTD refinement study: the Yee scheme is second order in Δx at a fixed Courant number
// (Taflove & Hagness, Computational Electrodynamics, 3rd ed., ch. 4), so halving the cell size should
// quarter the engine's error against the exact solution of the media it steps (src/tmm on the stepped
// media). The error against the stack as written cannot fall below the model share of the fitted power law.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fdtdStudy, formatFdtdStudy } from '../../src/report/converge.ts';
import { parseStackText } from '../../src/stack/parse.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { linspace } from '../../src/units.ts';

describe('fdtd convergence study', () => {
  it('shows order ≈ 2 for the engine on a brick wall and keeps the model share apart, saying when the engine is below it', () => {
    const parsed = parseStackText(readFileSync('presets/default.stack.json', 'utf8'));
    if (!parsed.ok) throw new Error(parsed.errors.join('\n'));
    const f = linspace(parsed.stack.band_Hz[0], parsed.stack.band_Hz[1], 41);
    const study = fdtdStudy(parsed.stack, solveTmm(parsed.stack, f), [20, 40, 80]);
    expect(study.modelShare).not.toBeNull();
    const share = Math.max(study.modelShare!.R, study.modelShare!.T);
    expect(share).toBeGreaterThan(0);
    for (const r of study.rows.slice(1)) { expect(r.engineOrder).toBeGreaterThan(1.7); expect(r.engineOrder).toBeLessThan(2.3); }
    // The total error is bounded below by the model share (triangle inequality), whatever the grid.
    for (const r of study.rows) expect(Math.max(r.total.R, r.total.T)).toBeGreaterThan(0.5 * share);
    const text = formatFdtdStudy(study);
    if (study.engineBelowShareFrom !== null) expect(text).toMatch(/already below the model share/);
    expect(text).toMatch(/model share, max\|dR\|/);
  });
});
