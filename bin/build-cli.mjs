#!/usr/bin/env node
// Compiles the command line into one ES module, build/cli.mjs, so `npx slabecho` starts without compiling
// TypeScript (npm runs this after `npm ci` / `npm install` as the `prepare` script; `npm run build:cli` by hand).
// An optional argument names another output file.
import { build } from 'esbuild';
import { fileURLToPath } from 'node:url';

export const CLI_ENTRY = fileURLToPath(new URL('../src/cli/main.ts', import.meta.url));
export const CLI_BUNDLE = fileURLToPath(new URL('../build/cli.mjs', import.meta.url));

/** Bundle the CLI (node builtins stay imports) into `outfile`. */
export async function buildCli(outfile = CLI_BUNDLE) {
  await build({
    entryPoints: [CLI_ENTRY], outfile, bundle: true, platform: 'node', format: 'esm', target: 'node20',
    logLevel: 'warning', legalComments: 'none',
  });
  return outfile;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) await buildCli(process.argv[2]);
