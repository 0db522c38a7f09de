// The stepped media as an ordinary stack (`--media stepped`): the exact solver (src/tmm) on it must equal
// the exact solution of the engine's effective stack, normal and oblique TE (the shift ε − ε_front sin²θ
// of Born & Wolf §1.6 / Orfanidis ch. 7 is exact); the reports then compare all three methods on the same
// media, and the model's share against the ITU-R P.2040-3 tables stays in its own row. The stacks that
// once crashed the engine run through the command line.
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { resolveStack } from '../../src/fdtd/effective.ts';
import { atIncidence } from '../../src/fdtd/oblique.ts';
import { solveEffective } from '../../src/fdtd/stepped-exact.ts';
import { steppedStack } from '../../src/fdtd/stepped-stack.ts';
import { compareSpectra } from '../../src/report/agreement.ts';
import { runReport } from '../../src/report/run.ts';
import { solveReport } from '../../src/report/solve.ts';
import type { Stack } from '../../src/stack/types.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { linspace } from '../../src/units.ts';
import { cli, tempDir } from '../cli/support.ts';
import { bulk, material, sheet, stackOf } from './stacks.ts';

const concrete = material('concrete', { model: 'power-law', a: 5.24, b: 0, c: 0.0462, d: 0.7822 });
const glass = material('glass', { model: 'power-law', a: 6.31, b: 0, c: 0.0036, d: 1.3394 });
const metal = material('metal', { model: 'fixed', eps_r: 1, sigma_S_per_m: 1e7 });
const water = material('water', { model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: 73.16, tau_ps: 8.27 }], sigma_S_per_m: 0 });
const at = (s: Stack, deg: number): Stack => ({ ...s, incidence: { angle_rad: (deg * Math.PI) / 180, polarization: 'TE' } });
type Row = { pair: string; R_max: number; T_max: number; target?: number };

describe('the stepped stack', () => {
  it('its exact solution is the effective stack’s, films, sheets, walls and an angle included', () => {
    const stacks = [
      stackOf([bulk(glass, 4), bulk(metal, 0.0005), bulk(concrete, 30), sheet(80), bulk(water, 1)], { band_GHz: [1, 6] }),
      stackOf([bulk(concrete, 50), bulk(metal, 2), bulk(glass, 4)], { band_GHz: [2, 8] }),
      at(stackOf([bulk(concrete, 40), sheet(200), bulk(glass, 6)], { band_GHz: [1, 6], back: concrete }), 35),
    ];
    for (const stack of stacks) {
      const f = linspace(stack.band_Hz[0], stack.band_Hz[1], 31);
      const eff = atIncidence(resolveStack(stack).effective, stack.incidence, stack.band_Hz);
      const a = compareSpectra(solveTmm(steppedStack(stack), f), solveEffective(eff, f));
      expect(a.R_max).toBeLessThan(1e-12);
      expect(a.T_max).toBeLessThan(1e-12);
    }
  });

  it('solve --media stepped: FEM and the exact solver on the stepped media, the model share in its own row', () => {
    const stack = stackOf([bulk(concrete, 100)], { band_GHz: [1, 3], back: 'pec' });
    const rep = solveReport(stack, { media: 'stepped' });
    const rows = rep.agreement as Row[];
    const fem = rows.find((r) => r.pair === 'fem-tmm')!, share = rows.find((r) => r.pair === 'stepped media-tmm')!;
    expect(Math.max(fem.R_max, fem.T_max)).toBeLessThan(fem.target!);
    const f = linspace(1e9, 3e9, stack.points);
    const want = compareSpectra(solveEffective(resolveStack(stack).effective, f), solveTmm(stack, f));
    expect(share.R_max).toBeCloseTo(want.R_max, 12);
    expect(share.R_max).toBeGreaterThan(1e-4);
    expect(rep.summary.media).toBe('stepped');
    expect(rep.warnings.some((w) => w.startsWith('media:'))).toBe(true);
  });

  it('run --media stepped: every FDTD row is at the engine’s precision', async () => {
    const stack = stackOf([bulk(concrete, 40), bulk(glass, 6)], { band_GHz: [1, 4] });
    const rep = await runReport(stack, { media: 'stepped' });
    const rows = rep.agreement as Row[];
    const row = (p: string) => rows.find((r) => r.pair === p);
    for (const p of ['fdtd-tmm', 'fdtd-fem']) expect(Math.max(row(p)!.R_max, row(p)!.T_max)).toBeLessThan(0.3 * row(p)!.target!);
    expect(row('fdtd-tmm as stepped')).toBeUndefined();
    expect(row('stepped media-tmm')).toBeDefined();
  });
});

describe('the stacks that crashed the engine run (command line, exit 0)', () => {
  const tmp = tempDir();
  afterAll(tmp.cleanup);
  const write = (name: string, obj: unknown): string => { const p = join(tmp.dir, name); writeFileSync(p, JSON.stringify(obj)); return p; };
  const cases: [string, unknown][] = [
    ['lorentz-above.stack.json', { title: 'resonance far above the band', band_GHz: [1, 2.2], layers: [{ material: 'res', thickness_mm: 30 }], points: 41,
      materials: { res: { model: 'lorentz', eps_inf: 2.5, poles: [{ delta_eps: 3.56, f0_GHz: 46.5, gamma_GHz: 0.55 }], sigma_S_per_m: 0 } } }],
    ['drude-lossless.stack.json', { title: 'lossless plasma below its plasma frequency', band_GHz: [1, 5], layers: [{ material: 'pl', thickness_mm: 10 }], points: 41,
      materials: { pl: { model: 'drude', eps_inf: 1, plasma_GHz: 8, collision_GHz: 0, sigma_S_per_m: 0 } } }],
  ];
  for (const [name, obj] of cases) {
    for (const extra of [[], ['--courant', '0.5']]) {
      it(`${name} ${extra.join(' ')}`, async () => {
        const out = join(tmp.dir, `${name}${extra.length}`);
        const r = await cli('run', write(name, obj), '--out', out, ...extra);
        expect(r.code, r.stderr).toBe(0);
        const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
        expect(summary.run.end).toBe('converged');
        expect(summary.run.end_rule).toMatch(/settled at every check frequency/);
        const row = (summary.agreement as Row[]).find((x) => x.pair === 'fdtd-tmm')!;
        expect(Math.max(row.R_max, row.T_max)).toBeLessThan(0.3 * row.target!);
      });
    }
  }
});
