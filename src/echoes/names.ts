// Plain-words names for interfaces and bounce paths. Layers are numbered as in the stack file (1-based,
// sheets included in the count) and carry their material's name; a resistive sheet is named by its
// material, "coat (sheet)", wherever it sits. Every name has a compact form (layer numbers only) for the
// CSV files, whose path text is held to 80 characters.

import type { Stack } from '../stack/types.ts';

/** Longest path text in a CSV row. */
export const MAX_PATH_CHARS = 80;

interface Faces {
  /** Name of interface k (0 = front face … L = back face), full and compact. */
  full: string[];
  compact: string[];
  /** Per bulk layer: the stack-file number and the material name. */
  layers: { number: number; material: string }[];
  /** Whether interface k carries a sheet. */
  sheet: boolean[];
}

/** Faces of each stack named so far (a table names many paths of one stack). */
const facesCache = new WeakMap<Stack, Faces>();

function facesOf(stack: Stack): Faces {
  const known = facesCache.get(stack);
  if (known) return known;
  const faces = namedFaces(stack);
  facesCache.set(stack, faces);
  return faces;
}

function namedFaces(stack: Stack): Faces {
  const layers: Faces['layers'] = [];
  const sheets: string[][] = [[]];
  stack.layers.forEach((l, i) => {
    if (l.kind === 'bulk') { layers.push({ number: i + 1, material: l.material.name }); sheets.push([]); }
    else sheets[layers.length].push(l.material.name);
  });
  const L = layers.length, pec = stack.back === 'pec';
  const full: string[] = [], compact: string[] = [];
  for (let k = 0; k <= L; k++) {
    const where = k === 0 ? 'front face' : k === L ? 'back face' : '';
    if (k === L && pec) { full.push('conductor'); compact.push('conductor'); continue; }
    if (sheets[k].length > 0) {
      const s = `${sheets[k].join(' + ')} (sheet${sheets[k].length > 1 ? 's' : ''}${where ? `, ${where}` : ''})`;
      full.push(s); compact.push(s);
      continue;
    }
    if (where) { full.push(where); compact.push(where); continue; }
    const n = layers[k - 1];
    full.push(`back of layer ${n.number} (${n.material})`);
    compact.push(`back of layer ${n.number}`);
  }
  return { full, compact, layers, sheet: sheets.map((s) => s.length > 0) };
}

const trips = (m: number) => `${m} round trip${m === 1 ? '' : 's'}`;

/** "2 round trips in layer 1 (glass)", or between its faces when a sheet bounds it. */
function inLayer(f: Faces, i: number, m: number, compact: boolean): string {
  const faces = compact ? f.compact : f.full;
  if (f.sheet[i] || f.sheet[i + 1]) return `${trips(m)} between ${faces[i]} and ${faces[i + 1]}`;
  const l = f.layers[i];
  return `${trips(m)} in layer ${l.number}${compact ? '' : ` (${l.material})`}`;
}

/**
 * Name of a reflected path from its crossings of each bulk layer (all even): where it turned back
 * ("front face", "coat (sheet)", "back of layer 2 (air)", "back face", "conductor"), then the layers it
 * crossed more than once each way ("conductor, 2 round trips in layer 1 (concrete)").
 */
export function reflectedPathName(stack: Stack, crossings: ArrayLike<number>, compact = false): string {
  const f = facesOf(stack);
  let deepest = -1;
  for (let i = 0; i < crossings.length; i++) if (crossings[i] > 0) deepest = i;
  const base = (compact ? f.compact : f.full)[deepest + 1];
  const extra: string[] = [];
  for (let i = 0; i <= deepest; i++) if (crossings[i] >= 4) extra.push(inLayer(f, i, crossings[i] / 2, compact));
  return extra.length ? `${base}, ${extra.join(', ')}` : base;
}

/** Name of a transmitted path (crossings all odd): "direct", or the extra round trips it made inside. */
export function transmittedPathName(stack: Stack, crossings: ArrayLike<number>, compact = false): string {
  const f = facesOf(stack);
  const extra: string[] = [];
  for (let i = 0; i < crossings.length; i++) if (crossings[i] >= 3) extra.push(inLayer(f, i, (crossings[i] - 1) / 2, compact));
  return extra.length ? extra.join(', ') : 'direct';
}

const cut = (s: string, n: number) => (s.length <= n ? s : `${s.slice(0, n - 1)}…`);

export interface RowName {
  full: string;
  compact: string;
  /** Order of arrival and strength (level, linear). */
  t_s: number;
  level: number;
}

/** Paths of a row weaker than this fraction (20 dB) of its strongest are counted, not named. */
const NAMED_WITHIN = 0.1;

/**
 * The text of one row: a single path's name, or several joined with " + " in order of arrival and
 * marked "(unresolved)". The strongest paths are named first, as many as fit in `limit` characters
 * (full names, else compact ones), and only those within 20 dB of the strongest; the rest are counted
 * ("+ 3 more").
 */
export function rowText(paths: readonly RowName[], limit = Number.POSITIVE_INFINITY): string {
  if (paths.length === 0) return '';
  if (paths.length === 1) return cut(paths[0].full.length <= limit ? paths[0].full : paths[0].compact, limit);
  const byLevel = paths.slice().sort((a, b) => b.level - a.level);
  const tail = (more: number) => `${more ? ` + ${more} more` : ''} (unresolved)`;
  for (const form of ['full', 'compact'] as const) {
    // the strongest names that fit, counted by length as they are added
    const shown: RowName[] = [];
    let length = 0;
    for (const p of byLevel) {
      if (p.level < NAMED_WITHIN * byLevel[0].level) break;
      const grown = length + (shown.length ? 3 : 0) + p[form].length;
      if (shown.length > 0 && grown + tail(paths.length - shown.length - 1).length > limit) break;
      shown.push(p);
      length = grown;
    }
    if (length + tail(paths.length - shown.length).length > limit) continue;
    const names = shown.sort((a, b) => a.t_s - b.t_s).map((p) => p[form]);
    return `${names.join(' + ')}${tail(paths.length - shown.length)}`;
  }
  const more = ` + ${paths.length - 1} more (unresolved)`;
  return `${cut(byLevel[0].compact, Math.max(8, limit - more.length))}${more}`;
}
