// `slabecho bench`: the figures it prints are measured, consistent and finite (the speed itself is
// reported, never asserted).
import { describe, expect, it } from 'vitest';
import { cli } from './support.ts';

describe('slabecho bench', () => {
  it('--json prints one object whose rate is cells × steps / seconds, plus the FEM figure', async () => {
    const r = await cli('bench', '--cells', '2000', '--steps', '2000', '--json');
    expect(r.code).toBe(0);
    const o = JSON.parse(r.stdout);
    expect(o.cells).toBe(2000);
    expect(o.steps).toBe(2000);
    expect(o.seconds).toBeGreaterThan(0);
    // seconds is printed to 0.1 ms, so allow a few per cent of rounding
    expect(Math.abs(o.mcells_per_s / ((o.cells * o.steps) / o.seconds / 1e6) - 1)).toBeLessThan(0.05);
    expect(o.fem.frequencies).toBe(501);
    expect(o.fem.ms_per_solve).toBeGreaterThan(0);
    expect(o.fem.preset).toMatch(/\.stack\.json$/);
  });

  it('refuses a bad size with exit 2 naming the option', async () => {
    const r = await cli('bench', '--cells', '0');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--cells/);
  });
});
