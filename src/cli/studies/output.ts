// A study's output files, written as it runs and put in place together at the end: each file is streamed into a
// temporary file beside its target (named like io.ts's, ".NAME.<pid>.<random>.tmp"), and `commit` renames them all; `abort` (Ctrl-C,
// an error) removes them, so the folder keeps its previous files and never holds half a file.

import { closeSync, fsyncSync, mkdirSync, openSync, readdirSync, renameSync, rmSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { InputError } from '../command.ts';
import { ensureDir, tempName } from '../io.ts';
import { withSigintHeld } from '../signals.ts';

export interface StreamedFile {
  /** Text, or UTF-8 bytes. */
  write(text: string | Uint8Array): void;
  /** Bytes written so far. */
  readonly bytes: number;
}

interface Pending { target: string; temp: string; fd: number | null; bytes: number }

export class OutputSet {
  private readonly pending: Pending[] = [];
  private done = false;
  private total = 0;

  /** `cap`: the files may total at most this many bytes (--max-output-MB); past it the set is aborted. */
  constructor(readonly dir: string, private readonly cap = Infinity) { ensureDir(dir); }

  private openTemp(name: string): Pending {
    const target = join(this.dir, name);
    mkdirSync(dirname(target), { recursive: true });
    const temp = tempName(target);
    let fd: number;
    try { fd = openSync(temp, 'wx'); } catch (e) { throw this.failure(e); }
    const p: Pending = { target, temp, fd, bytes: 0 };
    this.pending.push(p);
    return p;
  }

  private failure(e: unknown): InputError {
    this.abort();
    return new InputError(`cannot write into ${this.dir}: ${e instanceof Error ? e.message.split('\n')[0] : String(e)}`);
  }

  private put(p: Pending, data: string | Uint8Array): void {
    try {
      const bytes = typeof data === 'string' ? Buffer.from(data, 'utf8') : data;
      this.total += bytes.length;
      if (this.total > this.cap) {
        this.abort();
        throw new InputError(`the output passed its limit of ${this.cap / 1e6} MB (--max-output-MB) while writing ${basename(p.target)}; nothing was written`);
      }
      for (let at = 0; at < bytes.length;) at += writeSync(p.fd!, bytes, at, bytes.length - at);
      p.bytes += bytes.length;
    } catch (e) { if (e instanceof InputError) throw e; throw this.failure(e); }
  }

  /** A file written piece by piece (a table as its rows come). */
  stream(name: string): StreamedFile {
    const p = this.openTemp(name);
    return { write: (text) => this.put(p, text), get bytes() { return p.bytes; } };
  }

  /** A whole file at once. */
  add(name: string, text: string): void {
    const p = this.openTemp(name);
    this.put(p, text);
    this.close(p);
  }

  private close(p: Pending): void {
    if (p.fd === null) return;
    try { fsyncSync(p.fd); closeSync(p.fd); } catch (e) { throw this.failure(e); } finally { p.fd = null; }
  }

  /**
   * Rename every file into place and return their paths. Files named `<prefix>*` in `staleIn` that this set did
   * not write (left by an earlier, larger study) are removed, so the folder holds one study's files. A Ctrl-C
   * arriving meanwhile waits until every rename is done.
   */
  commit(staleIn: { folder: string; prefix: string }[] = []): string[] {
    return withSigintHeld(() => this.renameAll(staleIn));
  }

  private renameAll(staleIn: { folder: string; prefix: string }[]): string[] {
    if (this.done) throw new Error('OutputSet: already committed or aborted');
    for (const p of this.pending) this.close(p);
    this.done = true;
    const written = this.pending.map((p) => { renameSync(p.temp, p.target); return p.target; });
    const mine = new Set(written);
    for (const { folder, prefix } of staleIn) {
      let names: string[] = [];
      try { names = readdirSync(join(this.dir, folder)); } catch { continue; }
      for (const n of names) {
        const path = join(this.dir, folder, n);
        if (n.startsWith(prefix) && !mine.has(path)) rmSync(path, { force: true });
      }
    }
    return written;
  }

  /** Remove every temporary file; nothing of this set reaches the folder. */
  abort(): void {
    if (this.done) return;
    this.done = true;
    for (const p of this.pending) {
      if (p.fd !== null) { try { closeSync(p.fd); } catch { /* already closed */ } p.fd = null; }
      rmSync(p.temp, { force: true });
    }
  }
}
