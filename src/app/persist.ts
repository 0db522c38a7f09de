// The edited stack and the view settings survive a reload (localStorage). Anything unreadable is
// ignored: the page then starts from the default preset.

const STACK_KEY = 'slabecho.stack.v1';
const SETTINGS_KEY = 'slabecho.settings.v1';
const ORIGIN_KEY = 'slabecho.origin.v1';

function read(key: string): unknown {
  try {
    const text = window.localStorage.getItem(key);
    return text === null ? undefined : JSON.parse(text);
  } catch {
    return undefined;
  }
}

function write(key: string, value: unknown): void {
  try { window.localStorage.setItem(key, JSON.stringify(value)); } catch { /* storage full or disabled: not fatal */ }
}

export const loadStoredStack = (): unknown => read(STACK_KEY);
export const storeStack = (file: unknown): void => write(STACK_KEY, file);
export const loadStoredSettings = (): unknown => read(SETTINGS_KEY);
export const storeSettings = (settings: unknown): void => write(SETTINGS_KEY, settings);

/** Where the stored stack came from: a preset or an imported file, and whether it was edited since. */
export interface Origin { kind: 'preset' | 'import'; name: string; edited: boolean }

export function loadStoredOrigin(): Origin | undefined {
  const v = read(ORIGIN_KEY);
  if (v === null || typeof v !== 'object') return undefined;
  const o = v as Record<string, unknown>;
  if ((o.kind !== 'preset' && o.kind !== 'import') || typeof o.name !== 'string' || typeof o.edited !== 'boolean') return undefined;
  return { kind: o.kind, name: o.name.slice(0, 120), edited: o.edited };
}
export const storeOrigin = (origin: Origin): void => write(ORIGIN_KEY, origin);

/** The preset menu's words for an origin. */
export function originLabel(o: Origin): string {
  const base = o.kind === 'preset' ? o.name : `imported: ${o.name}`;
  return o.edited ? `${base} (edited)` : base;
}
