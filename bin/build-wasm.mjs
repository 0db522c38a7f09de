#!/usr/bin/env node
// Compiles the WebAssembly time step (src/fdtd/asm/, AssemblyScript) into build/fdtd-step.wasm, when any of its
// sources (or the descriptor slots it shares with the TypeScript side) is newer than the module. Run by the
// `prepare` script (through build-cli.mjs), by the vite plugin in vite.config.ts before the workbench is served
// or built, and by bin/slabecho.mjs before it runs the sources. Options: --force rebuilds; --text also writes
// the module's text form beside it (for reading what the optimizer made).
import { mkdirSync, readdirSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
export const WASM_SOURCES = [join(root, 'src', 'fdtd', 'asm'), join(root, 'src', 'fdtd', 'wasm', 'slots.ts')];
export const WASM_ENTRY = join(root, 'src', 'fdtd', 'asm', 'step.ts');
export const WASM_MODULE = join(root, 'build', 'fdtd-step.wasm');

const ASC_FLAGS = [
  '-O3', '--converge', '--runtime', 'stub', '--enable', 'simd', '--importMemory', '--noAssert',
  '--use', 'abort=', '--noExportMemory',
];

function newestSource(path) {
  const st = statSync(path);
  if (!st.isDirectory()) return st.mtimeMs;
  return Math.max(0, ...readdirSync(path).map((f) => newestSource(join(path, f))));
}

/** True when build/fdtd-step.wasm is missing or older than a source. */
export function wasmIsStale(outfile = WASM_MODULE) {
  try { return statSync(outfile).mtimeMs < Math.max(...WASM_SOURCES.map(newestSource)); } catch { return true; }
}

/** Compile the module (when stale, or always with force); returns its path. Throws with asc's messages. */
export async function buildWasm({ force = false, text = false, outfile = WASM_MODULE } = {}) {
  if (!force && !wasmIsStale(outfile)) return outfile;
  const { default: asc } = await import('assemblyscript/asc');
  mkdirSync(dirname(outfile), { recursive: true });
  const args = [WASM_ENTRY, ...ASC_FLAGS, '-o', outfile];
  if (text) args.push('-t', outfile.replace(/\.wasm$/, '.wat'));
  const { error, stderr } = await asc.main(args);
  if (error) throw new Error(`build-wasm: ${error.message}\n${stderr.toString()}`);
  return outfile;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  await buildWasm({ force: process.argv.includes('--force'), text: process.argv.includes('--text') });
}
