// materials --export NAME: a catalog material as a user material that solves exactly like the catalog entry, and
// whose parameters a study can then vary.
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { cli, tempDir } from './support.ts';

const tmp = tempDir();
afterAll(() => tmp.cleanup());

describe('slabecho materials --export', () => {
  it('prints a user material that gives the catalog material\'s spectrum, number for number', async () => {
    const r = await cli('materials', '--export', 'concrete');
    expect(r.code).toBe(0);
    const exported = JSON.parse(r.stdout);
    expect(Object.keys(exported)).toEqual(['concrete-custom']);
    expect(exported['concrete-custom']).toMatchObject({ model: 'power-law', a: 5.24, b: 0, c: 0.0462, d: 0.7822, valid_GHz: [1, 100] }); // ITU-R P.2040-3 Table 3
    const base = { title: 'Wall', band_GHz: [1, 6], points: 11, layers: [{ material: 'concrete', thickness_mm: 150 }] };
    const own = { ...base, materials: exported, layers: [{ material: 'concrete-custom', thickness_mm: 150 }] };
    const files = ['catalog', 'own'].map((n, i) => { const p = join(tmp.dir, `${n}.stack.json`); writeFileSync(p, JSON.stringify(i ? own : base)); return p; });
    for (const [i, f] of files.entries()) expect((await cli('solve', f, '--out', join(tmp.dir, `out-${i}`))).code).toBe(0);
    expect(readFileSync(join(tmp.dir, 'out-1', 'spectrum.csv'), 'utf8')).toBe(readFileSync(join(tmp.dir, 'out-0', 'spectrum.csv'), 'utf8'));
    const swept = await cli('sweep', files[1], '--out', join(tmp.dir, 'sweep'), '--set', 'materials.concrete-custom.a=5,5.5', '--methods', 'tmm');
    expect(swept.code).toBe(0);
  });

  it('picks the validity range that holds --at-GHz, mentions the other, and names an unknown material', async () => {
    const sub = await cli('materials', '--export', 'glass', '--at-GHz', '300');
    expect(JSON.parse(sub.stdout)['glass-custom']).toMatchObject({ a: 5.79, d: 1.658, valid_GHz: [220, 450] }); // P.2040-3 Table 3
    expect(sub.stderr).toMatch(/another validity range, 0\.1–100 GHz/);
    const water = JSON.parse((await cli('materials', '--export', 'water-25c')).stdout)['water-25c-custom'];
    expect(water.note).toMatch(/from memory/); // the catalog's caution travels with the copy
    const bad = await cli('materials', '--export', 'concret');
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/"concret" is not a catalog material \(did you mean "concrete"\?\)/);
  });
});
