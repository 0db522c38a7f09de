// The compiled command line (bin/build-cli.mjs, run by npm as the `prepare` script): it must bundle, start
// without TypeScript tooling, and behave like the sources (bookkeeping, no source).
import { execFileSync, spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
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
});
