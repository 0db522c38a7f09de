// --max-output-MB and --max-seconds, shared by the commands that compute and write results, and the refusal of a
// study estimated above its output limit.

import { DEFAULT_BUDGET, type WorkBudget } from '../report/budget.ts';
import type { EstimateOptions } from '../report/estimate.ts';
import { InputError, numberOption, type ParsedArgs } from './command.ts';

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
  const mb = maxOutputMB(values, 50, 1e6);
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

/** --max-output-MB in megabytes (undefined when not given); UsageError giving `example` for a value outside (0, max_MB]. */
function maxOutputMB(values: ParsedArgs['values'], example: number, max_MB: number): number | undefined {
  return numberOption(values, 'max-output-MB', `must be a number of megabytes > 0, e.g. ${example}`, (x) => x > 0 && x <= max_MB);
}

/** A study's --max-output-MB in bytes (the default budget's when not given). */
export function outputCapFromArgs(values: ParsedArgs['values']): number {
  const mb = maxOutputMB(values, 500, 1e7);
  return mb === undefined ? DEFAULT_BUDGET.maxOutput_bytes : mb * 1e6;
}

/**
 * Refuses a study whose files are estimated above the cap, before any work (InputError, exit 2), naming the
 * biggest file and what to change.
 */
export function checkOutputEstimate(command: string, parts: { name: string; bytes: number }[], cap: number): void {
  const total = parts.reduce((s, p) => s + p.bytes, 0);
  if (total <= cap) return;
  const list = parts.filter((p) => p.bytes > 0).map((p) => `${p.name} ${sizeText(p.bytes)}`).join(', ');
  throw new InputError(`${command}: the output would be about ${sizeText(total)} (${list}), over the limit of ${sizeText(cap)} ` +
    `(--max-output-MB ${cap / 1e6}); raise the limit, use fewer cases, samples or points, or split the study with --shard K/N ` +
    '(each shard writes its own part); nothing was computed or written');
}

/** "12 MB", "340 kB": an output size for a message. */
export function sizeText(bytes: number): string {
  if (bytes >= 1e9) return `${(bytes / 1e9).toFixed(1)} GB`;
  if (bytes >= 1e6) return `${(bytes / 1e6).toFixed(1)} MB`;
  return `${Math.max(1, Math.round(bytes / 1e3))} kB`;
}
