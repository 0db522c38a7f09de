#!/usr/bin/env node
// Compiles the command line into one ES module, build/cli.mjs, so `npx slabecho` starts without compiling
// TypeScript (npm runs this after `npm ci` / `npm install` as the `prepare` script; `npm run build:cli` by hand).
// The WebAssembly time step is built first (bin/build-wasm.mjs) and its bytes go into the bundle, so the one
// file is the whole command line. An optional argument names another output file.
import { build } from 'esbuild';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { buildWasm } from './build-wasm.mjs';

export const CLI_ENTRY = fileURLToPath(new URL('../src/cli/main.ts', import.meta.url));
export const CLI_BUNDLE = fileURLToPath(new URL('../build/cli.mjs', import.meta.url));

/** Bundle the CLI (node builtins stay imports) into `outfile`. */
export async function buildCli(outfile = CLI_BUNDLE) {
  const wasm = readFileSync(await buildWasm()).toString('base64');
  await build({
    entryPoints: [CLI_ENTRY], outfile, bundle: true, platform: 'node', format: 'esm', target: 'node20',
    logLevel: 'warning', legalComments: 'none', define: { SLABECHO_STEP_WASM: JSON.stringify(wasm) },
  });
  return outfile;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) await buildCli(process.argv[2]);
