#!/usr/bin/env node
// Entry point for `npx slabecho`: the compiled CLI (build/cli.mjs, made by `npm ci` through the `prepare`
// script) when it is newer than every source file; otherwise the TypeScript sources through tsx (development),
// after rebuilding the WebAssembly step if its sources changed.
import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { isMainThread } from 'node:worker_threads';

const root = fileURLToPath(new URL('..', import.meta.url));
const bundle = join(root, 'build', 'cli.mjs');

/** Newest modification time under a folder (the browser app's sources do not go into the CLI). */
function newest(dir) {
  let t = 0;
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    if (e.isDirectory()) { if (e.name !== 'app') t = Math.max(t, newest(join(dir, e.name))); }
    else t = Math.max(t, statSync(join(dir, e.name)).mtimeMs);
  }
  return t;
}

function bundleIsCurrent() {
  try { return statSync(bundle).mtimeMs >= newest(join(root, 'src')); } catch { return false; }
}

let cli;
if (bundleIsCurrent()) cli = await import(bundle);
else {
  const { buildWasm } = await import('./build-wasm.mjs');
  await buildWasm(); // only when its sources changed
  const { register } = await import('tsx/esm/api');
  register();
  cli = await import('../src/cli/main.ts');
}
// The worker pool (src/cli/pool.ts, from the sources) starts its threads from this same file: there the loaded
// module serves the pool by itself.
if (isMainThread) process.exitCode = await cli.main(process.argv.slice(2));
