// Running a study's tasks for a command: threads, a progress line per finished case, Ctrl-C. The tasks (cases or
// samples, numbered) run on the CLI's worker pool (../pool.ts) and their results are handed back in task order,
// or in this thread when there is one task or one thread. Results that arrive ahead of their turn wait (at most
// `window` of them) so the caller can write them in order as they come. On Ctrl-C or an error the output set is
// aborted (the folder keeps its previous files, no half-written file); when every task is done the caller writes
// its closing files and commits.

import { availableParallelism } from 'node:os';
import type { Io } from '../command.ts';
import { TaskPool } from '../pool.ts';
import { watchInterrupt } from '../signals.ts';
import { caseProgress } from './args.ts';
import type { OutputSet } from './output.ts';
import { runStudyTask, type StudyJob, type StudyTaskResult } from './task.ts';

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

/** Tasks a worker holds at a time: one at work, the next already there when it finishes. */
const WORKER_DEPTH = 2;

/** The threads a study will use for `tasks` tasks (default: every core). */
export function threadsFor(tasks: number, requested?: number): number {
  const cores = Math.max(1, availableParallelism());
  return Math.max(1, Math.min(tasks, requested ?? cores));
}

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
    const end = await runTasks({
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

interface RunTasks {
  job: StudyJob;
  tasks: readonly number[];
  threads: number;
  onResult(result: StudyTaskResult): void;
  /** Polled often; true stops the run (workers are ended, the promise resolves with 'stopped'). */
  shouldStop(): boolean;
}

function runTasks(o: RunTasks): Promise<'done' | 'stopped'> {
  return o.threads > 1 ? runOnWorkers(o) : runHere(o);
}

/** The tasks one after another in this thread, yielding between them so Ctrl-C is seen. */
async function runHere(o: RunTasks): Promise<'done' | 'stopped'> {
  for (const t of o.tasks) {
    if (o.shouldStop()) return 'stopped';
    o.onResult(await runStudyTask(o.job, t, o.shouldStop));
    await new Promise<void>((resolve) => setImmediate(resolve));
  }
  return o.shouldStop() ? 'stopped' : 'done';
}

/** The tasks on `threads` workers, at most `window` ahead of the one the caller waits for. */
async function runOnWorkers(o: RunTasks): Promise<'done' | 'stopped'> {
  const pool = TaskPool.ofSize(o.threads, { context: o.job, depth: WORKER_DEPTH });
  const window = o.threads * 64;
  const pending: Promise<StudyTaskResult>[] = [];
  let next = 0;
  const submit = () => {
    while (next < o.tasks.length && pending.length < window) {
      const p = pool.run('study', { index: o.tasks[next++] });
      p.catch(() => {}); // awaited in turn below; one that fails after a stop is of no interest
      pending.push(p);
    }
  };
  let poll: ReturnType<typeof setInterval> | undefined;
  const stopped = new Promise<'stopped'>((resolve) => { poll = setInterval(() => { if (o.shouldStop()) resolve('stopped'); }, 50); });
  try {
    submit();
    while (pending.length > 0) {
      const r = await Promise.race([pending.shift()!, stopped]);
      if (r === 'stopped') return 'stopped';
      o.onResult(r);
      submit();
    }
    return 'done';
  } finally {
    clearInterval(poll);
    await pool.close();
  }
}
