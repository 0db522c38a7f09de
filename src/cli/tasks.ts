// Work the command line can hand to a worker thread (pool.ts): named tasks taking and returning
// structured-cloneable data. A command's independent parts run on these (e.g. `run`: the exact and FEM solves
// beside the pulse run, the echo analysis beside the spectra). To add one: a function here and its entry in
// TASKS; the result must survive structured cloning (typed arrays and plain objects do).

import { analyseEchoes, type EchoAnalysis, type EchoOptions } from '../echoes/table.ts';
import type { PulseRunRecords } from '../fdtd/types.ts';
import { solveReport, type Report, type SolveOptions } from '../report/solve.ts';
import type { Stack } from '../stack/types.ts';

/** solveReport without its progress callback (a function cannot cross to a worker). */
export type CloneableSolveOptions = Omit<SolveOptions, 'onProgress'>;

export const TASKS = {
  solve: (a: { stack: Stack; options: CloneableSolveOptions }): Report => solveReport(a.stack, a.options),
  echoes: (a: { stack: Stack; records: PulseRunRecords; options: EchoOptions }): EchoAnalysis => analyseEchoes(a.stack, a.records, a.options),
};

export type TaskName = keyof typeof TASKS;
export type TaskInput<K extends TaskName> = Parameters<(typeof TASKS)[K]>[0];
export type TaskOutput<K extends TaskName> = ReturnType<(typeof TASKS)[K]>;

/** Run a task in this thread (the pool's fallback, and what a worker does with a message). */
export function runTask<K extends TaskName>(name: K, input: TaskInput<K>): TaskOutput<K> {
  return (TASKS[name] as (x: TaskInput<K>) => TaskOutput<K>)(input);
}
