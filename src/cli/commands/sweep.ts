// slabecho sweep FILE --out DIR [--angle A:B:STEP] [--polarization TE,TM] [--set PATH=VALUES]…: the grid of cases,
// each solved exactly (and cross-checked), into sweep.csv, sweep.json and optionally a Touchstone file per case.

import type { StackFile } from '../../stack/file.ts';
import type { StudyMethod } from '../../studies/case.ts';
import { caseCount, shardRange, type Axis, type Shard } from '../../studies/grid.ts';
import { studyJson } from '../../studies/json-layout.ts';
import { PathError } from '../../studies/paths.ts';
import { angleAxis, polarizationAxis, setAxis, sweepAxes } from '../../studies/sweep-axes.ts';
import { caseStack, sweepDocument, sweepHead, sweepHeader, type SweepCaseRecord, type SweepPlan } from '../../studies/sweep.ts';
import { ValueSpecError } from '../../studies/values.ts';
import { WarningTally } from '../../studies/warning-tally.ts';
import { outDirFromArgs, readArgs, UsageError, type Command, type Io, type ParsedArgs } from '../command.ts';
import { FEM_ARG_OPTIONS, FEM_ARG_USAGE, femOptionsFromArgs } from '../fem-args.ts';
import { reportStopped } from '../signals.ts';
import { checkOutputEstimate, outputCapFromArgs, sizeText } from '../budget-args.ts';
import {
  methodsFromArgs, refuseInvalidTasks, shardFromArgs, STUDY_ARG_OPTIONS, STUDY_ARG_USAGE, threadsFromArgs,
  TOUCHSTONE_ARG_OPTIONS, TOUCHSTONE_ARG_USAGE, touchstoneFromArgs,
} from '../studies/args.ts';
import { execute, studyThreads } from '../studies/execute.ts';
import { OutputSet } from '../studies/output.ts';
import { PULSE_ARG_OPTIONS, pulseOptionsFromArgs } from './run.ts';
import { loadOrExplain } from './solve.ts';

/** The axes from --angle, --polarization and --set; UsageError naming the option. */
function axesFromArgs(values: ParsedArgs['values'], base: StackFile): Axis[] {
  const tryAxis = (option: string, make: () => Axis): Axis => {
    try { return make(); } catch (e) {
      if (e instanceof PathError || e instanceof ValueSpecError) throw new UsageError(`${option}: ${e.message}`);
      throw e;
    }
  };
  const angle = typeof values.angle === 'string' ? tryAxis('--angle', () => angleAxis(values.angle as string)) : null;
  const pol = typeof values.polarization === 'string' ? tryAxis('--polarization', () => polarizationAxis(values.polarization as string)) : null;
  const sets = ((values.set as string[] | undefined) ?? []).map((s) => tryAxis(`--set ${s}`, () => setAxis(s, base)));
  try { return sweepAxes(angle, pol, sets); } catch (e) { throw new UsageError(`--set: ${(e as Error).message}`); }
}

/** Rough cost of one case in exact frequency evaluations (to choose threads). */
function costPerCase(plan: SweepPlan): number {
  const base = plan.base.points * (plan.base.layers.length + 2);
  return base * (1 + (plan.methods.includes('fem') ? 30 : 0) + (plan.methods.includes('fdtd') ? 3000 : 0));
}

/**
 * The files' sizes, estimated before any work: sweep.csv's rows (the case's own columns, then f_GHz and ten numbers
 * of 12 significant digits, about 14 characters each with sign, point and comma, measured on typical sweeps), a
 * case record in sweep.json (about 230 bytes and 140 per agreement row), a Touchstone file (9 numbers a line).
 */
function estimateOutput(plan: SweepPlan, cases: number): { name: string; bytes: number }[] {
  const points = plan.base.points;
  const own = String(cases).length + 1 + 3 + 3 + plan.axes.length * 6;
  const rows = plan.methods.length === 1 ? 0 : plan.methods.includes('fdtd') ? 3 : 1;
  return [
    { name: 'sweep.csv', bytes: cases * points * (own + 6 + 10 * 14) },
    { name: 'sweep.json', bytes: 4000 + cases * (230 + 140 * rows) },
    { name: 'touchstone/', bytes: plan.touchstone ? cases * (700 + points * 9 * 15) : 0 },
  ];
}

const USAGE = `Usage: slabecho sweep FILE --out DIR [--angle A:B:STEP] [--polarization TE,TM] [--set PATH=VALUES]... [options]

Solve the stack in FILE for every combination of the values given (the grid of cases), exactly and cross-checked
by the FEM, and write into DIR (created if needed), all files together when the sweep is done:
  sweep.csv    case,angle_deg,polarization, one column per --set path (named by the path), then
               f_GHz,R_re,R_im,T_re,T_im,R_power,T_power,absorbed,IL_dB,RL_dB,IPD_deg: one row per case and frequency
  sweep.json   the stack, the axes and their values, each case's values, worst R_power and worst IL_dB over the
               band (and where), how far the methods agree, the worst case over the sweep, warnings counted
  touchstone/case-N.s2p (or .s1p)   with --touchstone, one Touchstone 2.0 file per case
VALUES is a range A:B:STEP (B included when it falls on a step), a list v1,v2,... or one value; a path that holds
a text (a material name) takes texts. Cases are numbered from 0, the last axis varying fastest.

Options:
  --out DIR                  output directory (required)
  --angle A:B:STEP           incidence angles in degrees (0 <= angle < 90), or a list
  --polarization TE,TM       polarizations (TE, TM or both)
  --set PATH=VALUES          a stack-file path and its values, e.g. layers[1].thickness_mm=2:8:0.5,
                             materials.coat.ohm_per_sq=150,377,600 (repeat for more axes)
  --methods LIST             tmm always; add fem (default: tmm,fem) and fdtd (a pulse run per case, slow)
${TOUCHSTONE_ARG_USAGE}
${STUDY_ARG_USAGE}
${FEM_ARG_USAGE}
  --accuracy X, --cells-per-wavelength N, --courant S   the pulse runs' settings (see slabecho run --help)
  -h, --help                 show this help

Every case is checked like a stack file before any work: a bad path or value is named. Ctrl-C stops the sweep:
nothing is written (DIR keeps its previous files), exit 130; shards already finished keep theirs.
Exit: 0 done, 2 invalid stack, case or usage (nothing written), 1 internal error.`;

export const sweep: Command = {
  name: 'sweep',
  summary: 'solve a grid of cases (angles, polarizations, any stack-file value) into one table',
  usage: USAGE,
  async run(args, io) {
    const a = readArgs(sweep, args, io, {
      out: { type: 'string' }, angle: { type: 'string' }, polarization: { type: 'string' },
      set: { type: 'string', multiple: true }, methods: { type: 'string' },
      ...PULSE_ARG_OPTIONS, ...TOUCHSTONE_ARG_OPTIONS, ...STUDY_ARG_OPTIONS, ...FEM_ARG_OPTIONS,
    }, [1, 1]);
    if (a === null) return 0;
    const out = outDirFromArgs(a.values, 'sweep');
    const methods: StudyMethod[] = methodsFromArgs(a.values);
    const options = {
      fem: femOptionsFromArgs(a.values), pulse: pulseOptionsFromArgs(a.values),
      touchstone: touchstoneFromArgs(a.values), shard: shardFromArgs(a.values), threads: threadsFromArgs(a.values),
      cap: outputCapFromArgs(a.values),
    };
    const path = a.positionals[0];
    const { file } = loadOrExplain(path, io);
    const plan: SweepPlan = { base: file, axes: axesFromArgs(a.values, file), methods, fem: options.fem, pulse: options.pulse, touchstone: options.touchstone };
    return runSweep(plan, options, out, io, path);
  },
};

interface RunOptions { shard: Shard | null; threads: number | undefined; cap: number }

async function runSweep(plan: SweepPlan, o: RunOptions, out: string, io: Io, path: string): Promise<number> {
  const { shard, threads } = o;
  const total = caseCount(plan.axes);
  const [from, to] = shardRange(total, shard);
  const n = to - from;
  const sizes = estimateOutput(plan, n);
  checkOutputEstimate('sweep', sizes, o.cap);
  refuseInvalidTasks(from, to, (k) => caseStack(plan, k), 'case', io, path);
  const cost = costPerCase(plan);
  io.err(`sweep: ${total} case${total === 1 ? '' : 's'}${shard ? `, shard ${shard.index}/${shard.count}: cases ${from} to ${to - 1}` : ''}; ` +
    `sweep.csv of about ${sizeText(sizes[0].bytes)}; ${studyThreads(n, cost, threads)} thread(s); methods ${plan.methods.join(', ')}`);
  const output = new OutputSet(out, o.cap);
  const csv = output.stream('sweep.csv');
  csv.write(`${sweepHeader(plan)}\n`);
  const records: SweepCaseRecord[] = [];
  const tally = new WarningTally();
  const end = await execute({
    io, command: 'sweep', noun: 'case', job: { kind: 'sweep', plan }, threads, costPerTask: cost, output,
    tasks: Array.from({ length: n }, (_, i) => from + i),
    onResult: ({ sweep: r }) => {
      csv.write(r!.rows);
      records.push(r!.record);
      tally.add(r!.index, r!.warnings);
      for (const f of r!.files) output.add(f.name, f.text);
    },
  });
  if (end === 'stopped') return reportStopped(io, 'sweep');
  const doc = sweepDocument(sweepHead(plan), records, tally.list(), shard ? { ...shard, cases: [from, to] } : null);
  output.add('sweep.json', studyJson(doc));
  const written = output.commit(plan.touchstone ? [{ folder: 'touchstone', prefix: 'case-' }] : []);
  reportSweep(io, doc, records.length, written.length, out, csv.bytes);
  return 0;
}

function reportSweep(io: Io, doc: Record<string, unknown>, cases: number, files: number, out: string, csvBytes: number): void {
  const w = doc.worst as { R_power: { case: number; value: number; f_GHz: number }; IL_dB: { case: number; value: number; f_GHz: number } } | null;
  if (w) {
    io.out(`worst R_power ${w.R_power.value.toPrecision(4)} (case ${w.R_power.case}, ${w.R_power.f_GHz} GHz); ` +
      `worst IL_dB ${w.IL_dB.value.toPrecision(4)} (case ${w.IL_dB.case}, ${w.IL_dB.f_GHz} GHz)`);
  }
  for (const g of doc.agreement_worst as { pair: string; R_max: number; T_max: number; cases: number; not_met: number }[]) {
    io.out(`${g.pair.replace('-', ' vs ')}: max|dR| ${g.R_max.toExponential(1)}, max|dT| ${g.T_max.toExponential(1)} over ${g.cases} cases` +
      (g.not_met ? `, target not met in ${g.not_met}` : ''));
  }
  const warnings = doc.warnings as { message: string; cases: number }[];
  for (const x of warnings.slice(0, 5)) io.err(`warning (${x.cases} case${x.cases === 1 ? '' : 's'}): ${x.message}`);
  if (warnings.length > 5) io.err(`… and ${warnings.length - 5} more warnings in sweep.json`);
  io.out(`wrote ${cases} case${cases === 1 ? '' : 's'} into ${out}: sweep.csv (${sizeText(csvBytes)}), sweep.json${files > 2 ? ` and ${files - 2} Touchstone files` : ''}`);
}
