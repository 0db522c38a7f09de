// slabecho tolerance FILE --vary PATH:normal:SD --vary PATH:uniform:HALF … --samples N --seed S --out DIR:
// Monte Carlo over stack-file values; the 5th, 50th and 95th percentiles of the engineering quantities per frequency
// (tolerance.csv) and the worst samples found (tolerance.json).

import { formatCsv } from '../../report/table.ts';
import { bandFrequencies } from '../../results.ts';
import type { BandExtremes } from '../../studies/extremes.ts';
import { shardRange, type Shard } from '../../studies/grid.ts';
import { studyJson } from '../../studies/json-layout.ts';
import { PathError } from '../../studies/paths.ts';
import {
  drawSamples, MAX_SAMPLE_VALUES, MAX_SAMPLES, parseVary, SampleTable, sampleStack, type TolerancePlan,
} from '../../studies/tolerance.ts';
import { toleranceDocument, toleranceHead } from '../../studies/tolerance-doc.ts';
import { SAMPLES_FILE, SAMPLES_HEADER, sampleRows } from '../../studies/tolerance-shard.ts';
import { WarningTally } from '../../studies/warning-tally.ts';
import type { Stack } from '../../stack/types.ts';
import { numberOption, outDirFromArgs, readArgs, seedFromArgs, UsageError, type Command, type Io } from '../command.ts';
import { reportStopped } from '../signals.ts';
import { checkOutputEstimate, outputCapFromArgs } from '../budget-args.ts';
import { refuseInvalidTasks, shardFromArgs, STUDY_ARG_OPTIONS, STUDY_ARG_USAGE, threadsFromArgs } from '../studies/args.ts';
import { execute } from '../studies/execute.ts';
import { OutputSet } from '../studies/output.ts';
import { loadOrExplain } from './solve.ts';

const USAGE = `Usage: slabecho tolerance FILE --vary PATH:normal:SD [--vary PATH:uniform:HALF]... --out DIR [options]

Draw the varied stack-file values at random around their values in FILE (normal with standard deviation SD, or
uniform within +-HALF, in the path's own unit: mm for thickness_mm), solve every sample exactly, and write into DIR:
  tolerance.csv   f_GHz,R_power_p05,R_power_p50,R_power_p95,T_power_p05,...,absorbed_...,IL_dB_p05,IL_dB_p50,
                  IL_dB_p95,IPD_deg_p05,IPD_deg_p50,IPD_deg_p95: the 5th, 50th and 95th percentiles over the samples
  tolerance.json  what was varied and how, the seed, the nominal stack's results (with the FEM cross-check), the
                  sample with the worst R_power and the one with the worst IL_dB (their values and stack files)
The same seed gives the same samples on every machine, whatever the threads or shards. PATH is any number of the
stack file (layers[1].thickness_mm, materials.coat.eps_r, materials.coat.ohm_per_sq, incidence.angle_deg); to vary
a catalog material, print it as your own with "slabecho materials --export NAME". A shard (--shard) writes
tolerance-samples.csv and its tolerance.json instead; "slabecho merge" turns the shards into the two files above.

Options:
  --out DIR            output directory (required)
  --vary SPEC          PATH:normal:SD or PATH:uniform:HALF (repeat for more values; drawn together per sample)
  --samples N          number of samples, 2 to ${MAX_SAMPLES} (default 1000)
  --seed S             seed of the generator, a whole number 0 to 4294967295 (default 1)
${STUDY_ARG_USAGE}
  -h, --help           show this help

Every sample is checked like a stack file before any work (a normal draw can leave the allowed range: a smaller SD
or a uniform range fixes it). Ctrl-C: nothing is written, exit 130.
Exit: 0 done, 2 invalid stack, sample or usage (nothing written), 1 internal error.`;

export const tolerance: Command = {
  name: 'tolerance',
  summary: 'Monte Carlo over stack-file values: percentile bands of R, T, loss and phase delay',
  usage: USAGE,
  async run(args, io) {
    const a = readArgs(tolerance, args, io, {
      out: { type: 'string' }, vary: { type: 'string', multiple: true }, samples: { type: 'string' }, seed: { type: 'string' },
      ...STUDY_ARG_OPTIONS,
    }, [1, 1]);
    if (a === null) return 0;
    const out = outDirFromArgs(a.values, 'tolerance');
    const specs = (a.values.vary as string[] | undefined) ?? [];
    if (specs.length === 0) throw new UsageError('--vary PATH:normal:SD (or PATH:uniform:HALF) is required at least once');
    const samples = numberOption(a.values, 'samples', `must be a whole number from 2 to ${MAX_SAMPLES}`, (x) => Number.isInteger(x) && x >= 2 && x <= MAX_SAMPLES) ?? 1000;
    const seed = seedFromArgs(a.values);
    const shard = shardFromArgs(a.values), threads = threadsFromArgs(a.values), cap = outputCapFromArgs(a.values);
    const path = a.positionals[0];
    const { file, stack } = loadOrExplain(path, io);
    const varies = specs.map((s) => {
      try { return parseVary(s, file); } catch (e) {
        if (e instanceof PathError) throw new UsageError(`--vary ${s}: ${e.message}`);
        throw e;
      }
    });
    const seen = new Set<string>();
    for (const v of varies) {
      if (seen.has(v.path.text)) throw new UsageError(`--vary: ${v.path.text} is given twice`);
      seen.add(v.path.text);
    }
    if (samples * stack.points > MAX_SAMPLE_VALUES) {
      throw new UsageError(`--samples: ${samples} samples × ${stack.points} frequencies is more than ${MAX_SAMPLE_VALUES} values; ` +
        'use fewer samples or fewer "points" in the stack, or split the run with --shard');
    }
    return runTolerance({ base: file, varies, samples, seed }, stack, { shard, threads, cap }, out, io, path);
  },
};

async function runTolerance(plan: TolerancePlan, nominal: Stack, o: { shard: Shard | null; threads: number | undefined; cap: number },
  out: string, io: Io, path: string): Promise<number> {
  const { shard, threads } = o;
  const values = drawSamples(plan);
  const [from, to] = shardRange(plan.samples, shard);
  const f_Hz = bandFrequencies(nominal);
  // tolerance.csv: 16 numbers a frequency; a shard's samples: 7 full-precision numbers a sample and frequency.
  checkOutputEstimate('tolerance', [
    { name: 'tolerance.csv', bytes: shard ? 0 : f_Hz.length * 16 * 15 },
    { name: 'tolerance.json', bytes: 20_000 + 3 * JSON.stringify(plan.base).length }, // the stack, twice more in the worst samples
    { name: SAMPLES_FILE, bytes: shard ? (to - from) * f_Hz.length * 7 * 20 : 0 },
  ], o.cap);
  refuseInvalidTasks(from, to, (k) => sampleStack(plan, values, k), 'sample', io, path);
  io.err(`tolerance: ${plan.samples} samples of ${plan.varies.length} value${plan.varies.length === 1 ? '' : 's'}, seed ${plan.seed}` +
    `${shard ? `, shard ${shard.index}/${shard.count}: samples ${from} to ${to - 1}` : ''}; ${f_Hz.length} frequencies`);
  const head = await toleranceHead(plan, nominal);
  const output = new OutputSet(out, o.cap);
  const table = new SampleTable(f_Hz.length, to - from, from);
  const raw = shard ? output.stream(SAMPLES_FILE) : null;
  raw?.write(`${SAMPLES_HEADER}\n`);
  const tally = new WarningTally();
  const end = await execute({
    io, command: 'tolerance', noun: 'sample', job: { kind: 'tolerance', plan, values }, threads, output,
    costPerTask: f_Hz.length * (plan.base.layers.length + 2),
    tasks: Array.from({ length: to - from }, (_, i) => from + i),
    onResult: ({ sample }) => {
      table.add(sample!.index, sample!.quantities, sample!.extremes);
      tally.add(sample!.index, sample!.warnings);
      raw?.write(sampleRows(sample!, f_Hz));
    },
  });
  if (end === 'stopped') return reportStopped(io, 'tolerance');
  const extremes = table.extremes as BandExtremes[];
  const doc = toleranceDocument(head, plan, values, extremes, tally.list(), shard ? { ...shard, cases: [from, to] } : null);
  if (!shard) output.add('tolerance.csv', formatCsv(table.percentileColumns(f_Hz)));
  output.add('tolerance.json', studyJson(doc));
  const written = output.commit();
  reportTolerance(io, doc, written);
  return 0;
}

function reportTolerance(io: Io, doc: Record<string, unknown>, written: string[]): void {
  const n = doc.nominal as { worst_R_power: number; worst_IL_dB: number };
  const w = doc.worst as { R_power: { sample: number; value: number; f_GHz: number }; IL_dB: { sample: number; value: number; f_GHz: number } } | null;
  io.out(`nominal: worst R_power ${n.worst_R_power.toPrecision(4)}, worst IL_dB ${n.worst_IL_dB.toPrecision(4)}`);
  if (w) {
    io.out(`worst sample: R_power ${w.R_power.value.toPrecision(4)} (sample ${w.R_power.sample}, ${w.R_power.f_GHz} GHz); ` +
      `IL_dB ${w.IL_dB.value.toPrecision(4)} (sample ${w.IL_dB.sample}, ${w.IL_dB.f_GHz} GHz)`);
  }
  for (const x of (doc.warnings as { message: string; cases: number }[]).slice(0, 5)) io.err(`warning (${x.cases} samples): ${x.message}`);
  io.out(`wrote ${written.join(', ')}`);
}
