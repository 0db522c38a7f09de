// Echo analysis, measured (not asserted): its time beside the pulse run's on every preset and on a few
// stacks beyond them, and how far its rows sit from the exact band envelope's peaks.
// Run: npx tsx bench/echoes.ts [--times N] [--json]
//
// Times are CPU times (the machine is shared, so wall-clock times wander). Each stack runs in fresh
// processes, as `slabecho run` would: one for the whole run pipeline (runReport), one for the pulse run
// then the echo analysis, whose first call runs on code the JIT has not optimized yet ("first", the
// figure a run pays) and later calls on warm code ("warm", median of five); each figure is the median
// over N such processes (default 3). Accuracy: every exact envelope peak above the floor with no other within one pulse
// width, against the row nearest it (time in %, level in dB); the exact envelope is the exact
// solution's R(f) (or T(f)) times the band pulse's spectrum (test/echoes/support.ts), of the stack as
// written and of the media the run stepped (fitted power laws), which separates the fits' share.

import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { bandPulse } from '../src/echoes/band-pulse.ts';
import { analyseEchoes, type EchoTable } from '../src/echoes/table.ts';
import { createPulseRun, runToEndSync } from '../src/fdtd/run.ts';
import { runReport } from '../src/report/run.ts';
import { spectrumFromRecords } from '../src/spectra/spectrum.ts';
import { parseStackObject } from '../src/stack/parse.ts';
import type { Stack } from '../src/stack/types.ts';
import { solveEffective } from '../src/fdtd/stepped-exact.ts';
import { exactEnvelope, exactPeaks, type Solver } from '../test/echoes/support.ts';

const sheet = (name: string, ohm: number) => [name, { model: 'sheet', ohm_per_sq: ohm }] as const;
/** Stacks beyond the presets (invented scenarios). */
const EXTRA: Record<string, unknown> = {
  'concrete on a conductor': { band_GHz: [1, 6], layers: [{ material: 'concrete', thickness_mm: 150 }], back: 'pec' },
  '20 mm skin': { band_GHz: [1, 6], layers: [{ material: 'skin', thickness_mm: 20 }], materials: { skin: { model: 'fixed', eps_r: 3 } } },
  'double-skin partition': { band_GHz: [1, 6], layers: [{ material: 'chipboard', thickness_mm: 18 }, { material: 'air', thickness_mm: 45 }, { material: 'chipboard', thickness_mm: 18 }] },
  'coated double pane': {
    band_GHz: [2, 18], layers: [{ material: 'glass', thickness_mm: 6 }, { material: 'coat' }, { material: 'air', thickness_mm: 16 }, { material: 'glass', thickness_mm: 6 }],
    materials: Object.fromEntries([sheet('coat', 15)]),
  },
  'water film between panes': { band_GHz: [1, 6], layers: [{ material: 'glass', thickness_mm: 4 }, { material: 'water-25c', thickness_mm: 0.5 }, { material: 'glass', thickness_mm: 4 }] },
  'two-sheet absorber': {
    band_GHz: [4, 16], back: 'pec',
    layers: [{ material: 'outer' }, { material: 'foam', thickness_mm: 7 }, { material: 'inner' }, { material: 'foam', thickness_mm: 7 }],
    materials: { ...Object.fromEntries([sheet('outer', 900), sheet('inner', 300)]), foam: { model: 'fixed', eps_r: 1.1 } },
  },
  'brick on soil': { band_GHz: [1, 4], layers: [{ material: 'brick', thickness_mm: 120 }], back: 'medium-dry-ground' },
};

function stacks(): [string, Stack][] {
  const files = readdirSync('presets').filter((f) => f.endsWith('.stack.json')).sort();
  const raw: [string, unknown][] = [...files.map((f) => [f.replace('.stack.json', ''), JSON.parse(readFileSync(`presets/${f}`, 'utf8'))] as [string, unknown]), ...Object.entries(EXTRA)];
  return raw.map(([name, obj]) => {
    const r = parseStackObject(obj);
    if (!r.ok) throw new Error(`${name}: ${r.errors.join('; ')}`);
    return [name, r.stack];
  });
}

/** Worst time (relative) and level (dB) error of the rows against the isolated exact envelope peaks. */
function accuracy(stack: Stack, table: EchoTable, which: 'R' | 'T', solve?: Solver): { dt_rel: number; dlevel_dB: number; peaks: number } {
  const W = bandPulse(stack.band_Hz).width_s;
  const peaks = exactPeaks(exactEnvelope(stack, which, W / 200, 64e-9, solve), 0.01);
  const isolated = peaks.filter((p) => peaks.every((q) => q === p || Math.abs(q.t_s - p.t_s) >= W));
  let dt = 0, dl = 0;
  for (const p of isolated) {
    let best = -1;
    for (let i = 0; i < table.t_s.length; i++) if (best < 0 || Math.abs(table.t_s[i] - p.t_s) < Math.abs(table.t_s[best] - p.t_s)) best = i;
    if (best < 0) { dt = Infinity; continue; }
    dt = Math.max(dt, Math.abs(table.t_s[best] - p.t_s) / Math.max(Math.abs(p.t_s), W));
    dl = Math.max(dl, Math.abs(table.level_dB[best] - 20 * Math.log10(p.level)));
  }
  return { dt_rel: dt, dlevel_dB: dl, peaks: isolated.length };
}

/** CPU time (all threads of this process: the JIT compiles in the background) in ms. */
const cpu = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1000; };

/** In a fresh process: the whole `slabecho run` pipeline, or the pulse run followed by the echo analysis. */
async function one(index: number, part: 'report' | 'echoes'): Promise<Record<string, unknown>> {
  const [name, stack] = stacks()[index];
  if (part === 'report') {
    const c0 = cpu(), t0 = performance.now();
    await runReport(stack);
    return { name, run_ms: performance.now() - t0, run_cpu_ms: cpu() - c0 };
  }
  const run = createPulseRun(stack);
  let c0 = cpu();
  runToEndSync(run);
  const fdtd_cpu_ms = cpu() - c0;
  const rec = run.records();
  spectrumFromRecords(rec, Float64Array.from({ length: stack.points }, (_, i) => stack.band_Hz[0] + ((stack.band_Hz[1] - stack.band_Hz[0]) * i) / (stack.points - 1)));
  c0 = cpu();
  let a = analyseEchoes(stack, rec);
  const echoes_cpu_ms = cpu() - c0;
  const warm: number[] = [];
  for (let i = 0; i < 5; i++) { const c = cpu(); a = analyseEchoes(stack, rec); warm.push(cpu() - c); }
  warm.sort((x, y) => x - y);
  const R = accuracy(stack, a.reflected, 'R'), T = a.transmitted ? accuracy(stack, a.transmitted, 'T') : null;
  // the same against the exact solution of the media the run stepped (fitted power laws, conductors as walls)
  const stepped: Solver = (f) => {
    const sp = solveEffective(run.plan.effective, Float64Array.of(f));
    return { R: { re: sp.R_re[0], im: sp.R_im[0] }, T: { re: sp.T_re[0], im: sp.T_im[0] } };
  };
  const Rs = accuracy(stack, a.reflected, 'R', stepped), Ts = a.transmitted ? accuracy(stack, a.transmitted, 'T', stepped) : null;
  return { name, fdtd_cpu_ms, echoes_cpu_ms, echoes_warm_ms: warm[2], rows: a.reflected.t_s.length, rows_T: a.transmitted?.t_s.length ?? 0, R, T, Rs, Ts };
}

const median = (x: number[]) => x.slice().sort((a, b) => a - b)[Math.floor(x.length / 2)];

/** Runs `part` for stack i in fresh processes, `times` over, and keeps each figure's median. */
function measured(self: string, i: number, part: string, times: number): Record<string, any> {
  const runs = Array.from({ length: times }, () => {
    const r = spawnSync(process.execPath, ['--import', 'tsx', self, '--one', String(i), part], { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(r.stderr);
    return JSON.parse(r.stdout.trim().split('\n').at(-1)!) as Record<string, any>;
  });
  const out: Record<string, any> = { ...runs[0] };
  for (const k of Object.keys(out)) if (typeof out[k] === 'number') out[k] = median(runs.map((r) => r[k]));
  return out;
}

const pct = (a: number, b: number) => `${((100 * a) / b).toFixed(1)} %`;
const fmt = (x: number) => (Number.isFinite(x) ? x.toPrecision(2) : '—');

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const only = args.indexOf('--one');
  if (only >= 0) { process.stdout.write(`${JSON.stringify(await one(Number(args[only + 1]), args[only + 2] as 'report' | 'echoes'))}\n`); return; }
  const self = fileURLToPath(import.meta.url);
  const times = Number(args[args.indexOf('--times') + 1]) || 3;
  const results = stacks().map((_, i) => ({ ...measured(self, i, 'report', times), ...measured(self, i, 'echoes', times) }));
  if (args.includes('--json')) { process.stdout.write(`${JSON.stringify(results, null, 2)}\n`); return; }
  console.log(`CPU ms, median of ${times} fresh processes each; "first" = the first analysis in a process (as in slabecho run), "warm" = later ones`);
  console.log('stack                        run  FDTD  echoes first/warm  echoes/run  rows R/T  worst vs exact: R Δt, ΔdB; T Δt, ΔdB | vs the stepped media: R; T');
  for (const r of results) {
    const acc = (x: any) => (x ? `${fmt(100 * x.dt_rel)} %, ${fmt(x.dlevel_dB)} dB` : '—');
    console.log(`${r.name.padEnd(26)} ${r.run_cpu_ms.toFixed(0).padStart(5)} ${r.fdtd_cpu_ms.toFixed(0).padStart(5)} ${r.echoes_cpu_ms.toFixed(1).padStart(9)} / ${r.echoes_warm_ms.toFixed(1).padEnd(5)} ${pct(r.echoes_cpu_ms, r.run_cpu_ms).padStart(9)}  ${String(r.rows).padStart(4)}/${String(r.rows_T).padEnd(3)}  ${acc(r.R)}; ${acc(r.T)} | ${acc(r.Rs)}; ${acc(r.Ts)}`);
  }
}

await main();
