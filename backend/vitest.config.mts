import path from 'node:path';
import swc from 'unplugin-swc';
import { defineConfig } from 'vitest/config';

// Nest needs decorator metadata, which esbuild does not emit: SWC compiles the tests and the code.
export default defineConfig({
  plugins: [
    swc.vite({ jsc: { transform: { decoratorMetadata: true, legacyDecorator: true }, target: 'es2022' } }),
  ],
  resolve: {
    alias: { '@loambook/common': path.resolve(import.meta.dirname, '../common/src/index.ts') },
  },
  test: {
    include: ['test/**/*.e2e-spec.ts', 'src/**/*.spec.ts'],
    globalSetup: ['test/support/global-setup.ts'],
    // The API tests share one fresh database; running files one after another keeps them independent
    // of each other's timing on a two-core machine.
    fileParallelism: false,
    testTimeout: 30_000,
    hookTimeout: 60_000,
    env: {
      SCRYPT_LOG_N: '12',
      LOG_LEVEL: 'silent',
      AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true',
    },
  },
});
