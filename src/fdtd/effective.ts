// The stack as the engine steps it: every medium a line medium (its ε as the shunt model, its μ as the series
// model, at normal incidence; oblique.ts folds the angle in), power laws and lossy fixed permeabilities fitted,
// good conductors turned into a wall (thick) or a resistive sheet (thin film), warnings saying so. Fits are
// cached per stack (a fit is a small linear program; a stack planned twice, as the command line does to refuse
// oversized runs early, fits once).

import { effectiveConductivity, permittivity } from '../materials/permittivity.ts';
import type { BulkModel, MagneticModel } from '../materials/types.ts';
import type { BulkMaterial, Stack } from '../stack/types.ts';
import { GHz, MU0_H_per_m, ps } from '../units.ts';
import { tableInterpolant, tableValue } from '../materials/table.ts';
import { PlanError } from './errors.ts';
import { sheetExcessTransmission_dB } from './film-error.ts';
import { type PowerLawFit, fitPermittivity, permeabilityTarget, powerLawTarget, tableTarget } from './causal-fit.ts';
import { type LineMedium, type StepModel, UNIT_MODEL, lineMedium, stepModelOf } from './media.ts';
import { probeSensitivity } from './probe-sensitivity.ts';
import type { EffectiveStack, GridSegment, GridSheet } from './types.ts';

/** ε''/max(ε', 1) at the band top above which a medium is a conductor for the engine. */
export const CONDUCTOR_LOSS_TANGENT = 1e4;
/** A conductor layer at least this many skin depths thick (at the band bottom) is a wall. */
export const WALL_SKIN_DEPTHS = 5;

export function isConductor(m: BulkModel, band_Hz: [number, number]): boolean {
  const e = permittivity(m, band_Hz[1]);
  return -e.im / Math.max(e.re, 1) >= CONDUCTOR_LOSS_TANGENT;
}

const skinDepth_m = (m: BulkModel, f_Hz: number): number =>
  Math.sqrt(2 / (2 * Math.PI * f_Hz * MU0_H_per_m * effectiveConductivity(m, f_Hz)));

/** Below this the sheet's excess transmission is not worth a word (dB). */
const FILM_NOTE_DB = 0.1;
/** What the sheet does to a shielding figure, when it matters. */
function filmShieldingNote(d_over_delta: number): string {
  const excess = sheetExcessTransmission_dB(d_over_delta);
  return excess < FILM_NOTE_DB ? '' :
    ` As a sheet it leaves out the loss inside the film, so the pulse run's T is up to ${excess.toFixed(1)} dB too high at the band top (too little shielding): take shielding figures from the exact solution.`;
}

export interface Resolved { effective: EffectiveStack; fits: PowerLawFit[]; warnings: string[] }

/** Fits warn when their worst error over the band exceeds these (ε' and ε'' separately). */
export const FIT_WARN_RE = 0.01;
export const FIT_WARN_IM = 0.03;

/** A warning for each fit whose worst error over the band is above FIT_WARN_RE in ε' or FIT_WARN_IM in ε''. */
export function fitWarnings(fits: readonly PowerLawFit[]): string[] {
  const out: string[] = [];
  for (const f of fits) {
    const high = f.maxRelErr_re > FIT_WARN_RE || f.maxRelErr_im > FIT_WARN_IM;
    const negative = f.quantity === 'permittivity' && f.minEpsRe_wide < 1;
    if (!high && !negative) continue;
    const mu = f.quantity === 'permeability', x = mu ? 'μ' : 'ε';
    const below = negative ? `; ${x}' falls to ${f.minEpsRe_wide.toPrecision(3)} between half the band's bottom and twice its top` : '';
    const why = f.source === 'table' ? `a measured ${mu ? 'μ' : 'ε'} table is not a model the engine steps`
      : mu ? 'its permeability, a fixed μ with loss, is not causal' : 'a power law is not causal';
    out.push(
      `material "${f.material}": stepped by the pulse engine as a fitted causal model (${why}); ` +
      `its worst error over the band is ${(100 * f.maxRelErr_re).toFixed(2)} % in ${x}' and ${(100 * f.maxRelErr_im).toFixed(2)} % in ${x}''${below} ` +
      '(the fit favours the frequencies whose waves reach the probes). The agreement row "stepped media-tmm" shows what this does to R and T.',
    );
  }
  return out;
}

/** Stacks resolved recently, by everything the result depends on. */
const CACHE_SIZE = 16;
const cache = new Map<string, Resolved>();

const cacheKey = (stack: Stack): string =>
  JSON.stringify([stack.band_Hz, stack.front, stack.layers, stack.back, stack.incidence]);

/** The effective stack (cached); callers get their own copies of the warning and fit lists. */
export function resolveStack(stack: Stack): Resolved {
  const key = cacheKey(stack);
  let hit = cache.get(key);
  if (!hit) {
    hit = resolveUncached(stack);
    if (cache.size >= CACHE_SIZE) cache.delete(cache.keys().next().value as string);
    cache.set(key, hit);
  }
  return { effective: hit.effective, fits: [...hit.fits], warnings: [...hit.warnings] };
}

/** The series model of a permeability that needs no fitting (all but a fixed μ with loss). */
function magneticStepModel(m: MagneticModel | undefined): StepModel | null {
  if (m === undefined) return UNIT_MODEL;
  switch (m.model) {
    case 'fixed':
      return m.mu_loss === 0 ? (m.mu_r === 1 ? UNIT_MODEL : { epsInf: m.mu_r, sigma: 0, debye: [], osc: [] }) : null;
    case 'debye':
      return { epsInf: m.mu_inf, sigma: 0, debye: m.poles.map((p) => ({ deps: p.delta_mu, tau_s: p.tau_ps * ps })), osc: [] };
    case 'lorentz':
      return {
        epsInf: m.mu_inf, sigma: 0, debye: [],
        osc: m.poles.map((p) => {
          const w0 = 2 * Math.PI * p.f0_GHz * GHz;
          return { c: p.delta_mu * w0 * w0, w0sq: w0 * w0, gamma: 2 * Math.PI * p.gamma_GHz * GHz };
        }),
      };
  }
}

function resolveUncached(stack: Stack): Resolved {
  const fits: PowerLawFit[] = [];
  const warnings: string[] = [];
  const band = stack.band_Hz;
  const models = new Map<string, StepModel>();
  const cached = (key: string, make: () => PowerLawFit): StepModel => {
    const hit = models.get(key);
    if (hit) return hit;
    const fit = make();
    fits.push(fit);
    models.set(key, fit.model);
    return fit.model;
  };
  const shuntOf = (mat: BulkMaterial): StepModel => {
    const spec = mat.spec;
    if (spec.model !== 'power-law' && spec.model !== 'table') return stepModelOf(spec);
    const target = spec.model === 'table' ? tableTarget(spec) : powerLawTarget(spec);
    return cached(`ε|${mat.name}|${JSON.stringify(spec)}`,
      () => fitPermittivity(target, band, mat.name, { sensitivity: probeSensitivity(stack, mat.name) }));
  };
  const seriesOf = (mat: BulkMaterial): StepModel => {
    const spec = mat.spec;
    const fitMu = (target: ReturnType<typeof permeabilityTarget>) => cached(`μ|${mat.name}|${JSON.stringify(spec)}`,
      () => fitPermittivity(target, band, mat.name, { sensitivity: probeSensitivity(stack, mat.name, 'permeability') }));
    if (spec.model === 'table' && spec.mu_points !== undefined) {
      // A measured μ table: fitted as a table of ε is (its range, no conduction term).
      const pts = spec.mu_points, range = [...tableInterpolant(pts).range_Hz] as [number, number];
      if (pts.every(([, re, loss]) => re === 1 && loss === 0)) return UNIT_MODEL;
      return fitMu(permeabilityTarget('table', (f) => tableValue(pts, f), range, Math.min(...pts.map(([, re]) => re))));
    }
    const m = spec.magnetic, direct = magneticStepModel(m);
    if (direct !== null || m === undefined || m.model !== 'fixed') return direct ?? UNIT_MODEL;
    const mu = { re: m.mu_r, im: -m.mu_loss };
    return fitMu(permeabilityTarget('fixed', () => mu, null, m.mu_r));
  };
  const media = new Map<BulkMaterial, LineMedium>();
  const modelOf = (mat: BulkMaterial): LineMedium => {
    let m = media.get(mat);
    if (!m) { m = lineMedium(shuntOf(mat), seriesOf(mat)); media.set(mat, m); }
    return m;
  };
  if (isConductor(stack.front.spec, band)) {
    throw new PlanError(`front: the medium the wave comes from ("${stack.front.name}") is a conductor; nothing would reach the stack`, 'bad-input');
  }
  const front = modelOf(stack.front);
  const segments: GridSegment[] = [];
  const sheets: GridSheet[] = [];
  let back: LineMedium | 'pec' = 'pec';
  let x = 0;
  let ended = false;
  let previous = front;
  let conductors = 0;
  for (let i = 0; i < stack.layers.length && !ended; i++) {
    const layer = stack.layers[i];
    const label = `layers[${i}] ${layer.material.name}`;
    if (layer.kind === 'sheet') {
      sheets.push({ x_m: x, conductance_S: 1 / layer.material.spec.ohm_per_sq, label });
      continue;
    }
    const spec = layer.material.spec;
    const d = layer.thickness_m;
    if (isConductor(spec, band)) {
      const delta = skinDepth_m(spec, band[0]);
      if (d >= WALL_SKIN_DEPTHS * delta) {
        warnings.push(
          `${label}: a conductor ${(d / delta).toFixed(0)} skin depths thick at the band bottom; the pulse engine treats it as a perfect conductor at its front face (x = ${(x * 1e3).toFixed(3)} mm): layers behind it are not simulated and T = 0, so the pulse run gives no shielding figure: take it from the exact solution.`,
        );
        ended = true;
        conductors++;
        break;
      }
      const sigma = effectiveConductivity(spec, band[0]);
      const kd = d / skinDepth_m(spec, band[1]);
      warnings.push(
        `${label}: a conductive film ${(d * 1e6).toFixed(2)} µm thick (${kd.toFixed(2)} skin depths at the band top); the pulse engine treats it as a resistive sheet of ${(1 / (sigma * d)).toPrecision(3)} Ω/sq at its centre (thin-film approximation, error of order (d/δ)² = ${(kd * kd).toPrecision(2)}).${filmShieldingNote(kd)}`,
      );
      sheets.push({ x_m: x + d / 2, conductance_S: sigma * d, label });
      conductors++;
      const name = `${layer.material.name} (film filled with its neighbour)`;
      segments.push({ x0_m: x, x1_m: x + d, model: previous, layer: i, name, label: `layers[${i}] ${name}` });
      x += d;
      continue;
    }
    const model = modelOf(layer.material);
    segments.push({ x0_m: x, x1_m: x + d, model, layer: i, name: layer.material.name, label });
    previous = model;
    x += d;
  }
  if (!ended) {
    if (stack.back === 'pec') back = 'pec';
    else if (isConductor(stack.back.spec, band)) {
      warnings.push(`back: "${stack.back.name}" is a conductor; the pulse engine treats it as a perfect conductor at the back face.`);
      back = 'pec';
      conductors++;
    } else back = modelOf(stack.back);
  }
  warnings.push(...fitWarnings(fits));
  const substitutions = fits.length + conductors;
  return { effective: { front, segments, sheets, back, thickness_m: x, substitutions }, fits, warnings };
}
