// Stacks and measurements for the tune tests: parsed stack files and synthetic measured responses from the exact
// solver with seeded Gaussian noise (MT19937, Box–Muller, src/studies/random.ts).
import { parseStackObject } from '../../src/stack/parse.ts';
import type { StackFile } from '../../src/stack/file.ts';
import type { Stack } from '../../src/stack/types.ts';
import { Mt19937 } from '../../src/studies/random.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { readMeasured, type Measured } from '../../src/tune/measured.ts';
import { linspace } from '../../src/units.ts';

export function parsed(obj: unknown): { stack: Stack; file: StackFile } {
  const r = parseStackObject(obj);
  if (!r.ok) throw new Error(r.errors.join('\n'));
  return { stack: r.stack, file: r.file };
}

/** A measured CSV of `columns` (R_re,R_im,T_re,T_im or R_dB …) from `truth` at n frequencies, noise σ per value. */
export function synthetic(truth: Stack, n: number, columns: ('R' | 'T' | 'R_dB')[], sigma: number, rng: Mt19937): string {
  const f = linspace(truth.band_Hz[0], truth.band_Hz[1], n), sp = solveTmm(truth, f);
  const head = columns.flatMap((c) => (c === 'R_dB' ? ['R_dB'] : [`${c}_re`, `${c}_im`]));
  const rows = Array.from(f, (fi, i) => [fi / 1e9, ...columns.flatMap((c) => {
    if (c === 'R_dB') return [20 * Math.log10(Math.hypot(sp.R_re[i], sp.R_im[i])) + sigma * rng.normal()];
    const [re, im] = c === 'R' ? [sp.R_re[i], sp.R_im[i]] : [sp.T_re[i], sp.T_im[i]];
    return [re + sigma * rng.normal(), im + sigma * rng.normal()];
  })].join(','));
  return `f_GHz,${head.join(',')}\n${rows.join('\n')}\n`;
}

export function measuredOf(csv: string, stack: Stack): Measured {
  const m = readMeasured(csv, 'measured.csv', stack);
  if (!m.ok) throw new Error(m.errors.join('\n'));
  return m.measured;
}
