// Joining a study's shards: each shard's document (sweep.json or tolerance.json) splits into the head every shard
// shares and its own part; the set must be one study (identical heads, one version) cut into all N shards, each
// once. The caller then concatenates the rows in shard order and rebuilds the document with sweepDocument or
// toleranceDocument, exactly as an unsharded run does.

import type { TalliedWarning } from './warning-tally.ts';

export type StudyKind = 'sweep' | 'tolerance';

/** The keys a document derives from its cases (recomputed after a merge), and the shard block. */
const DERIVED: Record<StudyKind, readonly string[]> = {
  sweep: ['shard', 'worst', 'agreement_worst', 'warnings', 'cases'],
  tolerance: ['shard', 'worst', 'warnings'],
};

export interface ShardPart {
  /** Where it came from (a folder), for messages. */
  source: string;
  kind: StudyKind;
  head: Record<string, unknown>;
  shard: { index: number; count: number; first: number; end: number };
  warnings: TalliedWarning[];
  /** sweep: the case records. */
  cases: unknown[];
}

/** A shard set that cannot be merged; the message says which folder and why. */
export class MergeError extends Error {
  override name = 'MergeError';
}

/** Splits one shard's document. */
export function shardPart(source: string, doc: unknown): ShardPart {
  if (doc === null || typeof doc !== 'object' || Array.isArray(doc)) throw new MergeError(`${source}: not a study document`);
  const d = doc as Record<string, unknown>;
  const kind = d.kind;
  if (kind !== 'sweep' && kind !== 'tolerance') throw new MergeError(`${source}: not a sweep or tolerance document`);
  const s = d.shard as Record<string, number> | undefined;
  if (!s) throw new MergeError(`${source}: not a shard (written without --shard): there is nothing to merge`);
  const head: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(d)) if (!DERIVED[kind].includes(k)) head[k] = v;
  const first = kind === 'sweep' ? s.first_case : s.first_sample, end = kind === 'sweep' ? s.end_case : s.end_sample;
  return {
    source, kind, head, shard: { index: s.index, count: s.count, first, end },
    warnings: (d.warnings as TalliedWarning[]) ?? [], cases: kind === 'sweep' ? (d.cases as unknown[]) ?? [] : [],
  };
}

/** The parts in shard order, checked to be one whole study; MergeError otherwise. */
export function orderShards(parts: ShardPart[]): ShardPart[] {
  if (parts.length === 0) throw new MergeError('no shard folders given');
  const [a] = parts;
  const headText = JSON.stringify(a.head);
  for (const p of parts) {
    if (p.kind !== a.kind) throw new MergeError(`${p.source} holds a ${p.kind}, ${a.source} a ${a.kind}`);
    if (p.shard.count !== a.shard.count) throw new MergeError(`${p.source} is one of ${p.shard.count} shards, ${a.source} one of ${a.shard.count}`);
    if (JSON.stringify(p.head) !== headText) {
      throw new MergeError(`${p.source} and ${a.source} are shards of different studies (their stack, axes, methods, samples, seed or version differ)`);
    }
  }
  const byIndex = new Map<number, ShardPart>();
  for (const p of parts) {
    const twin = byIndex.get(p.shard.index);
    if (twin) throw new MergeError(`${p.source} and ${twin.source} are both shard ${p.shard.index}/${p.shard.count}`);
    byIndex.set(p.shard.index, p);
  }
  const missing = Array.from({ length: a.shard.count }, (_, k) => k).filter((k) => !byIndex.has(k));
  if (missing.length) {
    throw new MergeError(`shard${missing.length === 1 ? '' : 's'} ${missing.map((k) => `${k}/${a.shard.count}`).join(', ')} missing; give every shard's folder`);
  }
  const ordered = [...byIndex.keys()].sort((x, y) => x - y).map((k) => byIndex.get(k)!);
  for (let k = 1; k < ordered.length; k++) {
    if (ordered[k].shard.first !== ordered[k - 1].shard.end) throw new MergeError(`${ordered[k].source}: its cases do not follow shard ${k - 1}'s`);
  }
  return ordered;
}
