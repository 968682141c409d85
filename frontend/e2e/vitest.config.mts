import { defineConfig } from 'vitest/config';

// Browser journeys: Debian's Chromium (playwright-core) against the built app, one journey file at a time.
export default defineConfig({
  test: {
    root: import.meta.dirname,
    include: ['**/*.spec.ts'],
    setupFiles: ['./setup.ts'],
    environment: 'node',
    fileParallelism: false,
    testTimeout: 120_000,
    hookTimeout: 180_000,
    // expect.poll waits 1 s by default: too short for a busy two-core CI machine driving a browser.
    expect: { poll: { timeout: 15_000, interval: 100 } },
  },
});
