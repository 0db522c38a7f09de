// The command line's one pool of worker threads, for independent work (tasks.ts): a command's parts (`run`) and a
// study's cases or samples (`sweep`, `tolerance`, through studies/execute.ts). Every worker loads the compiled CLI
// (build/cli.mjs) as a whole, so a worker costs one module load; from the sources (tsx) it starts through
// bin/slabecho.mjs, which loads the compiled CLI when it is current and the sources otherwise.
//
// Two ways to size it:
//   new TaskPool(wanted)               up to `wanted` workers, one per idle core. From the sources (where a worker
//                                      would compile everything again) the tasks run in the calling thread unless
//                                      SLABECHO_WORKERS is set: 0 keeps them in one thread anywhere, 1 allows
//                                      workers, N > 1 asks for N workers whatever the load.
//   TaskPool.ofSize(n, { context })    exactly n workers (a study: its --threads), each given `context` once.
// Results are the same either way.
//
//   const pool = new TaskPool();          // workers start at once (their module load overlaps the caller's work)
//   const r = await pool.run('solve', { stack, options });
//   await pool.close();

import { availableParallelism, loadavg } from 'node:os';
import { isMainThread, parentPort, Worker, workerData } from 'node:worker_threads';
import { provideCliStepModule } from './step-module.ts';
import { POSTING, runTask, type TaskInput, type TaskName, type TaskOutput } from './tasks.ts';

interface Job { id: number; name: TaskName; input: unknown }
type Reply = { id: number; ok: true; output: unknown } | { id: number; ok: false; message: string };
interface PoolData { slabechoPool: true; context?: unknown }

const FROM_SOURCES = import.meta.url.endsWith('.ts');

/** Whether `new TaskPool()` sends tasks to worker threads here (see the head of this file). */
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

export interface PoolSettings {
  /** Data every worker receives once, at its start, and hands to each task (a study's job). */
  context?: unknown;
  /** Tasks a worker is given at a time (more than one hides the trip between threads behind the work). */
  depth?: number;
}

interface Slot { worker: Worker; inFlight: number }
interface Waiter { resolve: (v: unknown) => void; reject: (e: Error) => void }

export class TaskPool {
  private readonly slots: Slot[] = [];
  private readonly queue: Array<{ job: Job } & Waiter> = [];
  private readonly waiting = new Map<number, Waiter & { slot: Slot }>();
  private readonly context: unknown;
  private readonly depth: number;
  private nextId = 1;
  private closing = false;

  /** Up to `wanted` workers (none when workers are not enabled or no core is idle: then run() works in this thread). */
  constructor(wanted = 1, settings: PoolSettings & { size?: number } = {}) {
    this.context = settings.context;
    this.depth = Math.max(1, settings.depth ?? 1);
    let size = settings.size;
    if (size === undefined) {
      if (!workersEnabled()) return;
      const asked = Number(process.env.SLABECHO_WORKERS);
      size = Number.isInteger(asked) && asked > 1 ? asked : defaultPoolSize(wanted);
    }
    for (let i = 0; i < size; i++) this.slots.push(this.spawn());
  }

  /** Exactly `size` workers, wherever it runs. */
  static ofSize(size: number, settings: PoolSettings = {}): TaskPool {
    return new TaskPool(size, { ...settings, size });
  }

  get size(): number { return this.slots.length; }

  private spawn(): Slot {
    // The compiled CLI starts itself; the sources start through bin/slabecho.mjs, which registers tsx first.
    const entry = FROM_SOURCES ? new URL('../../bin/slabecho.mjs', import.meta.url) : new URL(import.meta.url);
    const data: PoolData = { slabechoPool: true, context: this.context };
    const worker = new Worker(entry, { workerData: data });
    const slot: Slot = { worker, inFlight: 0 };
    worker.on('message', (r: Reply) => this.settle(slot, r));
    worker.on('error', (e) => this.failAll(slot, e));
    worker.on('exit', (code) => {
      if (!this.closing && code !== 0) this.failAll(slot, new Error(`a worker thread stopped (exit code ${code})`));
    });
    worker.unref();
    return slot;
  }

  /** Run a task on a free worker (queued while all are busy), or in this thread when the pool has none. */
  run<K extends TaskName>(name: K, input: TaskInput<K>): Promise<TaskOutput<K>> {
    if (this.slots.length === 0) {
      return new Promise((resolve) => resolve(runTask(name, input, this.context) as TaskOutput<K>));
    }
    return new Promise((resolve, reject) => {
      this.queue.push({ job: { id: this.nextId++, name, input }, resolve: resolve as (v: unknown) => void, reject });
      this.dispatch();
    });
  }

  private dispatch(): void {
    for (const slot of this.slots) {
      while (slot.inFlight < this.depth && this.queue.length > 0) {
        const { job, resolve, reject } = this.queue.shift()!;
        if (slot.inFlight++ === 0) slot.worker.ref();
        this.waiting.set(job.id, { resolve, reject, slot });
        slot.worker.postMessage(job);
      }
    }
  }

  private settle(slot: Slot, r: Reply): void {
    const w = this.waiting.get(r.id);
    if (!w) return;
    this.waiting.delete(r.id);
    if (--slot.inFlight === 0) slot.worker.unref();
    if (r.ok) w.resolve(r.output);
    else w.reject(new Error(r.message));
    this.dispatch();
  }

  private failAll(slot: Slot, e: Error): void {
    for (const [id, w] of this.waiting) if (w.slot === slot) { this.waiting.delete(id); w.reject(e); }
  }

  /** Stop every worker (waiting tasks fail). */
  async close(): Promise<void> {
    this.closing = true;
    const slots = this.slots.splice(0);
    for (const { job, reject } of this.queue.splice(0)) reject(new Error(`task ${job.name}: the pool was closed`));
    await Promise.all(slots.map((s) => s.worker.terminate()));
  }
}

/** Whether this thread is a pool worker. */
export const isPoolWorker = (): boolean => !isMainThread && (workerData as Partial<PoolData> | null)?.slabechoPool === true;

let serving = false;

/** The reply to one job, with the buffers it hands over. */
async function answer(job: Job, context: unknown): Promise<{ reply: Reply; transfer: ArrayBuffer[] }> {
  try {
    const output = await runTask(job.name, job.input as never, context);
    const post = POSTING[job.name] as ((o: unknown) => { message: unknown; transfer: ArrayBuffer[] }) | undefined;
    const { message, transfer } = post ? post(output) : { message: output, transfer: [] };
    return { reply: { id: job.id, ok: true, output: message }, transfer };
  } catch (e) {
    return { reply: { id: job.id, ok: false, message: e instanceof Error ? e.message : String(e) }, transfer: [] };
  }
}

/** The worker side: answer every job with its task's result, one job after another (once per thread). */
function serve(): void {
  if (serving) return;
  serving = true;
  provideCliStepModule(); // the pulse runs of this thread step with the WebAssembly kernel too
  const context = (workerData as PoolData).context;
  let previous: Promise<void> = Promise.resolve();
  parentPort!.on('message', (job: Job) => {
    previous = previous.then(async () => {
      const { reply, transfer } = await answer(job, context);
      parentPort!.postMessage(reply, transfer);
    });
  });
}

if (isPoolWorker()) serve();
