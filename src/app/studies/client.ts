// Page side of the study worker: one worker per running study (a fresh one each time), its progress and its
// result or failure handed to the caller; `cancel` terminates it. A new study of the same slot cancels the old.

import type { StudyReply, StudyRequest } from './protocol.ts';

type Request = StudyRequest extends infer R ? (R extends { id: number } ? Omit<R, 'id'> : never) : never;

export interface StudyEvents {
  progress(fraction: number, note: string): void;
  done(reply: Exclude<StudyReply, { kind: 'progress' | 'failed' }>): void;
  failed(messages: string[], input: boolean): void;
}

export class StudyRunner {
  private worker: Worker | null = null;
  private id = 0;

  get running(): boolean { return this.worker !== null; }

  start(request: Request, on: StudyEvents): void {
    this.cancel();
    const id = ++this.id;
    const w = new Worker(new URL('./worker.ts', import.meta.url), { type: 'module', name: 'slabecho-study' });
    this.worker = w;
    w.onmessage = (e: MessageEvent<StudyReply>) => {
      const m = e.data;
      if (m.id !== this.id) return;
      if (m.kind === 'progress') { on.progress(m.fraction, m.note); return; }
      this.finish();
      if (m.kind === 'failed') on.failed(m.messages, m.input); else on.done(m);
    };
    w.onerror = (e) => { e.preventDefault(); if (id === this.id) { this.finish(); on.failed([`study worker: ${e.message || 'failed to start'}`], false); } };
    w.postMessage({ ...request, id } as StudyRequest);
  }

  /** Stop the running study (its worker is terminated); true when one was running. */
  cancel(): boolean {
    if (this.worker === null) return false;
    this.finish();
    this.id++;
    return true;
  }

  private finish(): void {
    this.worker?.terminate();
    this.worker = null;
  }
}
