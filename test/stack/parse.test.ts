// Stack-file validation: every bad input named in the foundation issue is refused with the field path,
// every problem is reported (not just the first), defaults are filled in, and warnings do not fail.
import { describe, expect, it } from 'vitest';
import { parseStackObject, parseStackText, type ParseResult } from '../../src/stack/parse.ts';
import { toStackFile } from '../../src/stack/file.ts';

const base = (): Record<string, unknown> => ({ band_GHz: [1, 6], layers: [{ material: 'concrete', thickness_mm: 150 }] });
const withBase = (extra: Record<string, unknown>) => ({ ...base(), ...extra });

function errors(r: ParseResult): string[] {
  if (r.ok) throw new Error(`expected errors, got a valid stack (warnings: ${r.warnings.join('; ')})`);
  return r.errors;
}
/** Assert that some error line names `path` (exactly, at the start) and, if given, contains `text`. */
function expectError(input: unknown, path: string, text?: string | RegExp): string[] {
  const errs = errors(typeof input === 'string' ? parseStackText(input) : parseStackObject(input));
  const line = errs.find((e) => e.startsWith(`${path}: `));
  expect(line, `no error for ${path} in:\n${errs.join('\n')}`).toBeDefined();
  if (text !== undefined) expect(line).toMatch(text);
  return errs;
}
function ok(input: unknown) {
  const r = typeof input === 'string' ? parseStackText(input) : parseStackObject(input);
  if (!r.ok) throw new Error(`expected a valid stack, got:\n${r.errors.join('\n')}`);
  return r;
}

describe('valid files and defaults', () => {
  it('fills in the defaults: front/back air, TE at 0°, band-centre profile, 501 points, title', () => {
    const r = ok({ band_GHz: [1, 6], layers: [] });
    expect(r.file).toMatchObject({
      title: 'Untitled stack', front: 'air', back: 'air', layers: [],
      incidence: { angle_deg: 0, polarization: 'TE' }, profile_GHz: 3.5, points: 501,
    });
    expect(r.stack.band_Hz).toEqual([1e9, 6e9]);
    expect(r.stack.profile_Hz).toBe(3.5e9);
    expect(r.stack.incidence).toEqual({ angle_rad: 0, polarization: 'TE' });
    expect(r.stack.front.name).toBe('air');
    expect(r.stack.back).not.toBe('pec');
    expect(r.warnings).toEqual([]);
  });

  it('accepts the example of the foundation issue, every model, in SI inside', () => {
    const r = ok({
      title: 'Meeting-room partition', band_GHz: [1, 12], front: 'air',
      layers: [
        { material: 'plasterboard', thickness_mm: 12.5 }, { material: 'air', thickness_mm: 75 }, { material: 'film' },
        { material: 'foam', thickness_mm: 1 }, { material: 'water', thickness_mm: 1 }, { material: 'res', thickness_mm: 1 },
        { material: 'plasma', thickness_mm: 1 }, { material: 'mix', thickness_mm: 1 },
      ],
      back: 'air',
      materials: {
        film: { model: 'sheet', ohm_per_sq: 377 },
        foam: { model: 'fixed', eps_r: 1.07, sigma_S_per_m: 0 },
        water: { model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: 73.16, tau_ps: 8.27 }], sigma_S_per_m: 0 },
        res: { model: 'lorentz', eps_inf: 2, poles: [{ delta_eps: 1, f0_GHz: 6, gamma_GHz: 0.5 }] },
        plasma: { model: 'drude', eps_inf: 1, plasma_GHz: 20, collision_GHz: 1 },
        mix: { model: 'power-law', a: 4, b: 0, c: 0.02, d: 0.8 },
      },
      incidence: { angle_deg: 0, polarization: 'TE' }, profile_GHz: 5.5, points: 501,
    });
    expect(r.stack.layers.map((l) => l.kind)).toEqual(['bulk', 'bulk', 'sheet', 'bulk', 'bulk', 'bulk', 'bulk', 'bulk']);
    const l0 = r.stack.layers[0];
    expect(l0.kind === 'bulk' && l0.thickness_m).toBeCloseTo(0.0125, 15);
    expect(r.stack.layers[1].material.source).toContain('vacuum');
    expect(r.stack.layers[3].material.source).toBe('user');
    // The lorentz default σ = 0 is filled in.
    expect(r.file.materials.res).toMatchObject({ sigma_S_per_m: 0 });
    expect(r.stack.profile_Hz).toBe(5.5e9);
    expect(r.warnings).toEqual([]);
  });

  it('accepts pec as back and records it', () => {
    const r = ok(withBase({ back: 'pec' }));
    expect(r.stack.back).toBe('pec');
    expect(r.file.back).toBe('pec');
  });

  it('round-trips through toStackFile', () => {
    const r = ok(withBase({ layers: [{ material: 'glass', thickness_mm: 4 }, { material: 'coat' }], back: 'pec',
      materials: { coat: { model: 'sheet', ohm_per_sq: 20, note: 'n', valid_GHz: [1, 10] } },
      incidence: { angle_deg: 30, polarization: 'TM' } }));
    const again = ok(JSON.parse(JSON.stringify(toStackFile(r.stack))));
    expect(again.file.layers).toEqual(r.file.layers);
    expect(again.file.materials.coat).toEqual({ model: 'sheet', ohm_per_sq: 20, note: 'n', valid_GHz: [1, 10] });
    expect(again.file.incidence.angle_deg).toBeCloseTo(30, 12);
    expect(again.file.band_GHz).toEqual([1, 6]);
  });

  it('gives the stack private copies of catalog materials', () => {
    const r = ok(base());
    const m = r.stack.layers[0].material;
    expect(Object.isFrozen(m)).toBe(false);
  });
});

describe('bad input: syntax and top level', () => {
  it('invalid JSON says where (line and column)', () => {
    const errs = expectError('{\n  "band_GHz": [1, 6],\n  "layers": [ {"material": "brick", "thickness_mm": 10,} ]\n}', 'file', /line 3, column 56: trailing comma/);
    expect(errs).toHaveLength(1);
    expectError('{"band_GHz": [1, 6]', 'file', /line 1, column 20: unexpected end of input/);
    expectError('{"band_GHz": [1, tru]}', 'file', /line 1, column 18/);
    expectError('', 'file', /line 1, column 1/);
  });

  it('a top level that is not an object', () => {
    for (const v of [[], 3, 'x', null, true, new Date()]) {
      const errs = errors(parseStackObject(v));
      expect(errs).toHaveLength(1);
      expect(errs[0]).toMatch(/^\(top level\): must be a JSON object/);
    }
    expectError('[1, 2]', '(top level)');
  });

  it('text over 1 MB', () => {
    const big = JSON.stringify({ ...base(), title: 'x'.repeat(10) }) + ' '.repeat(1_000_001);
    expectError(big, 'file', /over the 1 MB limit/);
  });

  it('unknown keys are refused with a hint (typos)', () => {
    expectError(withBase({ layer: [] }), 'layer', /unknown key \(did you mean "layers"\?\)/);
    expectError(withBase({ incidence: { angle: 10 } }), 'incidence.angle', /did you mean "angle_deg"/);
    expectError(withBase({ layers: [{ material: 'brick', thickness: 10 }] }), 'layers[0].thickness', /did you mean "thickness_mm"/);
    expectError(withBase({ materials: { f: { model: 'fixed', eps_r: 2, sigma: 0 } } }), 'materials.f.sigma', /unknown key/);
    expectError(withBase({ materials: { f: { model: 'debye', eps_inf: 2, poles: [{ delta_eps: 1, tau_ps: 1, tau: 2 }] } } }),
      'materials.f.poles[0].tau', /unknown key/);
  });

  it('collects every problem, not just the first', () => {
    const errs = errors(parseStackObject({
      band_GHz: [6, 1], layers: [{ material: 'brick', thickness_mm: 0 }, { material: 'nope', thickness_mm: 1 }],
      points: 1, incidence: { angle_deg: -1, polarization: 'XY' },
    }));
    for (const path of ['band_GHz', 'layers[0].thickness_mm', 'layers[1].material', 'points', 'incidence.angle_deg', 'incidence.polarization']) {
      expect(errs.some((e) => e.startsWith(`${path}: `)), path).toBe(true);
    }
  });
});

describe('bad input: band, points, profile', () => {
  it('missing or empty band', () => {
    expectError({ layers: [] }, 'band_GHz', /required/);
    expectError({ band_GHz: [] }, 'band_GHz', /two numbers \(got an empty list\)/);
    expectError({ band_GHz: [1] }, 'band_GHz');
    expectError({ band_GHz: [1, 2, 3] }, 'band_GHz');
    expectError({ band_GHz: 5 }, 'band_GHz');
  });
  it('min ≥ max', () => {
    expectError({ band_GHz: [6, 1] }, 'band_GHz', /min must be below max/);
    expectError({ band_GHz: [2, 2] }, 'band_GHz', /min must be below max/);
  });
  it('non-positive frequencies', () => {
    expectError({ band_GHz: [0, 1] }, 'band_GHz[0]', /must be a number > 0 \(got 0\)/);
    expectError({ band_GHz: [-1, 1] }, 'band_GHz[0]', /> 0/);
    expectError(withBase({ profile_GHz: 0 }), 'profile_GHz');
    expectError(withBase({ profile_GHz: -2 }), 'profile_GHz');
  });
  it('wrong types: "12" for a number', () => {
    expectError({ band_GHz: ['1', 6] }, 'band_GHz[0]', /got the string "1"/);
    expectError(withBase({ points: '501' }), 'points', /got the string "501"/);
    expectError(withBase({ layers: [{ material: 'brick', thickness_mm: '12' }] }), 'layers[0].thickness_mm', /must be a number > 0 \(got the string "12"\)/);
    expectError(withBase({ incidence: { angle_deg: '10' } }), 'incidence.angle_deg');
    expectError(withBase({ title: 12 }), 'title');
    expectError(withBase({ front: 1 }), 'front');
    expectError(withBase({ back: null }), 'back');
    expectError(withBase({ layers: {} }), 'layers');
    expectError(withBase({ layers: ['brick'] }), 'layers[0]');
    expectError(withBase({ layers: [{ material: 3, thickness_mm: 1 }] }), 'layers[0].material');
    expectError(withBase({ materials: [] }), 'materials');
    expectError(withBase({ materials: { f: 'fixed' } }), 'materials.f');
    expectError(withBase({ incidence: 'TE' }), 'incidence');
    expectError(withBase({ materials: { f: { model: 'fixed', eps_r: '2' } } }), 'materials.f.eps_r', /got the string "2"/);
  });
  it('NaN and Infinity (objects built in code; 1e999 in JSON)', () => {
    expectError({ band_GHz: [1, Number.NaN] }, 'band_GHz[1]', /got NaN/);
    expectError({ band_GHz: [1, Infinity] }, 'band_GHz[1]', /too large/);
    // A number beyond the double range overflows to Infinity when read (IEEE 754: the largest double is about 1.8e308).
    expectError('{"band_GHz": [1, 1e999]}', 'band_GHz[1]', /^band_GHz\[1\]: too large \(beyond ±1\.8e308/);
    expectError(withBase({ layers: [{ material: 'brick', thickness_mm: 1e400 }] }), 'layers[0].thickness_mm', /too large.*must be a number > 0/);
    expectError('{"band_GHz": [1, 2], "incidence": {"angle_deg": -1e400}}', 'incidence.angle_deg', /too large a negative number/);
    expectError(withBase({ layers: [{ material: 'brick', thickness_mm: Number.NaN }] }), 'layers[0].thickness_mm');
    expectError(withBase({ materials: { f: { model: 'fixed', eps_r: Number.NaN } } }), 'materials.f.eps_r');
  });
  it('band outside 1 MHz – 1 THz', () => {
    expectError({ band_GHz: [0.0005, 1] }, 'band_GHz[0]', /at least 0.001 GHz/);
    expectError({ band_GHz: [1, 1500] }, 'band_GHz[1]', /at most 1000 GHz/);
    expectError(withBase({ profile_GHz: 2000 }), 'profile_GHz');
  });
  it('points outside 2..100000 or not whole', () => {
    expectError(withBase({ points: 1 }), 'points', /from 2 to 100000/);
    expectError(withBase({ points: 100001 }), 'points');
    expectError(withBase({ points: 10.5 }), 'points');
    expect(ok(withBase({ points: 2 })).stack.points).toBe(2);
    expect(ok(withBase({ points: 100000 })).stack.points).toBe(100000);
  });
});

describe('bad input: layers and half-spaces', () => {
  it('unknown material or back, with a hint', () => {
    expectError(withBase({ layers: [{ material: 'concrte', thickness_mm: 1 }] }), 'layers[0].material', /unknown material "concrte" \(did you mean "concrete"\?\)/);
    expectError(withBase({ back: 'pcc' }), 'back', /unknown material "pcc" \(did you mean "pec"\?\)/);
    expectError(withBase({ front: 'vacuum' }), 'front', /unknown material/);
    // Catalog names are exact: lowercase, hyphenated.
    expectError(withBase({ layers: [{ material: 'Concrete', thickness_mm: 1 }] }), 'layers[0].material', /did you mean "concrete"/);
    expectError(withBase({ layers: [{ material: 'ceiling board', thickness_mm: 1 }] }), 'layers[0].material');
  });
  it('zero or negative thickness on a non-sheet layer, and a missing one', () => {
    expectError(withBase({ layers: [{ material: 'brick', thickness_mm: 0 }] }), 'layers[0].thickness_mm', /must be a number > 0/);
    expectError(withBase({ layers: [{ material: 'brick', thickness_mm: 10 }, { material: 'brick', thickness_mm: -5 }] }), 'layers[1].thickness_mm', /must be a number > 0 \(got -5\)/);
    expectError(withBase({ layers: [{ material: 'brick' }] }), 'layers[0].thickness_mm', /required for a bulk material/);
    expectError(withBase({ layers: [{ thickness_mm: 3 }] }), 'layers[0].material', /required/);
  });
  it('a sheet with a thickness', () => {
    expectError(withBase({ layers: [{ material: 's', thickness_mm: 1 }], materials: { s: { model: 'sheet', ohm_per_sq: 100 } } }),
      'layers[0].thickness_mm', /sheet of zero thickness/);
  });
  it('a sheet as front or back half-space', () => {
    const materials = { s: { model: 'sheet', ohm_per_sq: 100 } };
    expectError(withBase({ front: 's', materials }), 'front', /is a sheet/);
    expectError(withBase({ back: 's', materials }), 'back', /is a sheet/);
  });
  it('"pec" only as back', () => {
    expectError(withBase({ front: 'pec' }), 'front', /allowed only as back/);
    expectError(withBase({ layers: [{ material: 'pec' }] }), 'layers[0].material', /allowed only as back/);
    expectError(withBase({ materials: { pec: { model: 'fixed', eps_r: 2 } } }), 'materials.pec', /reserved/);
  });
  it('over 200 layers; a layer over 10 m', () => {
    const layers = Array.from({ length: 201 }, () => ({ material: 'air', thickness_mm: 1 }));
    expectError({ band_GHz: [1, 2], layers }, 'layers', /at most 200 layers \(got 201\)/);
    expect(ok({ band_GHz: [1, 2], layers: layers.slice(0, 200) }).stack.layers).toHaveLength(200);
    expectError(withBase({ layers: [{ material: 'brick', thickness_mm: 10_001 }] }), 'layers[0].thickness_mm', /at most 10000 mm/);
    expect(ok(withBase({ layers: [{ material: 'air', thickness_mm: 10_000 }] })).stack.layers).toHaveLength(1);
  });
  it('a problem in a user material is reported once, not again as "unknown" where it is used', () => {
    const errs = expectError(withBase({ layers: [{ material: 'f', thickness_mm: 1 }], materials: { f: { model: 'fixed', eps_r: 0.5 } } }),
      'materials.f.eps_r');
    expect(errs.some((e) => e.includes('unknown material'))).toBe(false);
  });
});

describe('bad input: incidence', () => {
  it('angle outside [0, 90)', () => {
    expectError(withBase({ incidence: { angle_deg: 90 } }), 'incidence.angle_deg', /from 0 up to \(not including\) 90/);
    expectError(withBase({ incidence: { angle_deg: -0.1 } }), 'incidence.angle_deg');
    expect(ok(withBase({ incidence: { angle_deg: 89.9 } })).stack.incidence.angle_rad).toBeCloseTo(89.9 * Math.PI / 180, 12);
  });
  it('polarization other than TE/TM', () => {
    expectError(withBase({ incidence: { polarization: 'te' } }), 'incidence.polarization', /"TE" or "TM"/);
    expectError(withBase({ incidence: { polarization: 'TEM' } }), 'incidence.polarization');
    expect(ok(withBase({ incidence: { polarization: 'TM' } })).stack.incidence.polarization).toBe('TM');
  });
});

describe('bad input: user materials', () => {
  const mat = (def: unknown, name = 'm') => withBase({ materials: { [name]: def }, layers: [{ material: name, thickness_mm: 1 }] });
  it('unknown or missing model', () => {
    expectError(mat({ model: 'debey', eps_inf: 2 }), 'materials.m.model', /unknown model "debey" \(did you mean "debye"\?\)/);
    expectError(mat({ eps_r: 2 }), 'materials.m.model', /required/);
  });
  it('missing parameters', () => {
    expectError(mat({ model: 'fixed' }), 'materials.m.eps_r', /required/);
    expectError(mat({ model: 'debye', eps_inf: 2 }), 'materials.m.poles', /required/);
    expectError(mat({ model: 'debye', eps_inf: 2, poles: [] }), 'materials.m.poles', /1 to 16 poles/);
    expectError(mat({ model: 'debye', eps_inf: 2, poles: [{ delta_eps: 1 }] }), 'materials.m.poles[0].tau_ps', /required/);
    expectError(mat({ model: 'power-law', a: 2, b: 0, c: 0 }), 'materials.m.d', /required/);
  });
  it('non-physical parameters', () => {
    expectError(mat({ model: 'fixed', eps_r: 0.9 }), 'materials.m.eps_r', /≥ 1/);
    expectError(mat({ model: 'fixed', eps_r: 2, sigma_S_per_m: -1 }), 'materials.m.sigma_S_per_m', /≥ 0/);
    expectError(mat({ model: 'debye', eps_inf: 0.5, poles: [{ delta_eps: 1, tau_ps: 1 }] }), 'materials.m.eps_inf', /≥ 1/);
    expectError(mat({ model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: 73, tau_ps: 0 }] }, 'water2'), 'materials.water2.poles[0].tau_ps', /must be a number > 0/);
    expectError(mat({ model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: 73, tau_ps: -1 }] }), 'materials.m.poles[0].tau_ps');
    expectError(mat({ model: 'debye', eps_inf: 5.2, poles: [{ delta_eps: -1, tau_ps: 1 }] }), 'materials.m.poles[0].delta_eps');
    expectError(mat({ model: 'lorentz', eps_inf: 2, poles: [{ delta_eps: 1, f0_GHz: 0, gamma_GHz: 1 }] }), 'materials.m.poles[0].f0_GHz', /> 0/);
    expectError(mat({ model: 'lorentz', eps_inf: 2, poles: [{ delta_eps: 1, f0_GHz: 5, gamma_GHz: -1 }] }), 'materials.m.poles[0].gamma_GHz', /≥ 0/);
    expectError(mat({ model: 'lorentz', eps_inf: 2, poles: [{ delta_eps: 1, f0_GHz: 3, gamma_GHz: 0 }] }), 'materials.m.poles[0].gamma_GHz', /inside the band/);
    expectError(mat({ model: 'drude', eps_inf: 1, plasma_GHz: 0, collision_GHz: 1 }), 'materials.m.plasma_GHz');
    expectError(mat({ model: 'drude', eps_inf: 1, plasma_GHz: 5, collision_GHz: -1 }), 'materials.m.collision_GHz');
    expectError(mat({ model: 'power-law', a: 0.5, b: 0, c: 0, d: 0 }), 'materials.m', /below 1/);
    expectError(mat({ model: 'power-law', a: 2, b: -1, c: 0, d: 0 }), 'materials.m', /at 6 GHz is below 1/);
    expectError(mat({ model: 'power-law', a: 2, b: 0, c: -1, d: 0 }), 'materials.m.c');
    expectError(mat({ model: 'power-law', a: 2, b: 0, c: 1, d: 50 }), 'materials.m.d');
    const sheet = withBase({ materials: { s: { model: 'sheet', ohm_per_sq: 0 } }, layers: [{ material: 's' }] });
    expectError(sheet, 'materials.s.ohm_per_sq', /must be a number > 0/);
    expectError(withBase({ materials: { s: { model: 'sheet', ohm_per_sq: -3 } } }), 'materials.s.ohm_per_sq');
    expectError(mat({ model: 'fixed', eps_r: 2, valid_GHz: [5, 1] }), 'materials.m.valid_GHz', /min must be below max/);
  });
  it('a user material reusing a catalog name', () => {
    expectError(mat({ model: 'fixed', eps_r: 4 }, 'concrete'), 'materials.concrete', /catalog material name/);
    expectError(mat({ model: 'fixed', eps_r: 4 }, 'Brick'), 'materials.Brick', /catalog material name/);
    expectError(withBase({ materials: { '': { model: 'fixed', eps_r: 2 } } }), 'materials[""]');
  });
});

describe('warnings (the stack stays valid)', () => {
  it('band leaving a material\'s validity range names the material and the range', () => {
    const r = ok({ band_GHz: [0.5, 12], layers: [{ material: 'brick', thickness_mm: 100 }] });
    expect(r.warnings).toHaveLength(1);
    expect(r.warnings[0]).toMatch(/^layers\[0\]: .*0\.5–12 GHz.*"brick", 1–40 GHz \(ITU-R P\.2040-3/);
    const w = ok({ band_GHz: [1, 60], layers: [{ material: 'brick', thickness_mm: 100 }] }).warnings;
    expect(w[0]).toMatch(/1–40 GHz/);
  });
  it('a power-law material whose band is inside validity gives no warning', () => {
    expect(ok({ band_GHz: [1, 6], layers: [{ material: 'concrete', thickness_mm: 150 }], back: 'wet-ground' }).warnings).toEqual([]);
    expect(ok({ band_GHz: [1, 40], layers: [{ material: 'brick', thickness_mm: 100 }] }).warnings).toEqual([]);
  });
  it('a user material\'s own validity range is checked too', () => {
    const r = ok(withBase({ materials: { f: { model: 'fixed', eps_r: 2, valid_GHz: [2, 4] } }, layers: [{ material: 'f', thickness_mm: 1 }] }));
    expect(r.warnings.some((w) => w.includes('"f", 2–4 GHz (user)'))).toBe(true);
  });
  it('oblique incidence with a profile frequency: no warning (the profile is computed at any angle)', () => {
    const r = ok(withBase({ incidence: { angle_deg: 30 }, profile_GHz: 3 }));
    expect(r.warnings).toEqual([]);
  });
  it('profile outside the band; unused material; lossy front', () => {
    expect(ok(withBase({ profile_GHz: 10 })).warnings.some((w) => w.startsWith('profile_GHz: ') && w.includes('outside the band'))).toBe(true);
    expect(ok(withBase({ materials: { f: { model: 'fixed', eps_r: 2 } } })).warnings).toContain('materials.f: defined but not used');
    expect(ok(withBase({ front: 'concrete' })).warnings.some((w) => w.startsWith('front: ') && w.includes('lossy'))).toBe(true);
  });
});

describe('text that could mislead a terminal or break a file', () => {
  // Control characters (C0 U+0000–001F, DEL, C1 U+0080–009F) and the explicit bidirectional controls of Unicode
  // Standard Annex #9 (LRE/RLE/PDF/LRO/RLO U+202A–202E, isolates U+2066–2069, marks U+200E/200F/061C; from memory).
  const cases: [string, string][] = [
    ['NUL', '\u0000'], ['escape', '\u001b[31m'], ['tab', '\t'], ['C1 next line', '\u0085'], ['DEL', '\u007f'],
    ['right-to-left override', '\u202e'], ['left-to-right isolate', '\u2066'], ['right-to-left mark', '\u200f'],
    ['line separator', '\u2028'],
  ];
  it('a title with any of them is refused, naming the field, the character and where it is', () => {
    for (const [what, ch] of cases) {
      const errs = expectError(withBase({ title: `Wall ${ch}x` }), 'title', new RegExp(`U\\+${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}\\) at character 6`));
      expect(errs.join('\n'), what).not.toContain(ch);
    }
  });
  it('an unpaired surrogate written as a JSON escape is refused too', () => {
    expectError('{"band_GHz": [1, 2], "title": "ab\\ud800"}', 'title', /unpaired surrogate/);
  });
  it('material names are refused; notes may hold tabs and line feeds but nothing else', () => {
    expectError(withBase({ materials: { 'foam\u202e': { model: 'fixed', eps_r: 1.1 } } }), 'materials["foam\\u{202E}"]', /bidirectional-text control \(U\+202E\)/);
    ok(withBase({ materials: { foam: { model: 'fixed', eps_r: 1.1, note: 'line one\n\tline two' } }, layers: [{ material: 'foam', thickness_mm: 1 }] }));
    expectError(withBase({ materials: { foam: { model: 'fixed', eps_r: 1.1, note: 'a\u0007b' } }, layers: [{ material: 'foam', thickness_mm: 1 }] }),
      'materials.foam.note', /control character \(U\+0007\)/);
  });
  it('messages quoting a refused value, key or name show the characters escaped, never raw', () => {
    for (const input of [
      withBase({ layers: [{ material: 'brick\u202e', thickness_mm: 1 }] }),
      withBase({ 'tit\u202ele': 'x' }),
      withBase({ incidence: { polarization: 'T\u202eE' } }),
      withBase({ materials: { m: { model: 'fix\u202eed' } } }),
    ]) {
      const errs = errors(parseStackObject(input)).join('\n');
      expect(errs).not.toMatch(/[\u202e]/);
      expect(errs).toContain('\\u{202E}');
    }
  });
});

describe('magnetic blocks (permeability on a bulk material)', () => {
  const mag = (magnetic: unknown, extra: Record<string, unknown> = {}) => withBase({
    materials: { ferrite: { model: 'fixed', eps_r: 12, magnetic, ...extra } },
    layers: [{ material: 'ferrite', thickness_mm: 2 }],
  });
  it('accepts the three models on any bulk model, fills mu_loss = 0, and round-trips through toStackFile', () => {
    const r = ok(withBase({
      materials: {
        a: { model: 'fixed', eps_r: 12, magnetic: { model: 'fixed', mu_r: 3 } },
        b: { model: 'debye', eps_inf: 4, poles: [{ delta_eps: 2, tau_ps: 5 }], magnetic: { model: 'debye', mu_inf: 1, poles: [{ delta_mu: 9, tau_ps: 80 }] } },
        c: { model: 'power-law', a: 5, b: 0, c: 0.01, d: 1, magnetic: { model: 'lorentz', mu_inf: 1, poles: [{ delta_mu: 4, f0_GHz: 8, gamma_GHz: 0 }] } },
      },
      layers: [{ material: 'a', thickness_mm: 1 }, { material: 'b', thickness_mm: 1 }, { material: 'c', thickness_mm: 1 }],
    }));
    expect(r.file.materials.a).toEqual({ model: 'fixed', eps_r: 12, sigma_S_per_m: 0, magnetic: { model: 'fixed', mu_r: 3, mu_loss: 0 } });
    const spec = r.stack.layers[1].material.spec;
    expect(spec.model !== 'sheet' && spec.magnetic).toEqual({ model: 'debye', mu_inf: 1, poles: [{ delta_mu: 9, tau_ps: 80 }] });
    const again = ok(toStackFile(r.stack));
    expect(again.stack.layers).toEqual(r.stack.layers);
    expect(toStackFile(again.stack)).toEqual(toStackFile(r.stack));
  });
  it('refuses a block that is not an object, an unknown or missing model, unknown and missing keys', () => {
    expectError(mag(2), 'materials.ferrite.magnetic', /must be an object/);
    expectError(mag({ mu_r: 2 }), 'materials.ferrite.magnetic.model', /required: one of fixed, debye, lorentz/);
    expectError(mag({ model: 'drude', mu_r: 2 }), 'materials.ferrite.magnetic.model', /unknown permeability model "drude"/);
    expectError(mag({ model: 'debey', mu_inf: 1, poles: [] }), 'materials.ferrite.magnetic.model', /did you mean "debye"/);
    expectError(mag({ model: 'fixed', mu_r: 2, mu_los: 1 }), 'materials.ferrite.magnetic.mu_los', /did you mean "mu_loss"/);
    expectError(mag({ model: 'fixed', mu_loss: 1 }), 'materials.ferrite.magnetic.mu_r', /required for the fixed permeability model/);
    expectError(mag({ model: 'debye', mu_inf: 1 }), 'materials.ferrite.magnetic.poles', /required/);
    expectError(mag({ model: 'debye', mu_inf: 1, poles: [] }), 'materials.ferrite.magnetic.poles', /1 to 16 poles/);
    expectError(mag({ model: 'debye', mu_inf: 1, poles: [{ delta_eps: 1, tau_ps: 2 }] }), 'materials.ferrite.magnetic.poles[0].delta_eps', /unknown key/);
    expectError(mag({ model: 'lorentz', mu_inf: 1, poles: [{ delta_mu: 1, f0_GHz: 2 }] }), 'materials.ferrite.magnetic.poles[0].gamma_GHz', /required/);
  });
  it('refuses what a passive medium cannot have, naming the field', () => {
    expectError(mag({ model: 'fixed', mu_r: 0 }), 'materials.ferrite.magnetic.mu_r', /must be a number > 0 \(got 0\)/);
    expectError(mag({ model: 'fixed', mu_r: -2 }), 'materials.ferrite.magnetic.mu_r', /> 0/);
    expectError(mag({ model: 'fixed', mu_r: 2, mu_loss: -0.1 }), 'materials.ferrite.magnetic.mu_loss', /≥ 0/);
    expectError(mag({ model: 'fixed', mu_r: '2' }), 'materials.ferrite.magnetic.mu_r', /got the string "2"/);
    expectError(mag({ model: 'debye', mu_inf: 0.5, poles: [{ delta_mu: 1, tau_ps: 2 }] }), 'materials.ferrite.magnetic.mu_inf', /≥ 1/);
    expectError(mag({ model: 'debye', mu_inf: 1, poles: [{ delta_mu: -1, tau_ps: 2 }] }), 'materials.ferrite.magnetic.poles[0].delta_mu', /≥ 0/);
    expectError(mag({ model: 'debye', mu_inf: 1, poles: [{ delta_mu: 1, tau_ps: 0 }] }), 'materials.ferrite.magnetic.poles[0].tau_ps', /> 0/);
    expectError(mag({ model: 'lorentz', mu_inf: 1, poles: [{ delta_mu: 1, f0_GHz: 0, gamma_GHz: 1 }] }), 'materials.ferrite.magnetic.poles[0].f0_GHz', /> 0/);
    expectError(mag({ model: 'lorentz', mu_inf: 1, poles: [{ delta_mu: 1, f0_GHz: 3, gamma_GHz: -1 }] }), 'materials.ferrite.magnetic.poles[0].gamma_GHz', /≥ 0/);
    // A lossless resonance inside the band (1–6 GHz) is singular there.
    expectError(mag({ model: 'lorentz', mu_inf: 1, poles: [{ delta_mu: 1, f0_GHz: 3, gamma_GHz: 0 }] }), 'materials.ferrite.magnetic.poles[0].gamma_GHz', /inside the band/);
    expectError(mag({ model: 'fixed', mu_r: Infinity }), 'materials.ferrite.magnetic.mu_r', /too large/);
  });
  it('reports a bad block together with the permittivity\'s own problems, and refuses one on a sheet', () => {
    const errs = expectError(mag({ model: 'fixed', mu_r: 0 }, { eps_r: 0.5 }), 'materials.ferrite.eps_r', /≥ 1/);
    expect(errs.some((e) => e.startsWith('materials.ferrite.magnetic.mu_r: '))).toBe(true);
    expectError(withBase({ materials: { s: { model: 'sheet', ohm_per_sq: 100, magnetic: { model: 'fixed', mu_r: 2 } } }, layers: [{ material: 's' }] }),
      'materials.s.magnetic', /a sheet has no thickness/);
    expectError(mag({ model: 'fixed', mu_r: 2, __proto__x: 1, constructor: 1 }), 'materials.ferrite.magnetic.constructor', /not allowed anywhere/);
  });
});
