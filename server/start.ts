import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join, resolve } from 'node:path';
import pino from 'pino';
import { loadEnv } from './config/env.ts';
import { prepareDataFolder, restrictDataFiles } from './config/data-folder.ts';
import { resolveSecret } from './config/secret.ts';
import { openOrm, type Orm } from './db/orm.ts';
import { createSqlRateLimitStore } from './db/rate-limit-store.ts';
import { accountsWithDemoPassword, seedDemo } from './db/seed.ts';
import { createSmtpMailer } from './mail/mailer.ts';
import { startMailFake } from './mail/fake-smtp.ts';
import { createMailbox, type Mailbox } from './mail/mailbox.ts';
import { createApp } from './app.ts';
import { systemClock } from './context.ts';
import { createAnalysisPool } from './analysis/pool.ts';
import { createRunPool } from './runner/pool.ts';
import { verifyApiToken } from './features/tokens/verify.ts';
import { resumeUnfinishedTraces } from './features/traces/resume.ts';
import { closeOrphanedRuns } from './features/runs/resume.ts';
import { createLocalJobQueue } from './jobs/local-queue.ts';
import { createPgJobQueue } from './jobs/pg-queue.ts';
import type { JobQueue } from './jobs/types.ts';
import { createLocalTraceStore } from './storage/local-store.ts';
import { createS3TraceStore } from './storage/s3-store.ts';
import type { TraceStore } from './storage/types.ts';
import type { Env } from './config/env.ts';

export interface StartOptions {
  /** 0 = a random free port. Default PORT or 3000. */
  port?: number;
  host?: string;
  /** Folder of the SQLite file and the generated secret. Default PARLEY_DATA or ./data. */
  dataDir?: string;
  /** Seed the demo organisation on an empty database. Default PARLEY_DEMO (on). */
  demo?: boolean;
  /** Send mail through this SMTP server; without it an in-process fake fills the Outbox. */
  smtpUrl?: string;
  /** Log start-up and one line per request. Default on. */
  log?: boolean;
  distDir?: string;
}

/** The trace store the environment names: a bucket with S3_URL and S3_BUCKET, else `<dataDir>/traces`. */
export function traceStoreFromEnv(env: Env, dataDir: string): TraceStore {
  if (env.S3_URL && env.S3_BUCKET) return createS3TraceStore({ endpoint: env.S3_URL, bucket: env.S3_BUCKET, region: env.S3_REGION, prefix: env.S3_PREFIX, incomingDir: join(dataDir, 'incoming') });
  return createLocalTraceStore(dataDir);
}

/** The job queue: shared through PostgreSQL with DATABASE_URL, else in this process. */
export async function jobQueueFromEnv(env: Env, logger: pino.Logger): Promise<JobQueue> {
  const onError = (kind: string, key: string, cause: unknown) => logger.error({ err: cause, kind, key }, 'job failed');
  if (env.DATABASE_URL) return createPgJobQueue({ databaseUrl: env.DATABASE_URL, onError, log: (message) => logger.warn(message) });
  return createLocalJobQueue({ onError });
}

export interface RunningServer {
  url: string;
  close(): Promise<void>;
  orm: Orm;
  mailbox: Mailbox;
  /** Settles once the traces left unfinished by the last run have been analysed again. */
  resumed: Promise<void>;
}

const repoRoot = resolve(fileURLToPath(new URL('..', import.meta.url)));

function listen(server: Server, port: number, host: string | undefined): Promise<number> {
  return new Promise((resolveListen, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolveListen((server.address() as AddressInfo).port));
  });
}

export async function startServer(options: StartOptions = {}): Promise<RunningServer> {
  const env = loadEnv();
  // Lines go out asynchronously (pino flushes what is left when the process exits): one line per
  // request written synchronously stalls every request whenever the reader of stdout lags.
  const logger = pino({ level: options.log === false ? 'silent' : env.LOG_LEVEL }, pino.destination({ dest: 1, sync: false }));
  const dataDir = resolve(options.dataDir ?? env.PARLEY_DATA);
  const { removed } = prepareDataFolder(dataDir);
  if (removed.length > 0) logger.info(`removed ${removed.length} file(s) a stopped server left behind: ${removed.slice(0, 5).join(', ')}`);
  const production = env.NODE_ENV === 'production';
  const secret = resolveSecret({ envSecret: env.PARLEY_SECRET, dataDir, production, shared: env.DATABASE_URL !== undefined });

  const orm = await openOrm(env.DATABASE_URL ? { databaseUrl: env.DATABASE_URL } : { dbName: join(dataDir, 'parley.sqlite') });
  restrictDataFiles(dataDir);
  const store = traceStoreFromEnv(env, dataDir);
  if (options.demo ?? env.PARLEY_DEMO) {
    if (await seedDemo(orm.em.fork(), systemClock, { dataDir, traceStore: store })) logger.info('demo data created: sign in as admin@kestrel.example / parley-demo');
  }
  if (production && !env.demoAskedFor) {
    const exposed = await accountsWithDemoPassword(orm.em.fork());
    if (exposed.length > 0) {
      await orm.close();
      throw new Error(
        `Refusing to start in production: ${exposed.join(', ')} still sign${exposed.length === 1 ? 's' : ''} in with the published demo password. ` +
          'Set new passwords or deactivate these accounts (or set PARLEY_DEMO=1 for a deliberate public demo).',
      );
    }
  }

  const smtpUrl = options.smtpUrl ?? env.SMTP_URL;
  const fake = smtpUrl ? null : await startMailFake({ orm, clock: systemClock });
  const mailer = createSmtpMailer({ url: smtpUrl ?? fake!.url, from: env.MAIL_FROM });
  if (fake) logger.info(`SMTP_URL not set: mail goes to the built-in Outbox (a loopback SMTP fake with a per-start credential)`);

  const runPool = createRunPool({ sandboxMode: env.PARLEY_SANDBOX });
  // Prepared before the server listens (bundling the checker and probing the isolation cost the
  // request thread a few tenths of a second), and the log says at once which sandbox is in use.
  await runPool.sandboxStatus?.('').then(
    ({ info }) => (info.mode === 'bubblewrap' ? logger.info('property sandbox: bubblewrap') : logger.warn(`property sandbox: fallback launcher (${info.fallbackReason})`)),
    (cause: unknown) => logger.error(`property sandbox: cannot start (${cause instanceof Error ? cause.message : String(cause)})`),
  );

  const server = createServer();
  let port: number;
  try {
    port = await listen(server, options.port ?? env.PORT, options.host ?? env.HOST);
  } catch (err) {
    await runPool.close();
    mailer.close();
    await fake?.close();
    await orm.close();
    throw err;
  }
  const publicUrl = env.publicUrlDefaulted ? `http://localhost:${port}` : env.PUBLIC_URL;

  const distDir = options.distDir ?? join(repoRoot, 'dist');
  if (!existsSync(join(distDir, 'index.html'))) logger.warn(`no built client in ${distDir}: serving the API only (run \`npm run build\`)`);
  const jobs = await jobQueueFromEnv(env, logger);
  const analysisPool = createAnalysisPool();
  const app = createApp({
    orm,
    mailer,
    secret,
    publicUrl,
    distDir,
    production,
    logger,
    logRequests: options.log !== false,
    dataDir,
    verifyBearer: verifyApiToken,
    jobs,
    runJobs: env.PARLEY_RUN_JOBS,
    analysisPool,
    runPool,
    traceStore: store,
    trustProxy: env.trustProxy,
    // Several instances on one PostgreSQL count sign-in and reset attempts together.
    ...(env.DATABASE_URL ? { rateLimitStore: (name: string) => createSqlRateLimitStore({ orm, name }) } : {}),
  });
  server.on('request', app);
  const url = `http://${options.host ?? env.HOST ?? 'localhost'}:${port}`;
  logger.info(`Parley listening on ${url}`);
  if (!env.PARLEY_RUN_JOBS) logger.info('PARLEY_RUN_JOBS=off: this instance queues jobs and relays their progress; parley worker processes run them');

  // Traces left queued or analysing by the last run resume now, in the background.
  // A PostgreSQL queue keeps its jobs (and retries a dead worker's); the in-process one resumes here.
  const resume = async (): Promise<void> => {
    if (jobs.name === 'postgres') return;
    await closeOrphanedRuns(orm, systemClock);
    const { ids, done } = await resumeUnfinishedTraces({ orm, jobs, onError: (traceId, message) => logger.warn(`trace ${traceId}: ${message}`) });
    if (ids.length > 0) logger.info(`resuming the analysis of ${ids.length} unfinished trace(s)`);
    await done;
  };
  const resumed = resume().catch((cause: unknown) => logger.error(`unfinished traces could not be resumed: ${cause instanceof Error ? cause.message : String(cause)}`));

  let closing: Promise<void> | undefined;
  const close = () => {
    closing ??= (async () => {
      // Open event streams end too: a load balancer sends their reconnects to another instance.
      await new Promise<void>((resolveClose) => {
        server.close(() => resolveClose());
        server.closeIdleConnections();
        setTimeout(() => server.closeAllConnections(), 2_000).unref();
      });
      // Jobs stop first (their rows stay unfinished, for the next start to resume), then the threads.
      const jobsStopped = jobs.close();
      await Promise.all([analysisPool.close(), runPool.close()]);
      await jobsStopped;
      mailer.close();
      await fake?.close();
      await orm.close();
      logger.info('Parley stopped');
    })();
    return closing;
  };
  return { url, close, orm, mailbox: createMailbox(orm), resumed: resumed.then(() => undefined) };
}
