// The workbench's palette and type, in one place so every view (pixi and 2D canvas) agrees.

export const THEME = {
  font: '"Inter", "Segoe UI", "Helvetica Neue", Arial, sans-serif',
  mono: '"JetBrains Mono", "DejaVu Sans Mono", Menlo, Consolas, monospace',
  paper: '#fbfaf7',
  panel: '#ffffff',
  ink: '#1d2230',
  inkSoft: '#5b6272',
  grid: '#e7e4dc',
  axis: '#9a9a92',
  // Field traces.
  total: '#243b8f',
  incident: '#9aa0aa',
  reflected: '#c4532d',
  transmitted: '#0f8a7d',
  // Methods in the frequency-domain views.
  exact: '#1d2230',
  fem: '#d08a00',
  fdtd: '#0f8a7d',
  diff: '#a23b72',
  measured: '#c2185b',
  // Geometry.
  absorber: '#cfc9bd',
  conductor: '#4a4d55',
  sheet: '#7b3fb5',
  probe: '#c4532d',
  source: '#243b8f',
} as const;

/** Soft tints for layer bands, picked by a stable hash of the material name. */
const BAND_TINTS = ['#efe3c8', '#dbe8df', '#e4e0f0', '#f3dcd2', '#d9e6ef', '#ece8d6', '#e8dbe6', '#dfe9d1'];

export function bandTint(material: string): string {
  if (material === 'air') return '#f4f6f8';
  let h = 2166136261;
  for (let i = 0; i < material.length; i++) h = Math.imul(h ^ material.charCodeAt(i), 16777619);
  return BAND_TINTS[(h >>> 0) % BAND_TINTS.length];
}

/** '#rrggbb' → 0xrrggbb for pixi. */
export const hexNumber = (css: string): number => parseInt(css.slice(1), 16);
