import { defineConfig } from 'vitest/config';

// Relative base so the static build works from any path on any static host.
export default defineConfig({
  base: './',
  build: { outDir: 'dist', target: 'es2022' },
  worker: { format: 'es' },
  test: {
    include: ['test/**/*.test.ts'],
    environment: 'node',
    testTimeout: 60_000,
  },
});
