import type { Request, RequestHandler, Response } from 'express';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import type { z } from 'zod';
import type { IUser, Role } from './db/entities.ts';
import type { AppDeps } from './context.ts';
import { unauthorized } from './errors.ts';

export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** Who may call a route: anybody, any signed-in user, or signed-in users with one of the roles. */
export type Access = 'anyone' | 'signed-in' | readonly Role[];

export interface RouteContext<B, Q, P> {
  req: Request;
  res: Response;
  body: B;
  query: Q;
  params: P;
  /** The signed-in user, or null on an `anyone` route called without a session. */
  user: IUser | null;
  /** This request's entity manager (a MikroORM RequestContext fork). */
  em: EntityManager;
  deps: AppDeps;
}

/** What a route's `keep` may read: never the user, so a kept answer is the same for everyone allowed to ask. */
export interface KeepContext<Q, P> {
  query: Q;
  params: P;
  /** An entity manager for plain reads (`sqlReads`); on the fast path, the ORM's root one. */
  em: EntityManager;
  deps: AppDeps;
}

/**
 * One API route. The handler returns the JSON body (status 200 unless it set another with
 * `ctx.res.status(…)`), or undefined for 204; it may also answer through `ctx.res` itself.
 */
export interface RouteDef<B = unknown, Q = unknown, P = unknown> {
  method: HttpMethod;
  /** Express path under the app root, e.g. `/api/devices/:id`. */
  path: string;
  access: Access;
  body?: z.ZodType<B>;
  query?: z.ZodType<Q>;
  params?: z.ZodType<P>;
  /** Extra middleware (rate limits, upload parsers), built once per app; runs after the role check, before validation. */
  middleware?: (deps: AppDeps) => RequestHandler[];
  handler(ctx: RouteContext<B, Q, P>): Promise<unknown>;
  /**
   * A GET whose answer is a function of data that carries a version: the key its 200 answer is kept
   * under, serialised (server/http/kept-answers.ts), or null to answer afresh. The key must change
   * whenever the answer would (read the version, e.g. `libraryVersion`, not the data). Runs after
   * the role check and validation, on the normal path and on the kept-reads fast path
   * (server/middleware/kept-reads.ts); when it throws, the normal path answers.
   */
  keep?(ctx: KeepContext<Q, P>): Promise<string | null>;
}

/** Keeps the schema types flowing into the handler; the result fits in any `RouteDef[]`. */
export function route<B = undefined, Q = undefined, P = undefined>(def: RouteDef<B, Q, P>): RouteDef {
  return def as RouteDef;
}

/** The signed-in user of a route whose access is not `anyone`. */
export function currentUser(ctx: { user: IUser | null }): IUser {
  if (!ctx.user) throw unauthorized();
  return ctx.user;
}
