// slabecho solve FILE --out DIR: exact frequency-domain results (spectrum, profile, summary) into DIR.

import { join } from 'node:path';
import { solveReport, type Media, type Report } from '../../report/solve.ts';
import { PlanError } from '../../fdtd/errors.ts';
import { csvChunks, fixedDecimals } from '../../report/table.ts';
import { fmtGHz } from '../../stack/warnings.ts';
import type { Stack } from '../../stack/types.ts';
import type { StackFile } from '../../stack/file.ts';
import type { Command, Io, ParsedArgs } from '../command.ts';
import { CliError, InputError, readArgs, UsageError } from '../command.ts';
import { ensureDir, loadStackFile, removeIfPresent, textFile, writeFilesAtomic, type OutputFile, type WriteOptions } from '../io.ts';
import { FEM_ARG_OPTIONS, FEM_ARG_USAGE, femOptionsFromArgs } from '../fem-args.ts';
import { formatAgreement } from '../../report/format-agreement.ts';
import { estimateSolve } from '../../report/estimate.ts';
import { BUDGET_ARG_OPTIONS, BUDGET_ARG_USAGE, budgetFromArgs } from '../budget-args.ts';
import { SParameterError, sParameters, type PlaneShift } from '../../studies/sparams.ts';
import { bandFrequencies } from '../../results.ts';
import { solveTmm } from '../../tmm/solve.ts';
import { touchstoneExtension, touchstoneText } from '../../studies/touchstone.ts';
import { SLABECHO_VERSION } from '../../version.ts';
import { TOUCHSTONE_ARG_OPTIONS, TOUCHSTONE_ARG_USAGE, touchstoneFromArgs } from '../studies/args.ts';

/** --media, shared by solve, run and converge. */
export const MEDIA_ARG_OPTIONS = { media: { type: 'string' } } as const;
export const MEDIA_ARG_USAGE = `  --media M    tables (default): every method solves the media as the stack names them; stepped: the
               exact solver and the FEM solve the media as the pulse engine steps them (power laws as their
               fitted causal models, conductors as walls or sheets); the row "stepped media-tmm" keeps the difference`;

/** --media, or 'tables'; a UsageError (exit 2) for anything else. */
export function mediaFromArgs(values: ParsedArgs['values']): Media {
  const m = values.media;
  if (m === undefined) return 'tables';
  if (m === 'tables' || m === 'stepped') return m;
  throw new UsageError(`--media: must be tables or stepped (got "${String(m)}")`);
}

/** A PlanError met while preparing the stepped media is the stack's problem: exit 2, the message as it is. */
export function planErrorAsInput<T>(work: () => T): T {
  try { return work(); } catch (e) {
    if (e instanceof PlanError) throw new CliError(`${e.message}; nothing was written`, 2);
    throw e;
  }
}

/** Load FILE, or print its problems (one line each) and throw InputError (exit 2). */
export function loadOrExplain(path: string, io: Io): { stack: Stack; warnings: string[]; file: StackFile } {
  const r = loadStackFile(path);
  if (!r.ok) {
    for (const line of r.errors) io.err(`${path}: ${line}`);
    throw new InputError(`${path}: ${r.errors.length} problem${r.errors.length === 1 ? '' : 's'}; nothing was written`);
  }
  return { stack: r.stack, warnings: r.warnings, file: r.file };
}

/**
 * Write a report's files into `dir` (created if needed) all at once, atomically and streamed row by row:
 * spectrum.csv, profile.csv (when there is a profile), then `extra`, then summary.json. Returns the paths written.
 */
export function writeReport(dir: string, report: Report, extra: readonly OutputFile[] = [], options: WriteOptions = {}): string[] {
  ensureDir(dir);
  const files: OutputFile[] = [{ name: 'spectrum.csv', chunks: csvChunks(report.spectrum) }];
  if (report.profile.length > 0) files.push({ name: 'profile.csv', chunks: csvChunks(report.profile) });
  files.push(...extra, textFile('summary.json', `${JSON.stringify(report.summary, null, 2)}\n`));
  const written = writeFilesAtomic(dir, files, options);
  // A profile.csv left by an earlier normal-incidence run would not belong to these results.
  if (report.profile.length === 0) removeIfPresent(join(dir, 'profile.csv'));
  return written;
}

/**
 * spectrum.s2p (or .s1p behind a conductor) of the stack as written (also with --media stepped); InputError (exit 2,
 * nothing written) when a half-space cannot be a port.
 */
export function touchstoneFile(stack: Stack, shift: PlaneShift): OutputFile {
  try {
    const s = sParameters(stack, solveTmm(stack, bandFrequencies(stack)), shift);
    return textFile(`spectrum${touchstoneExtension(s)}`, touchstoneText(stack, s, shift, SLABECHO_VERSION));
  } catch (e) {
    if (e instanceof SParameterError) throw new InputError(`--touchstone: ${e.message}; nothing was written`);
    throw e;
  }
}

export const solve: Command = {
  name: 'solve',
  summary: 'exact R, T spectra and standing-wave profile of a stack into a directory',
  usage: `Usage: slabecho solve FILE --out DIR [--fem-order P] [--fem-density N] [--media tables|stepped]
                    [--touchstone [--deembed-mm F,B]]

Solve the stack in FILE with the exact transfer-matrix method, cross-checked by the FEM, and write into DIR
(created if needed):
  spectrum.csv   f_GHz,R_tmm_re,R_tmm_im,T_tmm_re,T_tmm_im,R_fem_re,R_fem_im,T_fem_re,T_fem_im: one row per frequency
  profile.csv    x_mm,E_tmm_re,E_tmm_im,E_fem_re,E_fem_im: total tangential E along the normal line at
                 profile_GHz, incident amplitude 1 at x = 0, at any angle; in TM also H_tmm_re,H_tmm_im
                 after E_tmm and H_fem_re,H_fem_im after E_fem: the tangential H over its incident value
                 ... then R_power,T_power,absorbed,IL_dB,RL_dB,IPD_deg (the engineering quantities, exact)
  summary.json   the stack as understood, methods run with timings, results in brief, warnings
  spectrum.s2p   with --touchstone (spectrum.s1p behind a conductor): Touchstone 2.0 S-parameters
Files are written atomically: an interrupted run leaves the previous files or the new ones.
The work is estimated first: a job over the limits below is refused before it starts.

Options:
  --out DIR          output directory (required)
${FEM_ARG_USAGE}
${MEDIA_ARG_USAGE}
${TOUCHSTONE_ARG_USAGE}
${BUDGET_ARG_USAGE}
  -h, --help         show this help

Exit: 0 done, 2 invalid stack, usage, or a job over its limits (nothing written), 1 internal error.`,
  async run(args, io) {
    const a = readArgs(solve, args, io, { out: { type: 'string' }, ...FEM_ARG_OPTIONS, ...MEDIA_ARG_OPTIONS, ...TOUCHSTONE_ARG_OPTIONS, ...BUDGET_ARG_OPTIONS }, [1, 1]);
    if (a === null) return 0;
    const out = a.values.out;
    if (typeof out !== 'string' || out === '') throw new UsageError('--out DIR is required (see slabecho solve --help)');
    const fem = femOptionsFromArgs(a.values);
    const media = mediaFromArgs(a.values);
    const shift = touchstoneFromArgs(a.values);
    const { budget, limitNames } = budgetFromArgs(a.values);
    const path = a.positionals[0];
    const { stack, warnings } = loadOrExplain(path, io);
    const job = estimateSolve(stack, { fem, budget, limitNames, touchstone: shift !== null });
    if (job.refusal !== undefined) throw new InputError(`${job.refusal}; nothing was written`);
    const report = planErrorAsInput(() => solveReport(stack, { inputWarnings: warnings, fem, media, job }));
    const touchstone = shift === null ? [] : [touchstoneFile(stack, shift)];
    for (const w of report.warnings) io.err(`warning: ${w}`);
    const written = writeReport(out, report, touchstone, { maxBytes: budget.maxOutput_bytes, limitName: limitNames.output });
    if (touchstone.length > 0) removeIfPresent(join(out, touchstone[0].name.endsWith('.s1p') ? 'spectrum.s2p' : 'spectrum.s1p'));
    const s = report.summary as { results: Record<string, number | null>; methods: { name: string; time_ms: number }[] };
    const r = s.results;
    const inc = stack.incidence.angle_rad === 0 ? `normal incidence (${stack.incidence.polarization})`
      : `${(report.summary.incidence as { angle_deg: number }).angle_deg}° ${stack.incidence.polarization}`;
    io.out(`${stack.title}: ${stack.layers.length} layer${stack.layers.length === 1 ? '' : 's'}, ` +
      `${fmtGHz(stack.band_Hz[0] / 1e9)}–${fmtGHz(stack.band_Hz[1] / 1e9)} GHz, ${stack.points} points, ${inc}`);
    let line = `|R| ${r.R_dB_min} to ${r.R_dB_max} dB`;
    if (r.T_dB_min !== null) line += `; |T| ${r.T_dB_min} to ${r.T_dB_max} dB`;
    if (typeof r.absorbed_fraction_max === 'number') {
      line += `; absorbed up to ${(100 * r.absorbed_fraction_max).toFixed(1)} % (at ${fmtGHz(r.absorbed_fraction_max_at_GHz as number)} GHz)`;
    }
    io.out(line);
    if (r.T_dB_min !== null && typeof r.IL_dB_min === 'number') {
      io.out(`insertion loss ${fixedDecimals(r.IL_dB_min, 2)} to ${fixedDecimals(r.IL_dB_max as number, 2)} dB; ` +
        `insertion phase delay ${fixedDecimals(r.IPD_deg_min as number, 1)} to ${fixedDecimals(r.IPD_deg_max as number, 1)}°`);
    }
    io.out(`wrote ${written.join(', ')} (${s.methods.map((m) => `${m.name} ${m.time_ms.toFixed(1)} ms`).join(', ')})`);
    if (report.agreement.length > 0) io.out(formatAgreement(report.agreement));
    return 0;
  },
};
