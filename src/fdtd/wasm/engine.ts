// The WebAssembly engine: one instance and one memory per run (arena.ts), stepped a batch at a time by the
// module's `step`; the run reads its fields, DFT and probe table through views. Nothing is allocated per step.

import { BATCH_STEPS, type EngineInput, type StepEngine } from '../engine.ts';
import { ARENA_BASE, layoutArena } from './arena.ts';
import { R_INC_IM, R_INC_RE } from './slots.ts';

interface StepExports {
  heapBase(): number;
  step(run: number, n: number, k: number): void;
  energy(run: number): number;
}

export class WasmEngine implements StepEngine {
  readonly kind = 'wasm-simd' as const;
  readonly mainE: Float64Array;
  readonly auxE: Float64Array;
  readonly dftRe: Float64Array;
  readonly dftIm: Float64Array;
  readonly phasors: Float64Array;
  readonly probes: Float64Array;
  readonly mainH: Float64Array;
  readonly spectra: StepEngine['spectra'];
  private readonly x: StepExports;
  private readonly run: number;
  private readonly f64: Float64Array;

  /** Throws when the memory cannot be had (the caller falls back to the TypeScript engine). */
  constructor(module: WebAssembly.Module, input: EngineInput) {
    const layout = layoutArena(input);
    const memory = new WebAssembly.Memory({ initial: layout.pages, maximum: layout.pages });
    this.x = new WebAssembly.Instance(module, { env: { memory } }).exports as unknown as StepExports;
    if (this.x.heapBase() > ARENA_BASE) throw new Error(`the WebAssembly step's static data ends at ${this.x.heapBase()}, past the arena's start`);
    layout.write(memory);
    const buf = memory.buffer, { grids, setup } = input;
    const view = (at: number, length: number) => new Float64Array(buf, at, length);
    this.mainE = view(layout.mainE, grids.main.n);
    this.mainH = view(layout.mainH, grids.main.n - 1);
    this.auxE = view(layout.auxE, grids.aux.n);
    this.dftRe = view(layout.dftRe, setup.dftLength);
    this.dftIm = view(layout.dftIm, setup.dftLength);
    this.phasors = view(layout.phasors, 2 * BATCH_STEPS);
    this.probes = view(layout.probes, 4 * BATCH_STEPS);
    const nf = setup.spectraFrequencies, sp = layout.spectra;
    this.spectra = { acc: view(sp.acc, 6 * nf), phasor: view(sp.phasor, 2 * nf), rotation: view(sp.rotation, 2 * nf), seeds: view(sp.seeds, 2 * nf) };
    this.run = layout.run;
    this.f64 = new Float64Array(buf);
  }

  advance(n: number, k: number): void { this.x.step(this.run, n, k); }

  incidentDft(): [number, number] {
    return [this.f64[(this.run + 4 * R_INC_RE) / 8], this.f64[(this.run + 4 * R_INC_IM) / 8]];
  }

  energy(): number { return this.x.energy(this.run); }
}
