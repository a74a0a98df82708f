import { defineConfig } from 'vitest/config';

const browserTests = 'tests/browser/**/*.test.ts';

export default defineConfig({
  test: {
    environment: 'node',
    testTimeout: 30_000,
    hookTimeout: 60_000,
    reporters: ['default', './tests/support/summary-reporter.ts'],
    projects: [
      {
        extends: true,
        test: {
          name: 'engine-server-cli',
          include: ['shared/**/*.test.ts', 'server/**/*.test.ts', 'cli/**/*.test.ts', 'src/**/*.test.{ts,tsx}', 'workers/**/*.test.ts', 'tests/**/*.test.ts'],
          exclude: [browserTests, '**/node_modules/**'],
          sequence: { groupOrder: 0 },
        },
      },
      {
        // Browser tests measure main-thread responsiveness (no task over 50 ms), so they run after the
        // rest, one file at a time, with the machine to themselves.
        extends: true,
        test: {
          name: 'browser',
          include: [browserTests],
          fileParallelism: false,
          sequence: { groupOrder: 1 },
        },
      },
    ],
  },
});
