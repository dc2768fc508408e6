/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import { svelte } from '@sveltejs/vite-plugin-svelte';

// SharedArrayBuffer in the page needs cross-origin isolation (stack.md §4).
const isolation = { 'Cross-Origin-Opener-Policy': 'same-origin', 'Cross-Origin-Embedder-Policy': 'require-corp' };

export default defineConfig({
  root: 'app/renderer',
  base: './',
  publicDir: false,
  plugins: [svelte()],
  worker: { format: 'es' },
  server: { headers: isolation, host: '127.0.0.1' },
  preview: { headers: isolation, host: '127.0.0.1', port: 4173, strictPort: false },
  build: { target: 'es2022', outDir: '../../dist/renderer', emptyOutDir: true, chunkSizeWarningLimit: 2000 },
  test: {
    root: '.',
    reporters: ['default', './test/reporter.ts'],
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          root: '.',
          include: ['test/unit/**/*.test.ts', 'test/reference/**/*.test.ts', 'test/cli/**/*.test.ts'],
          environment: 'node',
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          root: '.',
          include: ['test/e2e/**/*.e2e.test.ts'],
          testTimeout: 180_000,
          hookTimeout: 120_000,
          fileParallelism: false,
          retry: process.env.CI ? 1 : 0,
        },
      },
    ],
  },
});
