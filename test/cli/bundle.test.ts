// The compiled command line (bin/build-cli.mjs, run by npm as the `prepare` script): it must bundle, start
// without TypeScript tooling, and behave like the sources (bookkeeping, no source).
import { execFileSync, spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { SLABECHO_VERSION } from '../../src/version.ts';
import { tempDir } from './support.ts';

const tmp = tempDir();
afterAll(() => tmp.cleanup());

describe('compiled CLI', () => {
  it('bundles into one module that prints the version and checks a preset like the sources do', () => {
    const out = join(tmp.dir, 'cli.mjs');
    execFileSync(process.execPath, ['bin/build-cli.mjs', out]);
    const runner = join(tmp.dir, 'run.mjs');
    writeFileSync(runner, "const { main } = await import('./cli.mjs');\nprocess.exitCode = await main(process.argv.slice(2));\n");
    const version = spawnSync(process.execPath, [runner, '--version'], { encoding: 'utf8' });
    expect(version.status).toBe(0);
    expect(version.stdout.trim()).toBe(SLABECHO_VERSION);
    const checked = spawnSync(process.execPath, [runner, 'check', 'presets/default.stack.json'], { encoding: 'utf8' });
    expect(checked.status).toBe(0);
    const bad = spawnSync(process.execPath, [runner, 'check', 'no-such-file.stack.json'], { encoding: 'utf8' });
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/no-such-file\.stack\.json/);
  });

  it('carries the WebAssembly step in itself and runs a report\'s parts on a worker thread with the same results', () => {
    const out = join(tmp.dir, 'cli2.mjs');
    execFileSync(process.execPath, ['bin/build-cli.mjs', out]);
    const runner = join(tmp.dir, 'run2.mjs');
    writeFileSync(runner, "const { main } = await import('./cli2.mjs');\nprocess.exitCode = await main(process.argv.slice(2));\n");
    // No .wasm file beside the bundle: the engine comes from the bytes inside it.
    const bench = spawnSync(process.execPath, [runner, 'bench', '--cells', '1000', '--steps', '200', '--json'], { encoding: 'utf8' });
    expect(bench.status).toBe(0);
    expect(JSON.parse(bench.stdout).engine).toBe('wasm-simd');
    const dirWorkers = join(tmp.dir, 'workers'), dirOne = join(tmp.dir, 'one');
    const env = (w: string) => ({ ...process.env, SLABECHO_WORKERS: w });
    const a = spawnSync(process.execPath, [runner, 'run', 'presets/radome-panel.stack.json', '--out', dirWorkers], { encoding: 'utf8', env: env('2') });
    const b = spawnSync(process.execPath, [runner, 'run', 'presets/radome-panel.stack.json', '--out', dirOne], { encoding: 'utf8', env: env('0') });
    expect([a.status, b.status]).toEqual([0, 0]);
    for (const f of ['spectrum.csv', 'profile.csv', 'echoes.csv', 'trace.csv']) {
      expect(readFileSync(join(dirWorkers, f), 'utf8')).toBe(readFileSync(join(dirOne, f), 'utf8'));
    }
    const summary = JSON.parse(readFileSync(join(dirWorkers, 'summary.json'), 'utf8'));
    expect(summary.run.engine).toBe('wasm-simd');
  });
});
