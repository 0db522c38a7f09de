// `slabecho bench`: the figures it prints are measured, consistent and finite (the speed itself is
// reported, never asserted); it steps the production step with the engine it names.
import { describe, expect, it } from 'vitest';
import { cli } from './support.ts';

const json = async (...args: string[]) => {
  const r = await cli('bench', ...args, '--json');
  expect(r.stderr).toBe('');
  expect(r.code).toBe(0);
  return JSON.parse(r.stdout);
};

describe('slabecho bench', () => {
  it('--json prints one object whose rate is cells × steps / seconds, the engine, plus the FEM figure', async () => {
    const o = await json('--cells', '2000', '--steps', '2000');
    expect(o.cells).toBe(2000);
    expect(o.steps).toBe(2000);
    expect(o.seconds).toBeGreaterThan(0);
    // seconds is printed to 0.1 ms, so allow a few per cent of rounding
    expect(Math.abs(o.mcells_per_s / ((o.cells * o.steps) / o.seconds / 1e6) - 1)).toBeLessThan(0.05);
    expect(o.engine).toBe('wasm-simd');
    expect([o.debye_poles, o.lorentz_poles]).toEqual([0, 0]);
    expect(o.fem.frequencies).toBe(501);
    expect(o.fem.ms_per_solve).toBeGreaterThan(0);
    expect(o.fem.preset).toMatch(/\.stack\.json$/);
  });

  it('steps a dispersive medium with the poles asked for, with either engine', async () => {
    const fast = await json('--cells', '1000', '--steps', '300', '--debye-poles', '4', '--lorentz-poles', '2');
    expect([fast.debye_poles, fast.lorentz_poles, fast.engine]).toEqual([4, 2, 'wasm-simd']);
    const reference = await json('--cells', '1000', '--steps', '300', '--debye-poles', '1', '--engine', 'js');
    expect(reference.engine).toBe('js');
    expect(reference.cells).toBe(1000);
  });

  it('--stack times the stack’s planned grid (both grids counted)', async () => {
    const o = await json('--stack', 'presets/radome-panel.stack.json', '--steps', '200');
    expect(o.stack).toBe('presets/radome-panel.stack.json');
    expect(o.cells).toBeGreaterThan(100);
    expect(o.steps).toBe(200);
  });

  it('refuses a bad size, pole count or engine with exit 2 naming the option', async () => {
    for (const [args, name] of [[['--cells', '0'], '--cells'], [['--debye-poles', '40'], '--debye-poles'], [['--lorentz-poles', '1.5'], '--lorentz-poles'], [['--engine', 'gpu'], '--engine']] as const) {
      const r = await cli('bench', ...args);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(name);
    }
    const both = await cli('bench', '--stack', 'presets/radome-panel.stack.json', '--cells', '1000');
    expect(both.code).toBe(2);
    expect(both.stderr).toMatch(/--stack FILE sets the grid/);
  });
});
