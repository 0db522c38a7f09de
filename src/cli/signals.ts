// Ctrl-C for long commands: a flag the work polls, and a guard that keeps a finished run's renames together.

import type { Io } from './command.ts';

/** Exit code of a run stopped by Ctrl-C (128 + SIGINT, the shell convention). */
export const EXIT_INTERRUPTED = 130;

/** Tells that `command` was stopped by Ctrl-C before writing anything; returns its exit code. */
export function reportStopped(io: Io, command: string): number {
  io.err(`slabecho ${command}: stopped (Ctrl-C); nothing was written`);
  return EXIT_INTERRUPTED;
}

/** Watch for SIGINT until `dispose`; `interrupted()` tells whether one came. */
export function watchInterrupt(): { interrupted: () => boolean; dispose: () => void } {
  let seen = false;
  const on = () => { seen = true; };
  process.on('SIGINT', on);
  return { interrupted: () => seen, dispose: () => { process.removeListener('SIGINT', on); } };
}

/**
 * Run `write` (synchronous) with a SIGINT listener in place, so a Ctrl-C arriving while the files are
 * renamed into place cannot end the process between two renames: the run is complete by then, and every
 * file of it is written.
 */
export function withSigintHeld<T>(write: () => T): T {
  const hold = () => {};
  process.on('SIGINT', hold);
  try { return write(); } finally { process.removeListener('SIGINT', hold); }
}
