import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';

const here = path.dirname(fileURLToPath(import.meta.url));

/** Shared by the dev server, the build and (through vitest.config.mts) the component tests. */
export const resolve = {
  alias: {
    // The screens use the common rules from source, so common/ needn't be built first.
    '@loambook/common': path.resolve(here, '../common/src/index.ts'),
  },
};

export default defineConfig({
  plugins: [react()],
  resolve,
  server: {
    proxy: {
      '/api': 'http://127.0.0.1:3000',
    },
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    sourcemap: true,
  },
});
