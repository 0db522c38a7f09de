// The study work one thread does: a sweep case or a tolerance sample, by number. The same function serves the
// worker threads (studyWorkerMain, started through bin/slabecho.mjs) and a study run in the main thread.

import { parentPort, workerData } from 'node:worker_threads';
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
 * The result ready to post, and the buffers it hands over without copying: a sweep case's rows go as UTF-8 bytes
 * (copying a long string between threads costs more than encoding it, which the file needs anyway).
 */
function forPosting(r: StudyTaskResult): { message: StudyTaskResult; transfer: ArrayBuffer[] } {
  if (r.sweep && typeof r.sweep.rows === 'string') {
    const bytes = utf8.encode(r.sweep.rows);
    return { message: { ...r, sweep: { ...r.sweep, rows: bytes } }, transfer: [bytes.buffer as ArrayBuffer] };
  }
  return { message: r, transfer: r.sample ? Object.values(r.sample.quantities).map((a) => a.buffer as ArrayBuffer) : [] };
}

/** Entry of a study worker thread: answer each `run` message with one `result` message per task. */
export function studyWorkerMain(): void {
  const port = parentPort;
  const data = workerData as { slabechoStudy?: StudyJob } | null;
  if (port === null || !data?.slabechoStudy) throw new Error('studyWorkerMain: not started as a study worker');
  const job = data.slabechoStudy;
  port.on('message', async (m: { type: 'run'; tasks: number[] }) => {
    try {
      for (const t of m.tasks) {
        const { message, transfer } = forPosting(await runStudyTask(job, t));
        port.postMessage({ type: 'result', result: message }, transfer);
      }
    } catch (e) {
      port.postMessage({ type: 'error', message: e instanceof Error ? e.message : String(e), stack: e instanceof Error ? e.stack : undefined });
    }
  });
}
