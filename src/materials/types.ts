// Material models as written in a stack file (units in the key names).
// Time dependence e^{+jωt}; complex relative permittivity ε_r = ε' − jε''.

export interface FixedModel { model: 'fixed'; eps_r: number; sigma_S_per_m: number }
export interface DebyePole { delta_eps: number; tau_ps: number }
export interface DebyeModel { model: 'debye'; eps_inf: number; poles: DebyePole[]; sigma_S_per_m: number }
export interface LorentzPole { delta_eps: number; f0_GHz: number; gamma_GHz: number }
export interface LorentzModel { model: 'lorentz'; eps_inf: number; poles: LorentzPole[]; sigma_S_per_m: number }
export interface DrudeModel { model: 'drude'; eps_inf: number; plasma_GHz: number; collision_GHz: number; sigma_S_per_m: number }
/** ITU-R P.2040 form: ε' = a f^b, σ = c f^d, f in GHz. */
export interface PowerLawModel { model: 'power-law'; a: number; b: number; c: number; d: number }
/** A resistive sheet of zero thickness. */
export interface SheetModel { model: 'sheet'; ohm_per_sq: number }

export type BulkModel = FixedModel | DebyeModel | LorentzModel | DrudeModel | PowerLawModel;
export type MaterialModel = BulkModel | SheetModel;
export type ModelName = MaterialModel['model'];

export const MODEL_NAMES: readonly ModelName[] = ['fixed', 'debye', 'lorentz', 'drude', 'power-law', 'sheet'];

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
