// slabecho merge DIR... --out DIR: join the folders of a sharded sweep or tolerance run into exactly the files one
// unsharded run writes (sweep.csv, sweep.json and the Touchstone files; or tolerance.csv and tolerance.json).

import { closeSync, openSync, readFileSync, readSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { formatCsv } from '../../report/table.ts';
import { bandFrequencies } from '../../results.ts';
import { parseStackObject } from '../../stack/parse.ts';
import type { BandExtremes } from '../../studies/extremes.ts';
import { bandExtremes } from '../../studies/extremes.ts';
import { csvField } from '../../studies/csv.ts';
import { studyJson } from '../../studies/json-layout.ts';
import { MergeError, orderShards, shardPart, type ShardPart } from '../../studies/merge.ts';
import { sweepDocument, type SweepCaseRecord } from '../../studies/sweep.ts';
import { drawSamples, SampleTable } from '../../studies/tolerance.ts';
import { toleranceDocument } from '../../studies/tolerance-doc.ts';
import { readSampleRows, SAMPLES_FILE, ShardFormatError, tolerancePlanOf } from '../../studies/tolerance-shard.ts';
import { WarningTally } from '../../studies/warning-tally.ts';
import { InputError, outDirFromArgs, readArgs, type Command, type Io } from '../command.ts';
import { OutputSet, type StreamedFile } from '../studies/output.ts';

const USAGE = `Usage: slabecho merge DIR... --out DIR

Join the output folders of a sweep or tolerance run split with --shard K/N (every shard 0 … N-1, each once, in
any order) into the files one run without --shard writes, byte for byte: sweep.csv, sweep.json and touchstone/
for a sweep; tolerance.csv and tolerance.json for a tolerance study. The shards must come from the same command
on the same stack file (checked); their folders are only read.

Options:
  --out DIR    output directory (required; created if needed)
  -h, --help   show this help

Exit: 0 done, 2 a missing, duplicated or foreign shard, or usage (nothing written), 1 internal error.`;

function readText(path: string): string {
  try { return readFileSync(path, 'utf8'); } catch (e) {
    throw new InputError(`${path}: ${(e as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file (is this a shard folder?)' : (e as Error).message}`);
  }
}

/** The shard document of one folder. */
function readPart(dir: string): ShardPart {
  const candidates = ['sweep.json', 'tolerance.json'].filter((n) => { try { return statSync(join(dir, n)).isFile(); } catch { return false; } });
  if (candidates.length !== 1) throw new InputError(`${dir}: ${candidates.length ? 'holds both sweep.json and tolerance.json' : 'no sweep.json or tolerance.json here (is this a shard folder?)'}`);
  const path = join(dir, candidates[0]);
  let doc: unknown;
  try { doc = JSON.parse(readText(path)); } catch (e) { if (e instanceof InputError) throw e; throw new InputError(`${path}: not valid JSON`); }
  try { return shardPart(dir, doc); } catch (e) { if (e instanceof MergeError) throw new InputError(e.message); throw e; }
}

/** Copies a shard's table without its header line (which must be `header`), in pieces. */
function copyBody(path: string, header: string, to: StreamedFile): void {
  let fd: number;
  try { fd = openSync(path, 'r'); } catch { throw new InputError(`${path}: cannot be read`); }
  try {
    const buf = Buffer.alloc(1 << 22), dec = new TextDecoder('utf-8');
    let head: string | null = '', n: number;
    while ((n = readSync(fd, buf, 0, buf.length, null)) > 0) {
      let text = dec.decode(buf.subarray(0, n), { stream: true });
      if (head !== null) {
        const nl = text.indexOf('\n');
        head += nl < 0 ? text : text.slice(0, nl);
        if (nl < 0) continue;
        if (head !== header) throw new InputError(`${path}: its header differs from the study's`);
        head = null;
        text = text.slice(nl + 1);
      }
      to.write(text);
    }
    if (head !== null) throw new InputError(`${path}: no header line`);
  } finally { closeSync(fd); }
}

function mergeSweep(parts: ShardPart[], output: OutputSet): void {
  const head = parts[0].head;
  const header = (head.columns as string[]).map(csvField).join(',');
  const csv = output.stream('sweep.csv');
  csv.write(`${header}\n`);
  const records: SweepCaseRecord[] = [];
  const tally = new WarningTally();
  for (const p of parts) {
    copyBody(join(p.source, 'sweep.csv'), header, csv);
    records.push(...(p.cases as SweepCaseRecord[]));
    tally.merge(p.warnings);
    for (const r of p.cases as SweepCaseRecord[]) {
      if (r.touchstone) output.add(r.touchstone, readText(join(p.source, r.touchstone)));
    }
  }
  if (records.length !== head.case_count) throw new InputError(`the shards hold ${records.length} cases, the study ${head.case_count}`);
  output.add('sweep.json', studyJson(sweepDocument(head, records, tally.list(), null)));
}

function mergeTolerance(parts: ShardPart[], output: OutputSet): void {
  const head = parts[0].head;
  const plan = tolerancePlanOf(head);
  const parsed = parseStackObject(plan.base);
  if (!parsed.ok) throw new InputError(`${parts[0].source}: the stack in tolerance.json is not valid: ${parsed.errors[0]}`);
  const f_Hz = bandFrequencies(parsed.stack);
  const table = new SampleTable(f_Hz.length, plan.samples);
  const tally = new WarningTally();
  let next = 0;
  for (const p of parts) {
    const path = join(p.source, SAMPLES_FILE);
    try {
      readSampleRows(readText(path), f_Hz.length, (s, q) => {
        if (s !== next) throw new ShardFormatError(`sample ${s} where sample ${next} was expected`);
        table.add(s, q, bandExtremes(f_Hz, q));
        next++;
      });
    } catch (e) { if (e instanceof ShardFormatError) throw new InputError(`${path}: ${e.message}`); throw e; }
    if (next !== p.shard.end) throw new InputError(`${path}: holds samples up to ${next - 1}, the shard ends at ${p.shard.end - 1}`);
    tally.merge(p.warnings);
  }
  output.add('tolerance.csv', formatCsv(table.percentileColumns(f_Hz)));
  const doc = toleranceDocument(head, plan, drawSamples(plan), table.extremes as BandExtremes[], tally.list(), null);
  output.add('tolerance.json', studyJson(doc));
}

export const merge: Command = {
  name: 'merge',
  summary: 'join the folders of a sharded sweep or tolerance run into one result',
  usage: USAGE,
  async run(args, io: Io) {
    const a = readArgs(merge, args, io, { out: { type: 'string' } }, [1, 100_000]);
    if (a === null) return 0;
    const out = outDirFromArgs(a.values, 'merge');
    let parts: ShardPart[];
    try { parts = orderShards(a.positionals.map(readPart)); } catch (e) { if (e instanceof MergeError) throw new InputError(e.message); throw e; }
    const output = new OutputSet(out);
    try {
      if (parts[0].kind === 'sweep') mergeSweep(parts, output); else mergeTolerance(parts, output);
    } catch (e) { output.abort(); throw e; }
    const stale = parts[0].kind === 'sweep' && parts[0].head.touchstone ? [{ folder: 'touchstone', prefix: 'case-' }] : [];
    const written = output.commit(stale);
    io.out(`merged ${parts.length} shard${parts.length === 1 ? '' : 's'} of a ${parts[0].kind} into ${out} (${written.length} files)`);
    return 0;
  },
};
