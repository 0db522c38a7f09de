// The search behind `tune`, independent of stacks: a bounded problem in the unit cube, a global stage (the
// problem's own start points, then a quasi-random Halton set, halton.ts) and a local stage from the best few
// distinct points found (Nelder–Mead, or Levenberg–Marquardt for least squares), within a budget of evaluations.
// Deterministic for a seed. DOM-free and cancellable: evaluations run in batches of about BATCH_MS, and between
// batches the search reports progress, gives the event loop a turn (a worker's messages or a Ctrl-C get through)
// and asks whether to stop. For least squares, the Jacobian at the best point (central differences) follows,
// for the confidence intervals.

import { haltonPoints } from './halton.ts';
import { levenbergMarquardt } from './levenberg-marquardt.ts';
import { nelderMead, type LocalEnd } from './nelder-mead.ts';

export type Stage = 'start' | 'global' | 'local' | 'jacobian';
export const STAGES: readonly Stage[] = ['start', 'global', 'local', 'jacobian'];

/**
 * One evaluation: the value minimised, the goal's own figure, for least squares the residuals, and optionally a
 * smooth stand-in for a nonsmooth cost (a worst case over a band is a maximum with corners; a high power mean of
 * the same values is smooth and nearly as large), which the local stage descends first.
 */
export interface Evaluation { cost: number; objective: number; residuals?: Float64Array; smooth?: number }

/** A point the problem cannot evaluate (the stack it gives is refused); the message says why. */
export class RefusedPoint extends Error {
  override name = 'RefusedPoint';
}

export interface SearchProblem {
  dims: number;
  leastSquares: boolean;
  /** Throws RefusedPoint for a point it cannot evaluate. */
  evaluate(u: Float64Array): Evaluation;
  /** Points tried first (the stack file's own values). */
  starts: readonly Float64Array[];
}

export interface SearchProgress { evaluations: number; budget: number; stage: Stage; bestObjective: number }

export interface SearchOptions {
  seed: number;
  /** Evaluations for the global and local stages (the final Jacobian adds 2 per parameter at most). */
  budget: number;
  onProgress?: (p: SearchProgress) => void;
  shouldStop?: () => boolean;
}

export interface EvaluationRecord { u: Float64Array; objective: number; stage: Stage }

export interface SearchResult {
  best: { u: Float64Array; evaluation: Evaluation } | null;
  records: EvaluationRecord[];
  counts: Record<Stage, number>;
  refused: number;
  firstRefusal: string | null;
  /** Central-difference Jacobian of the residuals at the best point (m × n, per unit-cube coordinate). */
  jacobian: Float64Array | null;
  /** A local search ended on its own criteria (not on the budget). */
  converged: boolean;
  stopped: boolean;
}

/** Share of the budget for the global stage, and how many distinct points start local searches. */
export const GLOBAL_SHARE = 0.3;
export const LOCAL_STARTS = 3;
/** Local starts must differ by this much in some coordinate (unit cube). */
const DISTINCT = 0.05;
const BATCH_MS = 50;
const XTOL = 1e-7, NM_FTOL = 1e-13, LM_FTOL = 1e-12;
/** Central-difference step of the final Jacobian (unit cube). */
const JACOBIAN_STEP = 1e-5;

class Budgeted {
  readonly records: EvaluationRecord[] = [];
  readonly counts: Record<Stage, number> = { start: 0, global: 0, local: 0, jacobian: 0 };
  best: { u: Float64Array; evaluation: Evaluation } | null = null;
  refused = 0;
  firstRefusal: string | null = null;
  stopped = false;
  private spent = 0;
  private lastYield = now();

  constructor(private readonly problem: SearchProblem, private readonly options: SearchOptions) {}

  get exhausted(): boolean { return this.stopped || this.spent >= this.options.budget; }

  /** Evaluate u (counted against the budget, except the final Jacobian's); a refused point costs +∞. */
  async evaluate(u: Float64Array, stage: Stage): Promise<Evaluation> {
    if (stage !== 'jacobian') this.spent++;
    let ev: Evaluation;
    try {
      ev = this.problem.evaluate(u);
      this.counts[stage]++;
      this.records.push({ u: Float64Array.from(u), objective: ev.objective, stage });
      if (this.best === null || ev.cost < this.best.evaluation.cost) this.best = { u: Float64Array.from(u), evaluation: ev };
    } catch (e) {
      if (!(e instanceof RefusedPoint)) throw e;
      this.refused++;
      this.firstRefusal ??= e.message;
      ev = { cost: Infinity, objective: Infinity };
    }
    if (now() - this.lastYield >= BATCH_MS) await this.pause(stage);
    return ev;
  }

  /** Progress, a turn for the event loop, and the stop question. */
  async pause(stage: Stage): Promise<void> {
    this.options.onProgress?.({ evaluations: this.records.length, budget: this.options.budget, stage, bestObjective: this.best?.evaluation.objective ?? NaN });
    await new Promise<void>((resolve) => setTimeout(resolve, 0));
    this.lastYield = now();
    if (this.options.shouldStop?.()) this.stopped = true;
  }
}

const now = (): number => globalThis.performance.now();

/** A point evaluated during the global stage. */
interface Found { u: Float64Array; ev: Evaluation }

/** Run the search. */
export async function search(problem: SearchProblem, options: SearchOptions): Promise<SearchResult> {
  const b = new Budgeted(problem, options);
  const n = problem.dims;
  const pool: Found[] = [];
  for (const u of problem.starts) {
    if (b.exhausted) break;
    pool.push({ u, ev: await b.evaluate(u, 'start') });
  }
  const globalCount = Math.max(n + 1, Math.round(GLOBAL_SHARE * options.budget) - problem.starts.length);
  for (const u of haltonPoints(globalCount, n, options.seed)) {
    if (b.exhausted) break;
    pool.push({ u, ev: await b.evaluate(u, 'global') });
  }
  const step = Math.min(0.25, Math.max(0.02, Math.pow(Math.max(globalCount, 1), -1 / n)));
  let converged = false;
  for (const start of distinctBest(pool, LOCAL_STARTS)) {
    if (b.exhausted) break;
    const end = await localSearch(b, problem, start, step);
    if (end?.converged) converged = true;
  }
  let jacobian: Float64Array | null = null;
  if (problem.leastSquares && b.best !== null && !b.stopped) jacobian = await centralJacobian(b, b.best.u, n);
  if (!b.stopped) await b.pause('local');
  return {
    best: b.best, records: b.records, counts: b.counts, refused: b.refused, firstRefusal: b.firstRefusal,
    jacobian, converged, stopped: b.stopped,
  };
}

/** The lowest-cost finite points, each differing from those already taken. */
function distinctBest(pool: Found[], count: number): Found[] {
  const sorted = pool.filter((p) => Number.isFinite(p.ev.cost)).sort((a, c) => a.ev.cost - c.ev.cost);
  const out: Found[] = [];
  for (const p of sorted) {
    if (out.length >= count) break;
    if (out.every((q) => q.u.some((x, k) => Math.abs(x - p.u[k]) > DISTINCT))) out.push(p);
  }
  return out;
}

/**
 * One local search driven to its end or the budget's. Nelder–Mead descends the smooth stand-in first when there is
 * one, then the cost, restarted from where it ended while a restart still improves (a fresh simplex undoes a
 * collapsed one); Levenberg–Marquardt ends at a stationary point.
 */
async function localSearch(b: Budgeted, problem: SearchProblem, start: Found, step: number): Promise<LocalEnd | null> {
  if (problem.leastSquares) {
    const r0 = start.ev.residuals!;
    return drive(b, levenbergMarquardt(start.u, r0, { xtol: XTOL, ftol: LM_FTOL }), (ev) => ev.residuals ?? r0.map(() => Infinity));
  }
  let from = { u: start.u, f: start.ev.cost }, end: LocalEnd | null = null;
  if (start.ev.smooth !== undefined) {
    // The smooth stand-in brings the simplex near the corner where several worst frequencies balance …
    const near = await drive(b, nelderMead(start.u, start.ev.smooth, { step, xtol: XTOL, ftol: NM_FTOL }), (ev) => ev.smooth ?? Infinity);
    if (near === null) return null;
    const ev = await b.evaluate(near.u, 'local');
    if (ev.cost < from.f) from = { u: near.u, f: ev.cost };
  }
  // … and the cost itself, restarted while a fresh simplex still improves, settles it.
  for (let restart = 0; restart < 4 && !b.exhausted; restart++) {
    end = await drive(b, nelderMead(from.u, from.f, { step, xtol: XTOL, ftol: NM_FTOL }), (ev) => ev.cost);
    if (end === null || !(end.f < from.f * (1 - 1e-9) - 1e-15)) break;
    from = end;
  }
  return end;
}

/** Feed a local generator its evaluations (what it wants of each: `reply`) until it ends or the budget does. */
async function drive<T>(b: Budgeted, gen: Generator<Float64Array, LocalEnd, T>, reply: (ev: Evaluation) => T): Promise<LocalEnd | null> {
  let r = gen.next(undefined as T);
  while (!r.done) {
    if (b.exhausted) return null;
    r = gen.next(reply(await b.evaluate(r.value, 'local')));
  }
  return r.value;
}

/** ∂r/∂u at u by central differences (one-sided at a bound), evaluations logged as the 'jacobian' stage. */
async function centralJacobian(b: Budgeted, u: Float64Array, n: number): Promise<Float64Array | null> {
  const r0 = b.best!.evaluation.residuals!;
  const m = r0.length, J = new Float64Array(m * n);
  for (let k = 0; k < n; k++) {
    const plus = Float64Array.from(u), minus = Float64Array.from(u);
    plus[k] = Math.min(1, u[k] + JACOBIAN_STEP);
    minus[k] = Math.max(0, u[k] - JACOBIAN_STEP);
    const rp = plus[k] === u[k] ? r0 : (await b.evaluate(plus, 'jacobian')).residuals;
    const rm = minus[k] === u[k] ? r0 : (await b.evaluate(minus, 'jacobian')).residuals;
    if (!rp || !rm || b.stopped) return null;
    const h = plus[k] - minus[k];
    for (let i = 0; i < m; i++) J[i * n + k] = (rp[i] - rm[i]) / h;
  }
  return J;
}

