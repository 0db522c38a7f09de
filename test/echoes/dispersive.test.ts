// Echo tables of dispersive and lossy stacks against the exact band envelope: the exact solution's R(f)
// (and T(f)) times the band pulse's spectrum, inverse FFT, Hilbert envelope (support.ts). Materials:
// ITU-R P.2040-3 Table 3 power laws (concrete, brick, glass, medium-dry ground) and a single-pole Debye
// water (Kaatze 1989, from memory, as in the catalog). Records are synthesized from the exact solution,
// so the whole analysis (division by the incident spectrum, band window, envelope, detection, grouping)
// is under test and nothing else.
import { describe, expect, it } from 'vitest';
import { catalogMaterial } from '../../src/materials/catalog.ts';
import { analyseEchoes } from '../../src/echoes/table.ts';
import type { BulkMaterial, Stack } from '../../src/stack/types.ts';
import { dielectric, layer, makeStack } from '../support/build-stack.ts';
import { exactRecords, expectExact } from './support.ts';

const cat = (name: string) => catalogMaterial(name) as BulkMaterial;
const water: BulkMaterial = cat('water-25c');

const cases: [string, Stack][] = [
  ['150 mm ITU concrete on a conductor, 1–6 GHz', makeStack({ band_GHz: [1, 6], layers: [layer(cat('concrete'), 0.15)], back: 'pec' })],
  ['100 mm ITU brick in air, 1–6 GHz', makeStack({ band_GHz: [1, 6], layers: [layer(cat('brick'), 0.1)] })],
  ['20 mm ITU glass in air, 2–18 GHz', makeStack({ band_GHz: [2, 18], layers: [layer(cat('glass'), 0.02)] })],
  ['2 mm Debye water film on a 60 mm ε = 2.5 slab, 2–18 GHz', makeStack({ band_GHz: [2, 18], layers: [layer(water, 0.002), layer(dielectric(2.5, 0, 'slab'), 0.06)] })],
  ['120 mm ITU brick on a lossy soil half-space (ITU medium-dry ground), 1–4 GHz', makeStack({ band_GHz: [1, 4], layers: [layer(cat('brick'), 0.12)], back: cat('medium-dry-ground') })],
];

describe('echoes of dispersive and lossy stacks match the exact band envelope', () => {
  for (const [name, stack] of cases) {
    it(name, () => {
      const a = analyseEchoes(stack, exactRecords(stack));
      expectExact(stack, a.reflected, 'R');
      if (a.transmitted) expectExact(stack, a.transmitted, 'T');
      // nothing unexplained: every row is some bounce path
      expect(a.reflected.path).not.toContain('unexplained');
    });
  }
});
