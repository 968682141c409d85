import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import { resolve } from './vite.config.ts';

export default defineConfig({
  plugins: [react()],
  resolve,
  test: {
    environment: 'jsdom',
    setupFiles: ['./src/testing/setup.ts'],
    include: ['src/**/*.test.ts', 'src/**/*.test.tsx'],
    css: false,
    restoreMocks: true,
    unstubGlobals: true,
    testTimeout: 20_000,
  },
});
