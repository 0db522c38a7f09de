// --max-output-MB and --max-seconds, shared by the commands that compute and write results.

import { DEFAULT_BUDGET, type WorkBudget } from '../report/budget.ts';
import type { EstimateOptions } from '../report/estimate.ts';
import { numberOption, type ParsedArgs } from './command.ts';

export const BUDGET_ARG_OPTIONS = {
  'max-output-MB': { type: 'string' },
  'max-seconds': { type: 'string' },
} as const;

export const BUDGET_ARG_USAGE = `  --max-output-MB M  the files written may total at most M megabytes (10^6 bytes; default ${DEFAULT_BUDGET.maxOutput_bytes / 1e6});
                     the profile and traces are sampled more sparsely to fit, with a warning
  --max-seconds S    refuse a job estimated to take longer than S seconds (default ${DEFAULT_BUDGET.maxSeconds}); the estimate
                     is made before any work, from nominal speeds (see slabecho bench)`;

/** The budget and the names of its limits (for messages) from parsed arguments; UsageError naming a bad option. */
export function budgetFromArgs(values: ParsedArgs['values']): { budget: WorkBudget; limitNames: NonNullable<EstimateOptions['limitNames']> } {
  const mb = numberOption(values, 'max-output-MB', 'must be a number of megabytes > 0, e.g. 50', (x) => x > 0 && x <= 1e6);
  const s = numberOption(values, 'max-seconds', 'must be a number of seconds > 0, e.g. 30', (x) => x > 0 && x <= 1e7);
  const budget: WorkBudget = {
    ...DEFAULT_BUDGET,
    ...(mb !== undefined ? { maxOutput_bytes: mb * 1e6 } : {}),
    ...(s !== undefined ? { maxSeconds: s } : {}),
  };
  return {
    budget,
    limitNames: {
      output: `${budget.maxOutput_bytes / 1e6} MB, --max-output-MB`,
      seconds: `${budget.maxSeconds} s, --max-seconds`,
    },
  };
}
