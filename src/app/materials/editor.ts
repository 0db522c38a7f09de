// The material editor in the panel: the stack's own materials — create, duplicate, delete, rename, change model —
// and every parameter of every model (poles, table rows, the magnetic block), with a small plot of ε′, ε″ (and
// μ′, μ″) over the band. Every change is a change of the stack file handed to the host, which validates the whole
// file with the core parser: a refused change shows the parser's own message (the field named by its path,
// materials.foam.eps_r) and the form goes back to the values in force. Text that is not a plain decimal is handed
// to the parser as text, so it is refused in the parser's words.

import { catalogNames } from '../../materials/catalog.ts';
import { MAGNETIC_MODEL_NAMES, MODEL_NAMES, type MagneticModelName, type ModelName } from '../../materials/types.ts';
import type { StackFile, StackFileMaterial } from '../../stack/file.ts';
import { Chart } from '../charts/chart.ts';
import { isDecimalText } from '../numberField.ts';
import { button, el, labelled, textInput } from '../dom.ts';
import { materialPlot } from './plot.ts';
import {
  freshName, MAGNETIC_FIELDS, MAGNETIC_POLE_FIELDS, MODEL_FIELDS, nextPole, POLE_FIELDS, rowsOf, rowsText, startingDefinition,
  startingMagnetic, type Definition, type FieldSpec,
} from './schema.ts';

export interface EditorHost {
  readonly file: StackFile;
  /** Apply a change to a copy of the stack file; false (and the parser's reason shown) when it is refused. */
  edit(change: (f: StackFile) => void): boolean;
  /** Materials were added, removed or renamed (the layer menus list them). */
  materialsChanged(): void;
}

const MODEL_LABELS: Record<ModelName, string> = {
  fixed: 'fixed ε_r and σ', debye: 'Debye relaxation', lorentz: 'Lorentz resonance', drude: 'Drude (free carriers)',
  'power-law': 'power law (ε′ = a f^b, σ = c f^d)', table: 'measured table', sheet: 'resistive sheet',
};

/** The text a user types, as the parser is to read it: a number when it is a plain decimal, else the text itself. */
const typed = (t: string): unknown => (isDecimalText(t) ? Number(t) : t);

type Path = Array<string | number>;

function setIn(root: Definition, path: Path, value: unknown): void {
  let o = root as Record<string | number, unknown>;
  for (let k = 0; k < path.length - 1; k++) o = o[path[k]] as Record<string | number, unknown>;
  const last = path[path.length - 1];
  if (value === undefined) delete o[last]; else o[last] = value;
}

function getIn(root: unknown, path: Path): unknown {
  let o = root as Record<string | number, unknown> | undefined;
  for (const k of path) o = o?.[k] as Record<string | number, unknown> | undefined;
  return o;
}

export class MaterialEditor {
  private readonly box: HTMLElement;
  private readonly form: HTMLElement;
  private readonly plotHost: HTMLElement;
  readonly plot: Chart;
  private selected: string | null = null;

  constructor(parent: HTMLElement, private readonly host: EditorHost) {
    this.box = el('section', 'editor');
    this.box.dataset.testid = 'material-editor';
    const head = el('h3', 'editor-head', 'Your materials');
    this.form = el('div', 'editor-form');
    this.plotHost = el('div', 'editor-plot');
    this.plotHost.dataset.testid = 'material-plot';
    this.box.append(head, this.form, this.plotHost);
    parent.append(this.box);
    this.plot = new Chart(this.plotHost, 240);
    this.refresh();
  }

  private names(): string[] { return Object.keys(this.host.file.materials); }
  private def(): StackFileMaterial | undefined { return this.selected === null ? undefined : this.host.file.materials[this.selected]; }

  /** Rebuild from the host's stack (after an import, a preset or an edit elsewhere). */
  refresh(): void {
    const names = this.names();
    if (this.selected === null || !names.includes(this.selected)) this.selected = names[0] ?? null;
    this.form.replaceChildren(this.listRow(names), ...this.fieldsOf());
    this.drawPlot();
  }

  /** Redraw the plot (the band or the material changed). */
  drawPlot(): void {
    const d = this.def();
    this.plot.set(materialPlot(this.selected ?? '', d ?? null, this.host.file.band_GHz));
  }

  /** Apply a change to the selected material's definition (a copy); on refusal, the form shows what holds. */
  private change(mutate: (d: Definition, file: StackFile) => void, rebuild = false): boolean {
    const name = this.selected;
    if (name === null) return false;
    const ok = this.host.edit((f) => mutate(f.materials[name] as unknown as Definition, f));
    if (!ok || rebuild) this.refresh(); else this.drawPlot();
    return ok;
  }

  // ---- the list: choose, new, duplicate, delete ---------------------------------------------

  private listRow(names: string[]): HTMLElement {
    const row = el('div', 'editor-row editor-list');
    const pick = document.createElement('select');
    pick.dataset.testid = 'me-select';
    pick.setAttribute('aria-label', 'material');
    for (const n of names) pick.append(new Option(n, n, false, n === this.selected));
    if (names.length === 0) pick.append(new Option('(none yet)', '', true, true));
    pick.disabled = names.length === 0;
    pick.addEventListener('change', () => { this.selected = pick.value; this.refresh(); });
    row.append(pick,
      button('new', 'me-new', () => this.create()),
      button('duplicate', 'me-duplicate', () => this.duplicate(), names.length === 0),
      button('delete', 'me-delete', () => this.remove(), names.length === 0));
    return row;
  }

  private taken = (n: string): boolean => n in this.host.file.materials || catalogNames().includes(n) || n === 'pec';

  private add(name: string, def: Definition): void {
    if (this.host.edit((f) => { f.materials[name] = def as unknown as StackFileMaterial; })) {
      this.selected = name;
      this.host.materialsChanged();
    }
    this.refresh();
  }

  private create(): void { this.add(freshName('material', this.taken), startingDefinition('fixed', this.host.file.band_GHz)); }

  private duplicate(): void {
    const d = this.def();
    if (this.selected !== null && d !== undefined) this.add(freshName(`${this.selected}-copy`, this.taken), structuredClone(d) as unknown as Definition);
  }

  /** Delete the selected material; the parser refuses while a layer or half-space uses it. */
  private remove(): void {
    const name = this.selected;
    if (name === null) return;
    if (this.host.edit((f) => { delete f.materials[name]; })) { this.selected = null; this.host.materialsChanged(); }
    this.refresh();
  }

  // ---- the selected material's fields -------------------------------------------------------

  private fieldsOf(): HTMLElement[] {
    const d = this.def(), name = this.selected;
    if (d === undefined || name === null) {
      return [el('p', 'editor-note', 'No materials of your own yet: "new" makes one; a layer can then use it.')];
    }
    const model = d.model;
    const out: HTMLElement[] = [this.nameRow(name), this.modelRow(model)];
    for (const f of MODEL_FIELDS[model]) out.push(this.numberRow(f, [f.key], `me-field-${f.key}`));
    const poleFields = POLE_FIELDS[model];
    if (poleFields !== undefined) out.push(this.poles(['poles'], poleFields, 'me-pole'));
    if (model === 'table') out.push(...this.tableRows(d as unknown as Definition));
    if (model !== 'sheet' && !(model === 'table' && 'mu_points' in d)) out.push(...this.magneticRows(d as unknown as Definition));
    out.push(this.rangeRow(), this.textRow('note', ['note'], 'me-note'));
    return out;
  }

  /** The range the user vouches for, "lo, hi" in GHz (optional; the band leaving it gives a warning). */
  private rangeRow(): HTMLElement {
    const v = this.def()?.valid_GHz;
    const input = textInput(Array.isArray(v) ? v.join(', ') : '', 'me-valid');
    input.placeholder = 'optional: lo, hi';
    input.addEventListener('change', () => {
      const t = input.value.trim();
      this.change((d) => setIn(d, ['valid_GHz'], t === '' ? undefined : t.split(/\s*[,;:]\s*|\s+/).map(typed)));
    });
    return labelled('valid (GHz)', input);
  }

  private nameRow(name: string): HTMLElement {
    const input = textInput(name, 'me-name');
    input.addEventListener('change', () => {
      const to = input.value.trim();
      if (to === name) return;
      if (this.host.edit((f) => renameMaterial(f, name, to))) { this.selected = to; this.host.materialsChanged(); }
      this.refresh();
    });
    return labelled('name', input);
  }

  private modelRow(model: ModelName): HTMLElement {
    const pick = document.createElement('select');
    pick.dataset.testid = 'me-model';
    for (const m of MODEL_NAMES) pick.append(new Option(MODEL_LABELS[m], m, false, m === model));
    pick.addEventListener('change', () => {
      const to = pick.value as ModelName;
      this.change((_, f) => switchModel(f, this.selected!, to), true);
      this.host.materialsChanged(); // a sheet and a bulk material go in different menus
    });
    return labelled('model', pick);
  }

  private numberRow(f: FieldSpec, path: Path, testid: string): HTMLElement {
    const value = getIn(this.def(), path);
    const input = textInput(value === undefined ? '' : String(value), testid);
    input.inputMode = 'decimal';
    input.addEventListener('change', () => {
      const t = input.value.trim();
      this.change((d) => setIn(d, path, t === '' ? undefined : typed(t)));
    });
    return labelled(f.label, input);
  }

  private textRow(label: string, path: Path, testid: string): HTMLElement {
    const value = getIn(this.def(), path);
    const input = textInput(typeof value === 'string' ? value : '', testid);
    input.addEventListener('change', () => { this.change((d) => setIn(d, path, input.value === '' ? undefined : input.value)); });
    return labelled(label, input);
  }

  /** A list of poles at `path`, each with its fields and a remove button, and an add button. */
  private poles(path: Path, fields: FieldSpec[], testid: string): HTMLElement {
    const box = el('div', 'editor-poles');
    const poles = (getIn(this.def(), path) as Definition[] | undefined) ?? [];
    poles.forEach((_, i) => {
      const row = el('div', 'editor-pole');
      row.append(el('span', 'editor-pole-title', `pole ${i + 1}`), ...fields.map((f) => this.numberRow(f, [...path, i, f.key], `${testid}-${i}-${f.key}`)),
        button('remove', `${testid}-${i}-remove`, () => this.change((d) => (getIn(d, path) as unknown[]).splice(i, 1), true), poles.length <= 1));
      box.append(row);
    });
    box.append(button('+ add a pole', `${testid}-add`, () => this.change((d) => {
      const list = getIn(d, path) as Definition[];
      list.push(nextPole(list, fields));
    }, true)));
    return box;
  }

  private tableRows(d: Definition): HTMLElement[] {
    const rows = (key: 'points' | 'mu_points', label: string, testid: string): HTMLElement => {
      const area = document.createElement('textarea');
      area.dataset.testid = testid;
      area.rows = 5;
      area.spellcheck = false;
      area.value = rowsText(d[key]);
      area.placeholder = key === 'points' ? 'f_GHz, ε′, ε″ per line' : 'f_GHz, μ′, μ″ per line (optional)';
      area.addEventListener('change', () => {
        const v = area.value.trim();
        this.change((m) => setIn(m, [key], v === '' && key === 'mu_points' ? undefined : rowsOf(v, isDecimalText)), true);
      });
      return labelled(label, area, true);
    };
    return [rows('points', 'ε rows: f (GHz), ε′, ε″', 'me-points'), rows('mu_points', 'μ rows: f (GHz), μ′, μ″', 'me-mu-points')];
  }

  private magneticRows(d: Definition): HTMLElement[] {
    const mag = d.magnetic as Definition | undefined;
    const on = document.createElement('input');
    on.type = 'checkbox';
    on.checked = mag !== undefined;
    on.dataset.testid = 'me-magnetic';
    on.addEventListener('change', () => this.change((m) => setIn(m, ['magnetic'], on.checked ? startingMagnetic('lorentz', this.host.file.band_GHz) : undefined), true));
    const out = [labelled('magnetic (μ_r ≠ 1)', on)];
    if (mag === undefined) return out;
    const model = mag.model as MagneticModelName;
    const pick = document.createElement('select');
    pick.dataset.testid = 'me-mag-model';
    for (const m of MAGNETIC_MODEL_NAMES) pick.append(new Option(m, m, false, m === model));
    pick.addEventListener('change', () => this.change((m) => setIn(m, ['magnetic'], startingMagnetic(pick.value as MagneticModelName, this.host.file.band_GHz)), true));
    out.push(labelled('μ model', pick));
    for (const f of MAGNETIC_FIELDS[model] ?? []) out.push(this.numberRow(f, ['magnetic', f.key], `me-mag-${f.key}`));
    const poleFields = MAGNETIC_POLE_FIELDS[model];
    if (poleFields !== undefined) out.push(this.poles(['magnetic', 'poles'], poleFields, 'me-mag-pole'));
    return out;
  }
}

/** Rename material `from` to `to` everywhere the file names it (its key keeps its place). */
export function renameMaterial(f: StackFile, from: string, to: string): void {
  const materials: Record<string, StackFileMaterial> = Object.create(null);
  for (const [k, v] of Object.entries(f.materials)) materials[k === from ? to : k] = v;
  f.materials = materials;
  for (const l of f.layers) if (l.material === from) l.material = to;
  if (f.front === from) f.front = to;
  if (f.back === from) f.back = to;
}

/** Give material `name` a fresh definition of `model`; layers using it gain or lose their thickness (sheets have none). */
export function switchModel(f: StackFile, name: string, model: ModelName): void {
  const old = f.materials[name];
  const next = startingDefinition(model, f.band_GHz);
  if (old.note !== undefined) next.note = old.note;
  if (old.valid_GHz !== undefined) next.valid_GHz = old.valid_GHz;
  if (old.model !== 'sheet' && model !== 'sheet' && model !== 'table' && 'magnetic' in old && old.magnetic !== undefined) next.magnetic = old.magnetic;
  f.materials[name] = next as unknown as StackFileMaterial;
  for (const l of f.layers) {
    if (l.material !== name) continue;
    if (model === 'sheet') delete l.thickness_mm;
    else if (l.thickness_mm === undefined) l.thickness_mm = 10;
  }
}
