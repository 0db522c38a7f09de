// Word offsets of the descriptors the WebAssembly step reads from its linear memory (arena.ts writes them).
// Shared verbatim by the TypeScript side and the AssemblyScript sources (src/fdtd/asm/), so the two cannot
// disagree. Every slot is a 32-bit word; f64 values take two words and start at an even word (8-byte aligned,
// descriptors are 16-byte aligned). Pointers are byte addresses; an absent array is 0; an absent node is −1.

/** Run descriptor: the two grids, the TF/SF coupling, the source, the probes and the profile's running DFT. */
export const R_MAIN = 0;
export const R_AUX = 1;
/** First total-field node a, and the auxiliary grid's offset (its node j is main node j + offset). */
export const R_TFSF = 2;
export const R_AUX_OFFSET = 3;
/** Source samples: the value driven into aux node 0 after step n is src[n] for n < length, else 0. */
export const R_SRC = 4;
export const R_SRC_LEN = 5;
/** Probe nodes (main grid): front face, back face (−1 behind a conductor), scattered-field probe. */
export const R_FRONT = 6;
export const R_BACK = 7;
export const R_SF_PROBE = 8;
/** Running DFT of the main grid's E over [lo, lo + len), one term at every step n with n % stride = 0. */
export const R_DFT_LO = 9;
export const R_DFT_LEN = 10;
export const R_DFT_RE = 11;
export const R_DFT_IM = 12;
export const R_DFT_STRIDE = 13;
/** Per step j of a batch: cos, sin of the DFT phase (read only on DFT steps). */
export const R_PHASORS = 14;
/** Per step j of a batch: incident, reflected, transmitted, scattered-probe samples. */
export const R_PROBES = 15;
/** ε∞ per main E node and μ∞ per main H node (energy weights). */
export const R_EPS_INF = 16;
export const R_MU_INF = 17;
/** f64: the DFT of the incident record (re, im), and Δt (energy of second-order poles). */
export const R_INC_RE = 18;
export const R_INC_IM = 20;
export const R_DT = 22;
/**
 * The running spectra of the probe records (convergence.ts): N check frequencies (even), accumulators (six runs
 * of N), phasor cos, sin (two runs of N), per-sample rotation (two runs of N), and the exact phasors for a step
 * whose index is a multiple of RESEED (two runs of N; the run fills them before such a batch).
 */
export const R_SPEC_N = 24;
export const R_SPEC_ACC = 25;
export const R_SPEC_PHASOR = 26;
export const R_SPEC_ROTATION = 27;
export const R_SPEC_SEEDS = 28;
export const RUN_WORDS = 32;
/** The phasors are re-seeded at every step index that is a multiple of this (convergence.ts RESEED). */
export const SPEC_RESEED = 256;

/** Grid descriptor. */
export const G_N = 0;
export const G_E = 1;
export const G_H = 2;
export const G_CA = 3;
export const G_CB = 4;
/** Per-H-node coefficient, or 0 when every H node has G_S. */
export const G_DB = 5;
/** f64: the H coefficient when uniform. */
export const G_S = 6;
export const G_PML_COUNT = 8;
/** Address of G_PML_COUNT consecutive PML descriptors. */
export const G_PML = 9;
/** Dispersive span descriptor (E nodes), or 0. */
export const G_DISP = 10;
/** H nodes with series terms: per-node da (h = da·h + db·curl), or 0 (da ≡ 1); their pole span, or 0. */
export const G_DA = 11;
export const G_HDISP = 12;
export const GRID_WORDS = 16;

/** PML region: E nodes [eLo, eHi) and H nodes [hLo, hHi), each with its b, c and ψ. */
export const P_E_LO = 0;
export const P_E_HI = 1;
export const P_BE = 2;
export const P_CE = 3;
export const P_PSI_E = 4;
export const P_H_LO = 5;
export const P_H_HI = 6;
export const P_BH = 7;
export const P_CH = 8;
export const P_PSI_H = 9;
export const PML_WORDS = 12;

/** Dispersive span: nodes [lo, hi) with cp, Eⁿ⁻¹ and the polarization accumulator; its pole groups. */
export const D_LO = 0;
export const D_HI = 1;
export const D_CP = 2;
export const D_E_OLD = 3;
export const D_ACC = 4;
export const D_GROUP_COUNT = 5;
/** Address of D_GROUP_COUNT consecutive group descriptors. */
export const D_GROUPS = 6;
export const DISP_WORDS = 8;

/**
 * Pole group (one material over nodes [lo, lo + len)). State is pair-interleaved: nodes 2p and 2p + 1 sit in the
 * two lanes of one 16-byte vector, so pole q of pair p is at state + 16 (p·nd + q) (Debye) and the second-order
 * pole's u, P̃ⁿ at state + 16 (2 (p·no + q)) and + 16 more.
 */
export const Q_LO = 0;
export const Q_LEN = 1;
export const Q_FILL = 2;
export const Q_ND = 3;
/** Debye: a, 1 − a, b per pole (3 f64). */
export const Q_D_COEF = 4;
export const Q_D_STATE = 5;
/** Δε per Debye pole (energy). */
export const Q_D_EPS = 6;
export const Q_NO = 7;
/** Second order: α, ξ, ζ per pole (3 f64). */
export const Q_O_COEF = 8;
export const Q_O_STATE = 9;
/** c and ω0² per second-order pole (energy). */
export const Q_O_C = 10;
export const Q_O_W0SQ = 11;
/**
 * Pairs [lo, hi) whose nodes belong to this group alone, to no CPML and no injection: their pole pass, Yee update
 * and polarization terms are done in one pass (the other nodes go through the span's accumulator).
 */
export const Q_FUSED_LO = 12;
export const Q_FUSED_HI = 13;
/**
 * 0 when no second-order term has an s-numerator (ζ1 = 2ζ0, ζ2 = ζ0: the update takes ζ0·f(2Fⁿ + Fⁿ⁻¹)); else
 * ζ1, ζ2 per pole (2 f64), and the update takes ζ1·fFⁿ + ζ2·fFⁿ⁻¹ (such a group has no fused pairs).
 */
export const Q_O_FULL = 14;
export const GROUP_WORDS = 16;

/** Steps per call of the WebAssembly step at most (the phasor and probe tables hold this many). */
export const BATCH_STEPS = 32;
