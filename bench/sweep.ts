// How long a 10 000-case exact sweep takes, measured (never asserted): the exact solver alone in this thread, then
// the whole `slabecho sweep` command (validation, solving, formatting, streaming sweep.csv, sweep.json) on one
// and on two worker threads, at 101 and 501 frequencies per case. The stack is an invented sandwich panel
// (two thin skins on a foam core) swept over 50 angles, both polarizations and 100 core thicknesses.
// Run: npx tsx bench/sweep.ts [--points 101,501] [--threads 1,2] [--json]
// (build the CLI first, npm run build:cli, so the workers start from the bundle.)

import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';
import { AXES, panel } from './sweep-solver.ts';

const arg = (name: string, fallback: string) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : fallback;
};
const POINTS = arg('points', '101,501').split(',').map(Number);
const THREADS = arg('threads', '1,2').split(',').map(Number);

/** bench/sweep-solver.ts bundled (as the CLI is) and run in a fresh process. */
async function solverOnly(points: number): Promise<{ cases: number; parse_seconds: number; seconds: number }> {
  const dir = mkdtempSync(join(tmpdir(), 'slabecho-bench-'));
  try {
    const out = join(dir, 'solver.mjs');
    await build({ entryPoints: [fileURLToPath(new URL('./sweep-solver.ts', import.meta.url))], outfile: out, bundle: true, platform: 'node', format: 'esm', logLevel: 'warning' });
    const r = spawnSync(process.execPath, [out, String(points)], { encoding: 'utf8' });
    return JSON.parse(r.stdout);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** The whole command, through bin/slabecho.mjs, wall time and CPU time of the process and its threads. */
function command(points: number, threads: number): { seconds: number; cpu_seconds: number; csv_MB: number; exit: number | null } {
  const dir = mkdtempSync(join(tmpdir(), 'slabecho-bench-'));
  try {
    const file = join(dir, 'panel.stack.json');
    writeFileSync(file, JSON.stringify(panel(points)));
    const t0 = performance.now();
    const r = spawnSync('/usr/bin/time', ['-f', '%U %S', process.execPath, 'bin/slabecho.mjs', 'sweep', file, '--out', join(dir, 'out'),
      '--angle', AXES.angle, '--polarization', AXES.polarization, '--set', AXES.set, '--methods', 'tmm', '--threads', String(threads), '--max-output-MB', '5000'],
    { encoding: 'utf8', maxBuffer: 1 << 26 });
    const seconds = (performance.now() - t0) / 1e3;
    const [user, sys] = (r.stderr.trim().split('\n').at(-1) ?? '0 0').split(' ').map(Number);
    let csv_MB = 0;
    try { csv_MB = statSync(join(dir, 'out', 'sweep.csv')).size / 1e6; } catch { /* failed run */ }
    return { seconds, cpu_seconds: user + sys, csv_MB, exit: r.status };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const results: Record<string, unknown>[] = [];
for (const points of POINTS) {
  const s = await solverOnly(points);
  results.push({ what: 'exact solver only', points, cases: s.cases, seconds: Number(s.seconds.toFixed(2)),
    rows_per_s: Math.round((s.cases * points) / s.seconds), case_parsing_seconds: Number(s.parse_seconds.toFixed(2)) });
  for (const threads of THREADS) {
    const c = command(points, threads);
    results.push({ what: 'slabecho sweep', points, threads, cases: s.cases, rows: s.cases * points, seconds: Number(c.seconds.toFixed(2)),
      cpu_seconds: Number(c.cpu_seconds.toFixed(2)), csv_MB: Number(c.csv_MB.toFixed(1)), exit: c.exit });
  }
}
if (process.argv.includes('--json')) console.log(JSON.stringify(results, null, 2));
else for (const r of results) console.log(Object.entries(r).map(([k, v]) => `${k} ${v}`).join(', '));
