// The "Measurements and tuning" section of the panel: a measured CSV (the columns `slabecho tune` matches:
// f_GHz and any of R_re,R_im, T_re,T_im, R_dB, T_dB, an optional weight) read by the core and drawn on the
// spectrum beside the three methods; and a tuning — match to it, or a worst-case goal — run in a worker with the
// tuning core, with progress, cancel, the result in words and the tuned stack, applied to the workbench only when
// asked.

import type { StackFile } from '../../stack/file.ts';
import type { Stack } from '../../stack/types.ts';
import { readMeasured, type Measured } from '../../tune/measured.ts';
import { button, el, labelled, select, textArea, textInput } from '../dom.ts';
import { isDecimalText } from '../numberField.ts';
import { StudyRunner } from '../studies/client.ts';
import type { TuneRequest, TuneResult } from '../studies/compute.ts';
import type { MeasuredOverlay } from '../views/spectrumView.ts';
import { resultLines } from './result.ts';

export interface TuneHost {
  readonly file: StackFile;
  readonly stack: Stack;
  refuse(field: string, need: string, text: string): void;
  /** Show the tuning's or the measurement's problems (null clears them). */
  tuneProblems(title: string | null, lines: string[]): void;
  measuredChanged(m: MeasuredOverlay | null): void;
  /** Replace the workbench's stack by the tuned one (validated like any edit). */
  applyTuned(file: StackFile): void;
  downloadStack(file: StackFile): void;
}

/** Evaluations per free path when the budget is left empty (the command line's defaults). */
const BUDGET_PER_PATH = { match: 100, search: 300 };

export function overlayOf(m: Measured): MeasuredOverlay {
  const v = (c: 'R_re' | 'R_im' | 'T_re' | 'T_im' | 'R_dB' | 'T_dB') => m.values.get(c) ?? null;
  const cx = (re: Float64Array | null, im: Float64Array | null) => (re !== null && im !== null ? { re, im } : null);
  return { name: m.name, f_GHz: m.f_Hz.map((f) => f * 1e-9), R: cx(v('R_re'), v('R_im')), T: cx(v('T_re'), v('T_im')), R_dB: v('R_dB'), T_dB: v('T_dB') };
}

/** A first free path for a stack: its first bulk layer's thickness from half to one and a half of it. */
export function defaultFree(file: StackFile): string {
  const i = file.layers.findIndex((l) => l.thickness_mm !== undefined);
  if (i < 0) return '';
  const d = file.layers[i].thickness_mm!, r = (x: number) => Number(x.toPrecision(3));
  return `layers[${i}].thickness_mm=${r(d / 2)}:${r(1.5 * d)}`;
}

export class TunePanel {
  private readonly runner = new StudyRunner();
  private measured: { name: string; text: string } | null = null;
  private result: TuneResult | null = null;
  private readonly status: HTMLElement;
  private readonly goal: HTMLSelectElement;
  private readonly free: HTMLTextAreaElement;
  private readonly angles: HTMLInputElement;
  private readonly pols: HTMLInputElement;
  private readonly seed: HTMLInputElement;
  private readonly budget: HTMLInputElement;
  private readonly progress: HTMLProgressElement;
  private readonly cancelButton: HTMLButtonElement;
  private readonly resultBox: HTMLElement;
  private readonly applyButton: HTMLButtonElement;
  private readonly downloadButton: HTMLButtonElement;
  private readonly worstRows: HTMLElement[];

  constructor(parent: HTMLElement, private readonly host: TuneHost) {
    const box = el('section', 'editor');
    box.dataset.testid = 'tune-panel';
    const file = document.createElement('input');
    file.type = 'file';
    file.accept = '.csv,text/csv';
    file.hidden = true;
    file.dataset.testid = 'measured-import';
    file.addEventListener('change', () => {
      const f = file.files?.[0];
      file.value = '';
      if (f !== undefined) void f.text().then((t) => this.loadMeasured(f.name, t));
    });
    const load = el('label', 'button small', 'load a measured CSV');
    load.append(file);
    this.status = el('div', 'editor-note', 'no measurement loaded');
    this.status.dataset.testid = 'measured-status';
    this.goal = select([['match', 'match the measurement'], ['min-worst-R', 'lowest worst R_power'], ['max-worst-T', 'highest worst T_power']], 'match', 'tune-goal');
    this.free = textArea(defaultFree(host.file), 'tune-free', 2);
    this.free.placeholder = 'PATH=LO:HI, one per line';
    this.angles = textInput('', 'tune-angles');
    this.angles.placeholder = "the stack's own";
    this.pols = textInput('', 'tune-polarizations');
    this.pols.placeholder = "the stack's own";
    this.seed = textInput('1', 'tune-seed');
    this.budget = textInput('', 'tune-budget');
    this.budget.placeholder = 'default';
    this.progress = document.createElement('progress');
    this.progress.max = 1;
    this.progress.value = 0;
    this.progress.dataset.testid = 'tune-progress';
    this.cancelButton = button('cancel', 'tune-cancel', () => this.cancel(), true);
    this.resultBox = el('pre', 'tune-result');
    this.resultBox.dataset.testid = 'tune-result';
    this.applyButton = button('apply to the workbench', 'tune-apply', () => { if (this.result?.tunedFile) host.applyTuned(this.result.tunedFile); }, true);
    this.downloadButton = button('download the tuned stack', 'tune-download', () => { if (this.result?.tunedFile) host.downloadStack(this.result.tunedFile); }, true);
    this.worstRows = [labelled('angles (°)', this.angles), labelled('polarizations', this.pols)];
    this.goal.addEventListener('change', () => this.showGoal());
    const run = el('div', 'editor-row');
    run.append(button('run the tuning', 'tune-run', () => this.run()), this.progress, this.cancelButton);
    const loadRow = el('div', 'editor-row');
    loadRow.append(load, button('clear', 'measured-clear', () => this.clearMeasured()));
    box.append(el('h3', 'editor-head', 'Measurements and tuning'), loadRow, this.status,
      labelled('goal', this.goal), labelled('free (PATH=LO:HI)', this.free, true), ...this.worstRows,
      labelled('seed', this.seed), labelled('budget (evaluations)', this.budget), run, this.resultBox,
      el('div', 'editor-row tune-actions'),
      el('p', 'editor-note', 'A tuned design is the optimum of an idealised model: build and measure it before relying on it, and defer to local codes and licensed practice where shielding or exposure limits matter.'));
    box.querySelector('.tune-actions')!.append(this.applyButton, this.downloadButton);
    parent.append(box);
    this.showGoal();
  }

  private showGoal(): void {
    for (const r of this.worstRows) r.hidden = this.goal.value === 'match';
  }

  /** After a new stack: new defaults; the measurement is checked against it again. */
  refresh(): void {
    this.free.value = defaultFree(this.host.file);
    this.recheck();
  }

  /** The measurement against the current stack (its band may have moved): drawn, or its problems shown. */
  recheck(): void {
    if (this.measured === null) return; // nothing drawn, nothing to redraw
    const r = readMeasured(this.measured.text, this.measured.name, this.host.stack);
    if (!r.ok) {
      this.status.textContent = `${this.measured.name}: does not fit this stack (see the messages)`;
      this.host.tuneProblems(`${this.measured.name} cannot be drawn on this stack:`, r.errors);
      this.host.measuredChanged(null);
      return;
    }
    const m = r.measured;
    this.status.textContent = `${m.name}: ${m.f_Hz.length} rows, ${m.columns.join(', ')}`;
    this.host.tuneProblems(null, []);
    this.host.measuredChanged(overlayOf(m));
  }

  private loadMeasured(name: string, text: string): void {
    if (text.length > 20_000_000) { this.host.tuneProblems(`${name} was not loaded:`, ['file: over 20 MB']); return; }
    this.measured = { name, text };
    this.recheck();
  }

  private clearMeasured(): void {
    this.measured = null;
    this.status.textContent = 'no measurement loaded';
    this.host.tuneProblems(null, []);
    this.host.measuredChanged(null);
  }

  private numberOf(input: HTMLInputElement, field: string, need: string, ok: (x: number) => boolean): number | null | undefined {
    const t = input.value.trim();
    if (t === '') return undefined;
    if (isDecimalText(t) && ok(Number(t))) return Number(t);
    this.host.refuse(`Measurements and tuning › ${field}`, need, t);
    return null;
  }

  private request(): TuneRequest | null {
    const free = this.free.value.split(/\r?\n/).map((l) => l.trim()).filter((l) => l !== '');
    const goal = this.goal.value as TuneRequest['goal'];
    const seed = this.numberOf(this.seed, 'seed', 'a whole number from 0 to 4294967295', (x) => Number.isInteger(x) && x >= 0 && x < 2 ** 32);
    const budget = this.numberOf(this.budget, 'budget (evaluations)', 'a whole number of evaluations', (x) => Number.isInteger(x) && x > 0 && x <= 1_000_000);
    if (seed === null || budget === null) return null;
    const perPath = goal === 'match' ? BUDGET_PER_PATH.match : BUDGET_PER_PATH.search;
    return {
      free, goal, angles: goal === 'match' ? '' : this.angles.value, polarizations: goal === 'match' ? '' : this.pols.value,
      measured: this.measured, seed: seed ?? 1, budget: budget ?? perPath * Math.max(1, free.length),
    };
  }

  private run(): void {
    const q = this.request();
    if (q === null) return;
    this.host.tuneProblems(null, []);
    this.result = null;
    this.applyButton.disabled = this.downloadButton.disabled = true;
    this.cancelButton.disabled = false;
    this.progress.value = 0;
    this.resultBox.textContent = 'starting…';
    this.runner.start({ kind: 'tune', file: this.host.file, request: q }, {
      progress: (fraction, note) => { this.progress.value = fraction; this.resultBox.textContent = note; },
      done: (m) => {
        this.cancelButton.disabled = true;
        this.progress.value = 1;
        const r = (m as { result: TuneResult }).result;
        this.result = r;
        this.resultBox.textContent = resultLines(r, m.ms).join('\n');
        this.applyButton.disabled = this.downloadButton.disabled = r.tunedFile === null;
      },
      failed: (messages, input) => {
        this.cancelButton.disabled = true;
        this.resultBox.textContent = 'not run';
        this.host.tuneProblems(input ? 'The tuning was not run:' : 'The tuning failed:', messages);
      },
    });
  }

  private cancel(): void {
    if (this.runner.cancel()) this.resultBox.textContent = 'cancelled';
    this.cancelButton.disabled = true;
  }
}
