// Typed errors of the FDTD engine. Both carry the figures a caller shows to the user.

/** The requested run cannot be planned (too big, unsupported input). Thrown before anything is allocated. */
export class PlanError extends Error {
  override readonly name = 'PlanError';
  constructor(
    message: string,
    /** 'too-many-cells' | 'too-much-work' | 'unsupported' | 'bad-input' */
    readonly code: 'too-many-cells' | 'too-much-work' | 'unsupported' | 'bad-input',
    /** The figures behind the refusal (cells, cell-updates, limits…). */
    readonly figures: Record<string, number> = {},
  ) {
    super(message);
  }
}

/** The fields blew up (NaN, Inf, or energy growing with no source). The run stops at once. */
export class FdtdInstabilityError extends Error {
  override readonly name = 'FdtdInstabilityError';
  constructor(
    message: string,
    readonly step: number,
    /** E node where the field was largest or first non-finite. */
    readonly node: number,
    /** Its position, metres from the front face. */
    readonly x_m: number,
  ) {
    super(message);
  }
}
