// Material models as written in a stack file (units in the key names).
// Time dependence e^{+jωt}; complex relative permittivity ε_r = ε' − jε'' and, where a bulk material
// carries a `magnetic` block, complex relative permeability μ_r = μ' − jμ'' (μ_r = 1 without one).

/** μ_r = mu_r − j mu_loss, constant over frequency. */
export interface FixedMagnetic { model: 'fixed'; mu_r: number; mu_loss: number }
export interface DebyeMagneticPole { delta_mu: number; tau_ps: number }
/** μ_r = μ∞ + Σ Δμ / (1 + jωτ). */
export interface DebyeMagnetic { model: 'debye'; mu_inf: number; poles: DebyeMagneticPole[] }
export interface LorentzMagneticPole { delta_mu: number; f0_GHz: number; gamma_GHz: number }
/** μ_r = μ∞ + Σ Δμ ω0² / (ω0² − ω² + jωγ). */
export interface LorentzMagnetic { model: 'lorentz'; mu_inf: number; poles: LorentzMagneticPole[] }
export type MagneticModel = FixedMagnetic | DebyeMagnetic | LorentzMagnetic;
export type MagneticModelName = MagneticModel['model'];
export const MAGNETIC_MODEL_NAMES: readonly MagneticModelName[] = ['fixed', 'debye', 'lorentz'];

/** Any bulk model may carry a permeability; without one μ_r = 1. */
interface MaybeMagnetic { magnetic?: MagneticModel }

export interface FixedModel extends MaybeMagnetic { model: 'fixed'; eps_r: number; sigma_S_per_m: number }
export interface DebyePole { delta_eps: number; tau_ps: number }
export interface DebyeModel extends MaybeMagnetic { model: 'debye'; eps_inf: number; poles: DebyePole[]; sigma_S_per_m: number }
export interface LorentzPole { delta_eps: number; f0_GHz: number; gamma_GHz: number }
export interface LorentzModel extends MaybeMagnetic { model: 'lorentz'; eps_inf: number; poles: LorentzPole[]; sigma_S_per_m: number }
export interface DrudeModel extends MaybeMagnetic { model: 'drude'; eps_inf: number; plasma_GHz: number; collision_GHz: number; sigma_S_per_m: number }
/** ITU-R P.2040 form: ε' = a f^b, σ = c f^d, f in GHz. */
export interface PowerLawModel extends MaybeMagnetic { model: 'power-law'; a: number; b: number; c: number; d: number }
/** One row of a measured table: frequency in GHz, then the real part and the loss (ε' and ε'', or μ' and μ''). */
export type TablePoint = [f_GHz: number, re: number, loss: number];
/**
 * Measured ε_r = ε' − jε'' (ε'' ≥ 0) at increasing frequencies, interpolated by PCHIP in ln f (table.ts);
 * `mu_points`, when given, is the sample's measured μ_r = μ' − jμ'' the same way (then no `magnetic` block).
 */
export interface TableModel extends MaybeMagnetic { model: 'table'; points: TablePoint[]; mu_points?: TablePoint[] }
/** A resistive sheet of zero thickness. */
export interface SheetModel { model: 'sheet'; ohm_per_sq: number }

export type BulkModel = FixedModel | DebyeModel | LorentzModel | DrudeModel | PowerLawModel | TableModel;
export type MaterialModel = BulkModel | SheetModel;
export type ModelName = MaterialModel['model'];

export const MODEL_NAMES: readonly ModelName[] = ['fixed', 'debye', 'lorentz', 'drude', 'power-law', 'table', 'sheet'];

/** A material with its provenance, as the catalog lists it and as a stack resolves it. */
export interface Material {
  name: string;
  spec: MaterialModel;
  /** Where the numbers come from ("user" for a stack's own materials). */
  source: string;
  /** Frequency range over which the source vouches for the model, GHz; null when unbounded. */
  valid_GHz: [number, number] | null;
  /** Anything a user must know (e.g. "treated as a perfect conductor in FDTD"). */
  note?: string;
}

export const isSheet = (m: MaterialModel): m is SheetModel => m.model === 'sheet';
