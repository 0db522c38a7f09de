// File input and output for the CLI: reading a stack file with clear errors, creating the output folder, and
// writing results atomically and in a stream: each file is written chunk by chunk (never held whole in one
// string) to a temporary file in the target folder; when every file of a result is complete they are renamed into
// place together. A failure on the way removes the temporary files and leaves the folder as it was.
// File-system errors are told in plain words with the path the user gave (never a temporary file's name).

import {
  closeSync, fsyncSync, mkdirSync, openSync, readFileSync, realpathSync, renameSync, rmSync, statSync, unlinkSync, writeSync,
} from 'node:fs';
import { randomBytes } from 'node:crypto';
import { basename, dirname, isAbsolute, join, relative, resolve, sep } from 'node:path';
import { STACK_LIMITS } from '../stack/file.ts';
import { parseStackText, type ParseResult } from '../stack/parse.ts';
import type { TableFileReader } from '../stack/parse-table.ts';
import { InputError } from './command.ts';
import { withSigintHeld } from './signals.ts';

/**
 * The file-system calls this module makes, gathered so tests can stand in for a full disk or a read-only file
 * system (conditions a test machine cannot produce on demand). Production code never replaces them.
 */
export const fsOps = { closeSync, fsyncSync, mkdirSync, openSync, readFileSync, renameSync, rmSync, statSync, unlinkSync, writeSync };

const code = (e: unknown): string | undefined => (e as { code?: string } | null)?.code;

/** A file-system failure in plain words (no path: the caller names the one the user gave). */
export function fsReason(e: unknown): string {
  switch (code(e)) {
    case 'ENOENT': return 'no such file or directory';
    case 'EACCES': case 'EPERM': return 'permission denied';
    case 'EROFS': return 'the file system is read-only';
    case 'ENOSPC': return 'the disk is full';
    case 'EDQUOT': return 'the disk quota is used up';
    case 'ENOTDIR': return 'a part of the path is not a directory';
    case 'EISDIR': return 'it is a directory';
    case 'EEXIST': return 'it already exists';
    case 'ENAMETOOLONG': return 'the name is too long';
    case 'ELOOP': return 'too many symbolic links in the path';
    case 'EMFILE': case 'ENFILE': return 'too many files are open';
    case 'EIO': return 'an input/output error on the device';
    case 'EFBIG': return 'the file is too large for the file system';
    case 'EBUSY': return 'the file or directory is busy';
    default: {
      // Unknown: the system's words without the paths it names (one of them may be a temporary file).
      const msg = e instanceof Error ? e.message.split('\n')[0] : String(e);
      return msg.replace(/, \w+ '[^']*'( -> '[^']*')?$/, '').replace(/^[A-Z]+: /, '') || 'unknown error';
    }
  }
}

/** The text of a stack file; InputError (exit 2) for a missing file, a folder, over 1 MB, not UTF-8. */
export function readStackFile(path: string): string {
  let size: number;
  try {
    const st = fsOps.statSync(path);
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
  try { bytes = fsOps.readFileSync(path); } catch (e) { throw new InputError(`${path}: ${fsReason(e)}`); }
  if (bytes.length > STACK_LIMITS.maxTextBytes) { // a file that grew, or a device that reports no size
    throw new InputError(`${path}: over the ${STACK_LIMITS.maxTextBytes / 1e6} MB limit for a stack file`);
  }
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
    const st = fsOps.statSync(path);
    if (st.isDirectory()) throw new InputError(`${what} ${path}: is a directory, not a file`);
    if (st.size > maxBytes) throw new InputError(`${what} ${path}: ${st.size} bytes is over the ${maxBytes / 1e6} MB limit`);
    bytes = fsOps.readFileSync(path);
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
      const st = fsOps.statSync(real);
      if (st.isDirectory()) return { ok: false, error: `"${name}" is a directory, not a CSV file` };
      if (st.size > STACK_LIMITS.maxTextBytes) return { ok: false, error: `"${name}": ${st.size} bytes is over the ${STACK_LIMITS.maxTextBytes / 1e6} MB limit for a table file` };
      return { ok: true, text: new TextDecoder('utf-8', { fatal: true }).decode(fsOps.readFileSync(real)) };
    } catch (e) {
      return { ok: false, error: e instanceof TypeError ? `"${name}": not UTF-8 text (a table file is CSV text)` : `"${name}": ${fsReason(e)}` };
    }
  };
}

/** What is at `p`: 'dir', 'other', 'none' (nothing there), or the error that stopped us looking. */
function kindOf(p: string): 'dir' | 'other' | 'none' | { error: unknown } {
  try {
    const st = fsOps.statSync(p, { throwIfNoEntry: false });
    if (st === undefined) return 'none';
    return st.isDirectory() ? 'dir' : 'other';
  } catch (e) {
    // ENOTDIR: a file further up the path; the walk up finds and names it.
    return code(e) === 'ENOENT' || code(e) === 'ENOTDIR' ? 'none' : { error: e };
  }
}

/**
 * mkdir -p, one level at a time from the deepest folder that exists (node's recursive mkdir can spin forever on
 * some special file systems). InputError naming the folder `what` refers to and why it cannot be made.
 */
export function ensureDir(dir: string, what = '--out'): void {
  const missing: string[] = [];
  let p = resolve(dir);
  for (;;) {
    const k = kindOf(p);
    if (k === 'dir') break;
    if (k === 'other') {
      throw new InputError(p === resolve(dir) ? `${what} ${dir}: exists and is not a directory`
        : `${what} ${dir}: cannot create it, ${p} is a file, not a directory`);
    }
    if (k !== 'none') throw new InputError(`${what} ${dir}: cannot look at ${p} (${fsReason(k.error)})`);
    missing.push(p);
    const up = dirname(p);
    if (up === p) throw new InputError(`${what} ${dir}: cannot create it (no existing directory above it)`);
    p = up;
  }
  for (const m of missing.reverse()) {
    try { fsOps.mkdirSync(m); } catch (e) {
      if (code(e) === 'EEXIST' && kindOf(m) === 'dir') continue; // made meanwhile by someone else
      throw new InputError(`${what} ${dir}: cannot create the directory ${m} (${fsReason(e)})`);
    }
  }
}

/** One file of a result: its name in the output folder and its content as text chunks (rows, or the whole of a small file). */
export interface OutputFile { name: string; chunks: Iterable<string> }

/** A small file given as one text. */
export const textFile = (name: string, text: string): OutputFile => ({ name, chunks: [text] });

export interface WriteOptions {
  /** Refuse to write more than this many bytes in total (the files are then not written). */
  maxBytes?: number;
  /** How the limit is set, for the message (e.g. "--max-output-MB 50"). */
  limitName?: string;
}

/** The output would pass WriteOptions.maxBytes: nothing is written. */
export class OutputLimitError extends InputError {
  override name = 'OutputLimitError';
}

/** The temporary file beside `path` that a write goes to before its rename: ".NAME.<pid>.<random>.tmp". */
export const tempName = (path: string): string =>
  join(dirname(path), `.${basename(path)}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`);

/** Chunks are gathered to about this many characters before each write. */
const WRITE_BATCH = 1 << 16;

/** Writes `file` into a new temporary file beside `target`; returns its path and the bytes written. */
function writeTemp(target: string, file: OutputFile, budget: { left: number; name: string }): { tmp: string; bytes: number } {
  const tmp = tempName(target);
  const fd = fsOps.openSync(tmp, 'wx', 0o644);
  let bytes = 0;
  try {
    let batch: string[] = [], pending = 0;
    const flush = () => {
      if (batch.length === 0) return;
      const text = batch.join('');
      batch = []; pending = 0;
      const n = Buffer.byteLength(text);
      if (n > budget.left) throw new OutputLimitError(`the output would pass its limit (${budget.name}) while writing ${basename(target)}; nothing was written`);
      budget.left -= n;
      bytes += n;
      let buf = Buffer.from(text);
      while (buf.length > 0) { const w = fsOps.writeSync(fd, buf); buf = buf.subarray(w); }
    };
    for (const chunk of file.chunks) {
      batch.push(chunk);
      pending += chunk.length;
      if (pending >= WRITE_BATCH) flush();
    }
    flush();
    fsOps.fsyncSync(fd);
  } catch (e) {
    try { fsOps.closeSync(fd); } catch { /* already failing */ }
    fsOps.rmSync(tmp, { force: true });
    throw e;
  }
  fsOps.closeSync(fd);
  return { tmp, bytes };
}

/**
 * Write several files into `dir` (which must exist): every temporary file first, then the renames, so a failure
 * while writing leaves none of the new files (and no temporary ones) behind. Returns the paths written.
 * InputError (exit 2) in plain words for a full disk, a read-only folder, missing permission, or the output limit.
 */
export function writeFilesAtomic(dir: string, files: readonly OutputFile[], options: WriteOptions = {}): string[] {
  return withSigintHeld(() => {
    const targets = files.map((f) => join(dir, f.name));
    // A folder where a file should go would only fail at the rename, after everything was written.
    targets.forEach((t) => {
      if (kindOf(t) === 'dir') throw new InputError(`cannot write ${t}: a directory of that name is in the way; nothing was written`);
    });
    const budget = { left: options.maxBytes ?? Infinity, name: options.limitName ?? `${options.maxBytes} bytes` };
    const temps: string[] = [];
    try {
      files.forEach((f, i) => { temps.push(writeTemp(targets[i], f, budget).tmp); });
    } catch (e) {
      for (const t of temps) fsOps.rmSync(t, { force: true });
      if (e instanceof InputError) throw e;
      throw new InputError(`cannot write into ${dir}: ${fsReason(e)}; nothing was written`);
    }
    const written: string[] = [];
    for (let i = 0; i < files.length; i++) {
      try { fsOps.renameSync(temps[i], targets[i]); } catch (e) {
        for (const t of temps.slice(i)) fsOps.rmSync(t, { force: true });
        const done = written.length > 0 ? ` (${written.join(', ')} already replaced)` : '; nothing was written';
        throw new InputError(`cannot put ${targets[i]} in place: ${fsReason(e)}${done}`);
      }
      written.push(targets[i]);
    }
    return written;
  });
}

/** Write `text` to `path` atomically: a reader sees the old file or the whole new one, never a part. */
export function writeAtomic(path: string, text: string): void {
  writeFilesAtomic(dirname(path), [textFile(basename(path), text)]);
}

/** Remove a file if present (a stale output the current run does not produce); InputError if it cannot be. */
export function removeIfPresent(path: string): boolean {
  try { fsOps.unlinkSync(path); return true; } catch (e) {
    if (code(e) === 'ENOENT') return false;
    throw new InputError(`cannot remove the stale ${path}: ${fsReason(e)}`);
  }
}
