/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';

/**
 * Test files timed against wall-clock limits that the load of other test files can break: the
 * hostile-server test's "health answers within a second" took 1.45 s in one CI run among the other
 * files, and 0.2-0.26 s alone.
 */
const runAlone = ['tests/hostile-server.test.ts'];

export default defineConfig({
  plugins: [react(), tailwindcss()],
  // The client imports shared/ and functions/ by these names (tsconfig.json "paths" says the same).
  resolve: {
    alias: {
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
      '@functions': fileURLToPath(new URL('./functions', import.meta.url)),
    },
  },
  build: { outDir: 'dist', emptyOutDir: true, chunkSizeWarningLimit: 4000 },
  // Module workers (the PPP worker is created with type: 'module'): the chemistry modules it runs load
  // openchemlib with a top-level await, which a classic worker script cannot hold.
  worker: { format: 'es' },
  server: { port: 5173 },
  test: {
    environment: 'node',
    testTimeout: 60_000,
    hookTimeout: 120_000,
    maxWorkers: 2,
    projects: [
      { extends: true, test: { name: 'suite', include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'], exclude: runAlone, sequence: { groupOrder: 0 } } },
      // After the rest, one file at a time: what these measure is the server's own responsiveness,
      // which the test files running beside them (browsers, builds, 80 MB uploads) would take from it.
      { extends: true, test: { name: 'alone', include: runAlone, maxWorkers: 1, sequence: { groupOrder: 1 } } },
    ],
  },
});
