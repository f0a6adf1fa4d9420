/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import { demoSetPlugin } from './scripts/demoSetPlugin.ts';

export default defineConfig({
  plugins: [react(), demoSetPlugin('sample-spectra')],
  base: './',
  worker: { format: 'es' },
  // The worker carries the whole engine and the page carries d3 and React: larger than Vite's default hint.
  build: { target: 'es2022', sourcemap: true, chunkSizeWarningLimit: 1200 },
  server: { host: '127.0.0.1' },
  test: {
    environment: 'node',
    include: ['test/**/*.test.ts', 'test/**/*.test.tsx'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
  },
});
