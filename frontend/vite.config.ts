import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';

const here = path.dirname(fileURLToPath(import.meta.url));
const commonSrc = path.resolve(here, '../common/src') + path.sep;

/** Shared by the dev server, the build and (through vitest.config.mts) the component tests. */
export const resolve = {
  alias: {
    '@/': path.resolve(here, 'src') + '/',
    // The screens use the common rules from source, so common/ needn't be built first.
    '@loambook/common': path.join(commonSrc, 'index.ts'),
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
    rolldownOptions: {
      treeshake: {
        // common/ is pure code without side effects; saying so lets the build drop what the screens do not
        // use (the deadline rules and their holiday calendars, for one).
        moduleSideEffects: (id: string) => !id.startsWith(commonSrc),
      },
      output: {
        // React and the router change rarely: their own chunk stays cached across releases.
        codeSplitting: {
          groups: [{ name: 'react', test: /node_modules[\\/](react|react-dom|scheduler|react-router)[\\/]/ }],
        },
      },
    },
  },
});
