// Work the command line can hand to a worker thread (pool.ts): named tasks taking and returning
// structured-cloneable data. A command's independent parts run on these (e.g. `run`: the exact and FEM solves
// beside the pulse run, the echo analysis beside the spectra; `sweep` and `tolerance`: one case or sample each).
// To add one: a function here and its entry in TASKS; the result must survive structured cloning (typed arrays
// and plain objects do). A task may also read the pool's context (data every worker receives once, at its start)
// and say in POSTING which of its result's buffers a worker hands over without copying.

import { analyseEchoes, type EchoAnalysis, type EchoOptions } from '../echoes/table.ts';
import type { PulseRunRecords } from '../fdtd/types.ts';
import { solveReport, type Report, type SolveOptions } from '../report/solve.ts';
import type { Stack } from '../stack/types.ts';
import { runStudyTask, studyResultForPosting, type StudyJob, type StudyTaskResult } from './studies/task.ts';

/** solveReport without its progress callback (a function cannot cross to a worker). */
export type CloneableSolveOptions = Omit<SolveOptions, 'onProgress'>;

export const TASKS = {
  solve: (a: { stack: Stack; options: CloneableSolveOptions }): Report => solveReport(a.stack, a.options),
  echoes: (a: { stack: Stack; records: PulseRunRecords; options: EchoOptions }): EchoAnalysis => analyseEchoes(a.stack, a.records, a.options),
  /** One case of a sweep or sample of a tolerance study; the pool's context is the study's job. */
  study: (a: { index: number }, job?: unknown): Promise<StudyTaskResult> => runStudyTask(job as StudyJob, a.index),
};

export type TaskName = keyof typeof TASKS;
export type TaskInput<K extends TaskName> = Parameters<(typeof TASKS)[K]>[0];
export type TaskOutput<K extends TaskName> = Awaited<ReturnType<(typeof TASKS)[K]>>;

/** How a worker posts a task's result when it is not simply cloned: the message and the buffers it hands over. */
export const POSTING: { [K in TaskName]?: (output: TaskOutput<K>) => { message: TaskOutput<K>; transfer: ArrayBuffer[] } } = {
  study: studyResultForPosting,
};

/** Run a task in this thread (the pool's fallback, and what a worker does with a message). */
export function runTask<K extends TaskName>(name: K, input: TaskInput<K>, context?: unknown): ReturnType<(typeof TASKS)[K]> {
  return (TASKS[name] as (x: TaskInput<K>, c?: unknown) => ReturnType<(typeof TASKS)[K]>)(input, context);
}
