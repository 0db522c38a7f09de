/// <reference lib="webworker" />
// The study worker: runs one sweep, tolerance study or tuning with the cores (compute.ts) and answers with its
// result, reporting progress at most every 50 ms on the way. The page terminates it to cancel.

import { transferablesOf } from '../protocol.ts';
import { runSweep, runTolerance, runTuning, StudyInputError, type Progress } from './compute.ts';
import type { StudyReply, StudyRequest } from './protocol.ts';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const send = (m: StudyReply): void => scope.postMessage(m, transferablesOf(m));

function progressFor(id: number): Progress {
  let last = -Infinity;
  return (fraction, note) => {
    const t = performance.now();
    if (t - last < 50 && fraction < 1) return;
    last = t;
    send({ kind: 'progress', id, fraction, note });
  };
}

async function handle(m: StudyRequest): Promise<void> {
  const t0 = performance.now(), progress = progressFor(m.id);
  try {
    if (m.kind === 'sweep') send({ kind: 'sweep', id: m.id, result: runSweep(m.file, m.axis, progress), ms: performance.now() - t0 });
    else if (m.kind === 'tolerance') send({ kind: 'tolerance', id: m.id, result: runTolerance(m.file, m.vary, m.samples, m.seed, progress), ms: performance.now() - t0 });
    else send({ kind: 'tune', id: m.id, result: await runTuning(m.file, m.request, progress), ms: performance.now() - t0 });
  } catch (e) {
    const input = e instanceof StudyInputError;
    send({ kind: 'failed', id: m.id, input, messages: input ? e.lines : [e instanceof Error ? e.message.split('\n')[0] : String(e)] });
  }
}

scope.onmessage = (e: MessageEvent<StudyRequest>) => { void handle(e.data); };
