// What the command line costs besides the pulse run itself, on the compiled CLI as a user runs it
// (node bin/slabecho.mjs): start-up (`--version` against `node -e 0`), and for `run` on every preset the wall
// time beyond the pulse run's own reported time (start-up, planning, exact and FEM solves, spectra, echo
// analysis, writing the files). A benchmark, not a test: medians of alternating repetitions.
//   nice npx tsx bench/cli-overhead.ts [--runs R] [--json]
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseArgs } from 'node:util';

const { values } = parseArgs({ options: { runs: { type: 'string' }, json: { type: 'boolean' } } });
const runs = Number(values.runs ?? 5);
const root = join(import.meta.dirname, '..');
const cli = join(root, 'bin', 'slabecho.mjs');
const median = (xs: number[]) => { const s = [...xs].sort((a, b) => a - b); return s[Math.floor(s.length / 2)]; };

function wall(args: string[]): number {
  const t0 = performance.now();
  execFileSync(process.execPath, args, { stdio: 'pipe' });
  return (performance.now() - t0) / 1000;
}

const nodeBare: number[] = [], version: number[] = [];
for (let r = 0; r < 4 * runs; r++) { nodeBare.push(wall(['-e', '0'])); version.push(wall([cli, '--version'])); }

const out = mkdtempSync(join(tmpdir(), 'slabecho-overhead-'));
const presets = readdirSync(join(root, 'presets')).filter((f) => f.endsWith('.stack.json')).sort();
const rows = presets.map((p) => {
  const beyond: number[] = [], pulse: number[] = [], total: number[] = [];
  let engine = '';
  for (let r = 0; r < runs; r++) {
    const t = wall([cli, 'run', join(root, 'presets', p), '--out', out]);
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    const fdtd = summary.methods.find((m: { name: string }) => m.name === 'fdtd')?.time_ms ?? 0;
    engine = summary.run?.engine ?? '';
    total.push(t); pulse.push(fdtd / 1000); beyond.push(t - fdtd / 1000);
  }
  return { preset: p, total_s: median(total), pulse_s: median(pulse), beyond_s: median(beyond), engine };
});
rmSync(out, { recursive: true, force: true });
const result = {
  node_e0_s: median(nodeBare), version_s: median(version), version_ratio: median(version) / median(nodeBare),
  run_beyond_pulse_median_s: median(rows.map((r) => r.beyond_s)), presets: rows,
};
if (values.json) console.log(JSON.stringify(result));
else {
  console.log(`node -e 0 ${result.node_e0_s.toFixed(3)} s, slabecho --version ${result.version_s.toFixed(3)} s (${result.version_ratio.toFixed(2)}×)`);
  console.log('preset                               total s  pulse s  beyond s  engine');
  for (const r of rows) console.log(`${r.preset.padEnd(36)} ${r.total_s.toFixed(3).padStart(7)}  ${r.pulse_s.toFixed(3).padStart(7)}  ${r.beyond_s.toFixed(3).padStart(8)}  ${r.engine}`);
  console.log(`median beyond the pulse run: ${result.run_beyond_pulse_median_s.toFixed(3)} s`);
}
