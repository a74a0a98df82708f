import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['shared/**/*.test.ts', 'server/**/*.test.ts', 'cli/**/*.test.ts', 'src/**/*.test.{ts,tsx}', 'workers/**/*.test.ts', 'tests/**/*.test.ts'],
    environment: 'node',
    testTimeout: 30_000,
    hookTimeout: 60_000,
    reporters: ['default', './tests/support/summary-reporter.ts'],
  },
});
