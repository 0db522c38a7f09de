// The presets shipped in presets/*.stack.json, bundled at build time (no request at run time).

const modules = import.meta.glob('../../presets/*.stack.json', { eager: true, import: 'default' }) as Record<string, unknown>;

export interface Preset { name: string; file: unknown }

/** Presets by name (file name without .stack.json), the default one first. */
export const PRESETS: readonly Preset[] = Object.entries(modules)
  .map(([path, file]) => ({ name: path.replace(/^.*\//, '').replace(/\.stack\.json$/, ''), file }))
  .sort((a, b) => (a.name === 'default' ? -1 : b.name === 'default' ? 1 : a.name.localeCompare(b.name)));

/** Used only when presets/ is empty: an empty stack over a modest band. */
const FALLBACK: unknown = { title: 'Empty stack', band_GHz: [1, 10], layers: [] };

export function presetFile(name: string): unknown {
  const p = PRESETS.find((q) => q.name === name);
  return structuredClone(p?.file ?? PRESETS[0]?.file ?? FALLBACK);
}

export const DEFAULT_PRESET = PRESETS[0]?.name ?? '(none)';
