// tolerance.json: what was varied and how, the nominal stack's results (with the FEM cross-check), the worst
// samples found (their values and stack files, to run again), and the warnings counted over the samples. A merge
// of shards assembles it from the same parts, so it is byte for byte the file one run writes.

import { roundedRow } from '../report/format-agreement.ts';
import type { StackFile } from '../stack/file.ts';
import type { Stack } from '../stack/types.ts';
import { SLABECHO_VERSION } from '../version.ts';
import { solveCase } from './case.ts';
import { bandExtremes, type BandExtremes } from './extremes.ts';
import type { Shard } from './grid.ts';
import { sampleSettings, sampleStack, toleranceColumns, PERCENTILES, type TolerancePlan } from './tolerance.ts';
import type { TalliedWarning } from './warning-tally.ts';

/** The part every shard shares: the plan, the generator, the nominal results. */
export async function toleranceHead(plan: TolerancePlan, nominal: Stack): Promise<Record<string, unknown>> {
  const solution = await solveCase(nominal, { methods: ['tmm', 'fem'] });
  return {
    slabecho_version: SLABECHO_VERSION,
    kind: 'tolerance',
    title: plan.base.title,
    columns: toleranceColumns(),
    samples: plan.samples,
    seed: plan.seed,
    generator: 'MT19937 (Matsumoto & Nishimura 1998), 53-bit uniforms; normals by Box-Muller; values drawn sample by sample, in the order of --vary',
    percentiles: {
      p: PERCENTILES.map((p) => p.p),
      definition: 'linear interpolation between order statistics at h = (n - 1) p (Hyndman & Fan 1996, definition 7)',
    },
    varies: plan.varies.map((v) => ({
      path: v.path.text, distribution: v.distribution, nominal: v.nominal,
      ...(v.distribution === 'normal' ? { sd: v.width } : { half_width: v.width }), spec: v.spec,
    })),
    nominal: {
      ...bandExtremes(solution.exact.spectrum.f_Hz, solution.exact.quantities),
      agreement: solution.agreement.map(roundedRow),
      ...(Object.keys(solution.declined).length ? { declined: solution.declined } : {}),
    },
    stack: plan.base,
  };
}

/** The sample with the largest value of `key` (the first on a tie). */
function worstSample(extremes: readonly BandExtremes[], key: 'worst_R_power' | 'worst_IL_dB'): number {
  let k = 0;
  for (let s = 1; s < extremes.length; s++) if (extremes[s][key] > extremes[k][key]) k = s;
  return k;
}

/** A worst sample as tolerance.json records it: its values and its stack file. */
function worstEntry(plan: TolerancePlan, values: Float64Array, s: number, value: number, f_GHz: number): Record<string, unknown> {
  const settings = sampleSettings(plan, values, s);
  const c = sampleStack(plan, values, s);
  return {
    sample: s, value, f_GHz,
    values: Object.fromEntries(settings.map((x) => [x.path.text, x.value])),
    stack: c.ok ? c.file : null as StackFile | null,
  };
}

/**
 * tolerance.json. `extremes` are the samples' band extremes in sample order (all of them, or a shard's, from
 * shard.cases[0]); `values` every sample's drawn values.
 */
export function toleranceDocument(head: Record<string, unknown>, plan: TolerancePlan, values: Float64Array,
  extremes: readonly BandExtremes[], warnings: readonly TalliedWarning[], shard: (Shard & { cases: [number, number] }) | null): Record<string, unknown> {
  const first = shard ? shard.cases[0] : 0;
  const worst = extremes.length === 0 ? null : (() => {
    const r = worstSample(extremes, 'worst_R_power'), t = worstSample(extremes, 'worst_IL_dB');
    return {
      R_power: worstEntry(plan, values, first + r, extremes[r].worst_R_power, extremes[r].worst_R_power_f_GHz),
      IL_dB: worstEntry(plan, values, first + t, extremes[t].worst_IL_dB, extremes[t].worst_IL_dB_f_GHz),
    };
  })();
  return {
    ...head,
    ...(shard ? { shard: { index: shard.index, count: shard.count, first_sample: shard.cases[0], end_sample: shard.cases[1] } } : {}),
    worst,
    warnings,
  };
}
