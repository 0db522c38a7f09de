// Running a study's tasks for a command: threads, a progress line per finished case, Ctrl-C. On Ctrl-C or an
// error the output set is aborted (the folder keeps its previous files, no half-written file); when every task is
// done the caller writes its closing files and commits.

import type { Io } from '../command.ts';
import { watchInterrupt } from '../signals.ts';
import { caseProgress } from './args.ts';
import type { OutputSet } from './output.ts';
import { runPool, threadsFor } from './pool.ts';
import type { StudyJob, StudyTaskResult } from './worker.ts';

export interface ExecuteOptions {
  io: Io;
  command: string;
  /** "case" or "sample", for the progress lines. */
  noun: string;
  job: StudyJob;
  tasks: readonly number[];
  threads?: number;
  /** A rough cost per task, in exact-solver frequency evaluations: below a threshold the study runs in one thread. */
  costPerTask: number;
  output: OutputSet;
  onResult(result: StudyTaskResult): void;
}

/** Studies cheaper than this (frequency evaluations) are not worth starting threads for. */
const THREAD_THRESHOLD = 200_000;

/** The threads a study runs on (what `execute` will use), for the opening line. */
export function studyThreads(tasks: number, costPerTask: number, requested?: number): number {
  if (tasks * costPerTask < THREAD_THRESHOLD && requested === undefined) return 1;
  return threadsFor(tasks, requested);
}

export async function execute(o: ExecuteOptions): Promise<'done' | 'stopped'> {
  const signal = watchInterrupt();
  const progress = caseProgress(o.io, o.command, o.noun, o.tasks.length);
  let done = 0;
  try {
    const end = await runPool({
      job: o.job,
      tasks: o.tasks,
      threads: studyThreads(o.tasks.length, o.costPerTask, o.threads),
      shouldStop: signal.interrupted,
      onResult: (r) => { o.onResult(r); progress(++done, r.index); },
    });
    if (end === 'stopped' || signal.interrupted()) { o.output.abort(); return 'stopped'; }
    return 'done';
  } catch (e) {
    o.output.abort();
    throw e;
  } finally {
    signal.dispose();
  }
}
