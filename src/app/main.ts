// The workbench page: wires the stack state, the engine workers, the four views and the controls.
// All numbers come from the core modules (in the worker, or the parser here); this file only moves
// data and draws.

import { parseStackObject, parseStackText } from '../stack/parse.ts';
import type { StackFile } from '../stack/file.ts';
import type { Stack } from '../stack/types.ts';
import { Controls, type ControlHost, type SettingsTopic } from './controls.ts';
import { Engine, type Solved } from './engine.ts';
import { FieldView, type FieldViewOptions } from './fieldView.ts';
import type { WorkbenchStats } from './stats.ts';
import { exportZip } from './exporter.ts';
import { loadStoredOrigin, loadStoredSettings, loadStoredStack, originLabel, storeOrigin, storeSettings, storeStack, type Origin } from './persist.ts';
import { describe as describeValue } from '../stack/problems.ts';
import { DEFAULT_PRESET, PRESETS, presetFile } from './presets.ts';
import type { FieldFrame, PulseGeometry, WireReport } from './protocol.ts';
import { downloadBlob, fileStem } from './download.ts';
import { autoStepsPerFrame, CLIP_FPS, readSettings, type Settings } from './settings.ts';
import { makeClip, type Clip } from './clip/session.ts';
import { sketchStack, type StackSketch } from './sketch.ts';
import { Messages } from './messages.ts';
import { adoptGuiStyles } from './guiStyles.ts';
import { SpectrumView } from './views/spectrumView.ts';
import { ProfileView } from './views/profileView.ts';
import { TraceView } from './views/traceView.ts';
import { AgreementView } from './views/agreementView.ts';
import { SpacetimeView } from './spacetime/view.ts';
import { MaterialEditor, type EditorHost } from './materials/editor.ts';
import { StudyPanel, type StudyHost } from './studies/panel.ts';
import { StudyMapView } from './studies/mapView.ts';
import type { SweepResult, ToleranceResult } from './studies/compute.ts';
import type { QuantityName } from '../studies/quantities.ts';
import { TunePanel, type TuneHost } from './tune/panel.ts';
import type { MeasuredOverlay, ToleranceOverlay } from './views/spectrumView.ts';
import { formatCsv, ordinal } from '../report/table.ts';
import { csvGrid, spacetimeCsv } from './spacetime/csv.ts';
import type { AgreementRow } from '../report/format-agreement.ts';

const $ = <T extends HTMLElement>(testid: string): T => {
  const el = document.querySelector<T>(`[data-testid="${testid}"]`);
  if (el === null) throw new Error(`page element ${testid} is missing`);
  return el;
};

class Workbench implements ControlHost, EditorHost, StudyHost, TuneHost {
  file: StackFile;
  stack: Stack;
  sketch: StackSketch;
  /** The parser's warnings for the current stack. */
  private inputWarnings: string[];
  /** Why the pulse engine declined the current stack (shown once, not again among the warnings). */
  private pulseRefusal: string[] = [];
  readonly settings: Settings;
  readonly presets = PRESETS.map((p) => p.name);
  /** Where the current stack came from (shown by the preset menu, kept across a reload). */
  private origin: Origin;
  private readonly messages = new Messages($('messages'));
  private readonly engine: Engine;
  private readonly spectrum = new SpectrumView($('spectrum-view'));
  private readonly profile = new ProfileView($('profile-view'));
  private readonly trace = new TraceView($('trace-view'));
  private readonly agreement = new AgreementView($('agreement'));
  private readonly spacetime = new SpacetimeView($('spacetime-view'));
  private field!: FieldView;
  private controls!: Controls;
  private editor!: MaterialEditor;
  private studies!: StudyPanel;
  private tuning!: TunePanel;
  private readonly studyMap = new StudyMapView($('study-view'));
  /** The latest sweep and tolerance study (for the stack version they ran on), and the measured overlay. */
  private sweep: { version: number; result: SweepResult } | null = null;
  private tolerance: { version: number; result: ToleranceResult } | null = null;
  private mapQuantityName: QuantityName = 'IL_dB';
  private measured: MeasuredOverlay | null = null;
  private version = 0;
  private solved: Solved | null = null;
  private solvedVersion = -1;
  private readonly solveVersion = new Map<number, number>();
  private report: WireReport | null = null;
  private reportVersion = -1;
  private reportRequestVersion = -1;
  private geometry: PulseGeometry | null = null;
  /** The stack version the animated run was started for. */
  private pulseVersion = -1;
  private frame: FieldFrame | null = null;
  private pendingFrame: FieldFrame | null = null;
  private playing = false;
  /** The clip being made (its cancel flag), and the last one made, with the stack version it shows. */
  private clip: { cancel: boolean } | null = null;
  private lastClip: { version: number; name: string; clip: Clip } | null = null;
  /** A clip waits for the frame with this tag. */
  private frameWaiter: { tag: number; ok: (f: FieldFrame) => void; fail: (e: Error) => void } | null = null;
  private editStart: number | null = null;
  private restartTimer = 0;
  /** False once the user cancelled the full run for this stack. */
  private reportWanted = true;
  readonly stats: WorkbenchStats = {
    fieldRenders: 0, renderer: '', engine: '', lastEditToUpdate_ms: null, lastSolve_ms: null, version: 0,
    solvedVersion: -1, reportVersion: -1, step: 0, playing: false, recording: false,
    field: { window_mm: [0, 0], default_mm: [0, 0], stack_mm: 0, zoomed: false, grid: false }, lastClip: null,
  };

  constructor(initial: { file: StackFile; stack: Stack; warnings: string[]; origin: Origin }, settings: Settings) {
    this.origin = initial.origin;
    this.file = initial.file;
    this.stack = initial.stack;
    this.inputWarnings = initial.warnings;
    this.sketch = sketchStack(initial.stack);
    this.settings = settings;
    this.engine = new Engine({
      solved: (s) => this.onSolved(s),
      solveFailed: (m) => this.messages.show('solve', 'error', 'The exact/FEM solve failed', m),
      pulseReady: (g) => this.onPulseReady(g),
      frame: (f, _id, tag) => this.onFrame(f, tag),
      pulseFailed: (m) => this.onPulseFailed(m),
      progress: (fr, note) => this.onProgress(fr, note),
      report: (r) => this.onReport(r),
      reportFailed: (m) => this.onReportFailed(m),
    });
  }

  async start(): Promise<void> {
    this.field = await FieldView.create($('field-view'), this.fieldOptions());
    this.stats.renderer = this.field.rendererName;
    this.field.onFraming = () => this.noteFraming();
    this.field.setStack(this.sketch);
    this.field.render();
    this.spectrum.chart.onDraw = () => this.noteUpdated();
    this.profile.chart.onDraw = () => this.noteUpdated();
    this.controls = new Controls($('controls'), this);
    this.editor = new MaterialEditor($('controls'), this);
    this.studies = new StudyPanel($('controls'), this);
    this.tuning = new TunePanel($('controls'), this);
    this.drawStudyMap();
    this.wireButtons();
    this.wireKeys();
    this.showTitle();
    this.showWarnings();
    this.solveNow();
    this.restartPulse(0);
    requestAnimationFrame(() => this.loop());
    const charts = { 'spectrum-view': this.spectrum.chart, 'profile-view': this.profile.chart, 'trace-view': this.trace.chart, 'material-plot': this.editor.plot };
    window.slabecho = {
      stats: this.stats,
      probe: {
        chartPoint: (view, x, panel = 0) => charts[view].clientPoint(x, panel),
        chartRange: (view) => charts[view].visibleX(),
        fieldBoxes: () => this.field.layoutBoxes,
        fieldMarks: () => this.field.layoutMarks,
        fieldLabels: () => this.field.labelTexts,
        spacetime: () => this.spacetime.probe(),
        studyMap: () => this.studyMap.probe(),
        tolerance: () => (this.tolerance === null ? null
          : { samples: this.tolerance.result.samples, columns: this.tolerance.result.columns.map((c) => ({ name: c.name, data: Array.from(c.data) })) }),
        solvedSpectrum: () => (this.solvedVersion === this.version && this.solved !== null
          ? this.solved.spectrum.map((c) => ({ name: c.name, data: Array.from(c.data as Float64Array) })) : null),
      },
    };
  }

  private noteFraming(): void {
    const w = this.field.span(), d = this.field.defaultSpan();
    this.stats.field = {
      window_mm: [w.x0_m * 1e3, w.x1_m * 1e3], default_mm: [d.x0_m * 1e3, d.x1_m * 1e3],
      stack_mm: this.sketch.thickness_m * 1e3, zoomed: this.field.zoomed,
      grid: this.field.hasGrid && this.pulseVersion === this.version,
    };
  }

  // ---- stack state -------------------------------------------------------------------------

  get originLabel(): string { return originLabel(this.origin); }

  /** ControlHost: validate a change to the stack file; apply it when valid. */
  edit(change: (f: StackFile) => void): boolean {
    const t0 = performance.now();
    const draft = JSON.parse(JSON.stringify(this.file)) as StackFile;
    change(draft);
    const r = parseStackObject(draft);
    if (!r.ok) {
      this.messages.show('edit', 'error', 'That change was not applied:', r.errors);
      return false;
    }
    this.clearRefusals();
    this.apply(r.file, r.stack, r.warnings);
    this.editStart = t0;
    if (!this.origin.edited) this.setOrigin({ ...this.origin, edited: true });
    return true;
  }

  /** EditorHost: the layer menus list the stack's own materials. */
  materialsChanged(): void { this.controls.refresh(); }

  /** ControlHost: a view or run setting was refused. */
  refuse(field: string, need: string, text: string): void {
    this.messages.show('edit', 'error', 'That change was not applied:', [`${field}: must be ${need} (got ${describeValue(text)})`]);
  }

  /** Errors about earlier edits and imports no longer apply once the stack has changed. */
  private clearRefusals(): void {
    this.messages.clear('edit');
    this.messages.clear('import');
  }

  private setOrigin(o: Origin): void {
    this.origin = o;
    storeOrigin(o);
    this.controls?.showOrigin();
  }

  loadPreset(name: string): void {
    const r = parseStackObject(presetFile(name));
    if (!r.ok) { this.messages.show('edit', 'error', `Preset ${name} is invalid:`, r.errors); return; }
    this.clearRefusals();
    this.apply(r.file, r.stack, r.warnings);
    this.origin = { kind: 'preset', name, edited: false };
    storeOrigin(this.origin);
    this.field.resetFraming();
    this.controls.refresh();
    this.editor.refresh();
    this.studies.refresh();
    this.tuning.refresh();
  }

  importText(name: string, text: string): void {
    const r = parseStackText(text);
    if (!r.ok) {
      this.messages.show('import', 'error', `${name} was not loaded (the current stack is kept):`, r.errors);
      return;
    }
    this.clearRefusals();
    this.apply(r.file, r.stack, r.warnings);
    this.origin = { kind: 'import', name, edited: false };
    storeOrigin(this.origin);
    this.field.resetFraming();
    this.controls.refresh();
    this.editor.refresh();
    this.studies.refresh();
    this.tuning.refresh();
    this.messages.show('import', 'info', `Loaded ${name}.`, []);
  }

  private apply(file: StackFile, stack: Stack, warnings: string[]): void {
    // A clip in the making shows the old stack: it stops (its frames would never come).
    this.frameWaiter?.fail(new Error('the stack was changed while the clip was made'));
    this.frameWaiter = null;
    this.file = file;
    this.stack = stack;
    this.inputWarnings = warnings;
    this.sketch = sketchStack(stack);
    this.version++;
    this.stats.version = this.version;
    storeStack(file);
    this.showTitle();
    this.showWarnings();
    this.field.setStack(this.sketch);
    this.editor?.drawPlot();
    this.tuning?.recheck();
    if (this.sweep !== null) this.drawStudyMap();
    this.editStart = performance.now();
    this.solveNow();
    this.restartPulse(350);
  }

  /** The parser's, the latest solve's and (when current) the pulse run's warnings, each once. */
  private showWarnings(): void {
    const skipped = new Set(this.pulseRefusal.map((m) => `FDTD skipped: ${m}`));
    const all = [...this.inputWarnings, ...(this.solved?.warnings ?? []), ...(this.reportCurrent()?.warnings ?? [])];
    this.messages.warnings(all.filter((w) => !skipped.has(w)));
  }

  private showTitle(): void {
    $('stack-title').textContent = this.file.title;
    document.title = `${this.file.title} · slabecho`;
  }

  // ---- exact + FEM ---------------------------------------------------------------------------

  private solveNow(): void {
    const id = this.engine.solve(this.file);
    this.solveVersion.set(id, this.version);
  }

  private onSolved(s: Solved): void {
    const v = this.solveVersion.get(s.id) ?? -1;
    this.solveVersion.delete(s.id);
    if (v < this.solvedVersion) return;
    this.solved = s;
    this.solvedVersion = v;
    this.stats.solvedVersion = v;
    this.stats.lastSolve_ms = s.ms;
    this.messages.clear('solve');
    this.showWarnings();
    this.drawFrequencyViews();
  }

  private noteUpdated(): void {
    if (this.editStart !== null && this.solvedVersion === this.version) {
      this.stats.lastEditToUpdate_ms = performance.now() - this.editStart;
      this.editStart = null;
    }
  }

  private reportCurrent(): WireReport | null {
    return this.reportVersion === this.version ? this.report : null;
  }

  private drawFrequencyViews(): void {
    const rep = this.reportCurrent();
    const pending = this.engine.reporting ? 'FDTD: pulse run in progress'
      : rep === null ? 'FDTD: no finished pulse run for this stack'
        : rep.skipped !== undefined ? 'the pulse engine did not run for this stack (see the messages above)' : '';
    const s = this.solved;
    const look = { mode: this.settings.spectrumMode, freqScale: this.settings.freqScale, magnitude: this.settings.magnitude };
    this.spectrum.show([s?.spectrum ?? null, rep?.spectrum ?? null], look, pending, { measured: this.measured, tolerance: this.toleranceOverlay() });
    this.profile.show([s?.profile ?? null, rep?.profile ?? null], this.sketch, this.file.profile_GHz, pending,
      s === null ? 'solving…' : 'no profile', this.file.incidence);
    // The full run's rows include the exact/FEM row; until it is there, show the solve's own.
    const fromRun = (rep?.summary as { agreement?: AgreementRow[] } | undefined)?.agreement;
    this.agreement.show(fromRun ?? s?.agreement ?? [], pending);
  }

  private drawTraceView(): void {
    this.drawSpacetime();
    const rep = this.reportCurrent();
    const note = rep !== null ? (rep.skipped !== undefined ? `The pulse engine did not run for this stack: ${rep.skipped}`
      : rep.trace[0]?.data.length === 0 ? 'the pulse run recorded nothing for this stack' : '')
      : this.engine.reporting ? 'pulse run in progress…' : 'no finished pulse run for this stack';
    const zero = (rep?.summary as { echoes?: { delay_zero_ns?: number } } | undefined)?.echoes?.delay_zero_ns;
    this.trace.show({
      trace: rep?.trace ?? null, echoes: rep?.echoes ?? null, echoesT: rep?.echoesT ?? null, envelope: rep?.envelope ?? null,
      delayZero_ns: typeof zero === 'number' ? zero : null,
    }, this.settings.envelope, note);
  }

  private drawSpacetime(): void {
    const rep = this.reportCurrent();
    const note = rep !== null ? (rep.skipped !== undefined ? `The pulse engine did not run for this stack: ${rep.skipped}`
      : rep.spacetime === null ? 'the pulse run recorded nothing for this stack' : '')
      : this.engine.reporting ? 'pulse run in progress… (the map is recorded from it)' : 'no finished pulse run for this stack';
    const s = this.settings;
    this.spacetime.show({ map: rep?.spacetime ?? null, rays: rep?.rays ?? null, sketch: this.sketch, note },
      { field: s.spacetimeField, gain: s.spacetimeGain, rays: s.spacetimeRays });
  }

  // ---- design studies and tuning ------------------------------------------------------------

  studyProblems(title: string | null, lines: string[]): void {
    if (title === null) this.messages.clear('study'); else this.messages.show('study', 'error', title, lines);
  }

  tuneProblems(title: string | null, lines: string[]): void {
    if (title === null) this.messages.clear('tune'); else this.messages.show('tune', 'error', title, lines);
  }

  sweepDone(result: SweepResult): void {
    this.sweep = { version: this.version, result };
    if (result.warnings.length > 0) this.messages.show('study', 'warn', 'The sweep\'s cases gave warnings:', result.warnings);
    this.drawStudyMap();
  }

  toleranceDone(result: ToleranceResult): void {
    this.tolerance = { version: this.version, result };
    if (result.warnings.length > 0) this.messages.show('study', 'warn', 'The tolerance study\'s samples gave warnings:', result.warnings);
    this.drawFrequencyViews();
  }

  mapQuantity(q: QuantityName): void {
    this.mapQuantityName = q;
    this.drawStudyMap();
  }

  measuredChanged(m: MeasuredOverlay | null): void {
    this.measured = m;
    this.drawFrequencyViews();
  }

  applyTuned(file: StackFile): void {
    if (this.edit((f) => { Object.assign(f, structuredClone(file)); })) {
      this.controls.refresh();
      this.editor.refresh();
      this.messages.show('tune', 'info', 'The tuned stack is now the workbench\'s stack.', []);
    }
  }

  downloadStack(file: StackFile): void {
    downloadBlob(`${fileStem(file.title)}-tuned.stack.json`, new Blob([`${JSON.stringify(file, null, 2)}\n`], { type: 'application/json' }));
  }

  /** Studies hold for the stack they ran on: after an edit they are dropped from the views, saying so. */
  private drawStudyMap(): void {
    const sw = this.sweep;
    const current = sw !== null && sw.version === this.version;
    this.studyMap.show(current ? sw.result : null, this.mapQuantityName,
      sw !== null && !current ? 'the stack has changed since the sweep: run it again' : '');
  }

  private toleranceOverlay(): ToleranceOverlay | null {
    const t = this.tolerance;
    if (t === null || t.version !== this.version) return null;
    const col = (n: string): Float64Array => t.result.columns.find((c) => c.name === n)!.data;
    const pct = (q: string) => ({ p05: col(`${q}_p05`), p50: col(`${q}_p50`), p95: col(`${q}_p95`) });
    return { samples: t.result.samples, f_GHz: col('f_GHz'), R: pct('R_power'), T: pct('T_power'), tIsMagnitude: this.file.front === this.file.back };
  }

  // ---- pulse run -----------------------------------------------------------------------------

  /** Restart the animated run and the full run after `delay_ms` of quiet. */
  private restartPulse(delay_ms: number): void {
    clearTimeout(this.restartTimer);
    this.engine.cancelReport();
    this.reportWanted = true;
    this.setRunStatus('running', 0, 'waiting for edits to settle');
    this.drawTraceView();
    this.restartTimer = window.setTimeout(() => {
      const settings = { accuracy: this.settings.accuracy };
      this.geometry = null;
      this.frame = null;
      this.pulseRefusal = [];
      this.field.setGeometry(null);
      this.field.render();
      this.pulseVersion = this.version;
      this.engine.pulse(this.file, settings);
      if (this.reportWanted) this.startReport();
    }, delay_ms);
  }

  /** Cancel the full run (running, or about to start); the animation is not affected. */
  private cancelReport(): void {
    const wasRunning = this.engine.cancelReport();
    if (!wasRunning && !this.reportWanted) return;
    this.reportWanted = false;
    this.setRunStatus('cancelled', 0, 'cancelled');
    this.drawTraceView();
    this.drawFrequencyViews();
  }

  private startReport(): void {
    this.reportWanted = true;
    this.reportRequestVersion = this.version;
    this.engine.report(this.file, { accuracy: this.settings.accuracy });
    this.setRunStatus('running', 0, 'starting');
    this.drawTraceView();
    this.drawFrequencyViews();
  }

  private onPulseReady(g: PulseGeometry): void {
    this.geometry = g;
    this.stats.engine = g.engine;
    if (this.settings.autoSpeed) {
      this.settings.speed = autoStepsPerFrame(g.cells, g.courant);
      this.controls.showSpeed(this.settings.speed);
    }
    this.messages.clear('pulse');
    this.field.setGeometry(g);
    this.field.render();
  }

  private onFrame(f: FieldFrame, tag: number): void {
    const w = this.frameWaiter;
    if (w !== null) {
      if (tag === w.tag) { this.frameWaiter = null; w.ok(f); } else this.engine.recycle(f);
      return;
    }
    if (this.pendingFrame !== null) this.engine.recycle(this.pendingFrame);
    this.pendingFrame = f;
  }

  /** The frame that answers the request `send` makes (which returns its tag). */
  private frameFor(send: () => number): Promise<FieldFrame> {
    return new Promise((ok, fail) => {
      const tag = send();
      if (tag === 0) { fail(new Error('the pulse run is not ready')); return; }
      this.frameWaiter = { tag, ok, fail };
    });
  }

  private onPulseFailed(m: string[]): void {
    this.frameWaiter?.fail(new Error(m.join('; ')));
    this.frameWaiter = null;
    this.pulseRefusal = m;
    this.messages.show('pulse', 'warn', 'No pulse animation for this stack:', m);
    this.setPlaying(false);
    this.field.setGeometry(null, 'no pulse animation for this stack (see the messages)');
    this.field.render();
    this.showWarnings();
  }

  private onProgress(fraction: number, note: string): void {
    this.setRunStatus('running', fraction, note);
  }

  private onReport(r: WireReport): void {
    this.reportWanted = false;
    this.report = r;
    this.reportVersion = this.reportRequestVersion;
    this.stats.reportVersion = this.reportVersion;
    if (r.skipped !== undefined) this.setRunStatus('declined', 1, 'FDTD not run: the pulse engine declined this stack');
    else this.setRunStatus('done', 1, `finished in ${(r.ms / 1000).toFixed(1)} s`);
    this.showWarnings();
    this.drawTraceView();
    this.drawFrequencyViews();
  }

  private onReportFailed(m: string[]): void {
    this.setRunStatus('failed', 0, 'failed');
    this.messages.show('report', 'error', 'The pulse run failed:', m);
    this.drawTraceView();
    this.drawFrequencyViews();
  }

  private setRunStatus(state: 'idle' | 'running' | 'done' | 'declined' | 'cancelled' | 'failed', fraction: number, note: string): void {
    const box = $('run-status');
    box.dataset.state = state;
    ($('run-progress') as HTMLProgressElement).value = Math.max(0, Math.min(1, fraction));
    const n = box.querySelector('.run-note');
    if (n !== null) n.textContent = note;
  }

  // ---- animation -----------------------------------------------------------------------------

  private loop(): void {
    const f = this.pendingFrame;
    if (f !== null) {
      this.pendingFrame = null;
      if (this.frame !== null) this.engine.recycle(this.frame);
      this.frame = f;
      this.field.setFrame(f);
      this.field.render();
      this.stats.fieldRenders++;
      this.stats.step = f.step;
      this.spacetime.setNow(this.pulseVersion === this.reportVersion ? f.time_s * 1e9 : null);
      if (f.done && this.playing) this.setPlaying(false);
    }
    if (this.clip !== null) {
      // A clip steps the run itself.
    } else if (this.geometry !== null && this.frame === null && this.pendingFrame === null) {
      this.engine.advance(0); // the first frame (t = 0) of a new run
    } else if (this.playing && this.geometry !== null && !(this.frame?.done ?? false)) {
      this.engine.advance(this.settings.speed);
    }
    requestAnimationFrame(() => this.loop());
  }

  /** Draw a frame the clip asked for (the previous one's buffers go back to the worker). */
  private showFrame(f: FieldFrame): void {
    if (this.frame !== null && this.frame !== f) this.engine.recycle(this.frame);
    this.frame = f;
    this.field.setFrame(f);
    this.field.render();
    this.stats.fieldRenders++;
    this.stats.step = f.step;
  }

  private setPlaying(on: boolean): void {
    this.playing = on;
    this.stats.playing = on;
    const b = $('play');
    b.textContent = on ? 'pause' : 'play';
    b.setAttribute('aria-pressed', String(on));
  }

  private togglePlay(): void {
    if (!this.playing && this.frame?.done === true) this.engine.rewind();
    this.setPlaying(!this.playing);
  }

  private stepOnce(): void {
    this.setPlaying(false);
    if (this.frame?.done === true) return;
    this.engine.advance(this.settings.speed);
  }

  private reset(): void {
    this.setPlaying(false);
    this.engine.rewind();
  }

  private async toggleRecord(): Promise<void> {
    if (this.clip !== null) { this.clip.cancel = true; return; }
    if (this.geometry === null) {
      this.messages.show('record', 'error', 'There is no pulse run to record for this stack (see the messages above).', []);
      return;
    }
    const session = { cancel: false };
    this.clip = session;
    this.setPlaying(false);
    this.setRecording(true);
    const version = this.version;
    const span = this.field.span();
    try {
      const clip = await makeClip({
        format: this.settings.clipFormat, length_s: this.settings.clipLength_s, fps: CLIP_FPS,
        title: this.file.title, window_m: [span.x0_m, span.x1_m], fieldCanvas: this.field.canvas,
      }, {
        timing: (w) => this.engine.clipTiming(w),
        seek: (step) => this.frameFor(() => this.engine.seek(step)),
        advance: (n) => this.frameFor(() => this.engine.advance(n)),
        show: (f) => this.showFrame(f),
        progress: (note) => this.messages.show('record', 'info', `Recording a clip: ${note}`, []),
        cancelled: () => session.cancel || this.version !== version,
      });
      if (clip === null) { this.messages.show('record', 'info', 'The clip was cancelled.', []); return; }
      const name = `${fileStem(this.file.title)}.${clip.extension}`;
      this.lastClip = { version, name, clip };
      this.stats.lastClip = {
        name, description: clip.description, frames: clip.frames, fps: clip.fps, duration_s: clip.duration_s, bytes: clip.blob.size,
        start_ns: clip.start_ns, end_ns: clip.end_ns, arrival_ns: clip.arrival_ns, stepsPerFrame: clip.stepsPerFrame,
      };
      downloadBlob(name, clip.blob);
      this.messages.show('record', 'info', `Clip saved as ${name}: ${clip.duration_s.toFixed(1)} s, ${clip.frames} frames of ${clip.stepsPerFrame} steps, `
        + `t = ${clip.start_ns.toFixed(3)} to ${clip.end_ns.toFixed(3)} ns${clip.ends === 'run-end' ? ' (the run ended before the view was quiet)' : ''}, `
        + `${clip.description}, ${(clip.blob.size / 1024).toFixed(0)} KiB.`, []);
    } catch (e) {
      this.messages.show('record', 'error', 'The clip could not be made:', [e instanceof Error ? e.message : String(e)]);
    } finally {
      this.clip = null;
      this.frameWaiter = null;
      this.setRecording(false);
    }
  }

  private setRecording(on: boolean): void {
    this.stats.recording = on;
    const b = $('record');
    b.textContent = on ? 'stop recording' : 'record';
    b.classList.toggle('recording', on);
  }

  // ---- controls ------------------------------------------------------------------------------

  settingsChanged(topic: SettingsTopic): void {
    storeSettings(this.settings);
    if (topic === 'traces' || topic === 'axis') { this.field.setOptions(this.fieldOptions()); return; }
    if (topic === 'spectrum') { this.drawFrequencyViews(); return; }
    if (topic === 'trace') { this.drawTraceView(); return; }
    if (topic === 'spacetime') { this.drawSpacetime(); return; }
    if (topic === 'accuracy') { this.restartPulse(0); return; }
    if (topic === 'speed' && this.settings.autoSpeed && this.geometry !== null) {
      this.settings.speed = autoStepsPerFrame(this.geometry.cells, this.geometry.courant);
      this.controls.showSpeed(this.settings.speed);
      storeSettings(this.settings);
    }
  }

  private fieldOptions(): FieldViewOptions {
    return { xUnit: this.settings.xUnit, lambdaAt_Hz: this.settings.lambda_GHz * 1e9, traces: { ...this.settings.traces } };
  }

  private wireButtons(): void {
    $('play').addEventListener('click', () => this.togglePlay());
    $('step').addEventListener('click', () => this.stepOnce());
    $('reset').addEventListener('click', () => this.reset());
    $('record').addEventListener('click', () => { void this.toggleRecord(); });
    $('export').addEventListener('click', () => { void this.exportNow(); });
    const input = $<HTMLInputElement>('import');
    input.addEventListener('change', () => {
      const f = input.files?.[0];
      input.value = '';
      if (f === undefined) return;
      if (f.size > 1_000_000) {
        this.messages.show('import', 'error', `${f.name} was not loaded (the current stack is kept):`,
          [`file: ${f.size} bytes is over the 1 MB limit for a stack file`]);
        return;
      }
      void f.text().then((t) => this.importText(f.name, t));
    });
    $('zoom-in').addEventListener('click', () => this.field.zoomIn());
    $('zoom-out').addEventListener('click', () => this.field.zoomOut());
    $('zoom-reset').addEventListener('click', () => this.field.resetFraming());
    $('run-cancel').addEventListener('click', () => this.cancelReport());
    $('run-start').addEventListener('click', () => this.startReport());
    const about = $<HTMLDialogElement>('about');
    $('about-open').addEventListener('click', () => about.showModal());
    $('about-close').addEventListener('click', () => about.close());
  }

  private wireKeys(): void {
    const typing = (e: KeyboardEvent): boolean => {
      const t = e.target as HTMLElement | null;
      return t !== null && t.closest('input, select, textarea, dialog, [contenteditable="true"]') !== null;
    };
    const isSpace = (e: KeyboardEvent): boolean => e.key === ' ' || e.code === 'Space';
    window.addEventListener('keydown', (e) => {
      if (typing(e) || e.altKey || e.ctrlKey || e.metaKey) return;
      if (isSpace(e)) { e.preventDefault(); if (!e.repeat) this.togglePlay(); }
      else if (e.key === 'ArrowRight') { e.preventDefault(); this.stepOnce(); }
    });
    // Space on a focused button would also click it on key-up: space always means play/pause here.
    window.addEventListener('keyup', (e) => { if (isSpace(e) && !typing(e)) e.preventDefault(); });
  }

  /** Files of the views beyond the CLI's tables, with a README line each. */
  private exportTexts(): Array<{ name: string; text: string; about: string }> {
    const out: Array<{ name: string; text: string; about: string }> = [];
    const t = this.tolerance;
    if (t !== null && t.version === this.version) {
      out.push({ name: 'tolerance.csv', text: formatCsv(t.result.columns),
        about: `tolerance.csv: the tolerance study's percentiles (${t.result.samples} samples, seed ${t.result.seed}, varying ${t.result.varies.join('; ')}), as \`slabecho tolerance\` writes them` });
    }
    const map = this.reportCurrent()?.spacetime ?? null;
    if (map !== null) {
      const g = csvGrid(map), field = this.settings.spacetimeField;
      out.push({
        name: 'spacetime.csv', text: spacetimeCsv(map, field),
        about: `spacetime.csv: the ${field} field E/E0 of the space–time map, t_ns,x_mm,E, on ${g.times} times ${+g.dt_ns.toPrecision(4)} ns apart`
          + ` × ${g.positions} positions ${+g.dx_mm.toPrecision(4)} mm apart (every ${g.every_row * map.stepsPerRow} steps of the run, every ${ordinal(g.every_column)} grid node of the view)`,
      });
    }
    return out;
  }

  private async exportNow(): Promise<void> {
    this.field.render();
    const clip = this.lastClip !== null && this.lastClip.version === this.version ? { name: this.lastClip.name, blob: this.lastClip.clip.blob } : null;
    try {
      const z = await exportZip({
        title: this.file.title,
        file: this.file,
        solved: this.solved,
        report: this.reportCurrent(),
        canvases: [
          ['field-view', this.field.canvas],
          ['trace-view', this.trace.chart.canvas],
          ['spectrum-view', this.spectrum.chart.canvas],
          ['profile-view', this.profile.chart.canvas],
          ['spacetime-view', this.spacetime.canvas],
          ...(this.sweep?.version === this.version ? [['study-view', this.studyMap.canvas] as [string, HTMLCanvasElement]] : []),
        ],
        texts: this.exportTexts(),
        clip,
        date: new Date(),
      });
      downloadBlob(z.name, z.blob);
      this.messages.show('export', z.notes.length > 0 ? 'warn' : 'info', z.notes.length > 0 ? `Exported ${z.name}, with gaps:` : `Exported ${z.name}: the tables, the stack file, the view snapshots${clip !== null ? ' and the clip' : ''}.`, z.notes);
    } catch (e) {
      this.messages.show('export', 'error', 'The export failed:', [e instanceof Error ? e.message : String(e)]);
    }
  }
}

function initialStack(): { file: StackFile; stack: Stack; warnings: string[]; origin: Origin; note: string | null } {
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

adoptGuiStyles();
const init = initialStack();
const bench = new Workbench(init, readSettings(loadStoredSettings()));
bench.start().then(() => {
  if (init.note !== null) document.querySelector('[data-testid="messages"]')?.append(init.note);
}).catch((e: unknown) => {
  const box = document.querySelector('[data-testid="messages"]');
  if (box !== null) box.textContent = `The workbench could not start: ${e instanceof Error ? e.message : String(e)}`;
  throw e;
});
