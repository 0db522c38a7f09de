/// <reference lib="webworker" />
// The engine worker: parses the stack file with the core parser and runs the core methods
// unchanged — exact + FEM solves, the steppable pulse run the field view animates, and the full
// pulse-run report. The page never waits on it: every answer is a message.

import { parseStackObject } from '../stack/parse.ts';
import { solveReport } from '../report/solve.ts';
import type { FromWorker, ToWorker } from './protocol.ts';
import { transferablesOf } from './protocol.ts';
import { copyTable } from './tables.ts';
import { advancePulse, clipTiming, rewindPulse, seekPulse, startPulse, fullReport } from './pulseHost.ts';

const scope = self as unknown as DedicatedWorkerGlobalScope;

const send = (m: FromWorker): void => scope.postMessage(m, transferablesOf(m));

const now = (): number => performance.now();

function messagesOf(e: unknown): string[] {
  if (e instanceof Error) return [e.message.split('\n')[0]];
  return [String(e)];
}

function parse(file: unknown, id: number, stage: Stage) {
  const r = parseStackObject(file);
  if (!r.ok) { send({ kind: 'failed', id, stage, messages: r.errors }); return null; }
  return r;
}

type Stage = Extract<FromWorker, { kind: 'failed' }>['stage'];

/** Send what `make` builds, or the failure it throws, for message `id`. */
function answer(id: number, stage: Stage, make: () => FromWorker): void {
  try {
    send(make());
  } catch (e) {
    send({ kind: 'failed', id, stage, messages: messagesOf(e) });
  }
}

function handle(m: ToWorker): void | Promise<void> {
  switch (m.kind) {
    case 'solve': {
      const r = parse(m.file, m.id, 'solve');
      if (r === null) return;
      answer(m.id, 'solve', () => {
        const t0 = now();
        const rep = solveReport(r.stack, { inputWarnings: r.warnings });
        return { kind: 'solved', id: m.id, spectrum: copyTable(rep.spectrum), profile: copyTable(rep.profile), agreement: rep.agreement, warnings: rep.warnings, ms: now() - t0 };
      });
      return;
    }
    case 'pulse': {
      const r = parse(m.file, m.id, 'pulse');
      if (r === null) return;
      answer(m.id, 'pulse', () => ({ kind: 'pulse-ready', id: m.id, geometry: startPulse(r.stack, m.settings) }));
      return;
    }
    case 'advance':
      answer(m.id, 'advance', () => ({ kind: 'frame', id: m.id, tag: m.tag, frame: advancePulse(m.steps, m.recycle) }));
      return;
    case 'rewind':
      answer(m.id, 'advance', () => ({ kind: 'frame', id: m.id, tag: m.tag, frame: rewindPulse() }));
      return;
    case 'seek':
      answer(m.id, 'advance', () => ({ kind: 'frame', id: m.id, tag: m.tag, frame: seekPulse(m.step, m.recycle) }));
      return;
    case 'clip-timing':
      answer(m.id, 'clip', () => ({ kind: 'clip-timing', id: m.id, timing: clipTiming(m.window_m) }));
      return;
    case 'report': {
      const r = parse(m.file, m.id, 'report');
      if (r === null) return;
      const t0 = now();
      return fullReport(r.stack, r.warnings, m.settings, (fraction, note) => send({ kind: 'progress', id: m.id, fraction, note }))
        .then((rep) => send({ kind: 'report', id: m.id, report: { ...rep, ms: now() - t0 } }))
        .catch((e: unknown) => send({ kind: 'failed', id: m.id, stage: 'report', messages: messagesOf(e) }));
    }
  }
}

// Messages are handled strictly in order (a report awaits between chunks, so keep a queue).
let queue: Promise<void> = Promise.resolve();
scope.onmessage = (e: MessageEvent<ToWorker>) => {
  queue = queue.then(() => handle(e.data)).catch(() => {});
};
