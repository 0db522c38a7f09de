// Plain-words names for bounce paths, from the round trips made inside each bulk layer.
// Layers are numbered as in the stack file (1-based, sheets included in the count).

import type { Stack } from '../stack/types.ts';

const WORDS = ['zero', 'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine'];
const count = (n: number): string => WORDS[n] ?? String(n);

/** Stack-file layer number (1-based) of each bulk layer, and its material name. */
function bulkLayers(stack: Stack): { number: number; name: string }[] {
  const out: { number: number; name: string }[] = [];
  stack.layers.forEach((l, i) => { if (l.kind === 'bulk') out.push({ number: i + 1, name: l.material.name }); });
  return out;
}

/**
 * "front face"; "back of layer 1 (concrete)"; "back face"; "conductor";
 * "two round trips inside layer 2 (air gap)"; combinations joined with " + ".
 */
export function pathName(stack: Stack, roundTrips: number[]): string {
  const bulk = bulkLayers(stack);
  let deepest = -1;
  roundTrips.forEach((m, j) => { if (m > 0) deepest = j; });
  if (deepest < 0) return 'front face';
  const last = deepest === bulk.length - 1;
  const layer = (j: number) => `layer ${bulk[j].number} (${bulk[j].name})`;
  const base = last ? (stack.back === 'pec' ? 'conductor' : 'back face') : `back of ${layer(deepest)}`;
  const multi: number[] = [];
  roundTrips.forEach((m, j) => { if (m >= 2) multi.push(j); });
  if (multi.length === 0) return base;
  const parts = multi.map((j) => `${count(roundTrips[j])} round trips inside ${layer(j)}`);
  const othersSingle = roundTrips.every((m, j) => j === deepest || m <= 1);
  if (multi.length === 1 && multi[0] === deepest && othersSingle) return parts[0];
  return multi.includes(deepest) ? parts.join(' + ') : `${base} + ${parts.join(' + ')}`;
}
