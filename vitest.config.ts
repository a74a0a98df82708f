import { defineConfig } from 'vitest/config';
import { findPostgres, postgresInstallHint } from './tests/support/pg-cluster.ts';

const browserTests = 'tests/browser/**/*.test.ts';

/**
 * The API suite again on PostgreSQL (one throwaway cluster for the run), plus the multi-instance
 * tests. Under CI=true it always runs (a missing PostgreSQL fails it); elsewhere it is left out,
 * with the install command, when PostgreSQL is not installed.
 */
const onPostgres = findPostgres() !== undefined || process.env.CI === 'true';
if (!onPostgres) console.warn(`The PostgreSQL test project is skipped: PostgreSQL is not installed (${postgresInstallHint})`);
const postgresProject = {
  extends: true as const,
  test: {
    name: 'api-postgres',
    include: ['tests/api/**/*.test.ts', 'tests/scale/**/*.test.ts'],
    // These start servers on SQLite files or test what does not touch the database.
    exclude: ['tests/api/start.test.ts', 'tests/api/resume-traces.test.ts', 'tests/api/property-worker-csp.test.ts', '**/node_modules/**'],
    globalSetup: ['tests/support/pg-global-setup.ts'],
    sequence: { groupOrder: 0 },
  },
};

export default defineConfig({
  test: {
    environment: 'node',
    // Time-outs catch a hang, not slowness: a busy CI machine (other builds on its cores) runs an API or
    // CLI-process test several times slower than an idle one, so they are generous.
    testTimeout: 120_000,
    hookTimeout: 180_000,
    // expect.poll waits for a page or a job to get there; its 1 s default failed a browser test at a
    // load average of 17 (the Offers page rechecked after 1.4 s), so it waits as long as a hang allows.
    expect: { poll: { timeout: 15_000 } },
    reporters: ['default', './tests/support/summary-reporter.ts'],
    projects: [
      {
        extends: true,
        test: {
          name: 'engine-server-cli',
          include: ['shared/**/*.test.ts', 'server/**/*.test.ts', 'cli/**/*.test.ts', 'src/**/*.test.{ts,tsx}', 'workers/**/*.test.ts', 'tests/**/*.test.ts'],
          exclude: [browserTests, 'tests/scale/**', '**/node_modules/**'],
          sequence: { groupOrder: 0 },
        },
      },
      ...(onPostgres ? [postgresProject] : []),
      {
        // Browser tests run after the rest, one file at a time, so a page is not starved by API tests
        // (main-thread budgets are measured by npm run bench:ui, not asserted here).
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
