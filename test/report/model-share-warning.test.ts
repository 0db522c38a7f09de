// The warning that tells a missed target from the material model's share apart from the engine's own error.
// The rows are built here by hand: the check is of the wording's logic, the figures themselves are measured in
// test/fdtd (engine error) and bench/walls.ts (model share). Common practice, no source: a report names which
// of two error sources broke its target.
import { describe, expect, it } from 'vitest';
import { modelShareWarning } from '../../src/report/fdtd-agreement.ts';
import type { AgreementRow } from '../../src/report/format-agreement.ts';

const row = (pair: string, R_max: number, T_max: number): AgreementRow => ({ pair, R_max, R_worst_f_GHz: 2, T_max, T_worst_f_GHz: 17.92 });

describe('modelShareWarning', () => {
  it('names the share, its frequency and the engine error when the share passes the target', () => {
    const w = modelShareWarning([row('fdtd-tmm', 3e-3, 1.6e-2), row('fdtd-tmm as stepped', 1e-3, 2e-3), row('stepped media-tmm', 2e-3, 1.4e-2)], 0.01);
    expect(w).toContain('max|dT| 1.4e-2 at 17.92 GHz');
    expect(w).toContain("engine's own error is 2.0e-3");
    expect(w).toContain('--media stepped');
  });
  it('speaks when the share and the engine error, each within the target, add up to a miss (250 mm brick at 2–18 GHz)', () => {
    const w = modelShareWarning([row('fdtd-tmm', 2.9e-3, 1.1e-2), row('fdtd-tmm as stepped', 5.4e-4, 1.9e-3), row('stepped media-tmm', 2.7e-3, 9.4e-3)], 0.01);
    expect(w).toContain('max|dT| 9.4e-3');
  });
  it('stays silent when the engine itself misses (a grid matter, not the model)', () => {
    expect(modelShareWarning([row('fdtd-tmm', 3e-2, 3e-2), row('fdtd-tmm as stepped', 2e-2, 2e-2), row('stepped media-tmm', 1.2e-2, 1e-3)], 0.01)).toBeNull();
  });
  it('stays silent when the share is within the target, or when nothing was substituted', () => {
    expect(modelShareWarning([row('fdtd-tmm', 3e-3, 3e-3), row('fdtd-tmm as stepped', 1e-3, 2e-3), row('stepped media-tmm', 2e-3, 9e-3)], 0.01)).toBeNull();
    expect(modelShareWarning([row('fdtd-tmm', 3e-2, 3e-2)], 0.01)).toBeNull();
  });
});

describe('modelShareWarning behind a conductor', () => {
  it('leaves out T, which is zero there', () => {
    const w = modelShareWarning([row('fdtd-tmm as stepped', 1.9e-3, 0), row('stepped media-tmm', 1.2e-2, 0)], 0.01);
    expect(w).toContain('max|dR| 1.2e-2');
    expect(w).not.toContain('max|dT|');
  });
});
