#!/usr/bin/env node
// Entry point for `npx slabecho`: runs the TypeScript CLI through tsx's loader.
import { register } from 'tsx/esm/api';
register();
const { main } = await import('../src/cli/main.ts');
process.exitCode = await main(process.argv.slice(2));
