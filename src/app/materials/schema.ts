// What the material editor offers for each model: the file-form keys it edits (the same keys a stack file
// holds, so the parser checks them and names them), the pole keys, and a starting definition for a model
// chosen fresh. DOM-free. Values stay what the user typed until the parser has read them.

import type { MagneticModelName, ModelName } from '../../materials/types.ts';

export interface FieldSpec { key: string; label: string }

/** Scalar keys per model, in the order shown. */
export const MODEL_FIELDS: Record<ModelName, FieldSpec[]> = {
  fixed: [{ key: 'eps_r', label: 'ε_r' }, { key: 'sigma_S_per_m', label: 'σ (S/m)' }],
  debye: [{ key: 'eps_inf', label: 'ε∞' }, { key: 'sigma_S_per_m', label: 'σ (S/m)' }],
  lorentz: [{ key: 'eps_inf', label: 'ε∞' }, { key: 'sigma_S_per_m', label: 'σ (S/m)' }],
  drude: [{ key: 'eps_inf', label: 'ε∞' }, { key: 'plasma_GHz', label: 'plasma (GHz)' }, { key: 'collision_GHz', label: 'collisions (GHz)' }, { key: 'sigma_S_per_m', label: 'σ (S/m)' }],
  'power-law': [{ key: 'a', label: 'a (ε′ = a f^b)' }, { key: 'b', label: 'b' }, { key: 'c', label: 'c (σ = c f^d)' }, { key: 'd', label: 'd' }],
  table: [],
  sheet: [{ key: 'ohm_per_sq', label: 'R_s (Ω/sq)' }],
};

/** Keys of one pole, per model that has poles (ε and μ). */
export const POLE_FIELDS: Partial<Record<ModelName, FieldSpec[]>> = {
  debye: [{ key: 'delta_eps', label: 'Δε' }, { key: 'tau_ps', label: 'τ (ps)' }],
  lorentz: [{ key: 'delta_eps', label: 'Δε' }, { key: 'f0_GHz', label: 'f0 (GHz)' }, { key: 'gamma_GHz', label: 'γ (GHz)' }],
};

export const MAGNETIC_FIELDS: Record<MagneticModelName, FieldSpec[]> = {
  fixed: [{ key: 'mu_r', label: 'μ_r' }, { key: 'mu_loss', label: 'μ″' }],
  debye: [{ key: 'mu_inf', label: 'μ∞' }],
  lorentz: [{ key: 'mu_inf', label: 'μ∞' }],
};

export const MAGNETIC_POLE_FIELDS: Partial<Record<MagneticModelName, FieldSpec[]>> = {
  debye: [{ key: 'delta_mu', label: 'Δμ' }, { key: 'tau_ps', label: 'τ (ps)' }],
  lorentz: [{ key: 'delta_mu', label: 'Δμ' }, { key: 'f0_GHz', label: 'f0 (GHz)' }, { key: 'gamma_GHz', label: 'γ (GHz)' }],
};

/** A material definition as the editor holds it: the file form, values possibly still text. */
export type Definition = Record<string, unknown>;

const round = (x: number): number => Number(x.toPrecision(4));

/** A fresh definition of `model` for a stack of this band (a table's rows span the band). */
export function startingDefinition(model: ModelName, band_GHz: [number, number]): Definition {
  const [f1, f2] = band_GHz;
  switch (model) {
    case 'fixed': return { model, eps_r: 2.5, sigma_S_per_m: 0 };
    case 'debye': return { model, eps_inf: 2.5, poles: [{ delta_eps: 4, tau_ps: round(1e3 / (2 * Math.PI * Math.sqrt(f1 * f2))) }], sigma_S_per_m: 0 };
    case 'lorentz': return { model, eps_inf: 2, poles: [{ delta_eps: 1, f0_GHz: round(3 * f2), gamma_GHz: round(f2) }], sigma_S_per_m: 0 };
    case 'drude': return { model, eps_inf: 1, plasma_GHz: round(f1 / 2), collision_GHz: round(f1), sigma_S_per_m: 0 };
    case 'power-law': return { model, a: 3, b: 0, c: 0.01, d: 1 };
    case 'table': return { model, points: [[f1, 2.2, 0.01], [round(Math.sqrt(f1 * f2)), 2.15, 0.012], [f2, 2.1, 0.015]] };
    case 'sheet': return { model, ohm_per_sq: 377 };
  }
}

export function startingMagnetic(model: MagneticModelName, band_GHz: [number, number]): Definition {
  const f2 = band_GHz[1];
  switch (model) {
    case 'fixed': return { model, mu_r: 2, mu_loss: 0.5 };
    case 'debye': return { model, mu_inf: 1, poles: [{ delta_mu: 2, tau_ps: round(1e3 / (2 * Math.PI * f2)) }] };
    case 'lorentz': return { model, mu_inf: 1, poles: [{ delta_mu: 2, f0_GHz: round(f2 / 2), gamma_GHz: round(f2) }] };
  }
}

/** A starting pole like the last one (or a fresh one). */
export function nextPole(poles: readonly Definition[], fields: readonly FieldSpec[]): Definition {
  const last = poles[poles.length - 1];
  if (last !== undefined) return { ...last };
  return Object.fromEntries(fields.map((f) => [f.key, 1]));
}

/** Rows of a table as text, one "f_GHz, re, loss" per line. */
export const rowsText = (rows: unknown): string =>
  Array.isArray(rows) ? rows.map((r) => (Array.isArray(r) ? r.map(String).join(', ') : String(r))).join('\n') : '';

/**
 * Table rows from text: one row per non-empty line, cells split at commas, tabs or spaces. A cell that is a plain
 * decimal becomes a number; anything else stays text, so the parser names it (materials.x.points[2][1]).
 */
export function rowsOf(text: string, isNumber: (t: string) => boolean): unknown[] {
  return text.split(/\r?\n/).map((l) => l.trim()).filter((l) => l !== '' && !l.startsWith('#'))
    .map((l) => l.split(/\s*[,;\t]\s*|\s+/).filter((c) => c !== '').map((c) => (isNumber(c) ? Number(c) : c)));
}

/** A name not yet among `taken`: base, base-2, base-3 … */
export function freshName(base: string, taken: (n: string) => boolean): string {
  if (!taken(base)) return base;
  for (let k = 2; ; k++) if (!taken(`${base}-${k}`)) return `${base}-${k}`;
}
