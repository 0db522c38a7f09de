// Validation of one user material definition from a stack file's `materials` object.
// Non-physical parameters are refused with the field named (materials.water.poles[0].tau_ps: must be > 0).

import type { DebyePole, LorentzPole, MagneticModel, MagneticModelName, MaterialModel, ModelName } from '../materials/types.ts';
import { MAGNETIC_MODEL_NAMES, MODEL_NAMES } from '../materials/types.ts';
import type { StackFileMaterial } from './file.ts';
import { STACK_LIMITS } from './file.ts';
import { parseTableModel, type TableFileReader } from './parse-table.ts';
import {
  describe, has, isRecord, joinIndex, joinKey, own, Problems, quoteShort, readNumber, refuseUnknownKeys, suggest,
} from './problems.ts';
import { unsafeTextProblem } from './text.ts';

/** Keys each model takes (besides `model`, `valid_GHz`, `note`); optional ones default as noted. */
const MODEL_KEYS: Record<ModelName, { required: readonly string[]; optional: readonly string[] }> = {
  fixed: { required: ['eps_r'], optional: ['sigma_S_per_m'] },
  debye: { required: ['eps_inf', 'poles'], optional: ['sigma_S_per_m'] },
  lorentz: { required: ['eps_inf', 'poles'], optional: ['sigma_S_per_m'] },
  drude: { required: ['eps_inf', 'plasma_GHz', 'collision_GHz'], optional: ['sigma_S_per_m'] },
  'power-law': { required: ['a', 'b', 'c', 'd'], optional: [] },
  table: { required: [], optional: ['points', 'mu_points', 'file'] }, // points or file: parse-table.ts
  sheet: { required: ['ohm_per_sq'], optional: [] },
};
const COMMON_KEYS = ['model', 'valid_GHz', 'note'] as const;
/** Keys every bulk model takes besides its own (a sheet is told why it cannot). */
const BULK_KEYS = ['magnetic'] as const;

/** Keys of each permeability model in a `magnetic` block. */
const MAGNETIC_KEYS: Record<MagneticModelName, { required: readonly string[]; optional: readonly string[] }> = {
  fixed: { required: ['mu_r'], optional: ['mu_loss'] },
  debye: { required: ['mu_inf', 'poles'], optional: [] },
  lorentz: { required: ['mu_inf', 'poles'], optional: [] },
};

const atLeast = (lo: number) => (x: number) => x >= lo;
const above = (lo: number) => (x: number) => x > lo;

/**
 * Validate `def` at `path`; `band_GHz` (when valid) is used for checks that depend on the band, and
 * `readTableFile` (when given) reads a table material's `file`.
 * Returns the normalized definition (defaults filled in), or undefined if it has problems.
 */
export function parseMaterialDefinition(p: Problems, def: unknown, path: string,
  band_GHz: [number, number] | undefined, readTableFile?: TableFileReader): StackFileMaterial | undefined {
  if (!isRecord(def)) {
    p.error(path, `must be an object such as {"model": "fixed", "eps_r": 4} (got ${describe(def)})`);
    return undefined;
  }
  const before = p.count;
  const modelValue = own(def, 'model');
  if (!has(def, 'model')) {
    p.error(joinKey(path, 'model'), `required: one of ${MODEL_NAMES.join(', ')}`);
    return undefined;
  }
  if (typeof modelValue !== 'string' || !(MODEL_NAMES as readonly string[]).includes(modelValue)) {
    const near = typeof modelValue === 'string' ? suggest(modelValue, MODEL_NAMES) : undefined;
    p.error(joinKey(path, 'model'), `unknown model ${typeof modelValue === 'string' ? quoteShort(modelValue) : describe(modelValue)}${near ? ` (did you mean "${near}"?)` : ''}; one of ${MODEL_NAMES.join(', ')}`);
    return undefined;
  }
  const model = modelValue as ModelName;
  const keys = MODEL_KEYS[model];
  refuseUnknownKeys(p, def, path, [...COMMON_KEYS, ...BULK_KEYS, ...keys.required, ...keys.optional]);
  if (model === 'sheet' && has(def, 'magnetic')) { // (listed above so it gets this message, not "unknown key")
    p.error(joinKey(path, 'magnetic'), 'a sheet has no thickness and so no permeability; give the magnetic block to a bulk material');
  }
  for (const k of keys.required) if (!has(def, k)) p.error(joinKey(path, k), `required for the ${model} model`);

  const num = (key: string, need: string, ok: (x: number) => boolean, fallback?: number): number | undefined => {
    if (!has(def, key)) return fallback;
    return readNumber(p, def[key], joinKey(path, key), need, ok);
  };
  const sigma = () => num('sigma_S_per_m', 'a number ≥ 0', atLeast(0), 0);
  const epsInf = () => num('eps_inf', 'a number ≥ 1', atLeast(1));

  let spec: MaterialModel | undefined;
  switch (model) {
    case 'fixed': {
      const eps_r = num('eps_r', 'a number ≥ 1', atLeast(1)), s = sigma();
      if (eps_r !== undefined && s !== undefined) spec = { model, eps_r, sigma_S_per_m: s };
      break;
    }
    case 'debye': {
      const eps_inf = epsInf(), s = sigma();
      const poles = readDebyePoles(p, def, path, 'delta_eps') as DebyePole[] | undefined;
      if (eps_inf !== undefined && s !== undefined && poles) spec = { model, eps_inf, poles, sigma_S_per_m: s };
      break;
    }
    case 'lorentz': {
      const eps_inf = epsInf(), s = sigma();
      const poles = readLorentzPoles(p, def, path, 'delta_eps', band_GHz) as LorentzPole[] | undefined;
      if (eps_inf !== undefined && s !== undefined && poles) spec = { model, eps_inf, poles, sigma_S_per_m: s };
      break;
    }
    case 'drude': {
      const eps_inf = epsInf(), s = sigma();
      const plasma_GHz = num('plasma_GHz', 'a number > 0', above(0));
      const collision_GHz = num('collision_GHz', 'a number ≥ 0', atLeast(0));
      if (eps_inf !== undefined && s !== undefined && plasma_GHz !== undefined && collision_GHz !== undefined) {
        spec = { model, eps_inf, plasma_GHz, collision_GHz, sigma_S_per_m: s };
      }
      break;
    }
    case 'power-law': {
      const X = STACK_LIMITS.maxExponent;
      const a = num('a', 'a number > 0', above(0));
      const b = num('b', `a number from −${X} to ${X}`, (x) => Math.abs(x) <= X);
      const c = num('c', 'a number ≥ 0', atLeast(0));
      const d = num('d', `a number from −${X} to ${X}`, (x) => Math.abs(x) <= X);
      if (a !== undefined && b !== undefined && band_GHz) {
        // ε' = a f^b is monotone in f, so the band edges bound it.
        for (const f of band_GHz) {
          const e = a * Math.pow(f, b);
          if (!(e >= 1)) p.error(path, `ε' = a·f^b = ${e.toPrecision(4)} at ${f} GHz is below 1 (non-physical for a passive material)`);
        }
      }
      if (a !== undefined && b !== undefined && c !== undefined && d !== undefined) spec = { model, a, b, c, d };
      break;
    }
    case 'table':
      spec = parseTableModel(p, def, path, band_GHz, readTableFile);
      break;
    case 'sheet': {
      const ohm_per_sq = num('ohm_per_sq', 'a number > 0', above(0));
      if (ohm_per_sq !== undefined) spec = { model, ohm_per_sq };
      break;
    }
  }

  // Read even when the permittivity has problems, so every problem is listed at once.
  const magnetic = model !== 'sheet' && has(def, 'magnetic')
    ? parseMagneticBlock(p, def.magnetic, joinKey(path, 'magnetic'), band_GHz) : undefined;
  if (spec && spec.model !== 'sheet' && magnetic) spec.magnetic = magnetic;
  const out: StackFileMaterial | undefined = spec ? { ...spec } : undefined;
  if (has(def, 'valid_GHz')) {
    const v = readRange(p, def.valid_GHz, joinKey(path, 'valid_GHz'));
    if (out && v) out.valid_GHz = v;
  }
  if (has(def, 'note')) {
    const note = def.note;
    if (typeof note !== 'string' || note.length > STACK_LIMITS.maxNoteChars) {
      p.error(joinKey(path, 'note'), `must be text of at most ${STACK_LIMITS.maxNoteChars} characters (got ${describe(note)})`);
    } else {
      // A note may run over several lines (tab and line feed pass); other controls are refused.
      const bad = unsafeTextProblem(note, true);
      if (bad !== undefined) p.error(joinKey(path, 'note'), bad);
      else if (out) out.note = note;
    }
  }
  return p.count === before ? out : undefined;
}

/**
 * A `magnetic` block at `path`: {"model": "fixed", "mu_r", "mu_loss"}, {"model": "debye", "mu_inf", "poles"}
 * or {"model": "lorentz", "mu_inf", "poles"}, each parameter in the range a passive medium allows.
 */
export function parseMagneticBlock(p: Problems, def: unknown, path: string,
  band_GHz: [number, number] | undefined): MagneticModel | undefined {
  const names = MAGNETIC_MODEL_NAMES.join(', ');
  const before = p.count;
  if (!isRecord(def)) {
    p.error(path, `must be an object such as {"model": "fixed", "mu_r": 2, "mu_loss": 0.5} (got ${describe(def)})`);
    return undefined;
  }
  const modelValue = own(def, 'model');
  if (!has(def, 'model')) { p.error(joinKey(path, 'model'), `required: one of ${names}`); return undefined; }
  if (typeof modelValue !== 'string' || !(MAGNETIC_MODEL_NAMES as readonly string[]).includes(modelValue)) {
    const near = typeof modelValue === 'string' ? suggest(modelValue, MAGNETIC_MODEL_NAMES) : undefined;
    p.error(joinKey(path, 'model'), `unknown permeability model ${typeof modelValue === 'string' ? JSON.stringify(modelValue) : describe(modelValue)}${near ? ` (did you mean "${near}"?)` : ''}; one of ${names}`);
    return undefined;
  }
  const model = modelValue as MagneticModelName;
  const keys = MAGNETIC_KEYS[model];
  refuseUnknownKeys(p, def, path, ['model', ...keys.required, ...keys.optional]);
  for (const k of keys.required) if (!has(def, k)) p.error(joinKey(path, k), `required for the ${model} permeability model`);
  const num = (key: string, need: string, ok: (x: number) => boolean, fallback?: number): number | undefined =>
    has(def, key) ? readNumber(p, def[key], joinKey(path, key), need, ok) : fallback;
  let out: MagneticModel | undefined;
  if (model === 'fixed') {
    const mu_r = num('mu_r', 'a number > 0', above(0));
    const mu_loss = num('mu_loss', 'a number ≥ 0 (μ\'\' of a passive medium)', atLeast(0), 0);
    if (mu_r !== undefined && mu_loss !== undefined) out = { model, mu_r, mu_loss };
  } else {
    const mu_inf = num('mu_inf', 'a number ≥ 1', atLeast(1));
    const poles = model === 'debye' ? readDebyePoles(p, def, path, 'delta_mu') : readLorentzPoles(p, def, path, 'delta_mu', band_GHz);
    if (mu_inf !== undefined && poles) {
      out = model === 'debye'
        ? { model, mu_inf, poles: poles as { delta_mu: number; tau_ps: number }[] }
        : { model, mu_inf, poles: poles as { delta_mu: number; f0_GHz: number; gamma_GHz: number }[] };
    }
  }
  return p.count === before ? out : undefined;
}

/** Debye poles {<strength>, tau_ps} of `def.poles`, the strength key being delta_eps or delta_mu. */
function readDebyePoles(p: Problems, def: Record<string, unknown>, path: string, strength: string): Record<string, number>[] | undefined {
  return readPoles(p, own(def, 'poles'), has(def, 'poles'), joinKey(path, 'poles'), [strength, 'tau_ps'], (pole, pp) => {
    const delta = readNumber(p, own(pole, strength), joinKey(pp, strength), 'a number ≥ 0', atLeast(0));
    const tau_ps = readNumber(p, own(pole, 'tau_ps'), joinKey(pp, 'tau_ps'), 'a number > 0', above(0));
    return delta !== undefined && tau_ps !== undefined ? { [strength]: delta, tau_ps } : undefined;
  });
}

/** Lorentz poles {<strength>, f0_GHz, gamma_GHz}; a lossless resonance inside the band is refused. */
function readLorentzPoles(p: Problems, def: Record<string, unknown>, path: string, strength: string,
  band_GHz: [number, number] | undefined): Record<string, number>[] | undefined {
  return readPoles(p, own(def, 'poles'), has(def, 'poles'), joinKey(path, 'poles'), [strength, 'f0_GHz', 'gamma_GHz'], (pole, pp) => {
    const delta = readNumber(p, own(pole, strength), joinKey(pp, strength), 'a number ≥ 0', atLeast(0));
    const f0_GHz = readNumber(p, own(pole, 'f0_GHz'), joinKey(pp, 'f0_GHz'), 'a number > 0', above(0));
    const gamma_GHz = readNumber(p, own(pole, 'gamma_GHz'), joinKey(pp, 'gamma_GHz'), 'a number ≥ 0', atLeast(0));
    if (gamma_GHz === 0 && f0_GHz !== undefined && band_GHz && f0_GHz >= band_GHz[0] && f0_GHz <= band_GHz[1]) {
      p.error(joinKey(pp, 'gamma_GHz'), `must be > 0 when the resonance f0_GHz = ${f0_GHz} lies inside the band (a lossless resonance is singular there)`);
      return undefined;
    }
    return delta !== undefined && f0_GHz !== undefined && gamma_GHz !== undefined
      ? { [strength]: delta, f0_GHz, gamma_GHz } : undefined;
  });
}

/** A list of 1..maxPoles pole objects, each read by `readPole`. */
function readPoles<T>(p: Problems, v: unknown, present: boolean, path: string, keys: readonly string[],
  readPole: (pole: Record<string, unknown>, path: string) => T | undefined): T[] | undefined {
  if (!present) return undefined; // already reported as required
  const max = STACK_LIMITS.maxPoles;
  if (!Array.isArray(v) || v.length === 0 || v.length > max) {
    p.error(path, `must be a list of 1 to ${max} poles (got ${describe(v)})`);
    return undefined;
  }
  const out: T[] = [];
  let ok = true;
  v.forEach((pole, i) => {
    const pp = joinIndex(path, i);
    if (!isRecord(pole)) { p.error(pp, `must be an object with ${keys.join(', ')} (got ${describe(pole)})`); ok = false; return; }
    refuseUnknownKeys(p, pole, pp, keys);
    const missing = keys.filter((k) => !has(pole, k));
    for (const k of missing) p.error(joinKey(pp, k), 'required');
    if (missing.length > 0) { ok = false; return; }
    const r = readPole(pole, pp);
    if (r === undefined) ok = false; else out.push(r);
  });
  return ok ? out : undefined;
}

/** [lo, hi] in GHz with 0 < lo < hi. */
export function readRange(p: Problems, v: unknown, path: string): [number, number] | undefined {
  if (!Array.isArray(v) || v.length !== 2) {
    p.error(path, `must be [min, max] in GHz, two numbers (got ${describe(v)})`);
    return undefined;
  }
  const lo = readNumber(p, v[0], joinIndex(path, 0), 'a number > 0', above(0));
  const hi = readNumber(p, v[1], joinIndex(path, 1), 'a number > 0', above(0));
  if (lo === undefined || hi === undefined) return undefined;
  if (!(lo < hi)) { p.error(path, `min must be below max (got [${lo}, ${hi}])`); return undefined; }
  return [lo, hi];
}
