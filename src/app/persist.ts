// The edited stack and the view settings survive a reload (localStorage). Anything unreadable is
// ignored: the page then starts from the default preset.

const STACK_KEY = 'slabecho.stack.v1';
const SETTINGS_KEY = 'slabecho.settings.v1';

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
