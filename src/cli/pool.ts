// A small pool of worker threads for the command line's independent work (tasks.ts). Every worker loads this
// same module: the compiled CLI (build/cli.mjs) as a whole, so a worker costs one module load. From the sources
// (tsx) workers would have to compile everything again, so there the tasks run in the calling thread unless
// SLABECHO_WORKERS is set: 0 keeps everything in one thread anywhere, 1 allows workers (one per idle core), N > 1
// asks for N workers whatever the load. Results are the same either way.
//
//   const pool = new TaskPool();          // workers start at once (their module load overlaps the caller's work)
//   const r = await pool.run('solve', { stack, options });
//   await pool.close();

import { availableParallelism, loadavg } from 'node:os';
import { isMainThread, parentPort, Worker, workerData } from 'node:worker_threads';
import { provideCliStepModule } from './step-module.ts';
import { runTask, type TaskInput, type TaskName, type TaskOutput } from './tasks.ts';

interface Job { id: number; name: TaskName; input: unknown }
type Reply = { id: number; ok: true; output: unknown } | { id: number; ok: false; message: string };

const FROM_SOURCES = import.meta.url.endsWith('.ts');

/** Whether tasks go to worker threads here (see the head of this file). */
export function workersEnabled(): boolean {
  const v = process.env.SLABECHO_WORKERS;
  if (v === undefined || v === '') return !FROM_SOURCES;
  return v !== '0';
}

/**
 * Worker threads to use beside the calling thread: one per idle core (the cores less the load average of the
 * last minute, the calling thread's own core not counted), at most `wanted`. None on a busy machine: a worker
 * costs a module load (about 50 ms), which only a free core repays.
 */
export function defaultPoolSize(wanted: number): number {
  const idle = availableParallelism() - 1 - loadavg()[0];
  return Math.max(0, Math.min(wanted, Math.floor(idle + 0.25)));
}

interface Slot { worker: Worker; busy: boolean }

export class TaskPool {
  private readonly slots: Slot[] = [];
  private readonly queue: Array<{ job: Job; resolve: (v: unknown) => void; reject: (e: Error) => void }> = [];
  private readonly waiting = new Map<number, { resolve: (v: unknown) => void; reject: (e: Error) => void; slot: Slot }>();
  private nextId = 1;

  /** Up to `wanted` workers (none when workers are not enabled or no core is idle: then run() works in this thread). */
  constructor(wanted = 1) {
    if (!workersEnabled()) return;
    const asked = Number(process.env.SLABECHO_WORKERS);
    const size = Number.isInteger(asked) && asked > 1 ? asked : defaultPoolSize(wanted);
    for (let i = 0; i < size; i++) this.slots.push(this.spawn());
  }

  get size(): number { return this.slots.length; }

  private spawn(): Slot {
    // The compiled CLI starts itself; the sources start through bin/slabecho.mjs, which registers tsx first.
    const entry = FROM_SOURCES ? new URL('../../bin/slabecho.mjs', import.meta.url) : new URL(import.meta.url);
    const worker = new Worker(entry, { workerData: { slabechoPool: true } });
    const slot: Slot = { worker, busy: false };
    worker.on('message', (r: Reply) => this.settle(slot, r));
    worker.on('error', (e) => this.failAll(slot, e));
    worker.unref();
    return slot;
  }

  /** Run a task on a free worker (queued while all are busy), or in this thread when the pool has none. */
  run<K extends TaskName>(name: K, input: TaskInput<K>): Promise<TaskOutput<K>> {
    if (this.slots.length === 0) {
      return new Promise((resolve) => resolve(runTask(name, input)));
    }
    return new Promise((resolve, reject) => {
      this.queue.push({ job: { id: this.nextId++, name, input }, resolve: resolve as (v: unknown) => void, reject });
      this.dispatch();
    });
  }

  private dispatch(): void {
    for (const slot of this.slots) {
      if (slot.busy || this.queue.length === 0) continue;
      const { job, resolve, reject } = this.queue.shift()!;
      slot.busy = true;
      slot.worker.ref();
      this.waiting.set(job.id, { resolve, reject, slot });
      slot.worker.postMessage(job);
    }
  }

  private settle(slot: Slot, r: Reply): void {
    const w = this.waiting.get(r.id);
    if (!w) return;
    this.waiting.delete(r.id);
    slot.busy = false;
    slot.worker.unref();
    if (r.ok) w.resolve(r.output);
    else w.reject(new Error(r.message));
    this.dispatch();
  }

  private failAll(slot: Slot, e: Error): void {
    for (const [id, w] of this.waiting) if (w.slot === slot) { this.waiting.delete(id); w.reject(e); }
  }

  /** Stop every worker (waiting tasks fail). */
  async close(): Promise<void> {
    const slots = this.slots.splice(0);
    for (const { job, reject } of this.queue.splice(0)) reject(new Error(`task ${job.name}: the pool was closed`));
    await Promise.all(slots.map((s) => s.worker.terminate()));
  }
}

/** Whether this thread is a pool worker. */
export const isPoolWorker = (): boolean => !isMainThread && (workerData as { slabechoPool?: boolean } | null)?.slabechoPool === true;

let serving = false;

/** The worker side: answer every job with its task's result (once per thread, whoever asks first). */
function serve(): void {
  if (serving) return;
  serving = true;
  provideCliStepModule();
  parentPort!.on('message', (job: Job) => {
    let reply: Reply;
    try {
      reply = { id: job.id, ok: true, output: runTask(job.name, job.input as never) };
    } catch (e) {
      reply = { id: job.id, ok: false, message: e instanceof Error ? e.message : String(e) };
    }
    parentPort!.postMessage(reply);
  });
}

if (isPoolWorker()) serve();
