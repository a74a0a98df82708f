import express, { type Express } from 'express';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import helmet from 'helmet';
import compression from 'compression';
import cookieParser from 'cookie-parser';
import { pinoHttp } from 'pino-http';
import pino from 'pino';
import { RequestContext } from '@mikro-orm/core';
import type { AppDeps, BearerVerifier, Clock, RateLimitOptions } from './context.ts';
import { systemClock } from './context.ts';
import type { Orm } from './db/orm.ts';
import type { Mailer } from './mail/mailer.ts';
import type { RouteDef } from './route-def.ts';
import { errorMiddleware, notFound } from './errors.ts';
import { sameOriginWrites } from './middleware/same-origin.ts';
import { keptReads } from './middleware/kept-reads.ts';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { buildApiRouter, routeTable } from './routes.ts';
import type { JobQueue } from './jobs/types.ts';
import { createLocalJobQueue } from './jobs/local-queue.ts';
import { registerJobKinds } from './jobs/kinds.ts';
import { queuedMailer } from './mail/mail-job.ts';
import { createAnalysisPool, type AnalysisPool } from './analysis/pool.ts';
import { createRunPool, type RunPool } from './runner/pool.ts';
import type { TraceStore } from './storage/types.ts';
import { createLocalTraceStore } from './storage/local-store.ts';
import { memoryRateLimitStore, type RateLimitStoreFactory } from './features/auth/rate-limit.ts';
import { createAuditBudget } from './features/audit/budget.ts';

export interface AppOptions {
  orm: Orm;
  mailer: Mailer;
  secret: string;
  publicUrl: string;
  clock?: Clock;
  /** Folder of the built client (`vite build`); when missing the app serves the API only. */
  distDir?: string;
  production?: boolean;
  logger?: pino.Logger;
  /** Log one line per request (off in tests). */
  logRequests?: boolean;
  /** JSON bodies larger than this get 413. */
  jsonLimit?: string;
  rateLimits?: Partial<AppDeps['rateLimits']>;
  /** Rate-limit counters shared across instances; default in memory. */
  rateLimitStore?: RateLimitStoreFactory;
  /** Failed sign-ins written to the audit log a minute, at most; default 120 (the rest are counted). */
  failedSignInAuditPerMinute?: number;
  /**
   * Express's `trust proxy` (the hops or addresses of reverse proxies in front). Unset: the client
   * address is the socket's, and `X-Forwarded-For` is ignored, so no client can pick its own address.
   */
  trustProxy?: string | number | boolean;
  verifyBearer?: BearerVerifier;
  /** Defaults to the full route table; tests may pass their own. */
  routes?: readonly RouteDef[];
  /** Folder for uploaded files (startServer passes PARLEY_DATA); default a folder in the system temp directory. */
  dataDir?: string;
  /** Where trace files live; default the `traces` folder of `dataDir`. */
  traceStore?: TraceStore;
  /**
   * The job queue; default an in-process one. The app registers its job kinds on it, so this
   * process works on them. Pools default to fresh ones whose idle threads leave on their own;
   * whoever passes them closes them.
   */
  jobs?: JobQueue;
  /** false: queue jobs and relay their events but run none (a web instance beside `parley worker` processes). Default true. */
  runJobs?: boolean;
  analysisPool?: AnalysisPool;
  runPool?: RunPool;
}

const fifteenMinutesMs = 15 * 60_000;
/** Sign-in and reset limits per 15 minutes (common practice for interactive sign-in; an office behind one address still gets 100 failures). */
const defaultLogin: RateLimitOptions = { windowMs: fifteenMinutesMs, limit: 10 };
const defaultLoginPerAddress: RateLimitOptions = { windowMs: fifteenMinutesMs, limit: 100 };
const defaultLoginPerAccount: RateLimitOptions = { windowMs: fifteenMinutesMs, limit: 30 };
const defaultForgot: RateLimitOptions = { windowMs: fifteenMinutesMs, limit: 3 };
const defaultForgotPerAddress: RateLimitOptions = { windowMs: fifteenMinutesMs, limit: 20 };
const defaultShare: RateLimitOptions = { windowMs: 60 * 60_000, limit: 30 };

/** Only our own origin: no CDN, no wildcard. Monaco's workers and charts need blob: and data:. */
export const contentSecurityPolicy = {
  defaultSrc: ["'self'"],
  scriptSrc: ["'self'"],
  styleSrc: ["'self'", "'unsafe-inline'"],
  imgSrc: ["'self'", 'data:', 'blob:'],
  fontSrc: ["'self'", 'data:'],
  workerSrc: ["'self'", 'blob:'],
  connectSrc: ["'self'"],
  objectSrc: ["'none'"],
  baseUri: ["'self'"],
  formAction: ["'self'"],
  frameAncestors: ["'none'"],
};

/**
 * The Properties page's worker evaluates the user's property code with `new Function`. A dedicated
 * worker's CSP comes from the response that delivers its script, so only that script gets
 * 'unsafe-eval'; pages and every other asset keep the strict policy above.
 */
export const propertyWorkerAsset = /^\/property\.worker-[\w-]+\.js$/;

export const propertyWorkerCsp = Object.entries({ ...contentSecurityPolicy, scriptSrc: [...contentSecurityPolicy.scriptSrc, "'unsafe-eval'"] })
  .map(([name, values]) => `${name.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)} ${values.join(' ')}`)
  .join(';');

export function createApp(options: AppOptions): Express {
  const logger = options.logger ?? pino({ level: 'silent' });
  const dataDir = options.dataDir ?? join(tmpdir(), 'parley-data');
  const jobs = options.jobs ?? createLocalJobQueue({ onError: (kind, key, cause) => logger.error({ err: cause, kind, key }, 'job failed') });
  const deps: AppDeps = {
    orm: options.orm,
    // Every message goes through the job queue; only the mail job talks to the SMTP transport.
    mailer: queuedMailer(jobs),
    clock: options.clock ?? systemClock,
    secret: options.secret,
    publicUrl: options.publicUrl.replace(/\/+$/, ''),
    production: options.production ?? false,
    logger,
    rateLimits: {
      login: options.rateLimits?.login ?? defaultLogin,
      loginPerAddress: options.rateLimits?.loginPerAddress ?? defaultLoginPerAddress,
      loginPerAccount: options.rateLimits?.loginPerAccount ?? defaultLoginPerAccount,
      forgot: options.rateLimits?.forgot ?? defaultForgot,
      forgotPerAddress: options.rateLimits?.forgotPerAddress ?? defaultForgotPerAddress,
      share: options.rateLimits?.share ?? defaultShare,
    },
    rateLimitStore: options.rateLimitStore ?? memoryRateLimitStore,
    failedSignInAudit: createAuditBudget(options.failedSignInAuditPerMinute ?? 120),
    verifyBearer: options.verifyBearer,
    dataDir,
    traceStore: options.traceStore ?? createLocalTraceStore(dataDir),
    jobs,
    analysisPool: options.analysisPool ?? createAnalysisPool(),
    runPool: options.runPool ?? createRunPool(),
  };
  if (options.runJobs !== false) registerJobKinds(deps, options.mailer);

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', options.trustProxy ?? false);
  app.use(helmet({ contentSecurityPolicy: { useDefaults: false, directives: contentSecurityPolicy } }));
  if (options.logRequests) {
    // Method, path and status only: headers carry session cookies and tokens.
    app.use(
      pinoHttp({
        logger,
        serializers: {
          req: (req: { method: string; url: string }) => ({ method: req.method, url: req.url.split('?')[0] }),
          res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
        },
      }),
    );
  }
  app.use(cookieParser());
  const routes = options.routes ?? routeTable;
  // A kept answer goes out from here, past compression (it is kept gzipped) and the rest of the stack.
  app.use(keptReads(routes, deps, options.orm.em as EntityManager));
  app.use(compression());
  app.use((_req, _res, next) => RequestContext.create(options.orm.em, next));
  app.use('/api', sameOriginWrites(deps.publicUrl));
  app.use('/api', express.json({ limit: options.jsonLimit ?? '1mb' }));

  app.use(buildApiRouter(routes, deps));
  app.use('/api', (req) => {
    throw notFound(`No API route ${req.method} ${req.originalUrl.split('?')[0]}`, 'route.not-found');
  });

  const distDir = options.distDir;
  const indexFile = distDir ? join(distDir, 'index.html') : undefined;
  if (distDir && indexFile && existsSync(indexFile)) {
    // Vite names assets by content hash, so a year and `immutable` is safe; index.html is always revalidated.
    app.use('/assets', (req, res, next) => {
      if (propertyWorkerAsset.test(req.path)) res.setHeader('Content-Security-Policy', propertyWorkerCsp);
      next();
    });
    app.use('/assets', express.static(join(distDir, 'assets'), { immutable: true, maxAge: '365d', index: false, fallthrough: false }));
    app.use(
      express.static(distDir, {
        index: false,
        setHeaders: (res) => res.setHeader('Cache-Control', 'no-cache'),
      }),
    );
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(indexFile);
    });
  } else {
    app.get('/{*splat}', (_req, res) => {
      res.status(404).type('text/plain').send('Parley API server: the client is not built (run `npm run build`).\n');
    });
  }

  app.use((req) => {
    throw notFound(`Nothing at ${req.method} ${req.path}`);
  });
  app.use(errorMiddleware(logger));
  return app;
}
