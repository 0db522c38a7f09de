// slabecho materials [--at-GHz F] [--json]: the built-in catalog with sources and validity ranges.

import { CATALOG, CATALOG_EDITION, CATALOG_ROWS, catalogNames, catalogRanges, pickRange } from '../../materials/catalog.ts';
import { suggest } from '../../stack/problems.ts';
import { effectiveConductivity, permittivity } from '../../materials/permittivity.ts';
import { permeability } from '../../materials/permeability.ts';
import { tableRange_GHz } from '../../materials/table.ts';
import type { MagneticModel, Material, MaterialModel } from '../../materials/types.ts';
import { fmtGHz } from '../../stack/warnings.ts';
import type { Command, Io } from '../command.ts';
import { numberOption, readArgs, UsageError } from '../command.ts';

export interface MaterialRow {
  name: string;
  model: string;
  /** ε' at --at-GHz (only with it). */
  eps_r?: number;
  /** Effective conductivity ω ε0 ε'' at --at-GHz, S/m (only with it). */
  sigma_S_per_m?: number;
  /** μ' and μ'' at --at-GHz, for a material with a magnetic block (only with both). */
  mu_r?: number;
  mu_loss?: number;
  parameters: Record<string, unknown>;
  source: string;
  valid_GHz: [number, number] | null;
  note: string | null;
}

export function materialRow(m: Material, f_GHz?: number): MaterialRow {
  const { model, ...parameters } = m.spec;
  const at = f_GHz !== undefined && m.spec.model !== 'sheet'
    ? { eps_r: sig(permittivity(m.spec, f_GHz * 1e9).re), sigma_S_per_m: sig(effectiveConductivity(m.spec, f_GHz * 1e9)) }
    : {};
  if (f_GHz !== undefined && m.spec.model !== 'sheet' && m.spec.magnetic !== undefined) {
    const mu = permeability(m.spec, f_GHz * 1e9);
    Object.assign(at, { mu_r: sig(mu.re), mu_loss: sig(-mu.im) + 0 });
  }
  return { name: m.name, model, ...at, parameters, source: m.source, valid_GHz: m.valid_GHz, note: m.note ?? null };
}

const sig = (x: number): number => Number(x.toPrecision(6));

/** The model's parameters in a few characters: "a=5.24 b=0 c=0.0462 d=0.7822", then the permeability's, if any. */
export function parameterText(m: Material): string {
  const s = m.spec;
  const mu = s.model !== 'sheet' && s.magnetic !== undefined ? ` μ: ${magneticText(s.magnetic)}` : '';
  return permittivityText(s) + mu;
}

function magneticText(m: MagneticModel): string {
  switch (m.model) {
    case 'fixed': return `μ_r=${m.mu_r} μ''=${m.mu_loss}`;
    case 'debye': return `μ∞=${m.mu_inf} ${m.poles.map((p) => `Δμ=${p.delta_mu} τ=${p.tau_ps}ps`).join(' ')}`;
    case 'lorentz': return `μ∞=${m.mu_inf} ${m.poles.map((p) => `Δμ=${p.delta_mu} f0=${p.f0_GHz} γ=${p.gamma_GHz}GHz`).join(' ')}`;
  }
}

function permittivityText(s: MaterialModel): string {
  switch (s.model) {
    case 'fixed': return `ε_r=${s.eps_r} σ=${s.sigma_S_per_m}`;
    case 'power-law': return `a=${s.a} b=${s.b} c=${s.c} d=${s.d}`;
    case 'debye': return `ε∞=${s.eps_inf} ${s.poles.map((p) => `Δε=${p.delta_eps} τ=${p.tau_ps}ps`).join(' ')}${s.sigma_S_per_m ? ` σ=${s.sigma_S_per_m}` : ''}`;
    case 'lorentz': return `ε∞=${s.eps_inf} ${s.poles.map((p) => `Δε=${p.delta_eps} f0=${p.f0_GHz} γ=${p.gamma_GHz}GHz`).join(' ')}`;
    case 'drude': return `ε∞=${s.eps_inf} fp=${s.plasma_GHz} fc=${s.collision_GHz}GHz`;
    case 'table': {
      const [a, b] = tableRange_GHz(s.points);
      return `${s.points.length} rows ${a}–${b} GHz${s.mu_points ? `, μ: ${s.mu_points.length} rows` : ''}`;
    }
    case 'sheet': return `${s.ohm_per_sq} Ω/sq`;
  }
}

function table(header: string[], rows: string[][]): string[] {
  const w = header.map((h, j) => Math.max(h.length, ...rows.map((r) => r[j].length)));
  const line = (cells: string[]) => cells.map((c, j) => (j === cells.length - 1 ? c : c.padEnd(w[j]))).join('  ').trimEnd();
  return [line(header), line(w.map((n) => '-'.repeat(n))), ...rows.map(line)];
}

export const materials: Command = {
  name: 'materials',
  summary: 'list the built-in materials with their sources and validity ranges',
  usage: `Usage: slabecho materials [--at-GHz F] [--json] [--export NAME]

List the built-in material catalog: name, model, parameters, the source of the numbers and the
frequency range over which the source vouches for them (a material with two ranges, each with its own
coefficients, has a row for each; with --at-GHz, the row of the range that holds F). Names are used as they appear here
(lowercase, hyphenated) in a stack file's layers, front and back.

Options:
  --at-GHz F   also give ε' and the effective conductivity σ (S/m) of each material at F GHz, and
               μ' − jμ'' of a magnetic one; a validity range that does not contain F is marked with "!"
  --json       print a JSON array of rows {name, model, eps_r, sigma_S_per_m, mu_r, mu_loss, parameters,
               source, valid_GHz, note} (eps_r and sigma_S_per_m only with --at-GHz, mu_r and mu_loss
               only then and for a magnetic material)
  --export NAME  print catalog material NAME as a user material (JSON, to paste under "materials" in a
               stack file and edit; its values can then be swept or varied, e.g. materials.NAME-custom.a);
               with --at-GHz, the validity range that holds F
  -h, --help   show this help`,
  async run(args, io) {
    const a = readArgs(materials, args, io, { 'at-GHz': { type: 'string' }, json: { type: 'boolean' }, export: { type: 'string' } }, [0, 0]);
    if (a === null) return 0;
    const f = numberOption(a.values, 'at-GHz', 'must be a number > 0 and at most 1000 (GHz)', (x) => x > 0 && x <= 1000);
    if (typeof a.values.export === 'string') { exportMaterial(a.values.export, f, io); return 0; }
    // Every validity range is a row; at one frequency, each material in the range that holds it (or the nearest).
    const listed = f === undefined ? CATALOG_ROWS : CATALOG.map((m) => pickRange(catalogRanges(m.name), f, f).range);
    const rows = listed.map((m) => materialRow(m, f));
    if (a.values.json) { io.out(JSON.stringify(rows, null, 2)); return 0; }
    const valid = (m: Material) => {
      if (m.valid_GHz === null) return 'any';
      const out = `${fmtGHz(m.valid_GHz[0])}–${fmtGHz(m.valid_GHz[1])}`;
      return f !== undefined && (f < m.valid_GHz[0] || f > m.valid_GHz[1]) ? `${out} !` : out;
    };
    // A μ column only when some material listed is magnetic.
    const withMu = rows.some((r) => r.mu_r !== undefined);
    const muText = (r: MaterialRow) => (r.mu_r === undefined ? '' : `${r.mu_r} − j${r.mu_loss}`);
    const header = f === undefined
      ? ['name', 'model', 'parameters (f in GHz, σ in S/m)', 'valid GHz', 'source']
      : ['name', 'model', `ε' @${fmtGHz(f)} GHz`, `σ S/m @${fmtGHz(f)} GHz`, ...(withMu ? [`μ_r @${fmtGHz(f)} GHz`] : []), 'valid GHz', 'source'];
    const body = listed.map((m, i) => f === undefined
      ? [m.name, m.spec.model, parameterText(m), valid(m), m.source]
      : [m.name, m.spec.model, String(rows[i].eps_r ?? ''), String(rows[i].sigma_S_per_m ?? ''),
        ...(withMu ? [muText(rows[i])] : []), valid(m), m.source]);
    for (const l of table(header, body)) io.out(l);
    const notes = CATALOG.filter((m) => m.note !== undefined);
    if (notes.length > 0) {
      io.out('');
      io.out('Notes:');
      for (const m of notes) io.out(`  ${m.name}: ${m.note}`);
    }
    if (f !== undefined && listed.some((m) => m.valid_GHz && (f! < m.valid_GHz[0] || f! > m.valid_GHz[1]))) {
      io.out('');
      io.out(`! the validity range does not include ${fmtGHz(f)} GHz: the value there is extrapolated.`);
    }
    io.out('');
    io.out(`Building materials: ${CATALOG_EDITION}. A material with two validity ranges has a row for each; a stack uses the range that holds its band.`);
    return 0;
  },
};

/**
 * `--export NAME`: the catalog material as a user material, `{"NAME-custom": {model, parameters, valid_GHz, note}}`,
 * ready to paste under "materials" (a user material may not reuse a catalog name, hence the new name).
 */
function exportMaterial(name: string, f_GHz: number | undefined, io: Io): void {
  const ranges = catalogRanges(name);
  if (ranges.length === 0) {
    const near = suggest(name, catalogNames());
    throw new UsageError(`--export: "${name}" is not a catalog material${near ? ` (did you mean "${near}"?)` : ''}; see slabecho materials`);
  }
  const m = f_GHz === undefined ? ranges[0] : pickRange(ranges, f_GHz, f_GHz).range;
  const own = `${name}-custom`;
  const entry: Record<string, unknown> = { ...structuredClone(m.spec) };
  if (m.valid_GHz !== null) entry.valid_GHz = [...m.valid_GHz];
  // The catalog's own note (values from memory, a conductor) travels with the copy.
  entry.note = `copied from the catalog's ${name} (${m.source}); use "${own}" in layers, front or back${m.note ? `. Catalog note: ${m.note}` : ''}`;
  io.out(JSON.stringify({ [own]: entry }, null, 2));
  for (const r of ranges) {
    if (r !== m && r.valid_GHz) {
      io.err(`note: ${name} has another validity range, ${fmtGHz(r.valid_GHz[0])}–${fmtGHz(r.valid_GHz[1])} GHz, with its own coefficients ` +
        `(add --at-GHz ${fmtGHz(r.valid_GHz[0])} to export that one)`);
    }
  }
}
