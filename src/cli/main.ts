// slabecho command line: a registry of commands, each in src/cli/commands/<name>.ts.
// To add a command: write its file exporting a `Command`, import it here and add it to COMMANDS.

import { SLABECHO_VERSION } from '../version.ts';
import { suggest } from '../stack/problems.ts';
import { CliError, processIo, type Command, type Io } from './command.ts';
import { check } from './commands/check.ts';
import { materials } from './commands/materials.ts';
import { solve } from './commands/solve.ts';
import { converge } from './commands/converge.ts';
import { run } from './commands/run.ts';
import { bench } from './commands/bench.ts';
import { sweep } from './commands/sweep.ts';
import { tolerance } from './commands/tolerance.ts';
import { merge } from './commands/merge.ts';
import { tune } from './commands/tune.ts';
import { provideCliStepModule } from './step-module.ts';
import './pool.ts'; // a worker thread of the pool (started through bin/slabecho.mjs) serves from there

export const COMMANDS: readonly Command[] = [
  check,
  materials,
  solve,
  run,
  sweep,
  tolerance,
  merge,
  tune,
  converge,
  bench,
];

function topHelp(): string {
  const w = Math.max(...COMMANDS.map((c) => c.name.length));
  return [
    `slabecho ${SLABECHO_VERSION}: plane-wave response of layered planar stacks (walls, windows, radomes, absorbers)`,
    '',
    'Usage: slabecho COMMAND [options]',
    '',
    'Commands:',
    ...COMMANDS.map((c) => `  ${c.name.padEnd(w)}  ${c.summary}`),
    '',
    'Run "slabecho COMMAND --help" for the options of a command.',
    'Options: -h, --help (this text), --version',
  ].join('\n');
}

/** Run the CLI; returns the exit code (0 done, 1 internal error, 2 bad input or usage). */
export async function main(argv: string[], io: Io = processIo()): Promise<number> {
  const [first, ...rest] = argv;
  if (first === undefined) { io.err(topHelp()); return 2; }
  if (first === '-h' || first === '--help' || first === 'help') {
    const cmd = COMMANDS.find((c) => c.name === rest[0]);
    io.out(cmd ? cmd.usage : topHelp());
    return 0;
  }
  if (first === '--version' || first === '-V') { io.out(SLABECHO_VERSION); return 0; }
  const cmd = COMMANDS.find((c) => c.name === first);
  if (cmd === undefined) {
    const near = suggest(first, COMMANDS.map((c) => c.name));
    const what = first.startsWith('-') ? `unknown option ${first}` : `unknown command "${first}"`;
    io.err(`slabecho: ${what}${near && !first.startsWith('-') ? ` (did you mean "${near}"?)` : ''}; commands: ${COMMANDS.map((c) => c.name).join(', ')} (see slabecho --help)`);
    return 2;
  }
  return runCommand(cmd, rest, io);
}

/** Run one command, turning anything it throws into one line on stderr and an exit code. */
export async function runCommand(cmd: Command, args: string[], io: Io): Promise<number> {
  provideCliStepModule();
  try {
    return await cmd.run(args, io);
  } catch (e) {
    return reportFailure(cmd.name, e, io);
  }
}

/** One line for the user; the stack trace only with SLABECHO_DEBUG=1. */
function reportFailure(name: string, e: unknown, io: Io): number {
  const debug = typeof process !== 'undefined' && process.env.SLABECHO_DEBUG === '1';
  const firstLine = (s: string) => s.split('\n')[0];
  if (e instanceof CliError) {
    io.err(`slabecho ${name}: ${firstLine(e.message)}`);
    if (debug && e.stack) io.err(e.stack);
    return e.exitCode;
  }
  const msg = e instanceof Error ? e.message : String(e);
  io.err(`slabecho ${name}: internal error: ${firstLine(msg)}${debug ? '' : ' (set SLABECHO_DEBUG=1 for details)'}`);
  if (debug && e instanceof Error && e.stack) io.err(e.stack);
  return 1;
}
