// The stack the workbench opens on: the one stored by the last visit, else the default preset, else an empty
// stack (with a note saying why).

import { parseStackObject } from '../stack/parse.ts';
import type { StackFile } from '../stack/file.ts';
import type { Stack } from '../stack/types.ts';
import { loadStoredOrigin, loadStoredStack, type Origin } from './persist.ts';
import { DEFAULT_PRESET, presetFile } from './presets.ts';

export interface InitialStack { file: StackFile; stack: Stack; warnings: string[]; origin: Origin; note: string | null }

export function initialStack(): InitialStack {
  const stored = loadStoredStack();
  const preset: Origin = { kind: 'preset', name: DEFAULT_PRESET, edited: false };
  if (stored !== undefined) {
    const r = parseStackObject(stored);
    // A stack stored before origins were kept is shown as an edited default.
    if (r.ok) return { ...r, origin: loadStoredOrigin() ?? { ...preset, edited: true }, note: null };
  }
  const r = parseStackObject(presetFile(DEFAULT_PRESET));
  if (r.ok) return { ...r, origin: preset, note: stored !== undefined ? 'The stored stack was unreadable; the default preset is loaded.' : null };
  const empty = parseStackObject({ title: 'Empty stack', band_GHz: [1, 10], layers: [] });
  if (!empty.ok) throw new Error(empty.errors.join('\n'));
  return { ...empty, origin: preset, note: `The default preset is invalid: ${r.errors.join('; ')}` };
}
