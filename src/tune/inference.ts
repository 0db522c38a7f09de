// What a least-squares fit tells about its parameters, from the Jacobian J of the weighted residuals at the best
// point (the linear approximation of nonlinear regression: Bates & Watts, Nonlinear Regression Analysis and Its
// Applications, Wiley 1988, §2.3; recalled from memory):
//   s² = Σr² / (m − n),   Cov = s² (JᵀJ)⁻¹,   95 % interval = θ̂ ± t(0.975, m − n) · √Cov_kk.
// JᵀJ is decomposed into eigenvalues (dense.ts) in the unit cube of the search, so the parameters' units do not
// enter. A direction whose eigenvalue is below IDENTIFIABLE_RATIO of the largest is one the data do not see at
// all: the parameters along it get no interval. Parameters are also flagged when their interval is wider than
// their search range (the data do not pin them down) or when two of them are correlated beyond
// CORRELATION_WARN (the data fix a combination of the two, not each).

import { symmetricEigen } from './dense.ts';
import { normalEquations } from './levenberg-marquardt.ts';
import { studentQuantile } from './student-t.ts';

export const IDENTIFIABLE_RATIO = 1e-12;
export const CORRELATION_WARN = 0.999;
/** Share of a direction a parameter must carry to be named as lying along it. */
const DIRECTION_SHARE = 0.3;

export interface ParameterRange { name: string; lo: number; hi: number }

export interface Inference {
  /** Residual degrees of freedom m − n. */
  dof: number;
  /** The noise level the residuals imply, s = √(Σr²/(m − n)) (in the residuals' weighted units). */
  s: number;
  /** t(0.975, m − n). */
  t: number;
  /** Standard error of each parameter in its own units; null where the data do not see it. */
  standardError: (number | null)[];
  /** [lo, hi] of each parameter; null where the data do not see it. */
  interval95: ([number, number] | null)[];
  /** Correlation matrix (n × n, row-major); 0 off the diagonal where a standard error is null. */
  correlation: Float64Array;
  /** The smallest eigenvalue of JᵀJ over the largest (unit cube). */
  conditionRatio: number;
  warnings: string[];
}

/**
 * Inference at the best point `best` (parameter units) from the residuals r (length m) and J (m × n, row-major,
 * derivatives per unit-cube coordinate, i.e. per whole range of each parameter).
 */
export function inferParameters(J: Float64Array, r: Float64Array, best: readonly number[], ranges: readonly ParameterRange[]): Inference {
  const n = ranges.length, m = r.length, dof = m - n;
  if (dof < 1) throw new RangeError(`needs more measured values (${m}) than free parameters (${n})`);
  let ss = 0;
  for (const x of r) ss += x * x;
  const s = Math.sqrt(ss / dof), t = studentQuantile(0.95, dof);
  const { A } = normalEquations(J, r, m, n);
  const { values, vectors } = symmetricEigen(A, n);
  const top = Math.max(values[n - 1], 0);
  const blind = new Set<number>();
  const cov = new Float64Array(n * n); // (JᵀJ)⁻¹ over the directions the data see
  for (let j = 0; j < n; j++) {
    if (!(values[j] > IDENTIFIABLE_RATIO * top) || top === 0) {
      for (let k = 0; k < n; k++) if (vectors[k * n + j] ** 2 > DIRECTION_SHARE) blind.add(k);
      continue;
    }
    for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) cov[a * n + b] += (vectors[a * n + j] * vectors[b * n + j]) / values[j];
  }
  const width = ranges.map((p) => p.hi - p.lo);
  const seUnit = ranges.map((_, k) => (blind.has(k) ? null : s * Math.sqrt(Math.max(cov[k * n + k], 0))));
  const standardError = seUnit.map((e, k) => (e === null ? null : e * width[k]));
  const interval95 = standardError.map((e, k): [number, number] | null => (e === null ? null : [best[k] - t * e, best[k] + t * e]));
  const correlation = new Float64Array(n * n);
  for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) {
    if (a === b) correlation[a * n + b] = 1;
    else if (!blind.has(a) && !blind.has(b) && cov[a * n + a] > 0 && cov[b * n + b] > 0) {
      correlation[a * n + b] = cov[a * n + b] / Math.sqrt(cov[a * n + a] * cov[b * n + b]);
    }
  }
  const warnings = identifiabilityWarnings(ranges, blind, interval95, correlation);
  return { dof, s, t, standardError, interval95, correlation, conditionRatio: top > 0 ? Math.max(values[0], 0) / top : 0, warnings };
}

function identifiabilityWarnings(ranges: readonly ParameterRange[], blind: ReadonlySet<number>,
  interval95: readonly ([number, number] | null)[], correlation: Float64Array): string[] {
  const n = ranges.length, out: string[] = [];
  const names = (ks: number[]) => ks.map((k) => ranges[k].name).join(', ');
  if (blind.size > 0) {
    const ks = [...blind].sort((a, b) => a - b);
    out.push(`not identifiable: ${names(ks)} — the measured columns barely change when ${ks.length === 1 ? 'it changes' : 'these change together'}, ` +
      'so the data cannot fix ' + (ks.length === 1 ? 'it' : 'them') + '; measure more (phase, transmission, another angle) or hold ' +
      (ks.length === 1 ? 'it' : 'some of them') + ' fixed');
  }
  interval95.forEach((iv, k) => {
    if (iv === null) return;
    const p = ranges[k];
    if (iv[1] - iv[0] > p.hi - p.lo) {
      out.push(`not identifiable: ${p.name} — its 95 % interval (${fmt(iv[0])} to ${fmt(iv[1])}) is wider than its whole search range ${fmt(p.lo)}–${fmt(p.hi)}`);
    }
  });
  for (let a = 0; a < n; a++) for (let b = a + 1; b < n; b++) {
    const rho = correlation[a * n + b];
    if (Math.abs(rho) > CORRELATION_WARN) {
      out.push(`poorly identifiable: ${ranges[a].name} and ${ranges[b].name} are correlated (${rho.toFixed(4)}): ` +
        'the data fix a combination of the two rather than each');
    }
  }
  return out;
}

const fmt = (x: number): string => String(Number(x.toPrecision(6)));
