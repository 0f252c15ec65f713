import { defineConfig } from 'vitest/config';

/** End-to-end tests: the built server in a child process, driven by Debian's Chromium. */
export default defineConfig({
  test: {
    include: ['test/e2e/**/*.e2e.ts'],
    environment: 'node',
    globals: true,
    testTimeout: 120_000,
    hookTimeout: 180_000,
    fileParallelism: false,
    pool: 'forks',
  },
});
