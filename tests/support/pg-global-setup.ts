/**
 * Global setup of the `api-postgres` test project: one throwaway PostgreSQL cluster for the run,
 * with a migrated template database each test app copies (a fresh database in milliseconds).
 */
import type { TestProject } from 'vitest/node';
import { openOrm } from '../../server/db/orm.ts';
import { startPgCluster, type PgCluster } from './pg-cluster.ts';

declare module 'vitest' {
  export interface ProvidedContext {
    /** The cluster's admin URL (database `postgres`) when the project runs on PostgreSQL. */
    postgresUrl: string;
  }
}

export const TEMPLATE_DATABASE = 'parley_template';

let cluster: PgCluster | undefined;

export async function setup(project: TestProject): Promise<void> {
  cluster = await startPgCluster();
  const orm = await openOrm({ databaseUrl: cluster.createDatabase(TEMPLATE_DATABASE) });
  await orm.close();
  project.provide('postgresUrl', cluster.url);
}

export function teardown(): void {
  cluster?.stop();
}
