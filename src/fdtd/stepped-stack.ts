// The stack the pulse engine steps, written back as an ordinary Stack: every medium as the model it is
// stepped with (a fitted power law as the Lorentz sum it was fitted with, conductors as a perfect conductor
// or a sheet, a film's filler as its neighbour's medium, a fixed permeability with loss as its fitted Lorentz sum). The exact solver and the FEM can then solve the
// very media the engine steps (`--media stepped`), so the three methods agree at the engine's precision and
// the pulse's waveform is that of a physical (causal) medium.

import type { BulkModel, MagneticModel } from '../materials/types.ts';
import type { BulkMaterial, Layer, Stack } from '../stack/types.ts';
import { resolveStack } from './effective.ts';
import type { LineMedium, StepModel } from './media.ts';

const GHz = (w_rad_per_s: number): number => w_rad_per_s / (2 * Math.PI * 1e9);

/** A step model in a stack file's terms (every step model the engine makes has one of these forms). */
export function bulkModelOf(m: StepModel): BulkModel {
  const lorentz = m.osc.filter((o) => o.w0sq > 0), drude = m.osc.filter((o) => o.w0sq === 0);
  if (m.debye.length === 0 && m.osc.length === 0) return { model: 'fixed', eps_r: m.epsInf, sigma_S_per_m: m.sigma };
  if (m.osc.length === 0) {
    return { model: 'debye', eps_inf: m.epsInf, sigma_S_per_m: m.sigma, poles: m.debye.map((p) => ({ delta_eps: p.deps, tau_ps: p.tau_s * 1e12 })) };
  }
  if (m.debye.length === 0 && drude.length === 0) {
    return {
      model: 'lorentz', eps_inf: m.epsInf, sigma_S_per_m: m.sigma,
      poles: lorentz.map((o) => ({ delta_eps: o.c / o.w0sq, f0_GHz: GHz(Math.sqrt(o.w0sq)), gamma_GHz: GHz(o.gamma) })),
    };
  }
  if (m.debye.length === 0 && lorentz.length === 0 && drude.length === 1) {
    return { model: 'drude', eps_inf: m.epsInf, sigma_S_per_m: m.sigma, plasma_GHz: GHz(Math.sqrt(drude[0].c)), collision_GHz: GHz(drude[0].gamma) };
  }
  throw new Error('bulkModelOf: a step model mixing Debye and second-order terms has no stack-file form');
}

/** A series (μ) step model as a stack file's magnetic block; none for μ = 1 (every series model resolveStack makes). */
export function magneticModelOf(m: StepModel): MagneticModel | undefined {
  if (m.sigma !== 0 || m.osc.some((o) => !(o.w0sq > 0) || (o.d ?? 0) !== 0) || (m.debye.length > 0 && m.osc.length > 0)) {
    throw new Error('magneticModelOf: this series model has no stack-file form');
  }
  if (m.debye.length === 0 && m.osc.length === 0) return m.epsInf === 1 ? undefined : { model: 'fixed', mu_r: m.epsInf, mu_loss: 0 };
  if (m.osc.length === 0) return { model: 'debye', mu_inf: m.epsInf, poles: m.debye.map((p) => ({ delta_mu: p.deps, tau_ps: p.tau_s * 1e12 })) };
  return {
    model: 'lorentz', mu_inf: m.epsInf,
    poles: m.osc.map((o) => ({ delta_mu: o.c / o.w0sq, f0_GHz: GHz(Math.sqrt(o.w0sq)), gamma_GHz: GHz(o.gamma) })),
  };
}

/** A line medium at normal incidence (its ε and μ) in a stack file's terms. */
function specOf(m: LineMedium): BulkModel {
  const spec = bulkModelOf(m.shunt), magnetic = magneticModelOf(m.series);
  return magnetic === undefined ? spec : { ...spec, magnetic };
}

/** The stack with each medium replaced by what the pulse engine steps (same band, incidence and profile). */
export function steppedStack(stack: Stack): Stack {
  const { effective: eff, fits } = resolveStack(stack);
  const fitted = new Set(fits.map((f) => f.material));
  const material = (name: string, m: LineMedium, like?: BulkMaterial): BulkMaterial => ({
    name,
    spec: specOf(m),
    source: fitted.has(like?.name ?? name) ? `${like?.source ?? 'stack'}; stepped as a fitted causal model` : (like?.source ?? 'pulse engine substitute'),
    valid_GHz: like?.valid_GHz ?? null,
  });
  const byName = new Map<string, BulkMaterial>();
  for (const l of stack.layers) if (l.kind === 'bulk') byName.set(l.material.name, l.material);
  byName.set(stack.front.name, stack.front);
  if (stack.back !== 'pec') byName.set(stack.back.name, stack.back);
  // Bulk pieces between sheets, in order; sheets as the stack names them (their resistance from the conductance).
  const sheets = [...eff.sheets].sort((a, b) => a.x_m - b.x_m);
  const cuts = sheets.map((s) => s.x_m);
  const layers: Layer[] = [];
  let si = 0;
  const putSheets = (upTo: number): void => {
    for (; si < sheets.length && sheets[si].x_m <= upTo + 1e-15; si++) {
      const sh = sheets[si];
      const name = sh.label.replace(/^layers\[\d+\] /, '');
      layers.push({ kind: 'sheet', material: { name, spec: { model: 'sheet', ohm_per_sq: 1 / sh.conductance_S }, source: 'pulse engine substitute', valid_GHz: null } });
    }
  };
  for (const seg of eff.segments) {
    const like = byName.get(stack.layers[seg.layer]?.kind === 'bulk' ? (stack.layers[seg.layer].material as BulkMaterial).name : '');
    const mat = material(seg.name, seg.model, seg.name === like?.name ? like : undefined);
    let x = seg.x0_m;
    putSheets(x);
    while (si < cuts.length && cuts[si] < seg.x1_m - 1e-15) {
      layers.push({ kind: 'bulk', material: mat, thickness_m: cuts[si] - x });
      x = cuts[si];
      putSheets(x);
    }
    layers.push({ kind: 'bulk', material: mat, thickness_m: seg.x1_m - x });
  }
  putSheets(Infinity);
  return {
    ...stack,
    front: material(stack.front.name, eff.front, stack.front),
    layers,
    back: eff.back === 'pec' ? 'pec' : material(stack.back === 'pec' ? 'back' : stack.back.name, eff.back, stack.back === 'pec' ? undefined : stack.back),
  };
}
