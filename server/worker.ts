/**
 * `parley worker`: a process that works on the shared job queue (trace analyses, vector runs, mail)
 * and serves no HTTP, for a team deployment (DATABASE_URL set). Start as many as the machines
 * allow; each takes jobs from PostgreSQL, and a job whose worker dies is retried by another.
 */
import { join, resolve } from 'node:path';
import { mkdirSync } from 'node:fs';
import pino from 'pino';
import { loadEnv } from './config/env.ts';
import { openOrm } from './db/orm.ts';
import { createSmtpMailer } from './mail/mailer.ts';
import { startMailFake } from './mail/fake-smtp.ts';
import { systemClock } from './context.ts';
import { createAnalysisPool } from './analysis/pool.ts';
import { createRunPool } from './runner/pool.ts';
import { registerJobKinds } from './jobs/kinds.ts';
import { queuedMailer } from './mail/mail-job.ts';
import { createPgJobQueue } from './jobs/pg-queue.ts';
import { traceStoreFromEnv } from './start.ts';

export interface RunningWorker {
  close(): Promise<void>;
}

export async function startWorker(options: { log?: boolean } = {}): Promise<RunningWorker> {
  const env = loadEnv();
  if (!env.DATABASE_URL) throw new Error('parley worker needs DATABASE_URL (a postgres:// URL): without it the server runs its jobs itself');
  const logger = pino({ level: options.log === false ? 'silent' : env.LOG_LEVEL });
  const dataDir = resolve(env.PARLEY_DATA);
  mkdirSync(dataDir, { recursive: true });
  const orm = await openOrm({ databaseUrl: env.DATABASE_URL });
  const fake = env.SMTP_URL ? null : await startMailFake({ orm, clock: systemClock });
  const mailer = createSmtpMailer({ url: env.SMTP_URL ?? fake!.url, from: env.MAIL_FROM });
  const jobs = await createPgJobQueue({
    databaseUrl: env.DATABASE_URL,
    onError: (kind, key, cause) => logger.error({ err: cause, kind, key }, 'job failed'),
    log: (message) => logger.warn(message),
  });
  const analysisPool = createAnalysisPool();
  const runPool = createRunPool({ sandboxMode: env.PARLEY_SANDBOX });
  registerJobKinds({ orm, clock: systemClock, mailer: queuedMailer(jobs), publicUrl: env.PUBLIC_URL, logger, jobs, traceStore: traceStoreFromEnv(env, join(dataDir)), analysisPool, runPool }, mailer);
  logger.info('Parley worker started: taking jobs from the shared queue');
  let closing: Promise<void> | undefined;
  return {
    close() {
      closing ??= (async () => {
        // Running jobs go back to the queue for another worker.
        const jobsStopped = jobs.close();
        await Promise.all([analysisPool.close(), runPool.close()]);
        await jobsStopped;
        mailer.close();
        await fake?.close();
        await orm.close();
        logger.info('Parley worker stopped');
      })();
      return closing;
    },
  };
}
