// The parameter panel (lil-gui): preset, stack editor (layers added, removed, reordered, material
// and thickness), band, incidence and profile frequency for the frequency-domain views, pulse-run
// accuracy and speed, trace toggles and view options. Edits go through `host.edit`, which validates
// the whole stack with the core parser before anything changes.

import GUI, { type Controller } from 'lil-gui';
import { catalogNames } from '../materials/catalog.ts';
import type { StackFile, StackFileLayer } from '../stack/file.ts';
import { TRACE_NAMES } from './fieldView.ts';
import { CLIP_LENGTH_LIMITS_s, SPACETIME_GAINS, type Settings, type SpectrumMode } from './settings.ts';
import type { ClipFormat } from './clip/sinks.ts';
import { guardNumber } from './numberField.ts';

export type SettingsTopic = 'traces' | 'axis' | 'spectrum' | 'trace' | 'speed' | 'accuracy' | 'clip' | 'spacetime';

export interface ControlHost {
  readonly file: StackFile;
  readonly settings: Settings;
  readonly presets: readonly string[];
  /** What the preset menu shows for the current stack: a preset's name, or "imported: …", "… (edited)". */
  readonly originLabel: string;
  loadPreset(name: string): void;
  /** Apply a change to a copy of the stack file; false (and the reason shown) when it is invalid. */
  edit(change: (f: StackFile) => void): boolean;
  /** Show that a view or run setting was refused: `field: must be need (got …)`. */
  refuse(field: string, need: string, text: string): void;
  settingsChanged(topic: SettingsTopic): void;
}

const ACCURACY: Record<string, number | null> = {
  'engine default': null, 'coarse (3 %)': 0.03, 'standard (1 %)': 0.01, 'fine (0.3 %)': 0.003,
};

const DEFAULT_THICKNESS_MM = 10;

export class Controls {
  private readonly gui: GUI;
  private readonly stackFolder: GUI;
  private readonly layersFolder: GUI;
  private readonly pick = { preset: '' };
  private presetController: Controller | null = null;
  private readonly fields = {
    title: '', front: 'air', back: 'air', fmin: 1, fmax: 10, points: 501,
    angle: 0, polarization: 'TE', profile: 5,
  };
  private readonly view = {
    accuracy: 'engine default', spectrum: 'magnitude' as SpectrumMode, magnitude: 'dB', freqScale: 'linear',
    xUnit: 'mm', lambda: 5, envelope: false, speed: 4, autoSpeed: true,
  };
  private stackControllers: Controller[] = [];
  private speedController: Controller | null = null;

  constructor(container: HTMLElement, private readonly host: ControlHost) {
    this.gui = new GUI({ container, title: 'Parameters', injectStyles: false, autoPlace: false });
    this.gui.domElement.dataset.testid = 'gui';
    this.pick.preset = host.originLabel;
    this.presetController = tag(this.gui.add(this.pick, 'preset', this.presetOptions()).name('preset')
      .onChange((name: string) => { if (host.presets.includes(name)) host.loadPreset(name); }), 'preset');
    this.stackFolder = this.gui.addFolder('Stack');
    this.layersFolder = this.gui.addFolder('Layers (front to back)');
    this.buildStack();
    this.buildLayers();
    this.buildRun();
    this.buildViews();
    this.buildClip();
  }

  /** Rebuild from the host's current stack (after a preset, an import or a structural edit). */
  refresh(): void {
    this.showOrigin();
    this.gui.controllers.forEach((c) => c.updateDisplay());
    this.buildStack();
    this.buildLayers();
  }

  /** The preset menu names where the current stack came from. */
  showOrigin(): void {
    this.pick.preset = this.host.originLabel;
    const c = this.presetController as (Controller & { options(o: string[]): Controller }) | null;
    c?.options(this.presetOptions());
    c?.updateDisplay();
  }

  private presetOptions(): string[] {
    const label = this.host.originLabel;
    return this.host.presets.includes(label) ? [...this.host.presets] : [label, ...this.host.presets];
  }

  /** Show a speed the page chose (auto speed). */
  showSpeed(n: number): void {
    this.view.speed = n;
    this.speedController?.updateDisplay();
  }

  private materialNames(kind: 'any' | 'bulk'): string[] {
    const f = this.host.file;
    const own = Object.keys(f.materials).filter((n) => kind === 'any' || f.materials[n].model !== 'sheet');
    return [...catalogNames(), ...own];
  }

  private isSheet(name: string): boolean {
    const m = this.host.file.materials[name];
    return m !== undefined && m.model === 'sheet';
  }

  private buildStack(): void {
    for (const c of this.stackControllers) c.destroy();
    this.stackControllers = [];
    const f = this.host.file, v = this.fields, host = this.host, folder = this.stackFolder;
    v.title = f.title; v.front = f.front; v.back = f.back;
    v.fmin = f.band_GHz[0]; v.fmax = f.band_GHz[1]; v.points = f.points;
    v.angle = f.incidence.angle_deg; v.polarization = f.incidence.polarization; v.profile = f.profile_GHz;
    const revert = (): void => this.buildStack();
    const add = (c: Controller, id: string): Controller => { tag(c, id); this.stackControllers.push(c); return c; };
    // A number box's text that is not a number goes to the parser as it is, which names the field.
    const raw = (t: string): number => t as unknown as number;
    const guard = (c: Controller, change: (s: StackFile, t: string) => void): Controller =>
      guardNumber(c, (t) => { if (!host.edit((s) => change(s, t))) revert(); });
    add(folder.add(v, 'title').name('title').onFinishChange((t: string) => { if (!host.edit((s) => { s.title = t; })) revert(); }), 'stack-title-input');
    add(folder.add(v, 'front', this.materialNames('bulk')).name('wave comes from').onChange((m: string) => {
      if (!host.edit((s) => { s.front = m; })) revert();
    }), 'front');
    add(folder.add(v, 'back', ['pec', ...this.materialNames('bulk')]).name('behind the stack').onChange((m: string) => {
      if (!host.edit((s) => { s.back = m; })) revert();
    }), 'back');
    guard(add(folder.add(v, 'fmin').name('band from (GHz)').onFinishChange((x: number) => {
      host.edit((s) => { s.band_GHz = [x, s.band_GHz[1]]; clampProfile(s); });
      this.buildStack(); // shows the clamped profile frequency and the slider's new range, or reverts
    }), 'band-min'), (s, t) => { s.band_GHz = [raw(t), s.band_GHz[1]]; });
    guard(add(folder.add(v, 'fmax').name('band to (GHz)').onFinishChange((x: number) => {
      host.edit((s) => { s.band_GHz = [s.band_GHz[0], x]; clampProfile(s); });
      this.buildStack(); // shows the clamped profile frequency and the slider's new range, or reverts
    }), 'band-max'), (s, t) => { s.band_GHz = [s.band_GHz[0], raw(t)]; });
    guard(add(folder.add(v, 'points').step(1).name('spectrum points').onFinishChange((x: number) => {
      if (!host.edit((s) => { s.points = Math.round(x); })) revert();
    }), 'points'), (s, t) => { s.points = raw(t); });
    guard(add(folder.add(v, 'angle', 0, 89, 0.5).name('incidence angle (°)').onChange((x: number) => {
      if (!host.edit((s) => { s.incidence = { ...s.incidence, angle_deg: x }; })) revert();
    }), 'angle'), (s, t) => { s.incidence = { ...s.incidence, angle_deg: raw(t) }; });
    add(folder.add(v, 'polarization', ['TE', 'TM']).name('polarization').onChange((x: 'TE' | 'TM') => {
      if (!host.edit((s) => { s.incidence = { ...s.incidence, polarization: x }; })) revert();
    }), 'polarization');
    guard(add(folder.add(v, 'profile', f.band_GHz[0], f.band_GHz[1]).name('profile at (GHz)').onChange((x: number) => {
      if (!host.edit((s) => { s.profile_GHz = x; })) revert();
    }), 'profile-GHz'), (s, t) => { s.profile_GHz = raw(t); });
  }

  private buildLayers(): void {
    const folder = this.layersFolder;
    for (const c of [...folder.children]) c.destroy();
    const f = this.host.file;
    f.layers.forEach((layer, i) => this.buildLayer(folder, layer, i, f.layers.length));
    const actions = {
      add: (): void => {
        const ok = this.host.edit((s) => { s.layers.push({ material: 'air', thickness_mm: DEFAULT_THICKNESS_MM }); });
        if (ok) this.buildLayers();
      },
    };
    tag(folder.add(actions, 'add').name('+ add a layer at the back'), 'layer-add');
  }

  private buildLayer(parent: GUI, layer: StackFileLayer, i: number, count: number): void {
    const host = this.host;
    const sub = parent.addFolder(layerTitle(layer, i));
    sub.domElement.dataset.testid = `layer-${i}`;
    const v = { material: layer.material, thickness_mm: layer.thickness_mm ?? DEFAULT_THICKNESS_MM };
    tag(sub.add(v, 'material', this.materialNames('any')).name('material').onChange((m: string) => {
      const wasSheet = layer.thickness_mm === undefined, nowSheet = this.isSheet(m);
      const ok = host.edit((s) => {
        const l: StackFileLayer = { material: m };
        if (!nowSheet) l.thickness_mm = s.layers[i].thickness_mm ?? DEFAULT_THICKNESS_MM;
        s.layers[i] = l;
      });
      if (!ok || wasSheet !== nowSheet) this.buildLayers();
      else { layer = this.host.file.layers[i]; sub.title(layerTitle(layer, i)); }
    }), `layer-${i}-material`);
    if (layer.thickness_mm !== undefined) {
      // No min(): lil-gui would clamp a typed −4 to the min and apply that. Valid values apply while
      // typing; an invalid one is refused by the parser when the input is left (the field named).
      const setThickness = (d: number): boolean => host.edit((s) => { s.layers[i] = { ...s.layers[i], thickness_mm: d }; });
      const c = sub.add(v, 'thickness_mm').name('thickness (mm)')
        .onChange((d: number) => {
          if (d > 0 && setThickness(d)) {
            layer = this.host.file.layers[i];
            sub.title(layerTitle(layer, i));
          }
        })
        .onFinishChange((d: number) => {
          if (!(d > 0)) setThickness(d);
          v.thickness_mm = this.host.file.layers[i]?.thickness_mm ?? v.thickness_mm;
          c.updateDisplay();
        });
      tag(c, `layer-${i}-thickness`);
      guardNumber(c, (t) => { host.edit((s) => { s.layers[i] = { ...s.layers[i], thickness_mm: t as unknown as number }; }); });
    }
    const move = (to: number): void => {
      if (to < 0 || to >= count) return;
      if (host.edit((s) => { const [l] = s.layers.splice(i, 1); s.layers.splice(to, 0, l); })) this.buildLayers();
    };
    const acts = {
      up: (): void => move(i - 1),
      down: (): void => move(i + 1),
      remove: (): void => { if (host.edit((s) => { s.layers.splice(i, 1); })) this.buildLayers(); },
    };
    if (i > 0) tag(sub.add(acts, 'up').name('move towards the front'), `layer-${i}-up`);
    if (i < count - 1) tag(sub.add(acts, 'down').name('move towards the back'), `layer-${i}-down`);
    tag(sub.add(acts, 'remove').name('remove this layer'), `layer-${i}-remove`);
    if (count > 4) sub.close();
  }

  private buildRun(): void {
    const s = this.host.settings, host = this.host;
    const folder = this.gui.addFolder('Pulse run');
    this.view.accuracy = Object.keys(ACCURACY).find((k) => ACCURACY[k] === s.accuracy) ?? 'engine default';
    tag(folder.add(this.view, 'accuracy', Object.keys(ACCURACY)).name('accuracy target').onChange((k: string) => {
      s.accuracy = ACCURACY[k] ?? null;
      host.settingsChanged('accuracy');
    }), 'accuracy');
    this.view.speed = s.speed;
    this.view.autoSpeed = s.autoSpeed;
    const auto = folder.add(this.view, 'autoSpeed').name('speed from the grid').onChange((on: boolean) => {
      s.autoSpeed = on;
      host.settingsChanged('speed');
    });
    tag(auto, 'auto-speed');
    this.speedController = folder.add(this.view, 'speed', 1, 200, 1).name('steps per frame').onChange((n: number) => {
      s.speed = Math.max(1, Math.round(n));
      if (s.autoSpeed) { s.autoSpeed = false; this.view.autoSpeed = false; auto.updateDisplay(); }
      host.settingsChanged('speed');
    });
    tag(this.speedController, 'speed');
    guardNumber(this.speedController, (t) => host.refuse('Pulse run › steps per frame', 'a whole number from 1 to 200', t));
    const traces = folder.addFolder('Traces in the field view');
    for (const name of TRACE_NAMES) {
      tag(traces.add(s.traces, name).name(name).onChange(() => host.settingsChanged('traces')), `trace-${name}`);
    }
  }

  private buildClip(): void {
    const s = this.host.settings, host = this.host;
    const folder = this.gui.addFolder('Clips of the field view');
    const v = { format: Object.keys(CLIP_FORMATS).find((k) => CLIP_FORMATS[k] === s.clipFormat) ?? 'WebM (VP9)', length: s.clipLength_s };
    tag(folder.add(v, 'format', Object.keys(CLIP_FORMATS)).name('file format').onChange((k: string) => {
      s.clipFormat = CLIP_FORMATS[k] ?? 'webm'; host.settingsChanged('clip');
    }), 'clip-format');
    const [lo, hi] = CLIP_LENGTH_LIMITS_s;
    const length = tag(folder.add(v, 'length', lo, hi, 0.5).name('length (s)').onChange((x: number) => {
      s.clipLength_s = Math.min(hi, Math.max(lo, x)); host.settingsChanged('clip');
    }), 'clip-length');
    guardNumber(length, (t) => host.refuse('Clips › length (s)', `a number of seconds from ${lo} to ${hi}`, t));
  }

  private buildViews(): void {
    const s = this.host.settings, host = this.host;
    const folder = this.gui.addFolder('Views');
    this.view.xUnit = s.xUnit; this.view.lambda = s.lambda_GHz;
    tag(folder.add(this.view, 'xUnit', { millimetres: 'mm', wavelengths: 'wavelengths' }).name('field view position').onChange((u: 'mm' | 'wavelengths') => {
      s.xUnit = u; host.settingsChanged('axis');
    }), 'x-unit');
    const lambda = tag(folder.add(this.view, 'lambda').min(0.001).name('wavelengths at (GHz)').onFinishChange((x: number) => {
      if (x > 0) { s.lambda_GHz = x; host.settingsChanged('axis'); }
    }), 'lambda-GHz');
    guardNumber(lambda, (t) => host.refuse('Views › wavelengths at (GHz)', 'a number of GHz > 0', t));
    this.view.spectrum = s.spectrumMode;
    tag(folder.add(this.view, 'spectrum', ['magnitude', 'phase', 'group delay']).name('spectrum shows').onChange((m: SpectrumMode) => {
      s.spectrumMode = m; host.settingsChanged('spectrum');
    }), 'spectrum-mode');
    this.view.magnitude = s.magnitude;
    tag(folder.add(this.view, 'magnitude', ['dB', 'linear']).name('magnitudes in').onChange((m: 'dB' | 'linear') => {
      s.magnitude = m; host.settingsChanged('spectrum');
    }), 'magnitude-scale');
    this.view.freqScale = s.freqScale;
    tag(folder.add(this.view, 'freqScale', ['linear', 'log']).name('frequency axis').onChange((m: 'linear' | 'log') => {
      s.freqScale = m; host.settingsChanged('spectrum');
    }), 'freq-scale');
    this.view.envelope = s.envelope;
    tag(folder.add(this.view, 'envelope').name('echoes as dB envelope').onChange((e: boolean) => {
      s.envelope = e; host.settingsChanged('trace');
    }), 'envelope');
    const st = { field: s.spacetimeField, gain: `×${s.spacetimeGain}`, rays: s.spacetimeRays };
    tag(folder.add(st, 'field', { 'total field': 'total', 'scattered field': 'scattered' }).name('space–time map shows').onChange((v: 'total' | 'scattered') => {
      s.spacetimeField = v; host.settingsChanged('spacetime');
    }), 'spacetime-field');
    tag(folder.add(st, 'gain', SPACETIME_GAINS.map((g) => `×${g}`)).name('space–time colour gain').onChange((v: string) => {
      s.spacetimeGain = Number(v.slice(1)); host.settingsChanged('spacetime');
    }), 'spacetime-gain');
    tag(folder.add(st, 'rays').name('space–time echo rays').onChange((v: boolean) => {
      s.spacetimeRays = v; host.settingsChanged('spacetime');
    }), 'spacetime-rays');
  }
}

const CLIP_FORMATS: Record<string, ClipFormat> = { 'WebM (VP9)': 'webm', 'MP4 (H.264)': 'mp4' };

function tag(c: Controller, id: string): Controller {
  c.domElement.dataset.testid = id;
  return c;
}

function layerTitle(l: StackFileLayer, i: number): string {
  return `${i + 1} · ${l.material}${l.thickness_mm !== undefined ? ` · ${+l.thickness_mm.toPrecision(6)} mm` : ' (sheet)'}`;
}

/** Keep the profile frequency inside a changed band. */
function clampProfile(s: StackFile): void {
  s.profile_GHz = Math.min(s.band_GHz[1], Math.max(s.band_GHz[0], s.profile_GHz));
}
