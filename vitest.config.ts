import { defineConfig } from 'vitest/config';

// Three projects so that `npm test` can run the fast pure tests first and the
// service-backed ones against the stack that scripts/test.mjs has started.
export default defineConfig({
  test: {
    // Two files at a time even on a 2-core machine (vitest's default there is
    // one): most of an integration or browser file's time is spent waiting on
    // the app, the worker, PostgreSQL or Chromium, so a second file fills the
    // gaps. Browser files still run one after another (fileParallelism below).
    maxWorkers: 2,
    projects: [
      {
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        test: {
          name: 'integration',
          include: ['tests/integration/**/*.test.ts'],
          environment: 'node',
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          testTimeout: 90_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
