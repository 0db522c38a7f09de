// Page side of the worker protocol. Three workers from the same script:
// - solver: exact + FEM solves (latest edit wins; at most one in flight), never queued behind a run;
// - live: the steppable pulse run the field view animates;
// - batch: the full pulse run with spectra and echoes; cancelling terminates it, and the next run
//   starts a fresh one.

import type { AgreementRow } from '../report/format-agreement.ts';
import type { FieldFrame, FromWorker, PulseGeometry, RunSettings, ToWorker, WireColumn, WireReport } from './protocol.ts';
import { transferablesOf } from './protocol.ts';
import type { ClipTiming } from './clip/scout.ts';

export interface Solved { id: number; spectrum: WireColumn[]; profile: WireColumn[]; agreement: AgreementRow[]; warnings: string[]; ms: number }

export interface EngineEvents {
  solved(s: Solved): void;
  solveFailed(messages: string[], id: number): void;
  pulseReady(geometry: PulseGeometry, id: number): void;
  /** A frame of the current run; `tag` is the one `advance`, `rewind` or `seek` returned. */
  frame(frame: FieldFrame, id: number, tag: number): void;
  pulseFailed(messages: string[], id: number): void;
  progress(fraction: number, note: string, id: number): void;
  report(report: WireReport, id: number): void;
  reportFailed(messages: string[], id: number): void;
}

const spawn = (): Worker => new Worker(new URL('./worker.ts', import.meta.url), { type: 'module', name: 'slabecho-engine' });

export class Engine {
  private readonly solver: Worker;
  private readonly live: Worker;
  private batch: Worker | null = null;
  private nextId = 1;
  private solveInFlight = false;
  private solveQueued: { file: unknown; id: number } | null = null;
  /** Id of the current pulse run; frames of older runs are dropped. */
  private pulseId = 0;
  private advanceInFlight = false;
  private nextTag = 1;
  private reportId = 0;
  /** Buffers of drawn frames, handed back to the worker for reuse. */
  private spare: FieldFrame | null = null;
  private clipWaiter: { resolve: (t: ClipTiming) => void; reject: (e: Error) => void } | null = null;

  constructor(private readonly on: EngineEvents) {
    this.solver = spawn();
    this.solver.onmessage = (e: MessageEvent<FromWorker>) => this.fromLive(e.data);
    this.solver.onerror = (e) => { e.preventDefault(); this.on.solveFailed([`engine worker: ${e.message || 'failed to start'}`], 0); };
    this.live = spawn();
    this.live.onmessage = (e: MessageEvent<FromWorker>) => this.fromLive(e.data);
    this.live.onerror = (e) => { e.preventDefault(); this.on.pulseFailed([`engine worker: ${e.message || 'failed to start'}`], 0); };
  }

  /** Solve exact + FEM for this file; returns the request id. Only the latest queued request runs. */
  solve(file: unknown): number {
    const id = this.nextId++;
    if (this.solveInFlight) { this.solveQueued = { file, id }; return id; }
    this.solveInFlight = true;
    this.post(this.solver, { kind: 'solve', id, file });
    return id;
  }

  /** Start a new steppable pulse run (the previous one is dropped). */
  pulse(file: unknown, settings: RunSettings): number {
    const id = this.nextId++;
    this.pulseId = id;
    this.clipWaiter?.reject(new Error('the stack was changed while the clip was prepared'));
    this.clipWaiter = null;
    this.post(this.live, { kind: 'pulse', id, file, settings });
    return id;
  }

  /** Ask for the next frame (`steps` further); its tag, or 0 when one is already on its way. */
  advance(steps: number): number {
    if (this.advanceInFlight || this.pulseId === 0) return 0;
    return this.askFrame((tag, recycle) => ({ kind: 'advance', id: this.pulseId, tag, steps, recycle }));
  }

  /** Back to step 0 of the current run; a frame follows. */
  rewind(): void {
    if (this.pulseId === 0) return;
    this.advanceInFlight = true;
    this.post(this.live, { kind: 'rewind', id: this.pulseId, tag: this.nextTag++ });
  }

  /** A fresh run of the current stack at exactly `step`; a frame with the returned tag follows (0: no run). */
  seek(step: number): number {
    if (this.pulseId === 0) return 0;
    return this.askFrame((tag, recycle) => ({ kind: 'seek', id: this.pulseId, tag, step, recycle }));
  }

  /** Send the live worker a request for a frame (handing back the spare frame's buffers); returns its tag. */
  private askFrame(message: (tag: number, recycle: FieldFrame | null) => ToWorker): number {
    this.advanceInFlight = true;
    const recycle = this.spare;
    this.spare = null;
    const tag = this.nextTag++;
    this.post(this.live, message(tag, recycle));
    return tag;
  }

  /** When a clip of the view [x0, x1] (metres) should start and end (the worker runs a scout). */
  clipTiming(window_m: [number, number]): Promise<ClipTiming> {
    this.clipWaiter?.reject(new Error('superseded'));
    return new Promise((resolve, reject) => {
      if (this.pulseId === 0) { reject(new Error('there is no pulse run for this stack')); return; }
      this.clipWaiter = { resolve, reject };
      this.post(this.live, { kind: 'clip-timing', id: this.pulseId, window_m });
    });
  }

  /** Give a drawn frame's buffers back for reuse. */
  recycle(frame: FieldFrame): void { this.spare = frame; }

  /** Start the full pulse run (cancelling one in progress). */
  report(file: unknown, settings: RunSettings): number {
    this.cancelReport();
    const id = this.nextId++;
    this.reportId = id;
    const w = spawn();
    w.onmessage = (e: MessageEvent<FromWorker>) => this.fromBatch(e.data);
    w.onerror = (e) => { e.preventDefault(); this.on.reportFailed([`engine worker: ${e.message || 'failed'}`], id); };
    this.batch = w;
    this.post(w, { kind: 'report', id, file, settings });
    return id;
  }

  cancelReport(): boolean {
    if (this.batch === null) return false;
    this.batch.terminate();
    this.batch = null;
    this.reportId = 0;
    return true;
  }

  get reporting(): boolean { return this.batch !== null; }

  private post(w: Worker, msg: ToWorker): void {
    w.postMessage(msg, transferablesOf(msg.kind === 'advance' || msg.kind === 'seek' ? msg.recycle : null));
  }

  private fromLive(m: FromWorker): void {
    switch (m.kind) {
      case 'solved':
      case 'failed':
        if (m.kind === 'solved' || m.stage === 'solve') {
          this.solveInFlight = false;
          const q = this.solveQueued;
          this.solveQueued = null;
          if (q !== null) { this.solveInFlight = true; this.post(this.solver, { kind: 'solve', id: q.id, file: q.file }); }
          // A newer request is on its way: this answer is already stale.
          if (q !== null) return;
          if (m.kind === 'solved') this.on.solved(m); else this.on.solveFailed(m.messages, m.id);
          return;
        }
        if (m.stage === 'advance') this.advanceInFlight = false;
        if (m.stage === 'clip') { this.clipWaiter?.reject(new Error(m.messages.join('; '))); this.clipWaiter = null; return; }
        if (m.id === this.pulseId) this.on.pulseFailed(m.messages, m.id);
        return;
      case 'clip-timing':
        if (m.id === this.pulseId) this.clipWaiter?.resolve(m.timing);
        else this.clipWaiter?.reject(new Error('the stack changed while the clip was prepared'));
        this.clipWaiter = null;
        return;
      case 'pulse-ready':
        if (m.id === this.pulseId) this.on.pulseReady(m.geometry, m.id);
        return;
      case 'frame':
        this.advanceInFlight = false;
        if (m.id === this.pulseId) this.on.frame(m.frame, m.id, m.tag);
        else this.spare = m.frame;
        return;
      default:
        return;
    }
  }

  private fromBatch(m: FromWorker): void {
    if (m.id !== this.reportId) return;
    switch (m.kind) {
      case 'progress': this.on.progress(m.fraction, m.note, m.id); return;
      case 'report':
        this.batch?.terminate();
        this.batch = null;
        this.on.report(m.report, m.id);
        return;
      case 'failed':
        this.batch?.terminate();
        this.batch = null;
        this.on.reportFailed(m.messages, m.id);
        return;
      default:
        return;
    }
  }
}
