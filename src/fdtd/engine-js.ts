// The TypeScript engine: the reference kernel (kernel.ts) stepped in the order engine.ts describes. The
// WebAssembly engine is tested against it, and it runs wherever WebAssembly SIMD is missing.

import { batchTable, type EngineInput, type StepEngine } from './engine.ts';
import type { EnergyWeights } from './build.ts';
import { type DispersiveSpan, type KernelState, updateE, updateH } from './kernel.ts';

/**
 * Energy held by the poles of one field (normalized like the field energy): P̃²/Δε for a Debye pole,
 * (P̃'² + ω0²P̃²)/c for a Lorentz or Drude one (their stored energies, dropping ε0/2 as the field energy does).
 * The terms of a partial fraction (inverse.ts) may have negative strengths or an s-term; for them the same forms
 * with the kernel's positive scales (|Δ|, |c| + ω0|d|) measure a state that falls to zero with it. `e` is the
 * field of the same step, which completes the state (kernel.ts). Summed as the WebAssembly engine does, in two
 * running sums (nodes of even and odd place in each group, its two lanes) added at the end, so the two engines
 * agree to the bit.
 */
export function poleEnergy(d: DispersiveSpan | null, e: Float64Array, dt: number): number {
  if (d === null) return 0;
  const W = [0, 0];
  for (const g of d.groups) {
    for (let k = 0; k < g.hi - g.lo; k++) {
      const f = g.fill[k], E = e[g.lo + k], fE = f * E, lane = k & 1;
      if (!(f > 0)) continue;
      for (let q = 0; q < g.nd; q++) {
        const P = g.dState[k * g.nd + q] + g.db[q] * fE;
        W[lane] += (P * P) / (f * g.dEps[q]);
      }
      for (let q = 0; q < g.no; q++) {
        const j = 2 * (k * g.no + q);
        const P = g.oState[j] + g.oz[q] * fE, Pold = g.oState[j + 1];
        const rate = (P - Pold) / dt, mean = (P + Pold) / 2;
        W[lane] += (rate * rate + g.ow0sq[q] * mean * mean) / (f * g.oc[q]);
      }
    }
  }
  return W[0] + W[1];
}

/**
 * Σ ε∞·E² over the E nodes plus Σ μ∞·h² over the H nodes, in two running sums (even and odd nodes) added at the
 * end (the WebAssembly engine's two lanes).
 */
export function fieldEnergy(e: Float64Array, h: Float64Array, w: EnergyWeights): number {
  const we = w.epsInf, wh = w.muInf;
  let even = 0, odd = 0, i = 0;
  for (; i + 1 < e.length; i += 2) { even += we[i] * e[i] * e[i]; odd += we[i + 1] * e[i + 1] * e[i + 1]; }
  if (i < e.length) even += we[i] * e[i] * e[i];
  for (i = 0; i + 1 < h.length; i += 2) { even += wh[i] * h[i] * h[i]; odd += wh[i + 1] * h[i + 1] * h[i + 1]; }
  if (i < h.length) even += wh[i] * h[i] * h[i];
  return even + odd;
}

export class JsEngine implements StepEngine {
  readonly kind = 'js' as const;
  readonly mainE: Float64Array;
  readonly auxE: Float64Array;
  readonly mainH: Float64Array;
  readonly dftRe: Float64Array;
  readonly dftIm: Float64Array;
  readonly phasors = batchTable(2);
  readonly probes = batchTable(4);
  readonly spectra = null;
  private readonly main: KernelState;
  private readonly aux: KernelState;
  private readonly weights: EnergyWeights;
  private incRe = 0;
  private incIm = 0;

  constructor(private readonly input: EngineInput) {
    const { grids, setup } = input;
    this.main = grids.main;
    this.aux = grids.aux;
    this.weights = grids.weights;
    this.mainE = grids.main.e;
    this.auxE = grids.aux.e;
    this.mainH = grids.main.h;
    this.dftRe = new Float64Array(setup.dftLength);
    this.dftIm = new Float64Array(setup.dftLength);
    this.main.injH = setup.tfsf - 1;
    this.main.injE = setup.tfsf;
  }

  advance(n: number, k: number): void {
    const main = this.main, aux = this.aux, s = this.input.setup;
    const a = s.tfsf, off = s.auxOffset, src = s.source;
    for (let j = 0; j < k; j++) {
      main.injHValue = -aux.e[a - off];
      updateH(aux);
      updateH(main);
      main.injEValue = -aux.h[a - 1 - off];
      updateE(main);
      updateE(aux);
      const t = n + j + 1;
      aux.e[0] = t < src.length ? src[t] : 0;
      this.sample(t, j);
    }
  }

  private sample(t: number, j: number): void {
    const s = this.input.setup, e = this.main.e, p = this.probes;
    const inc = this.aux.e[s.front - s.auxOffset], tot = e[s.front];
    p[4 * j] = inc;
    p[4 * j + 1] = tot - inc;
    p[4 * j + 2] = s.back < 0 ? 0 : e[s.back];
    p[4 * j + 3] = e[s.sfProbe];
    if (t % s.stride !== 0) return;
    const c = this.phasors[2 * j], sn = this.phasors[2 * j + 1];
    const re = this.dftRe, im = this.dftIm, lo = s.dftLo, len = re.length;
    for (let i = 0; i < len; i++) { const v = e[lo + i]; re[i] += v * c; im[i] -= v * sn; }
    this.incRe += inc * c;
    this.incIm -= inc * sn;
  }

  incidentDft(): [number, number] { return [this.incRe, this.incIm]; }

  energy(): number {
    const { e, h } = this.main, dt = this.input.setup.dt_s;
    return fieldEnergy(e, h, this.weights) + poleEnergy(this.main.disp, e, dt) + poleEnergy(this.main.mdisp, h, dt);
  }
}
