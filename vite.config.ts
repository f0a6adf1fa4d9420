/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import { demoSetPlugin } from './scripts/demoSetPlugin.ts';

export default defineConfig({
  plugins: [react(), demoSetPlugin('sample-spectra')],
  base: './',
  worker: { format: 'es' },
  build: { target: 'es2022', sourcemap: true },
  server: { host: '127.0.0.1' },
  test: {
    environment: 'node',
    include: ['test/**/*.test.ts', 'test/**/*.test.tsx'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
  },
});
