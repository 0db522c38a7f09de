// The pulse run's blocks of summary.json: what was stepped (grid), how the run went and ended, the fitted
// material models (read back by outside checks under `power_law_fits` and `permeability_fits`), the pulse.

import type { GridPlan, PulseRun } from '../fdtd/types.ts';
import type { Stack } from '../stack/types.ts';
import { degFromRad } from '../units.ts';
import { fittedMagneticModel, fittedModel } from './fitted-model.ts';

const r3 = (x: number): number => Number(x.toPrecision(3));
const r6 = (x: number): number => Number(x.toPrecision(6));

/** The method's line in summary.methods. */
export function fdtdDescription(stack: Stack): string {
  const { angle_rad, polarization } = stack.incidence;
  if (angle_rad === 0) return 'leapfrog FDTD pulse run (normal incidence)';
  const line = polarization === 'TE' ? 'series μ, shunt ε − s²/μ' : 'series μ − s²/ε, shunt ε';
  return `leapfrog FDTD pulse run (${polarization} at ${r6(degFromRad(angle_rad))}°, as the phase-matched line: ${line}, s² = ε_front μ_front sin²θ)`;
}

/** Which rule ended the run, in words. */
function endRule(run: PulseRun): string {
  switch (run.doneReason) {
    case 'converged': return `converged: R and T settled at every check frequency across the band (its bottom included) and the stored energy, pole states included, fell ${run.plan.decay_dB} dB below its peak`;
    case 'step-limit': return `step limit: ${run.plan.stepsLimit} steps reached before the run converged (see the warnings)`;
    default: return 'stopped before the run converged';
  }
}

export function gridSummary(p: GridPlan): Record<string, unknown> {
  return {
    cell_mm: r6(p.dx_m * 1e3),
    time_step_ps: r6(p.dt_s * 1e12),
    courant: r6(p.courant),
    cells: p.cells,
    cells_per_wavelength: r3(p.cellsPerWavelength),
    pml_cells: p.pmlCells,
    predicted_error: r3(p.predictedError),
    slowest_relaxation_ns: Number.isFinite(p.slowestRelaxation_s) ? r3(p.slowestRelaxation_s * 1e9) : null,
    accuracy_target: p.accuracyTarget,
    steps_limit: p.stepsLimit,
    memory_MB: r3(p.memory_bytes / 1e6),
    layers: p.layers.map((l) => ({
      index: l.index,
      name: l.name,
      cells: r3(l.cells),
      cells_per_wavelength: r3(l.cellsPerWavelength),
      phase_error_deg: r3(degFromRad(l.phaseError_rad)),
    })),
  };
}

/** How the run went: steps, simulated time, which rule ended it, the engine, what the records hold. */
export function runSummary(run: PulseRun, weakFrequencies: number, traceStride: number): Record<string, unknown> {
  const energy = run.energy();
  return {
    steps: run.stepIndex,
    simulated_ns: r6(run.time_s * 1e9),
    end: run.doneReason,
    end_rule: endRule(run),
    residual_energy_dB: Number.isFinite(energy.level_dB) ? r3(energy.level_dB) : null,
    decay_target_dB: -run.plan.decay_dB,
    truncated: run.doneReason !== 'converged',
    engine: run.engine,
    ...(run.engineFallback !== null ? { engine_note: run.engineFallback } : {}),
    weak_incident_frequencies: weakFrequencies,
    trace_every_nth_step: traceStride,
  };
}

/** The fitted causal models of power laws and tables (ε) and of permeabilities (μ). */
export function fitSummaries(fits: GridPlan['fits']): { power_law_fits: unknown[]; permeability_fits: unknown[] } {
  const power_law_fits = fits.filter((f) => f.quantity === 'permittivity').map((f) => ({
    material: f.material,
    source_model: f.source,
    band_GHz: [f.band_Hz[0] / 1e9, f.band_Hz[1] / 1e9],
    max_rel_error_eps_re: r3(f.maxRelErr_re),
    max_rel_error_eps_im: r3(f.maxRelErr_im),
    max_rel_error_eps: r3(f.maxRelErr_abs),
    min_eps_re_half_to_twice_band: r3(f.minEpsRe_wide),
    fit_range_GHz: [r6(f.fitRange_Hz[0] / 1e9), r6(f.fitRange_Hz[1] / 1e9)],
    model: fittedModel(f.model),
  }));
  // A fixed permeability with loss (not causal) or a μ table: stepped as a fitted Lorentz sum, written as a magnetic block.
  const permeability_fits = fits.filter((f) => f.quantity === 'permeability').map((f) => ({
    material: f.material,
    source_model: f.source,
    band_GHz: [f.band_Hz[0] / 1e9, f.band_Hz[1] / 1e9],
    max_rel_error_mu_re: r3(f.maxRelErr_re),
    max_rel_error_mu_im: r3(f.maxRelErr_im),
    max_rel_error_mu: r3(f.maxRelErr_abs),
    fit_range_GHz: [r6(f.fitRange_Hz[0] / 1e9), r6(f.fitRange_Hz[1] / 1e9)],
    magnetic: fittedMagneticModel(f.model),
  }));
  return { power_law_fits, permeability_fits };
}

/** The engine's own pulse (before the band window the echo analysis applies). */
export function pulseSummary(plan: GridPlan): Record<string, unknown> {
  return {
    f0_GHz: r6(plan.pulse.f0_Hz / 1e9),
    tau_ps: r6(plan.pulse.tau_s * 1e12),
    band_edge_dB: plan.pulse.edge_dB,
    envelope_fwhm_ns: r6(2 * Math.sqrt(Math.LN2) * plan.pulse.tau_s * 1e9),
  };
}
