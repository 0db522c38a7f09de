// The "Design studies" section of the panel: a sweep over one stack-file path (shown as a map), and a tolerance
// study (shown as p05–p95 bands on the spectrum). Both run in a worker with the studies core, with progress and
// a cancel button; what is typed is read by the core, whose messages name the field. Small defaults keep the
// page responsive; the command line runs the large ones.

import type { StackFile } from '../../stack/file.ts';
import { QUANTITY_NAMES, type QuantityName } from '../../studies/quantities.ts';
import { button, el, labelled, select, textArea, textInput } from '../dom.ts';
import { isDecimalText } from '../numberField.ts';
import { StudyRunner } from './client.ts';
import type { SweepResult, ToleranceResult } from './compute.ts';
import { QUANTITY_LABELS } from './mapView.ts';

export interface StudyHost {
  readonly file: StackFile;
  /** A panel value was refused: `field: must be need (got …)`. */
  refuse(field: string, need: string, text: string): void;
  /** Show the study's problems (null clears them). */
  studyProblems(title: string | null, lines: string[]): void;
  sweepDone(result: SweepResult, ms: number): void;
  toleranceDone(result: ToleranceResult, ms: number): void;
  mapQuantity(q: QuantityName): void;
}

export const DEFAULT_SAMPLES = 200;

/** The sweep and tolerance specs a stack starts with: the incidence angle; its first bulk layer's thickness at 2 %. */
export function defaultSpecs(file: StackFile): { axis: string; vary: string } {
  const i = file.layers.findIndex((l) => l.thickness_mm !== undefined);
  const d = i >= 0 ? file.layers[i].thickness_mm! : 0;
  return {
    axis: 'incidence.angle_deg=0:85:5',
    vary: i >= 0 ? `layers[${i}].thickness_mm:normal:${Number((0.02 * d).toPrecision(2))}` : '',
  };
}

export class StudyPanel {
  private readonly runner = new StudyRunner();
  private readonly axis: HTMLInputElement;
  private readonly vary: HTMLTextAreaElement;
  private readonly samples: HTMLInputElement;
  private readonly seed: HTMLInputElement;
  private readonly progress: HTMLProgressElement;
  private readonly status: HTMLElement;
  private readonly cancelButton: HTMLButtonElement;

  constructor(parent: HTMLElement, private readonly host: StudyHost) {
    const box = el('section', 'editor');
    box.dataset.testid = 'study-panel';
    const d = defaultSpecs(host.file);
    this.axis = textInput(d.axis, 'study-axis');
    const quantity = select(QUANTITY_NAMES.map((q) => [q, QUANTITY_LABELS[q]]), 'IL_dB', 'study-quantity');
    quantity.addEventListener('change', () => host.mapQuantity(quantity.value as QuantityName));
    this.vary = textArea(d.vary, 'study-vary', 2);
    this.vary.placeholder = 'PATH:normal:SD or PATH:uniform:HALF, one per line';
    this.samples = textInput(String(DEFAULT_SAMPLES), 'study-samples');
    this.seed = textInput('1', 'study-seed');
    this.progress = document.createElement('progress');
    this.progress.max = 1;
    this.progress.value = 0;
    this.progress.dataset.testid = 'study-progress';
    this.status = el('div', 'editor-note');
    this.status.dataset.testid = 'study-status';
    this.cancelButton = button('cancel', 'study-cancel', () => this.cancel(), true);
    box.append(
      el('h3', 'editor-head', 'Design studies'),
      labelled('sweep over (PATH=VALUES)', this.axis, true),
      labelled('map shows', quantity),
      button('run the sweep', 'study-sweep', () => this.runSweep()),
      labelled('tolerance: vary', this.vary, true),
      labelled('samples', this.samples),
      labelled('seed', this.seed),
      button('run the tolerance study', 'study-tolerance', () => this.runTolerance()),
      el('div', 'editor-row study-run', ''),
      this.status,
      el('p', 'editor-note', 'A worst case or a 95th percentile holds for the idealised stack and the spreads given, not for a built wall or enclosure: measure before relying on it, and defer to local codes and licensed practice for shielding or exposure limits.'),
    );
    box.querySelector('.study-run')!.append(this.progress, this.cancelButton);
    parent.append(box);
  }

  /** New defaults for a new stack (a preset or an import). */
  refresh(): void {
    const d = defaultSpecs(this.host.file);
    this.axis.value = d.axis;
    this.vary.value = d.vary;
  }

  private whole(input: HTMLInputElement, field: string, lo: number, hi: number): number | null {
    const t = input.value.trim(), x = Number(t);
    if (isDecimalText(t) && Number.isInteger(x) && x >= lo && x <= hi) return x;
    this.host.refuse(`Design studies › ${field}`, `a whole number from ${lo} to ${hi}`, t);
    return null;
  }

  private started(what: string): void {
    this.host.studyProblems(null, []);
    this.progress.value = 0;
    this.cancelButton.disabled = false;
    this.status.textContent = `${what}: starting…`;
  }

  private events(what: string, done: (m: { kind: string; result: unknown; ms: number }) => void) {
    return {
      progress: (fraction: number, note: string) => { this.progress.value = fraction; this.status.textContent = `${what}: ${note}`; },
      done: (m: { kind: string; result: unknown; ms: number }) => {
        this.cancelButton.disabled = true;
        this.progress.value = 1;
        this.status.textContent = `${what}: done in ${(m.ms / 1000).toFixed(2)} s`;
        done(m);
      },
      failed: (messages: string[], input: boolean) => {
        this.cancelButton.disabled = true;
        this.status.textContent = `${what}: not run`;
        this.host.studyProblems(input ? `The ${what} was not run:` : `The ${what} failed:`, messages);
      },
    };
  }

  private runSweep(): void {
    this.started('sweep');
    this.runner.start({ kind: 'sweep', file: this.host.file, axis: this.axis.value.trim() },
      this.events('sweep', (m) => this.host.sweepDone(m.result as SweepResult, m.ms)));
  }

  private runTolerance(): void {
    const samples = this.whole(this.samples, 'samples', 2, 20_000), seed = this.whole(this.seed, 'seed', 0, 4_294_967_295);
    if (samples === null || seed === null) return;
    const vary = this.vary.value.split(/\r?\n/).map((l) => l.trim()).filter((l) => l !== '');
    this.started('tolerance study');
    this.runner.start({ kind: 'tolerance', file: this.host.file, vary, samples, seed },
      this.events('tolerance study', (m) => this.host.toleranceDone(m.result as ToleranceResult, m.ms)));
  }

  private cancel(): void {
    if (this.runner.cancel()) this.status.textContent = 'cancelled';
    this.cancelButton.disabled = true;
  }
}
