// The echo tables of real pulse runs (small ones) against the exact band envelope (support.ts): the
// engine's records carry its own small errors, so this checks that the analysis keeps to the
// acceptance rules on them too. Debye water is stepped exactly by the engine; the ITU power laws of
// brick and ground are stepped as fitted causal models, whose residue is part of what is compared.
import { describe, expect, it } from 'vitest';
import { createPulseRun, runToEndSync } from '../../src/fdtd/run.ts';
import { catalogMaterial } from '../../src/materials/catalog.ts';
import { analyseEchoes } from '../../src/echoes/table.ts';
import type { BulkMaterial, Stack } from '../../src/stack/types.ts';
import { dielectric, layer, makeStack } from '../support/build-stack.ts';
import { expectExact } from './support.ts';

const cat = (name: string) => catalogMaterial(name) as BulkMaterial;

function run(stack: Stack) {
  const r = createPulseRun(stack);
  runToEndSync(r);
  return analyseEchoes(stack, r.records());
}

describe('echoes of pulse runs match the exact band envelope', () => {
  it('a 2 mm Debye water film on a 40 mm ε = 2.5 slab, 2–12 GHz', () => {
    const stack = makeStack({ band_GHz: [2, 12], layers: [layer(cat('water-25c'), 0.002), layer(dielectric(2.5, 0, 'slab'), 0.04)] });
    const a = run(stack);
    expectExact(stack, a.reflected, 'R');
    expectExact(stack, a.transmitted!, 'T');
    expect(a.reflected.path).not.toContain('unexplained');
  });

  it('120 mm ITU brick on ITU medium-dry ground (a lossy soil half-space), 1–4 GHz', () => {
    const stack = makeStack({ band_GHz: [1, 4], layers: [layer(cat('brick'), 0.12)], back: cat('medium-dry-ground') });
    const a = run(stack);
    expect(a.reflected.path).toEqual(['front face', 'back face']);
    expectExact(stack, a.reflected, 'R');
    expectExact(stack, a.transmitted!, 'T');
  });
});
