// The study work one task does: a sweep case or a tolerance sample, by number. The same function serves a study
// run in the main thread and the worker threads of the CLI's pool (src/cli/pool.ts, task "study" in tasks.ts),
// which receive the job once, when they start.

import { runSweepCase, type SweepCaseOutput, type SweepPlan } from '../../studies/sweep.ts';
import { runToleranceSample, type SampleOutput, type TolerancePlan } from '../../studies/tolerance.ts';

export type StudyJob =
  | { kind: 'sweep'; plan: SweepPlan }
  | { kind: 'tolerance'; plan: TolerancePlan; values: Float64Array };

export interface StudyTaskResult {
  index: number;
  sweep?: SweepCaseOutput;
  sample?: SampleOutput;
}

export async function runStudyTask(job: StudyJob, index: number, shouldStop?: () => boolean): Promise<StudyTaskResult> {
  if (job.kind === 'sweep') return { index, sweep: await runSweepCase(job.plan, index, shouldStop) };
  return { index, sample: runToleranceSample(job.plan, job.values, index) };
}

const utf8 = new TextEncoder();

/**
 * The result ready to post from a worker, and the buffers it hands over without copying: a sweep case's rows go
 * as UTF-8 bytes (copying a long string between threads costs more than encoding it, which the file needs anyway).
 */
export function studyResultForPosting(r: StudyTaskResult): { message: StudyTaskResult; transfer: ArrayBuffer[] } {
  if (r.sweep && typeof r.sweep.rows === 'string') {
    const bytes = utf8.encode(r.sweep.rows);
    return { message: { ...r, sweep: { ...r.sweep, rows: bytes } }, transfer: [bytes.buffer as ArrayBuffer] };
  }
  return { message: r, transfer: r.sample ? Object.values(r.sample.quantities).map((a) => a.buffer as ArrayBuffer) : [] };
}
