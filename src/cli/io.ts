// File input and output for the CLI: reading a stack file with clear errors, creating the output
// directory, and writing results atomically (temporary file in the same directory, then rename).

import { closeSync, fsyncSync, mkdirSync, openSync, renameSync, rmSync, statSync, unlinkSync, writeSync } from 'node:fs';
import { readFileSync, realpathSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { basename, dirname, isAbsolute, join, relative, resolve, sep } from 'node:path';
import { STACK_LIMITS } from '../stack/file.ts';
import { parseStackText, type ParseResult } from '../stack/parse.ts';
import type { TableFileReader } from '../stack/parse-table.ts';
import { InputError } from './command.ts';

const code = (e: unknown): string | undefined => (e as { code?: string } | null)?.code;

/** The text of a stack file; InputError (exit 2) for a missing file, a directory, over 1 MB, not UTF-8. */
export function readStackFile(path: string): string {
  let size: number;
  try {
    const st = statSync(path);
    if (st.isDirectory()) throw new InputError(`${path}: is a directory, not a stack file`);
    size = st.size;
  } catch (e) {
    if (e instanceof InputError) throw e;
    throw new InputError(`${path}: ${fsReason(e)}`);
  }
  if (size > STACK_LIMITS.maxTextBytes) {
    throw new InputError(`${path}: ${size} bytes is over the ${STACK_LIMITS.maxTextBytes / 1e6} MB limit for a stack file`);
  }
  let bytes: Buffer;
  try { bytes = readFileSync(path); } catch (e) { throw new InputError(`${path}: ${fsReason(e)}`); }
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new InputError(`${path}: not UTF-8 text (a stack file is JSON text)`);
  }
}

/** The UTF-8 text of a file named on the command line (`what` names it in messages); InputError (exit 2) otherwise. */
export function readTextFile(path: string, what: string, maxBytes: number): string {
  let bytes: Buffer;
  try {
    const st = statSync(path);
    if (st.isDirectory()) throw new InputError(`${what} ${path}: is a directory, not a file`);
    if (st.size > maxBytes) throw new InputError(`${what} ${path}: ${st.size} bytes is over the ${maxBytes / 1e6} MB limit`);
    bytes = readFileSync(path);
  } catch (e) {
    if (e instanceof InputError) throw e;
    throw new InputError(`${what} ${path}: ${fsReason(e)}`);
  }
  try { return new TextDecoder('utf-8', { fatal: true }).decode(bytes); } catch {
    throw new InputError(`${what} ${path}: not UTF-8 text`);
  }
}

/** Read and validate a stack file. Problems are returned (not thrown) so every one can be listed. */
export function loadStackFile(path: string): ParseResult {
  return parseStackText(readStackFile(path), { readTableFile: tableFileReader(dirname(path)) });
}

/**
 * Reads a table material's `file` relative to the stack file's folder. A name that leads outside that folder
 * (an absolute path, "..", or a link pointing out) is refused: a stack file names only what lies beside it.
 */
export function tableFileReader(folder: string): TableFileReader {
  return (name) => {
    if (isAbsolute(name)) return { ok: false, error: `"${name}" is an absolute path; name a file beside the stack file, relative to its folder` };
    let root: string, real: string;
    try { root = realpathSync(folder); } catch (e) { return { ok: false, error: `the stack file's folder ${folder}: ${fsReason(e)}` }; }
    const outside = (p: string) => { const r = relative(root, p); return r === '..' || r.startsWith(`..${sep}`) || isAbsolute(r); };
    if (outside(resolve(root, name))) return { ok: false, error: `"${name}" lies outside the stack file's folder; put the table beside the stack file (or in a folder under it)` };
    try { real = realpathSync(resolve(root, name)); } catch (e) { return { ok: false, error: `"${name}": ${fsReason(e)} beside the stack file` }; }
    if (outside(real)) return { ok: false, error: `"${name}" is a link to a file outside the stack file's folder; copy the table beside the stack file` };
    try {
      const st = statSync(real);
      if (st.isDirectory()) return { ok: false, error: `"${name}" is a directory, not a CSV file` };
      if (st.size > STACK_LIMITS.maxTextBytes) return { ok: false, error: `"${name}": ${st.size} bytes is over the ${STACK_LIMITS.maxTextBytes / 1e6} MB limit for a table file` };
      return { ok: true, text: new TextDecoder('utf-8', { fatal: true }).decode(readFileSync(real)) };
    } catch (e) {
      return { ok: false, error: e instanceof TypeError ? `"${name}": not UTF-8 text (a table file is CSV text)` : `"${name}": ${fsReason(e)}` };
    }
  };
}

function fsReason(e: unknown): string {
  switch (code(e)) {
    case 'ENOENT': return 'no such file';
    case 'EACCES': case 'EPERM': return 'permission denied';
    case 'ENOTDIR': return 'a part of the path is not a directory';
    case 'EISDIR': return 'is a directory';
    default: return e instanceof Error ? e.message.split('\n')[0] : String(e);
  }
}

/** mkdir -p; InputError if the path exists as something other than a directory or cannot be made. */
export function ensureDir(dir: string, what = '--out'): void {
  try {
    mkdirSync(dir, { recursive: true });
  } catch (e) {
    const c = code(e);
    if (c === 'EEXIST' || c === 'ENOTDIR') throw new InputError(`${what} ${dir}: exists and is not a directory`);
    throw new InputError(`${what} ${dir}: cannot create the directory (${fsReason(e)})`);
  }
  if (!statSync(dir).isDirectory()) throw new InputError(`${what} ${dir}: exists and is not a directory`);
}

const tempName = (path: string): string =>
  join(dirname(path), `.${basename(path)}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`);

function writeTemp(path: string, text: string): string {
  const tmp = tempName(path);
  const fd = openSync(tmp, 'wx');
  try {
    writeSync(fd, text);
    fsyncSync(fd);
  } catch (e) {
    closeSync(fd);
    rmSync(tmp, { force: true });
    throw e;
  }
  closeSync(fd);
  return tmp;
}

/** Write `text` to `path` atomically: a reader sees the old file or the whole new one, never a part. */
export function writeAtomic(path: string, text: string): void {
  const tmp = writeTemp(path, text);
  try { renameSync(tmp, path); } catch (e) { rmSync(tmp, { force: true }); throw e; }
}

/**
 * Write several files into `dir`: all temporary files first, then the renames, so a failure while
 * writing leaves none of the new files (and no temporary ones) behind.
 */
export function writeFilesAtomic(dir: string, files: readonly { name: string; text: string }[]): string[] {
  const temps: string[] = [];
  try {
    for (const f of files) temps.push(writeTemp(join(dir, f.name), f.text));
  } catch (e) {
    for (const t of temps) rmSync(t, { force: true });
    throw new InputError(`cannot write into ${dir}: ${fsReason(e)}`);
  }
  const written: string[] = [];
  files.forEach((f, i) => {
    const target = join(dir, f.name);
    renameSync(temps[i], target);
    written.push(target);
  });
  return written;
}

/** Remove a file if present (a stale output the current run does not produce). */
export function removeIfPresent(path: string): boolean {
  try { unlinkSync(path); return true; } catch (e) {
    if (code(e) === 'ENOENT') return false;
    throw e;
  }
}
