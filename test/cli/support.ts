// Helpers for running the CLI in-process and for temporary directories.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/main.ts';

export interface Run { code: number; out: string[]; err: string[]; stdout: string; stderr: string }

export async function cli(...argv: string[]): Promise<Run> {
  const out: string[] = [], err: string[] = [];
  const code = await main(argv, { out: (l) => out.push(l), err: (l) => err.push(l) });
  return { code, out, err, stdout: out.join('\n'), stderr: err.join('\n') };
}

export function tempDir(): { dir: string; cleanup: () => void } {
  const dir = mkdtempSync(join(tmpdir(), 'slabecho-test-'));
  return { dir, cleanup: () => rmSync(dir, { recursive: true, force: true }) };
}

/** Parse CSV text written by slabecho: header names and numeric rows. */
export function readCsv(text: string): { header: string[]; rows: number[][] } {
  const lines = text.trimEnd().split('\n');
  return { header: lines[0].split(','), rows: lines.slice(1).map((l) => l.split(',').map(Number)) };
}
