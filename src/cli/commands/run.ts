// slabecho run FILE --out DIR: everything `solve` writes plus the FDTD pulse results
// (spectrum and profile columns, echoes.csv, trace.csv, grid/run/agreement in summary.json).
//
// Interruption (Ctrl-C): the run stops at the end of the current chunk of steps and nothing is written
// (files already in DIR are left as they were); exit 130. All files are written atomically together.

import { FdtdInstabilityError, PlanError } from '../../fdtd/errors.ts';
import type { PulseOptions } from '../../fdtd/types.ts';
import { echoCsvChunks, formatEchoText } from '../../report/echo-table.ts';
import { formatAgreement } from '../../report/format-agreement.ts';
import { runReport, type RunReport } from '../../report/run.ts';
import { csvChunks } from '../../report/table.ts';
import { fmtGHz } from '../../stack/warnings.ts';
import { CliError, numberOption, outDirFromArgs, readArgs, UsageError, type Command, type Io, type ParsedArgs } from '../command.ts';
import { FEM_ARG_OPTIONS, FEM_ARG_USAGE, femOptionsFromArgs } from '../fem-args.ts';
import { loadOrExplain, MEDIA_ARG_OPTIONS, MEDIA_ARG_USAGE, mediaFromArgs, writeReport } from './solve.ts';
import { estimateRun, WorkRefused } from '../../report/estimate.ts';
import { BUDGET_ARG_OPTIONS, BUDGET_ARG_USAGE, budgetFromArgs } from '../budget-args.ts';
import type { WriteOptions } from '../io.ts';
import { EXIT_INTERRUPTED, reportStopped } from '../signals.ts';
import { TaskPool } from '../pool.ts';
import type { RunParallel } from '../../report/run.ts';

export { EXIT_INTERRUPTED };

/** The pulse run's options, shared by `run` and `sweep --methods …,fdtd`. */
export const PULSE_ARG_OPTIONS = {
  accuracy: { type: 'string' },
  'cells-per-wavelength': { type: 'string' },
  courant: { type: 'string' },
} as const;

/** Pulse options from the command line; UsageError (exit 2) naming the option. */
export function pulseOptionsFromArgs(values: ParsedArgs['values']): PulseOptions {
  const out: PulseOptions = {};
  const acc = numberOption(values, 'accuracy', 'must be a number between 0 and 1, e.g. 0.01', (x) => x > 0 && x < 1);
  if (acc !== undefined) out.accuracy = acc;
  const cpw = numberOption(values, 'cells-per-wavelength', 'must be a number >= 4', (x) => x >= 4);
  if (cpw !== undefined) out.cellsPerWavelength = cpw;
  const s = numberOption(values, 'courant', 'must be a number in (0, 1]', (x) => x > 0 && x <= 1);
  if (s !== undefined) out.courant = s;
  return out;
}

/** Write every file of a run report into `dir` at once (atomically, streamed); returns the paths. */
export function writeRunReport(dir: string, report: RunReport, options: WriteOptions = {}): string[] {
  return writeReport(dir, report, [
    { name: 'echoes.csv', chunks: echoCsvChunks(report.echoes) },
    { name: 'echoes_T.csv', chunks: echoCsvChunks(report.echoesT) },
    { name: 'trace.csv', chunks: csvChunks(report.trace) }, // header only when the pulse engine was skipped
  ], options);
}

/** Progress lines on stderr, the first after one second, then at most one a second. */
function progressPrinter(io: Io): (f: number) => void {
  const start = Date.now();
  let last = 0;
  return (f) => {
    const t = Date.now();
    if (t - start < 1000 || t - last < 1000) return;
    last = t;
    io.err(`run: ${Math.round(100 * f)} % (${((t - start) / 1000).toFixed(1)} s)`);
  };
}

export const run: Command = {
  name: 'run',
  summary: 'FDTD pulse run beside the exact solution: spectra, echoes, traces into a directory',
  usage: `Usage: slabecho run FILE --out DIR [options]

Send a broadband pulse at the stack in FILE (leapfrog FDTD), and solve it exactly (and by FEM) at the
same frequencies. Writes into DIR (created if needed), all files at once:
  spectrum.csv   f_GHz, the exact and FEM columns, then R_fdtd_re,R_fdtd_im,T_fdtd_re,T_fdtd_im
  profile.csv    x_mm, the exact and FEM columns as for solve, then E_fdtd_re,E_fdtd_im at profile_GHz
  echoes.csv     t_ns,level_dB,amplitude,predicted_t_ns,path,nearest_path,resolved: one row per
                 reflected echo; t_ns after the front-face echo (at 0), level relative to the incident
                 pulse, path in plain words ("unexplained" with its nearest path), resolved yes or no
  echoes_T.csv   the same for the transmitted record, t_ns after the incident pulse passes x = 0
  trace.csv      t_ns,E_incident,E_reflected,E_transmitted: the time records at x = 0 and the back face
  summary.json   as for solve, plus grid, run, pulse, echoes, transmitted, power-law and permeability fits,
                 agreement and timings
The engine is one-dimensional. At an angle, TE or TM, it steps the phase-matched line of each medium
(TE: series μ, shunt ε − s²/μ; TM: series μ − s²/ε, shunt ε; s² = ε_front μ_front sin²θ), which needs a
lossless, non-dispersive front medium such as air. A medium evanescent up to any frequency at that angle
(ε∞μ∞ below s²) has no stable stepping: a warning, solve's results, and the echo files and trace.csv with
only their headers.

Options:
  --out DIR                   output directory (required)
  --accuracy X                target for the engine's error, max |R_fdtd - R| and |T_fdtd - T| against the exact
                              solution of the media it steps (default 0.01, honoured down to 0.0001)
  --cells-per-wavelength N    fix the grid density at the band top in the slowest medium (overrides --accuracy)
  --courant S                 Courant number c dt / dx (default 1 in an air front medium)
  --echo-floor DB             list echoes down to DB below the incident pulse's envelope peak (default 40, at most 100)
${FEM_ARG_USAGE}
${MEDIA_ARG_USAGE}
${BUDGET_ARG_USAGE}
  -h, --help                  show this help

The work is estimated first (grid, time steps, memory, output): a job over the limits is refused at once.
Ctrl-C stops the run cleanly: nothing is written (DIR keeps its previous files), exit 130.
Exit: 0 done, 2 invalid stack, usage or a grid too large (nothing written), 1 instability or internal error.`,
  async run(args, io) {
    const a = readArgs(run, args, io, {
      out: { type: 'string' },
      ...PULSE_ARG_OPTIONS,
      'echo-floor': { type: 'string' },
      ...FEM_ARG_OPTIONS,
      ...MEDIA_ARG_OPTIONS,
      ...BUDGET_ARG_OPTIONS,
    }, [1, 1]);
    if (a === null) return 0;
    const out = outDirFromArgs(a.values, 'run');
    const pulse = pulseOptionsFromArgs(a.values);
    const fem = femOptionsFromArgs(a.values);
    const media = mediaFromArgs(a.values);
    const below = numberOption(a.values, 'echo-floor', 'must be a number of dB below the incident pulse, above 0 and at most 100, e.g. 50', (x) => x > 0 && x <= 100);
    const echoFloor_dB = below === undefined ? undefined : -below;
    const { budget, limitNames } = budgetFromArgs(a.values);
    const path = a.positionals[0];
    const { stack, warnings } = loadOrExplain(path, io);
    // A worker thread, where a core is idle, for the exact and FEM solves (beside the pulse run) and the echo
    // analysis (beside the spectra). Started first, so it loads while the estimate plans the grid (the fits).
    const pool = new TaskPool();
    // Before anything heavy: the engine's plan, the FEM's mesh, the outputs, the time and memory they need.
    const job = estimateRun(stack, { fem, pulse, budget, limitNames });
    if (job.refusal !== undefined) {
      void pool.close();
      throw new CliError(`${job.refusal}; nothing was written`, 2);
    }
    const parallel: RunParallel = {
      solve: (s, options) => pool.run('solve', { stack: s, options }),
      echoes: (s, records, options) => pool.run('echoes', { stack: s, records, options }),
    };

    let interrupted = false;
    const onSigint = () => { interrupted = true; };
    process.once('SIGINT', onSigint);
    let report: RunReport;
    try {
      report = await runReport(stack, { inputWarnings: warnings, fem, pulse, media, job, echoFloor_dB, parallel, onProgress: progressPrinter(io), shouldStop: () => interrupted });
    } catch (e) {
      // The message says what is too big, by how much and what to change; the figures stay in the error.
      if (e instanceof PlanError || e instanceof WorkRefused) throw new CliError(`${e.message}; nothing was written`, 2);
      if (e instanceof FdtdInstabilityError) throw new CliError(`${e.message}; nothing was written`, 1);
      throw e;
    } finally {
      process.removeListener('SIGINT', onSigint);
      void pool.close();
    }
    if (interrupted || report.stopped) return reportStopped(io, 'run');
    for (const w of report.warnings) io.err(`warning: ${w}`);
    const written = writeRunReport(out, report, { maxBytes: budget.maxOutput_bytes, limitName: limitNames.output });
    io.out(`${stack.title}: ${stack.layers.length} layer${stack.layers.length === 1 ? '' : 's'}, ` +
      `${fmtGHz(stack.band_Hz[0] / 1e9)}–${fmtGHz(stack.band_Hz[1] / 1e9)} GHz, ${stack.points} points`);
    if (!report.skipped) {
      const g = report.summary.grid as { cell_mm: number; time_step_ps: number; cells: number };
      const r = report.summary.run as { steps: number; end: string; residual_energy_dB: number | null };
      io.out(`FDTD: ${g.cells} cells of ${g.cell_mm} mm, ${r.steps} steps of ${g.time_step_ps} ps, ended ${r.end}` +
        (r.residual_energy_dB !== null ? ` (stored energy ${r.residual_energy_dB} dB)` : ''));
      const ec = report.summary.echoes as { floor_dB: number; pulse_width_ns: number };
      const how = `floor ${ec.floor_dB} dB, pulse width ${ec.pulse_width_ns} ns`;
      for (const line of formatEchoText(`reflected echoes (${how})`, report.echoes)) io.out(line);
      if (report.summary.transmitted) for (const line of formatEchoText('transmitted echoes', report.echoesT)) io.out(line);
    }
    const table = formatAgreement(report.agreement);
    if (table) io.out(table);
    io.out(`wrote ${written.join(', ')}`);
    return 0;
  },
};
