// The profile table's column groups of one method: tangential E, and in TM the tangential H beside it.

import type { Profile } from '../results.ts';
import type { Stack } from '../stack/types.ts';
import { complexColumns, type Column } from './table.ts';

/** The profile carries the tangential H beside E in TM (where H is the field normal to the plane of incidence). */
export const profileHasH = (stack: Stack): boolean => stack.incidence.polarization === 'TM';

/** E_<tag>_re, E_<tag>_im and, with `withH`, H_<tag>_re, H_<tag>_im of a profile. */
export function profileColumns(tag: string, p: Profile, withH: boolean): Column[] {
  const cols = complexColumns(`E_${tag}`, p.E_re, p.E_im);
  if (withH && p.H_re && p.H_im) cols.push(...complexColumns(`H_${tag}`, p.H_re, p.H_im));
  return cols;
}
