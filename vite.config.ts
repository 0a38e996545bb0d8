/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';

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
    include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'],
    environment: 'node',
    testTimeout: 60_000,
    hookTimeout: 120_000,
    maxWorkers: 2,
  },
});
