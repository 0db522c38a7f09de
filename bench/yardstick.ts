// The production step beside a C yardstick of the same update (bench/yardstick/step.c, gcc -O3 -march=native),
// measured in the same run, alternately, on the same grid: `slabecho bench` (the compiled CLI, as a user runs
// it) and the C loop reading the very coefficients the TypeScript side builds. A benchmark, not a test.
//   nice npx tsx bench/yardstick.ts [--cells 4000,200000] [--steps T] [--poles 0/0,4/2] [--runs R] [--json]
// Without a C compiler (cc, or $CC) it prints the bench figures alone. The C's final fields are compared with
// the TypeScript kernel's after the same steps (the C may contract a·b + c into one rounding, so they agree to
// rounding, not to the bit).
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdirSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseArgs } from 'node:util';
import { BENCH_BAND_Hz, benchMedium, uniformBenchPlan } from '../src/fdtd/bench.ts';
import { buildGrids } from '../src/fdtd/build.ts';
import { SpectraWatch, SETTLED_FRACTION } from '../src/fdtd/convergence.ts';
import type { KernelState } from '../src/fdtd/kernel.ts';
import { createRunOfPlan, profileStride, sourceSamples } from '../src/fdtd/run.ts';
import type { GridPlan } from '../src/fdtd/types.ts';

const { values } = parseArgs({ options: {
  cells: { type: 'string' }, steps: { type: 'string' }, poles: { type: 'string' }, runs: { type: 'string' }, json: { type: 'boolean' },
} });
const cellsList = (values.cells ?? '4000,200000').split(',').map(Number);
const stepsFor = (cells: number) => Number(values.steps ?? Math.max(500, Math.round(1.6e8 / cells)));
const poleList = (values.poles ?? '0/0,4/2').split(',').map((p) => p.split('/').map(Number) as [number, number]);
const runs = Number(values.runs ?? 5);
const root = join(import.meta.dirname, '..');
const work = join(root, 'build', 'yardstick');
mkdirSync(work, { recursive: true });

/** The same warm-up as `slabecho bench` (src/cli/commands/bench.ts). */
const warmUp = (steps: number) => Math.min(500, Math.max(50, Math.ceil(steps / 20)));

function compileC(): string | null {
  const cc = process.env.CC ?? 'cc', src = join(root, 'bench', 'yardstick', 'step.c'), exe = join(work, 'step');
  try {
    if (statSync(exe).mtimeMs > statSync(src).mtimeMs) return exe;
  } catch { /* not built yet */ }
  const r = spawnSync(cc, ['-O3', '-march=native', '-o', exe, src, '-lm'], { encoding: 'utf8' });
  if (r.status !== 0) { console.error(`no C yardstick: ${cc} failed (${r.error?.message ?? r.stderr.trim()})`); return null; }
  return exe;
}

/** Doubles of a grid in the order step.c reads them. */
function gridNumbers(s: KernelState, out: number[]): void {
  const arr = (a: ArrayLike<number>) => { out.push(a.length); for (let i = 0; i < a.length; i++) out.push(a[i]); };
  arr(s.e); arr(s.h); arr(s.ca); arr(s.cb); arr(s.db);
  out.push(s.pml.length);
  for (const p of s.pml) { out.push(p.eLo, p.eHi); arr(p.be); arr(p.ce); arr(p.psiE); out.push(p.hLo, p.hHi); arr(p.bh); arr(p.ch); arr(p.psiH); }
  const d = s.disp;
  out.push(d === null ? 0 : 1);
  if (d === null) return;
  out.push(d.lo, d.hi); arr(d.cp); arr(d.eOld); arr(d.acc); out.push(d.groups.length);
  for (const g of d.groups) {
    out.push(g.lo, g.hi); arr(g.fill);
    out.push(g.nd); arr(g.da); arr(g.db); arr(g.dEps); arr(g.dState);
    out.push(g.no); arr(g.oa); arr(g.ox); arr(g.oz); arr(g.oc); arr(g.ow0sq); arr(g.oState);
  }
}

/** The run of `plan` as step.c reads it. */
function dump(plan: GridPlan, file: string): void {
  const g = buildGrids(plan, BENCH_BAND_Hz), nodes = plan.nodes, out: number[] = [];
  gridNumbers(g.main, out);
  gridNumbers(g.aux, out);
  out.push(nodes.tfsf, nodes.auxOffset, nodes.front, plan.effective.back === 'pec' ? -1 : nodes.back, nodes.sfProbe);
  const arr = (a: ArrayLike<number>) => { out.push(a.length); for (let i = 0; i < a.length; i++) out.push(a[i]); };
  arr(sourceSamples(plan.pulse, plan.dt_s));
  const dftHi = plan.effective.back === 'pec' ? nodes.back + 1 : nodes.pmlBackStart;
  out.push(nodes.tfsf, dftHi - nodes.tfsf, profileStride(plan.pulse, plan.profile_Hz, plan.dt_s));
  out.push(plan.dt_s, 2 * Math.PI * plan.profile_Hz * plan.dt_s);
  arr(g.weights.epsInf);
  const w = Array.from({ length: 24 }, (_, i) => 2 * Math.PI * (BENCH_BAND_Hz[0] + ((BENCH_BAND_Hz[1] - BENCH_BAND_Hz[0]) * i) / 23));
  arr(w);
  const every = new SpectraWatch(BENCH_BAND_Hz, plan.dt_s, SETTLED_FRACTION * plan.accuracyTarget).every;
  out.push(32 * Math.max(1, Math.round(every / 32)));
  writeFileSync(file, new Uint8Array(Float64Array.from(out).buffer));
}

interface Figure { mcells: number; engine?: string }
const median = (xs: number[]) => { const s = [...xs].sort((a, b) => a - b); return s[Math.floor(s.length / 2)]; };

function benchOnce(cells: number, steps: number, d: number, l: number, engine?: string): Figure {
  const args = [join(root, 'bin', 'slabecho.mjs'), 'bench', '--cells', String(cells), '--steps', String(steps), '--debye-poles', String(d), '--lorentz-poles', String(l), '--json'];
  if (engine) args.push('--engine', engine);
  const o = JSON.parse(execFileSync(process.execPath, args, { encoding: 'utf8' }));
  return { mcells: o.mcells_per_s, engine: o.engine };
}

function cOnce(exe: string, file: string, cells: number, steps: number, layout: 'node-major' | 'pole-major'): { mcells: number; checksum: number } {
  const o = JSON.parse(execFileSync(exe, [file, String(warmUp(steps)), String(steps), layout], { encoding: 'utf8' }));
  return { mcells: (cells * steps) / o.seconds / 1e6, checksum: o.checksum };
}

/** Σ|E| of the main grid after warm-up + steps with the TypeScript kernel (the C's answer to compare). */
function referenceChecksum(plan: GridPlan, steps: number): number {
  const run = createRunOfPlan(BENCH_BAND_Hz, plan, { engine: 'js', endless: true });
  run.step(warmUp(steps) + steps);
  return run.totalField().reduce((s, v) => s + Math.abs(v), 0);
}

const exe = compileC();
const rows: Array<Record<string, number | string | null>> = [];
for (const cells of cellsList) {
  for (const [d, l] of poleList) {
    const steps = Math.round(stepsFor(cells) / (1 + (d + 2 * l) / 4));
    const plan = uniformBenchPlan(cells, benchMedium(d, l), warmUp(steps) + steps);
    const file = join(work, `grid-${cells}-${d}-${l}.bin`);
    if (exe) dump(plan, file);
    const wasm: number[] = [], cNode: number[] = [], cPole: number[] = [];
    let engine = '', checksum = NaN;
    for (let r = 0; r < runs; r++) {
      const b = benchOnce(cells, steps, d, l);
      wasm.push(b.mcells); engine = b.engine ?? '';
      if (exe) {
        const x = cOnce(exe, file, cells, steps, 'node-major');
        cNode.push(x.mcells); checksum = x.checksum;
        if (d + l > 0) cPole.push(cOnce(exe, file, cells, steps, 'pole-major').mcells);
      }
    }
    // The yardstick is the faster C layout.
    const c = cPole.length > 0 && median(cPole) > median(cNode) ? cPole : cNode;
    const js = benchOnce(cells, steps, d, l, 'js').mcells;
    const ref = exe ? referenceChecksum(plan, steps) : NaN;
    rows.push({
      cells, steps, debye_poles: d, lorentz_poles: l, engine,
      bench_mcells_per_s: median(wasm), js_mcells_per_s: js,
      c_mcells_per_s: exe ? Number(median(c).toFixed(1)) : null,
      c_node_major: exe ? Number(median(cNode).toFixed(1)) : null,
      c_pole_major: cPole.length > 0 ? Number(median(cPole).toFixed(1)) : null,
      best_bench: Math.max(...wasm), best_c: exe ? Number(Math.max(...c).toFixed(1)) : null,
      ratio: exe ? Number((median(wasm) / median(c)).toFixed(3)) : null,
      c_vs_ts_checksum: exe ? Number((Math.abs(checksum - ref) / ref).toExponential(1)) : null,
    });
  }
}
if (values.json) console.log(JSON.stringify(rows));
else {
  console.log(`median of ${runs}, alternating; Mcell/s = E nodes of both grids × steps / s`);
  console.log('C: the faster of node-major and pole-major pole state; best: the fastest repetition');
  console.log('cells      steps   poles  bench (engine)       C -O3 -march=native (node/pole)   ratio   best bench/C   js kernel   C vs TS fields');
  for (const r of rows) {
    const cs = `${r.c_mcells_per_s ?? '–'} (${r.c_node_major ?? '–'}/${r.c_pole_major ?? '–'})`;
    console.log(`${String(r.cells).padEnd(10)} ${String(r.steps).padEnd(7)} ${`${r.debye_poles}D+${r.lorentz_poles}L`.padEnd(6)} ` +
      `${`${r.bench_mcells_per_s} (${r.engine})`.padEnd(20)} ${cs.padEnd(33)} ${String(r.ratio ?? '–').padEnd(7)} ` +
      `${`${r.best_bench}/${r.best_c ?? '–'}`.padEnd(14)} ${String(r.js_mcells_per_s).padEnd(11)} ${r.c_vs_ts_checksum ?? '–'}`);
  }
}
