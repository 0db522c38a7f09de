// Fuzzing the command line in-process (fast-check): random valid stack files (every model, sheets, a conductor,
// angles, TE/TM, bands from 1 MHz wide to 1–100 GHz, up to 100 000 points) and random malformed ones, each through
// check, solve and run with a small work budget. Every outcome must be exit 0 with finite numbers in every file,
// or exit 2 with a message (naming the field when the file is at fault); never exit 1, never a NaN or Infinity
// in a file, never a temporary file left behind, never more output than the limit.
//
// Size and seed: SLABECHO_FUZZ_RUNS valid stacks (default 50) and four times as many malformed ones (they are quick),
// SLABECHO_FUZZ_SEED (default below); both are printed. Each stack goes through three commands.
//   SLABECHO_FUZZ_RUNS=1000 npx vitest run test/cli/fuzz.test.ts      # the larger run (1 000 + 4 000 stacks)

import { mkdirSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { catalogNames } from '../../src/materials/catalog.ts';
import { cli, tempDir } from './support.ts';

const RUNS = Number(process.env.SLABECHO_FUZZ_RUNS ?? 50);
const MALFORMED = 4 * RUNS;
const SEED = Number(process.env.SLABECHO_FUZZ_SEED ?? 20260511);
/** The work budget every solve and run gets: small, so a case takes well under a second. */
const BUDGET = ['--max-seconds', '0.3', '--max-output-MB', '2'];
const MAX_OUTPUT_BYTES = 2e6;

const tmp = tempDir();
afterAll(tmp.cleanup);

const log10Uniform = (lo: number, hi: number) =>
  fc.double({ min: Math.log10(lo), max: Math.log10(hi), noNaN: true }).map((e) => Number((10 ** e).toPrecision(6)));

type Json = Record<string, unknown>;

/** An optional permeability block of each model (fixed, Debye, Lorentz with damping). */
const magneticBlock: fc.Arbitrary<Json | null> = fc.option(fc.oneof(
  fc.record({ model: fc.constant('fixed'), mu_r: log10Uniform(0.1, 100), mu_loss: fc.oneof(fc.constant(0), log10Uniform(1e-6, 10)) }),
  fc.record({ model: fc.constant('debye'), mu_inf: fc.double({ min: 1, max: 5, noNaN: true }),
    poles: fc.array(fc.record({ delta_mu: fc.double({ min: 0, max: 50, noNaN: true }), tau_ps: log10Uniform(0.1, 1e4) }), { minLength: 1, maxLength: 2 }) }),
  fc.record({ model: fc.constant('lorentz'), mu_inf: fc.double({ min: 1, max: 5, noNaN: true }),
    poles: fc.array(fc.record({ delta_mu: fc.double({ min: 0, max: 5, noNaN: true }), f0_GHz: log10Uniform(0.01, 2000), gamma_GHz: log10Uniform(0.001, 100) }), { minLength: 1, maxLength: 2 }) }),
), { freq: 4 });

/** A user material of each model, with parameters the parser accepts for the band (b, f0 checked against it),
 *  sometimes magnetic. */
const userMaterial = (band: [number, number]): fc.Arbitrary<Json> => fc.tuple(bulkModel(band), magneticBlock)
  .map(([m, magnetic]) => (magnetic === null ? m : { ...m, magnetic }));

const bulkModel = (band: [number, number]): fc.Arbitrary<Json> => fc.oneof(
  fc.record({ model: fc.constant('fixed'), eps_r: fc.double({ min: 1, max: 80, noNaN: true }), sigma_S_per_m: fc.oneof(fc.constant(0), log10Uniform(1e-9, 1e7)) }),
  fc.record({
    model: fc.constant('debye'), eps_inf: fc.double({ min: 1, max: 10, noNaN: true }), sigma_S_per_m: fc.oneof(fc.constant(0), log10Uniform(1e-6, 10)),
    poles: fc.array(fc.record({ delta_eps: fc.double({ min: 0, max: 80, noNaN: true }), tau_ps: log10Uniform(0.01, 1e4) }), { minLength: 1, maxLength: 3 }),
  }),
  fc.record({
    model: fc.constant('lorentz'), eps_inf: fc.double({ min: 1, max: 5, noNaN: true }), sigma_S_per_m: fc.constant(0),
    poles: fc.array(fc.record({ delta_eps: fc.double({ min: 0, max: 5, noNaN: true }), f0_GHz: log10Uniform(0.01, 2000), gamma_GHz: log10Uniform(0.001, 100) }), { minLength: 1, maxLength: 2 }),
  }),
  fc.record({
    model: fc.constant('drude'), eps_inf: fc.double({ min: 1, max: 5, noNaN: true }), sigma_S_per_m: fc.constant(0),
    plasma_GHz: log10Uniform(0.01, 1000), collision_GHz: fc.double({ min: 0, max: 100, noNaN: true }),
  }),
  fc.record({ a: fc.double({ min: 1, max: 10, noNaN: true }), b: fc.double({ min: -0.5, max: 0.5, noNaN: true }), c: log10Uniform(1e-6, 1), d: fc.double({ min: -2, max: 2, noNaN: true }) })
    .map((m) => ({ model: 'power-law', ...m, b: band.every((f) => m.a * f ** m.b >= 1) ? m.b : 0 })),
);

const bandArb: fc.Arbitrary<[number, number]> = fc.oneof(
  fc.tuple(log10Uniform(0.01, 900), log10Uniform(0.001, 0.1)).map(([c, w]): [number, number] => [c, Number((c + w).toPrecision(9))]),
  fc.constant<[number, number]>([1, 100]),
  fc.tuple(log10Uniform(0.001, 500), log10Uniform(1.01, 100)).map(([lo, r]): [number, number] => [lo, Math.min(1000, Number((lo * r).toPrecision(6)))]),
);

/** A valid stack file (as an object). */
const validStack: fc.Arbitrary<Json> = bandArb.chain((band) => fc.record({
  band: fc.constant(band),
  bulk: fc.array(userMaterial(band), { maxLength: 3 }),
  sheets: fc.array(log10Uniform(0.01, 1e5), { maxLength: 2 }),
  layers: fc.array(fc.record({ pick: fc.nat(), thickness_mm: log10Uniform(1e-3, 1e4), sheet: fc.double({ min: 0, max: 1, noNaN: true }) }), { maxLength: 5 }),
  front: fc.nat(), back: fc.nat(),
  angle: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 89.9, noNaN: true })),
  pol: fc.constantFrom('TE', 'TM'),
  points: fc.oneof(fc.integer({ min: 2, max: 300 }), fc.integer({ min: 2, max: 5000 }), fc.constant(100_000)),
  profile: fc.option(log10Uniform(0.001, 1000)),
  title: fc.string({ maxLength: 30 }),
}).map((r) => {
  const catalog = catalogNames();
  const materials: Json = {};
  r.bulk.forEach((m, i) => { materials[`m${i}`] = m; });
  r.sheets.forEach((ohm, i) => { materials[`s${i}`] = { model: 'sheet', ohm_per_sq: ohm }; });
  const bulkNames = [...catalog, ...r.bulk.map((_, i) => `m${i}`)];
  const layers = r.layers.map((l) => (r.sheets.length > 0 && l.sheet < 0.2
    ? { material: `s${l.pick % r.sheets.length}` }
    : { material: bulkNames[l.pick % bulkNames.length], thickness_mm: l.thickness_mm }));
  const front = r.front % 3 === 0 && r.bulk.length > 0 ? `m${r.front % r.bulk.length}` : 'air';
  const back = r.back % 4 === 0 ? 'pec' : r.back % 4 === 1 ? bulkNames[r.back % bulkNames.length] : 'air';
  const file: Json = { title: r.title, band_GHz: r.band, front, layers, back, materials, incidence: { angle_deg: r.angle, polarization: r.pol }, points: r.points };
  if (r.profile !== null) file.profile_GHz = r.profile;
  return file;
}));

/** Ways to break a file, applied to its object or its text. */
const JUNK: unknown[] = ['12', null, [], {}, -1, 0, true, 'x'.repeat(300), '\u202e', [1], [2, 1], 1e-320];
const mutation = fc.oneof(
  fc.record({ kind: fc.constant('set' as const), key: fc.constantFrom('band_GHz', 'points', 'front', 'back', 'layers', 'incidence', 'profile_GHz', 'title', 'materials'), junk: fc.constantFrom(...JUNK) }),
  fc.record({ kind: fc.constant('layer' as const), junk: fc.constantFrom(...JUNK), field: fc.constantFrom('material', 'thickness_mm', 'extra') }),
  fc.record({ kind: fc.constant('text' as const), how: fc.constantFrom('truncate', 'overflow', 'duplicate', 'proto', 'nul', 'deep', 'empty', 'bytes', 'unknown-key'), at: fc.double({ min: 0, max: 1, noNaN: true }) }),
);

function breakStack(file: Json, m: typeof mutation extends fc.Arbitrary<infer T> ? T : never): string | Buffer {
  const f = structuredClone(file);
  if (m.kind === 'set') { f[m.key] = m.junk; return JSON.stringify(f); }
  if (m.kind === 'layer') {
    const layers = (f.layers as Json[]).length > 0 ? f.layers as Json[] : [{ material: 'brick', thickness_mm: 10 }];
    layers[0][m.field] = m.junk;
    f.layers = layers;
    return JSON.stringify(f);
  }
  const text = JSON.stringify(f, null, 1);
  switch (m.how) {
    case 'truncate': return text.slice(0, Math.floor(m.at * text.length));
    case 'overflow': return text.replace(/"points": \d+/, '"points": 1e400').replace(/"thickness_mm": [0-9.e+-]+/, '"thickness_mm": 1e400');
    case 'duplicate': return text.replace('"band_GHz"', '"points": 3, "band_GHz"').replace('"points": 3, ', '"points": 3, "points": 4, ');
    case 'proto': return text.replace('{', '{"__proto__": {"polluted": 1}, ');
    case 'nul': return text.replace('"title": "', '"title": "\\u0000\\u001b[2J\\u202e');
    case 'deep': return `${'['.repeat(5000)}${']'.repeat(5000)}`;
    case 'empty': return '';
    case 'bytes': return Buffer.from([0xff, 0xfe, 0x00, 0x7b, 0xc3, 0x28]);
    case 'unknown-key': return text.replace('{', '{"band_ghz": [1, 2], ');
  }
}

interface Outcome { command: string; code: number; err: string; seconds: number }

/**
 * The first cell of a CSV's rows (its header skipped) that is not a finite number, named with its line, or null.
 * The numeric columns only for the echo tables (their path columns are text). One plain loop over every cell,
 * one assertion per file: an assertion per cell cost a third of this file's time.
 */
function firstNonFinite(name: string, text: string): string | null {
  const lines = text.trimEnd().split('\n');
  const numeric = name.startsWith('echoes') ? 4 : Infinity;
  for (let i = 1; i < lines.length; i++) {
    const cells = lines[i].split(',');
    for (let k = 0; k < Math.min(numeric, cells.length); k++) {
      if (!Number.isFinite(Number(cells[k]))) return `${name}: "${cells[k]}" in "${lines[i].slice(0, 80)}"`;
    }
  }
  return null;
}

/** Every file of a finished solve/run: finite numbers only, and all of them within the output limit. */
function checkOutputs(dir: string): void {
  let total = 0;
  for (const name of readdirSync(dir)) {
    expect(name.endsWith('.tmp'), `temporary file ${name} left behind`).toBe(false);
    const path = join(dir, name);
    total += statSync(path).size;
    const text = readFileSync(path, 'utf8');
    if (name.endsWith('.csv')) {
      expect(firstNonFinite(name, text)).toBeNull();
    } else if (name.endsWith('.json')) {
      expect(text).not.toMatch(/NaN|Infinity/);
      JSON.parse(text);
    }
  }
  expect(total).toBeLessThanOrEqual(MAX_OUTPUT_BYTES);
}

/** What a failure (exit 2) must look like: one-line messages, no internal error, no trace, no raw control characters. */
function checkMessage(o: Outcome, path: string): void {
  expect(o.code, `${o.command}: exit ${o.code}: ${o.err.slice(0, 400)}`).not.toBe(1);
  expect([0, 2]).toContain(o.code);
  expect(o.err).not.toMatch(/internal error|\n\s+at /);
  expect(o.err).not.toMatch(/[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/);
  if (o.code === 2) {
    expect(o.err.length).toBeGreaterThan(0);
    // A file at fault: some line names the file and then the field (or "file"/"(top level)") it is about.
    if (o.command === 'check') expect(o.err).toMatch(new RegExp(`(^|\\n)${path.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}: \\S+`));
  }
}

let caseNo = 0;
const slowest = { seconds: 0, what: '' };
const counts = { cases: 0, exit0: 0, exit2: 0 };

async function runAll(content: string | Buffer): Promise<void> {
  const dir = join(tmp.dir, `case-${caseNo++}`);
  mkdirSync(dir);
  const path = join(dir, 'fuzz.stack.json');
  writeFileSync(path, content);
  for (const command of ['check', 'solve', 'run']) {
    const out = join(dir, `out-${command}`);
    const args = command === 'check' ? [command, path] : [command, path, '--out', out, ...BUDGET];
    const t0 = performance.now();
    const r = await cli(...args);
    const o: Outcome = { command, code: r.code, err: r.stderr, seconds: (performance.now() - t0) / 1000 };
    if (o.seconds > slowest.seconds) { slowest.seconds = o.seconds; slowest.what = `${command} case ${caseNo - 1}`; }
    if (o.seconds > 1 && process.env.SLABECHO_FUZZ_SLOW) console.log(`slow: ${command} ${o.seconds.toFixed(2)} s: ${String(content).slice(0, 1500)}`);
    counts.cases++;
    if (o.code === 0) counts.exit0++; else counts.exit2++;
    checkMessage(o, path);
    if (command !== 'check' && o.code === 0) checkOutputs(out);
    if (command !== 'check' && o.code !== 0) {
      let entries: string[] = [];
      try { entries = readdirSync(out); } catch { /* not created */ }
      expect(entries, 'a refused or failed job writes nothing').toEqual([]);
    }
  }
  expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
  rmSync(dir, { recursive: true, force: true });
}

describe(`fuzz: check, solve and run on random stack files (${RUNS} valid and ${MALFORMED} malformed, seed ${SEED})`, () => {
  it('valid stacks: exit 0 with finite files within the limit, or exit 2 with a plain refusal', async () => {
    console.log(`fuzz: ${RUNS} valid stacks, seed ${SEED} (SLABECHO_FUZZ_RUNS, SLABECHO_FUZZ_SEED)`);
    await fc.assert(fc.asyncProperty(validStack, async (file) => { await runAll(JSON.stringify(file)); }), { numRuns: RUNS, seed: SEED });
    console.log(`fuzz: ${counts.cases} command runs so far (${counts.exit0} exit 0, ${counts.exit2} exit 2); slowest ${slowest.seconds.toFixed(2)} s (${slowest.what})`);
  }, 600_000);

  it('malformed stacks: exit 2 naming the field, nothing written', async () => {
    console.log(`fuzz: ${MALFORMED} malformed stacks, seed ${SEED + 1}`);
    await fc.assert(fc.asyncProperty(validStack, mutation, async (file, m) => { await runAll(breakStack(file, m)); }), { numRuns: MALFORMED, seed: SEED + 1 });
    console.log(`fuzz: ${counts.cases} command runs in all (${counts.exit0} exit 0, ${counts.exit2} exit 2); slowest ${slowest.seconds.toFixed(2)} s (${slowest.what})`);
  }, 600_000);
});
