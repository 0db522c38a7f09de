// A sweep's axes from their specs as typed: the angle (`0:60:5`), the polarizations (`TE,TM`) and any
// `PATH=VALUES` (`layers[1].thickness_mm=2:8:0.5`, `materials.coat.ohm_per_sq=150,377,600`,
// `layers[0].material=brick,concrete`). Throws PathError or ValueSpecError naming what is wrong.

import type { StackFile } from '../stack/file.ts';
import type { Axis } from './grid.ts';
import { parsePath, parsePathPrefix, PathError, valueKindAt } from './paths.ts';
import { ANGLE_COLUMN, POLARIZATION_COLUMN } from './sweep.ts';
import { parseValueSpec, ValueSpecError } from './values.ts';

export const ANGLE_PATH = parsePath('incidence.angle_deg');
export const POLARIZATION_PATH = parsePath('incidence.polarization');

export const angleAxis = (spec: string): Axis =>
  ({ column: ANGLE_COLUMN, path: ANGLE_PATH, values: parseValueSpec(spec, 'number'), spec });

export function polarizationAxis(spec: string): Axis {
  const values = parseValueSpec(spec, 'string').map((v) => String(v).toUpperCase());
  const bad = values.find((v) => v !== 'TE' && v !== 'TM');
  if (bad !== undefined) throw new ValueSpecError(`"${bad}" is not a polarization; write TE, TM or TE,TM`);
  return { column: POLARIZATION_COLUMN, path: POLARIZATION_PATH, values: [...new Set(values)], spec };
}

/** `PATH=VALUES` against the stack file: the values take the kind the path holds (numbers or texts). */
export function setAxis(text: string, base: StackFile): Axis {
  const { path, rest } = parsePathPrefix(text.trim());
  if (!rest.startsWith('=')) throw new PathError(path.text, `write ${path.text}=A:B:STEP or ${path.text}=v1,v2,… (got "${text}")`);
  const values = parseValueSpec(rest.slice(1), valueKindAt(base, path));
  return { column: path.text, path, values, spec: rest.slice(1) };
}

/** The axes in column order (angle, polarization, then the --set paths); refuses a path given twice. */
export function sweepAxes(angle: Axis | null, polarization: Axis | null, sets: readonly Axis[]): Axis[] {
  const axes = [...(angle ? [angle] : []), ...(polarization ? [polarization] : []), ...sets];
  const seen = new Set<string>();
  for (const a of axes) {
    if (seen.has(a.path.text)) {
      const how = a.path.text === ANGLE_PATH.text ? ' (--angle sets it)' : a.path.text === POLARIZATION_PATH.text ? ' (--polarization sets it)' : '';
      throw new PathError(a.path.text, `given twice${how}; give each path once`);
    }
    seen.add(a.path.text);
  }
  return axes;
}
