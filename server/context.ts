import type { Request } from 'express';
import type { Logger } from 'pino';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import type { Orm } from './db/orm.ts';
import type { IUser } from './db/entities.ts';
import type { Mailer } from './mail/mailer.ts';
import type { JobQueue } from './jobs/types.ts';
import type { AnalysisPool } from './analysis/pool.ts';
import type { RunPool } from './runner/pool.ts';
import type { TraceStore } from './storage/types.ts';
import type { RateLimitStoreFactory } from './features/auth/rate-limit.ts';
import type { AuditBudget } from './features/audit/budget.ts';

export interface Clock {
  now(): Date;
}

export const systemClock: Clock = { now: () => new Date() };

export interface RateLimitOptions {
  windowMs: number;
  limit: number;
}

/**
 * Resolves an `Authorization: Bearer <token>` header to a user, for CI tokens. Without one the
 * server accepts session cookies only and answers a bearer token with 401. It gets the request
 * so that it can limit a token to the routes tokens are for (it may throw a 403 for the others).
 */
export type BearerVerifier = (token: string, em: EntityManager, req: Request) => Promise<IUser | null>;

/** Everything a route handler may use besides the request: injected so tests can swap each part. */
export interface AppDeps {
  orm: Orm;
  mailer: Mailer;
  clock: Clock;
  secret: string;
  /** Base of links in mail, without a trailing slash, e.g. `http://localhost:3000`. */
  publicUrl: string;
  /** Secure cookies and no development fallbacks. */
  production: boolean;
  logger: Logger;
  rateLimits: {
    /** Failed sign-ins per client address and account. */
    login: RateLimitOptions;
    /** Failed sign-ins per client address, whatever the account. */
    loginPerAddress: RateLimitOptions;
    /** Failed sign-ins per account, whatever the address. */
    loginPerAccount: RateLimitOptions;
    /** Reset requests per account. */
    forgot: RateLimitOptions;
    /** Reset requests per client address. */
    forgotPerAddress: RateLimitOptions;
    share: RateLimitOptions;
  };
  /** Where rate-limit counters live; the default is this process's memory. */
  rateLimitStore: RateLimitStoreFactory;
  /** Bounds the failed sign-ins a flood can write to the audit log (server/features/audit/budget.ts). */
  failedSignInAudit: AuditBudget;
  verifyBearer?: BearerVerifier;
  /** Folder for stored files (`PARLEY_DATA`): uploaded traces live in `<dataDir>/traces`. */
  dataDir: string;
  /** Where uploaded trace files live. */
  traceStore: TraceStore;
  /** Background jobs (analyses, runs): in-process, or shared through PostgreSQL. */
  jobs: JobQueue;
  /** Worker threads for trace analyses and vector runs. */
  analysisPool: AnalysisPool;
  runPool: RunPool;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      /** The signed-in user, set by the authorize middleware. */
      user?: IUser;
      /** Parsed body, query and params, set by the validate middleware. */
      valid?: { body: unknown; query: unknown; params: unknown };
    }
  }
}
