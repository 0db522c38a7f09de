// Messages between the page and the study worker (src/app/studies/worker.ts). One worker per study: cancelling
// a study terminates its worker, so nothing needs to be polled.

import type { SweepResult, ToleranceResult, TuneRequest, TuneResult } from './compute.ts';

export type StudyRequest =
  | { kind: 'sweep'; id: number; file: unknown; axis: string }
  | { kind: 'tolerance'; id: number; file: unknown; vary: string[]; samples: number; seed: number }
  | { kind: 'tune'; id: number; file: unknown; request: TuneRequest };

export type StudyReply =
  | { kind: 'progress'; id: number; fraction: number; note: string }
  | { kind: 'sweep'; id: number; result: SweepResult; ms: number }
  | { kind: 'tolerance'; id: number; result: ToleranceResult; ms: number }
  | { kind: 'tune'; id: number; result: TuneResult; ms: number }
  | { kind: 'failed'; id: number; messages: string[]; input: boolean };
