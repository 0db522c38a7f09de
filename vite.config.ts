import { defineConfig } from 'vitest/config';
import { buildWasm } from './bin/build-wasm.mjs';

// Relative base so the static build works from any path on any static host.
export default defineConfig({
  base: './',
  // The WebAssembly time step the engine worker fetches (src/app/worker.ts): rebuilt from its sources when stale.
  plugins: [{ name: 'slabecho-wasm-step', async buildStart() { await buildWasm(); } }],
  build: { outDir: 'dist', target: 'es2022' },
  worker: { format: 'es' },
  test: {
    include: ['test/**/*.test.ts'],
    globalSetup: ['test/support/global-setup.ts'],
    environment: 'node',
    testTimeout: 60_000,
  },
});
