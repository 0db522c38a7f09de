// Runs a study's tasks (cases or samples, numbered) on worker threads and hands their results back in task order,
// or in this thread when there is one task, one thread, or no worker entry to start. Workers are this program
// itself (bin/slabecho.mjs started as a worker thread: it runs `studyWorkerMain`), so they load the compiled CLI
// when it is current and the sources otherwise, like the command that started them.
//
// Tasks go out in small batches; a worker asks for more as it finishes. Results that arrive ahead of their turn
// wait (at most `window` of them) so the caller can write them in order as they come.

import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { StudyJob, StudyTaskResult } from './worker.ts';
import { runStudyTask } from './worker.ts';

export interface PoolOptions {
  job: StudyJob;
  /** The task numbers to run, in order. */
  tasks: readonly number[];
  /** Worker threads (default: every core). */
  threads?: number;
  /** Called with each result, in task order. */
  onResult(result: StudyTaskResult): void;
  /** Polled often; true stops the run (workers are ended, the promise resolves with 'stopped'). */
  shouldStop(): boolean;
}

export type PoolEnd = 'done' | 'stopped';

/** The worker entry (bin/slabecho.mjs) seen from the sources (src/cli/studies/) or from build/cli.mjs. */
function workerEntry(): string | null {
  for (const rel of ['../../../bin/slabecho.mjs', '../bin/slabecho.mjs']) {
    const path = fileURLToPath(new URL(rel, import.meta.url));
    if (existsSync(path)) return path;
  }
  return null;
}

/** The threads a study will use for `tasks` tasks. */
export function threadsFor(tasks: number, requested?: number): number {
  const cores = Math.max(1, availableParallelism());
  return Math.max(1, Math.min(tasks, requested ?? cores));
}

export async function runPool(options: PoolOptions): Promise<PoolEnd> {
  const threads = threadsFor(options.tasks.length, options.threads);
  const entry = threads > 1 ? workerEntry() : null;
  return entry === null ? runHere(options) : runOnWorkers(options, threads, entry);
}

/** The tasks one after another in this thread, yielding between them so Ctrl-C is seen. */
async function runHere(options: PoolOptions): Promise<PoolEnd> {
  for (const t of options.tasks) {
    if (options.shouldStop()) return 'stopped';
    options.onResult(await runStudyTask(options.job, t, options.shouldStop));
    await new Promise<void>((resolve) => setImmediate(resolve));
  }
  return options.shouldStop() ? 'stopped' : 'done';
}

interface WorkerMessage { type: 'result' | 'error'; result?: StudyTaskResult; message?: string; stack?: string }

function runOnWorkers(options: PoolOptions, threads: number, entry: string): Promise<PoolEnd> {
  const tasks = options.tasks;
  const window = threads * 64;
  const waiting = new Map<number, StudyTaskResult>(); // by position in `tasks`
  const position = new Map<number, number>(tasks.map((t, i) => [t, i]));
  let nextOut = 0, nextIn = 0;
  const workers: Worker[] = [];
  const busy = new Map<Worker, number>(); // tasks in flight per worker

  return new Promise<PoolEnd>((resolve, reject) => {
    let settled = false;
    const finish = (end: PoolEnd | Error) => {
      if (settled) return;
      settled = true;
      clearInterval(poll);
      for (const w of workers) void w.terminate();
      if (end instanceof Error) reject(end); else resolve(end);
    };
    const feed = (w: Worker) => {
      if ((busy.get(w) ?? 0) > 0 || nextIn >= tasks.length || nextIn - nextOut >= window) return;
      const size = Math.max(1, Math.min(64, Math.floor((tasks.length - nextIn) / (threads * 4))));
      const batch = tasks.slice(nextIn, Math.min(tasks.length, nextIn + size, nextOut + window));
      nextIn += batch.length;
      busy.set(w, batch.length);
      w.postMessage({ type: 'run', tasks: batch });
    };
    const deliver = () => {
      while (waiting.has(nextOut)) {
        const r = waiting.get(nextOut)!;
        waiting.delete(nextOut);
        nextOut++;
        try { options.onResult(r); } catch (e) { finish(e as Error); return; }
      }
      if (nextOut >= tasks.length) finish('done');
      else for (const w of workers) feed(w);
    };
    const poll = setInterval(() => { if (options.shouldStop()) finish('stopped'); }, 50);
    for (let k = 0; k < threads; k++) {
      const w = new Worker(entry, { workerData: { slabechoStudy: options.job } });
      workers.push(w);
      w.on('message', (m: WorkerMessage) => {
        if (m.type === 'error') { finish(new Error(m.message ?? 'a worker failed')); return; }
        const r = m.result!;
        busy.set(w, (busy.get(w) ?? 1) - 1);
        waiting.set(position.get(r.index)!, r);
        deliver();
      });
      w.on('error', (e) => finish(e));
      w.on('exit', (code) => { if (!settled && code !== 0) finish(new Error(`a worker thread stopped (exit code ${code})`)); });
      feed(w);
    }
  });
}
