// Stack file (text or parsed JSON) → validated Stack in SI units, plus the file with defaults filled in.
// Every problem is collected (not just the first), one line each, naming the field:
//   layers[1].thickness_mm: must be a number > 0 (got -3)
// Safety: JSON.parse creates own properties only; this module reads own keys only (Object.hasOwn),
// refuses __proto__ / constructor / prototype anywhere, and keeps user-named things in Maps or
// null-prototype records, so nothing a file says can reach an object's prototype.

import type { BulkModel, Material, SheetModel } from '../materials/types.ts';
import { catalogNames, catalogRanges, pickRange } from '../materials/catalog.ts';
import { hzFromGHz, mFromMm, radFromDeg } from '../units.ts';
import type { BulkMaterial, Layer, Polarization, SheetMaterial, Stack } from './types.ts';
import type { StackFile, StackFileLayer, StackFileMaterial } from './file.ts';
import { STACK_DEFAULTS, STACK_KEYS, STACK_LIMITS } from './file.ts';
import { parseJsonText, utf8Bytes } from './json-text.ts';
import { parseMaterialDefinition, readRange } from './parse-material.ts';
import type { TableFileReader } from './parse-table.ts';
import { tableCovers, tableRange_GHz } from '../materials/table.ts';
import {
  describe, FORBIDDEN_KEYS, has, isRecord, joinIndex, joinKey, own, Problems, quoteShort, readNumber,
  refuseForbiddenKeys, refuseUnknownKeys, suggest,
} from './problems.ts';
import { unsafeTextProblem } from './text.ts';
import { fmtGHz, stackWarnings } from './warnings.ts';

export type ParseResult =
  | { ok: true; stack: Stack; file: StackFile; warnings: string[] }
  | { ok: false; errors: string[] };

const L = STACK_LIMITS;

/** What the caller lends the parser besides the file itself. */
export interface ParseOptions {
  /** Reads a table material's `file` (the command line does, beside the stack file); without it `file` is refused. */
  readTableFile?: TableFileReader;
}

/** Parse stack-file text (JSON). */
export function parseStackText(text: string, options: ParseOptions = {}): ParseResult {
  const bytes = utf8Bytes(text);
  if (bytes > L.maxTextBytes) {
    return { ok: false, errors: [`file: ${bytes} bytes is over the ${L.maxTextBytes / 1e6} MB limit for a stack file`] };
  }
  const json = parseJsonText(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  if (!json.ok) return { ok: false, errors: [`file: ${json.error}`] };
  return parseStackObject(json.value, options);
}

/** Validate an already-parsed value (from JSON.parse, or built by the app). */
export function parseStackObject(obj: unknown, options: ParseOptions = {}): ParseResult {
  const p = new Problems();
  if (!isRecord(obj)) {
    p.error('(top level)', `must be a JSON object {…} describing a stack (got ${describe(obj)})`);
    return { ok: false, errors: p.errorLines() };
  }
  refuseForbiddenKeys(p, obj);
  refuseUnknownKeys(p, obj, '', STACK_KEYS);

  const title = readTitle(p, obj);
  const band = readBand(p, obj);
  const points = readPoints(p, obj);
  const incidence = readIncidence(p, obj);
  const user = readUserMaterials(p, obj, band, options.readTableFile);
  const resolve = (name: string) => resolveMaterial(name, user.valid, band);
  const front = readHalfSpace(p, obj, 'front', user.names, resolve);
  const back = readHalfSpace(p, obj, 'back', user.names, resolve);
  const layers = readLayers(p, obj, user.names, resolve);
  const profile_GHz = readProfile(p, obj, band);
  if (profile_GHz != null) refuseProfileOutsideTables(p, user.defs, profile_GHz);

  if (p.count > 0 || !band || !points || !incidence || !front || front.resolved === 'pec' || !back || !layers
    || title === undefined || profile_GHz === undefined) {
    if (p.count === 0) p.error('(top level)', 'invalid stack'); // defensive: every path above reports
    return { ok: false, errors: p.errorLines() };
  }

  const stack: Stack = {
    title,
    band_Hz: [hzFromGHz(band[0]), hzFromGHz(band[1])],
    front: front.resolved as BulkMaterial,
    layers: layers.map((l) => l.layer),
    back: back.resolved === 'pec' ? 'pec' : back.resolved as BulkMaterial,
    incidence: { angle_rad: radFromDeg(incidence.angle_deg), polarization: incidence.polarization },
    profile_Hz: hzFromGHz(profile_GHz ?? (band[0] + band[1]) / 2),
    points,
  };
  const materials: Record<string, StackFileMaterial> = Object.create(null);
  for (const [name, def] of user.defs) materials[name] = def;
  const file: StackFile = {
    title, band_GHz: [band[0], band[1]], front: front.name,
    layers: layers.map((l) => l.file), back: back.name, materials,
    incidence: { angle_deg: incidence.angle_deg, polarization: incidence.polarization },
    profile_GHz: profile_GHz ?? (band[0] + band[1]) / 2,
    points,
  };

  // Warnings: unused definitions, a profile outside the band, then the stack's own warnings.
  const used = new Set<string>([file.front, file.back, ...file.layers.map((l) => l.material)]);
  for (const name of user.defs.keys()) if (!used.has(name)) p.warn(joinKey('materials', name), 'defined but not used');
  if (file.profile_GHz < band[0] || file.profile_GHz > band[1]) {
    p.warn('profile_GHz', `${fmtGHz(file.profile_GHz)} GHz lies outside the band ${fmtGHz(band[0])}–${fmtGHz(band[1])} GHz`);
  }
  for (const w of stackWarnings(stack)) if (!p.warnings.includes(w)) p.warnings.push(w);
  return { ok: true, stack, file, warnings: [...p.warnings] };
}

function readTitle(p: Problems, o: Record<string, unknown>): string | undefined {
  if (!has(o, 'title')) return STACK_DEFAULTS.title;
  const t = o.title;
  if (typeof t !== 'string' || t.length > L.maxTitleChars) {
    p.error('title', `must be text of at most ${L.maxTitleChars} characters (got ${describe(t)})`);
    return undefined;
  }
  const bad = unsafeTextProblem(t);
  if (bad !== undefined) { p.error('title', bad); return undefined; }
  return t.trim() === '' ? STACK_DEFAULTS.title : t;
}

function readBand(p: Problems, o: Record<string, unknown>): [number, number] | undefined {
  if (!has(o, 'band_GHz')) { p.error('band_GHz', 'required: [min, max] in GHz, e.g. [1, 6]'); return undefined; }
  const band = readRange(p, o.band_GHz, 'band_GHz');
  if (!band) return undefined;
  let ok = true;
  if (band[0] < L.minBand_GHz) { p.error('band_GHz[0]', `must be at least ${L.minBand_GHz} GHz (1 MHz) (got ${band[0]})`); ok = false; }
  if (band[1] > L.maxBand_GHz) { p.error('band_GHz[1]', `must be at most ${L.maxBand_GHz} GHz (1 THz) (got ${band[1]})`); ok = false; }
  return ok ? band : undefined;
}

function readPoints(p: Problems, o: Record<string, unknown>): number | undefined {
  if (!has(o, 'points')) return STACK_DEFAULTS.points;
  return readNumber(p, o.points, 'points', `a whole number from ${L.minPoints} to ${L.maxPoints}`,
    (x) => Number.isInteger(x) && x >= L.minPoints && x <= L.maxPoints);
}

function readIncidence(p: Problems, o: Record<string, unknown>):
  { angle_deg: number; polarization: Polarization } | undefined {
  if (!has(o, 'incidence')) return { angle_deg: STACK_DEFAULTS.angle_deg, polarization: STACK_DEFAULTS.polarization };
  const inc = o.incidence;
  if (!isRecord(inc)) {
    p.error('incidence', `must be an object such as {"angle_deg": 0, "polarization": "TE"} (got ${describe(inc)})`);
    return undefined;
  }
  refuseUnknownKeys(p, inc, 'incidence', ['angle_deg', 'polarization']);
  const angle_deg = has(inc, 'angle_deg')
    ? readNumber(p, inc.angle_deg, 'incidence.angle_deg', 'a number of degrees from 0 up to (not including) 90', (x) => x >= 0 && x < 90)
    : STACK_DEFAULTS.angle_deg;
  let polarization: Polarization | undefined = STACK_DEFAULTS.polarization;
  if (has(inc, 'polarization')) {
    const v = inc.polarization;
    if (v === 'TE' || v === 'TM') polarization = v;
    else { p.error('incidence.polarization', `must be "TE" or "TM" (got ${describe(v)})`); polarization = undefined; }
  }
  return angle_deg !== undefined && polarization !== undefined ? { angle_deg, polarization } : undefined;
}

interface UserMaterials {
  /**
   * Every name defined under `materials`, valid or not (so a bad definition is not also "unknown"),
   * with the model it declares (if any), so a layer using it can still be checked.
   */
  names: ReadonlyMap<string, unknown>;
  /** Valid definitions, normalized. */
  defs: Map<string, StackFileMaterial>;
  /** Valid definitions, resolved. */
  valid: Map<string, Material>;
}

function readUserMaterials(p: Problems, o: Record<string, unknown>, band: [number, number] | undefined,
  readTableFile: TableFileReader | undefined): UserMaterials {
  const out: UserMaterials = { names: new Map(), defs: new Map(), valid: new Map() };
  if (!has(o, 'materials')) return out;
  const mats = o.materials;
  if (!isRecord(mats)) {
    p.error('materials', `must be an object mapping names to definitions, e.g. {"foam": {"model": "fixed", "eps_r": 1.07}} (got ${describe(mats)})`);
    return out;
  }
  const names = Object.keys(mats).filter((k) => !FORBIDDEN_KEYS.has(k));
  if (names.length > L.maxUserMaterials) {
    p.error('materials', `at most ${L.maxUserMaterials} materials (got ${names.length})`);
    return out;
  }
  const defined = new Map<string, unknown>();
  for (const name of names) {
    const path = joinKey('materials', name);
    const def = mats[name];
    defined.set(name, isRecord(def) ? own(def, 'model') : undefined);
    const bad = unsafeTextProblem(name);
    if (bad !== undefined) { p.error(path, `the material name ${bad}`); continue; }
    if (name.trim() === '' || name.length > L.maxNameChars) {
      p.error(path, `a material name must be 1 to ${L.maxNameChars} visible characters`);
      continue;
    }
    const clash = name === 'pec' ? 'pec' : catalogNames().find((c) => c === name.toLowerCase());
    if (clash !== undefined) {
      p.error(path, clash === 'pec'
        ? '"pec" is reserved for a perfect-conductor back; choose another name'
        : `"${name}" is a catalog material name; choose another name for your own material`);
      continue;
    }
    const parsed = parseMaterialDefinition(p, def, path, band, readTableFile);
    if (parsed === undefined) continue;
    out.defs.set(name, parsed);
    const { valid_GHz, note, ...spec } = parsed;
    const m: Material = { name, spec: spec as Material['spec'], source: 'user', valid_GHz: valid_GHz ?? null };
    if (note !== undefined) m.note = note;
    out.valid.set(name, m);
  }
  out.names = defined;
  return out;
}

/** A valid user material, or a catalog material (a private copy) in the validity range the band uses. */
function resolveMaterial(name: string, user: Map<string, Material>, band: [number, number] | undefined): Material | undefined {
  const u = user.get(name);
  if (u !== undefined) return u;
  const ranges = catalogRanges(name);
  if (ranges.length === 0) return undefined;
  return structuredClone(band ? pickRange(ranges, band[0], band[1]).range : ranges[0]);
}

/** Report an unknown name (unless it is defined but invalid, which is reported already). */
function unknownName(p: Problems, path: string, name: string, userNames: ReadonlyMap<string, unknown>, extra: string[] = []): void {
  if (userNames.has(name)) return;
  const candidates = [...catalogNames(), ...userNames.keys(), ...extra];
  const near = suggest(name, candidates);
  p.error(path, `unknown material ${quoteShort(name)}${near ? ` (did you mean "${near}"?)` : ''}: ` +
    'not in the catalog and not defined under "materials"');
}

function readHalfSpace(p: Problems, o: Record<string, unknown>, key: 'front' | 'back', userNames: ReadonlyMap<string, unknown>,
  resolve: (name: string) => Material | undefined): { name: string; resolved: BulkMaterial | 'pec' } | undefined {
  const name = has(o, key) ? o[key] : key === 'front' ? STACK_DEFAULTS.front : STACK_DEFAULTS.back;
  const what = key === 'front' ? 'a half-space material name' : 'a half-space material name or "pec"';
  if (typeof name !== 'string') { p.error(key, `must be ${what} (got ${describe(name)})`); return undefined; }
  if (name === 'pec') {
    if (key === 'back') return { name, resolved: 'pec' };
    p.error(key, '"pec" (perfect conductor) is allowed only as back');
    return undefined;
  }
  const m = resolve(name);
  const model = m !== undefined ? m.spec.model : userNames.get(name);
  if (model === 'sheet') {
    p.error(key, `"${name}" is a sheet (zero thickness); a half-space must be a bulk material`);
    return undefined;
  }
  if (m === undefined) { unknownName(p, key, name, userNames, key === 'back' ? ['pec'] : []); return undefined; }
  return { name, resolved: m as BulkMaterial };
}

function readLayers(p: Problems, o: Record<string, unknown>, userNames: ReadonlyMap<string, unknown>,
  resolve: (name: string) => Material | undefined): { layer: Layer; file: StackFileLayer }[] | undefined {
  if (!has(o, 'layers')) return [];
  const v = o.layers;
  if (!Array.isArray(v)) { p.error('layers', `must be a list of layers, front to back (got ${describe(v)})`); return undefined; }
  if (v.length > L.maxLayers) { p.error('layers', `at most ${L.maxLayers} layers (got ${v.length})`); return undefined; }
  const out: { layer: Layer; file: StackFileLayer }[] = [];
  let ok = true;
  v.forEach((entry, i) => {
    const r = readLayer(p, entry, joinIndex('layers', i), userNames, resolve);
    if (r === undefined) ok = false; else out.push(r);
  });
  return ok ? out : undefined;
}

function readLayer(p: Problems, entry: unknown, path: string, userNames: ReadonlyMap<string, unknown>,
  resolve: (name: string) => Material | undefined): { layer: Layer; file: StackFileLayer } | undefined {
  if (!isRecord(entry)) {
    p.error(path, `must be an object such as {"material": "brick", "thickness_mm": 100} (got ${describe(entry)})`);
    return undefined;
  }
  refuseUnknownKeys(p, entry, path, ['material', 'thickness_mm']);
  const mpath = joinKey(path, 'material'), tpath = joinKey(path, 'thickness_mm');
  const name = own(entry, 'material');
  if (!has(entry, 'material')) { p.error(mpath, 'required: a material name'); return undefined; }
  if (typeof name !== 'string') { p.error(mpath, `must be a material name (got ${describe(name)})`); return undefined; }
  if (name === 'pec') { p.error(mpath, '"pec" (perfect conductor) is allowed only as back'); return undefined; }
  const m = resolve(name);
  // A material defined with problems (reported under materials) is still checked by its declared model.
  const declared = m !== undefined ? m.spec.model : userNames.get(name);
  if (declared === 'sheet') {
    if (has(entry, 'thickness_mm')) {
      p.error(tpath, `"${name}" is a sheet of zero thickness; remove thickness_mm (give a bulk material for a thick layer)`);
      return undefined;
    }
    if (m === undefined) return undefined;
    return { layer: { kind: 'sheet', material: m as Material & { spec: SheetModel } as SheetMaterial }, file: { material: name } };
  }
  if (m === undefined) unknownName(p, mpath, name, userNames);
  if (!has(entry, 'thickness_mm')) {
    if (m !== undefined || typeof declared === 'string') p.error(tpath, 'required for a bulk material: a number > 0');
    return undefined;
  }
  const d = readThickness(p, entry.thickness_mm, tpath);
  if (d === undefined || m === undefined) return undefined;
  return {
    layer: { kind: 'bulk', material: m as Material & { spec: BulkModel } as BulkMaterial, thickness_m: mFromMm(d) },
    file: { material: name, thickness_mm: d },
  };
}

function readThickness(p: Problems, v: unknown, path: string): number | undefined {
  const d = readNumber(p, v, path, 'a number > 0', (x) => x > 0);
  if (d === undefined) return undefined;
  if (d > L.maxThickness_mm) { p.error(path, `must be at most ${L.maxThickness_mm} mm (10 m) (got ${d})`); return undefined; }
  return d;
}

/** A table has no value outside its rows, so the profile frequency must lie inside every table's range. */
function refuseProfileOutsideTables(p: Problems, defs: ReadonlyMap<string, StackFileMaterial>, f_GHz: number): void {
  for (const [name, def] of defs) {
    if (def.model !== 'table') continue;
    for (const rows of def.mu_points ? [def.points, def.mu_points] : [def.points]) {
      if (tableCovers(rows, f_GHz, f_GHz)) continue;
      const [a, b] = tableRange_GHz(rows);
      p.error('profile_GHz', `${fmtGHz(f_GHz)} GHz lies outside the range of the table material "${name}" (${fmtGHz(a)}–${fmtGHz(b)} GHz)`);
      return;
    }
  }
}

function readProfile(p: Problems, o: Record<string, unknown>, band: [number, number] | undefined): number | null | undefined {
  if (!has(o, 'profile_GHz')) return band ? (band[0] + band[1]) / 2 : null;
  return readNumber(p, o.profile_GHz, 'profile_GHz',
    `a number of GHz from ${L.minBand_GHz} to ${L.maxBand_GHz}`, (x) => x >= L.minBand_GHz && x <= L.maxBand_GHz);
}
