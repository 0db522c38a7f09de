// slabecho converge FILE [--method fem|fdtd]: error against the exact solution as the mesh (or grid) is refined.

import type { FemOrder } from '../../fem/basis.ts';
import { PlanError } from '../../fdtd/errors.ts';
import { fdtdStudy, femStudy, formatFdtdStudy, formatStudy } from '../../report/converge.ts';
import { steppedStack } from '../../fdtd/stepped-stack.ts';
import { bandFrequencies } from '../../results.ts';
import { solveTmm } from '../../tmm/solve.ts';
import { linspace } from '../../units.ts';
import { fmtGHz } from '../../stack/warnings.ts';
import type { Command } from '../command.ts';
import { InputError, readArgs, UsageError } from '../command.ts';
import { femOrderFromArgs } from '../fem-args.ts';
import { loadOrExplain, MEDIA_ARG_OPTIONS, mediaFromArgs, planErrorAsInput } from './solve.ts';
import { estimateFdtdStudy, estimateFemStudy } from '../../report/estimate-study.ts';
import { budgetFromArgs } from '../budget-args.ts';

/** Frequencies a study uses: the stack's own, at most this many (the study solves many meshes). */
const MAX_STUDY_POINTS = 201;

export const converge: Command = {
  name: 'converge',
  summary: 'refine the FEM mesh or FDTD grid step by step and print the error against the exact solution',
  usage: `Usage: slabecho converge FILE [--method fem|fdtd] [--fem-order P] [--media tables|stepped]

Solve the stack in FILE at a sequence of resolutions and print, for each, the largest |R − R_exact| and
|T − T_exact| over the band and the observed order of convergence between successive rows, beside the order
theory predicts (FEM: 2p for Lagrange order p; FDTD: 2). Shows how much resolution a result needs.
For FDTD the table separates the engine's own error (against the exact solution of the media it steps)
from the total against the stack as written, whose floor is the model share of fitted or substituted media.

Options:
  --method M      fem (default) or fdtd (at any angle, TE or TM)
  --fem-order P   study one FEM order (1, 2 or 3) instead of all three
  --media M       tables (default) or stepped: the FEM study solves the media as the pulse engine steps
                  them (power laws as their fitted causal models); the FDTD study always shows both
  --max-seconds S refuse a study estimated to take longer than S seconds (default 30)
  -h, --help      show this help

Uses the stack's frequencies (at most ${MAX_STUDY_POINTS}, spread over the band).
Exit: 0 done, 2 invalid stack or usage, 1 internal error.`,
  async run(args, io) {
    const a = readArgs(converge, args, io, { method: { type: 'string' }, 'fem-order': { type: 'string' }, ...MEDIA_ARG_OPTIONS, 'max-seconds': { type: 'string' } }, [1, 1]);
    if (a === null) return 0;
    const method = (a.values.method as string | undefined) ?? 'fem';
    if (method !== 'fem' && method !== 'fdtd') throw new UsageError(`--method: must be fem or fdtd (got "${method}")`);
    const po = femOrderFromArgs(a.values);
    if (po !== undefined && method === 'fdtd') throw new UsageError('--fem-order: applies to --method fem only');
    const orders: FemOrder[] = po === undefined ? [1, 2, 3] : [po];
    const media = mediaFromArgs(a.values);
    const { budget, limitNames } = budgetFromArgs(a.values);
    const { stack, warnings } = loadOrExplain(a.positionals[0], io);
    for (const w of warnings) io.err(`warning: ${w}`);
    const f = stack.points <= MAX_STUDY_POINTS ? bandFrequencies(stack) : linspace(stack.band_Hz[0], stack.band_Hz[1], MAX_STUDY_POINTS);
    // Every mesh or grid the study will make, estimated before the first is built.
    const est = method === 'fem' ? estimateFemStudy(stack, f, orders, budget, limitNames.seconds)
      : estimateFdtdStudy(stack, f.length, budget, limitNames.seconds);
    if (est.refusal !== undefined) throw new InputError(est.refusal);
    // The study runs before anything is printed, so a stack the engine refuses gives one line and exit 2.
    const lines: string[] = [];
    if (method === 'fem') {
      const solved = media === 'stepped' ? planErrorAsInput(() => steppedStack(stack)) : stack;
      if (solved !== stack) lines.push('media: the FEM and the exact solver both solve the media as the pulse engine steps them');
      lines.push(formatStudy(femStudy(solved, solveTmm(solved, f), orders), 'el/λ'));
    } else {
      let study;
      try { study = fdtdStudy(stack, solveTmm(stack, f)); } catch (e) {
        if (e instanceof PlanError) throw new InputError(`fdtd: ${e.message}`);
        throw e;
      }
      lines.push(formatFdtdStudy(study));
    }
    io.out(`${stack.title}: ${method.toUpperCase()} against the exact solution, ${f.length} frequencies, ` +
      `${fmtGHz(stack.band_Hz[0] / 1e9)}–${fmtGHz(stack.band_Hz[1] / 1e9)} GHz`);
    for (const l of lines) io.out(l);
    return 0;
  },
};
