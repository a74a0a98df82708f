/**
 * The fast path of kept answers (server/http/kept-answers.ts). A GET of a route with `keep`, signed
 * in by cookie, is answered here when its answer is kept: the same role check (`identify`, `allows`)
 * and the same validation as the route's own path, then the route's key, then the kept bytes,
 * without the rest of the middleware stack (compression, the request's entity manager, the body
 * parser, the walk through every route). Everything else (no kept answer yet, signed out, a role
 * not allowed, bad input, a bearer token, an error anywhere) goes on to the normal path, which
 * answers it, errors included, and keeps what it computes. So this path only ever answers what the
 * normal path would have answered at the same moment.
 */
import { Router, type RequestHandler } from 'express';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import type { AppDeps } from '../context.ts';
import type { RouteDef } from '../route-def.ts';
import { keptAnswer, keptKey, sendKept } from '../http/kept-answers.ts';
import { allows, identify } from './authorize.ts';
import { validateInput } from './validate.ts';

function fastPath(def: RouteDef, deps: AppDeps, em: EntityManager): RequestHandler {
  return async (req, res, next) => {
    // HEAD reaches GET routes too; bearer tokens are checked by the normal path.
    if (req.method !== 'GET' || req.headers.authorization !== undefined || !def.keep) return next();
    try {
      const user = await identify(req, deps, em);
      if (!user || !allows(def.access, user)) return next();
      const outcome = validateInput({ query: def.query, params: def.params }, req);
      if ('error' in outcome) return next();
      const key = await def.keep({ query: outcome.valid.query, params: outcome.valid.params, em, deps });
      const kept = key === null ? undefined : keptAnswer(em.config, keptKey(def, key));
      if (!kept) return next();
      sendKept(req, res, em.config, kept);
    } catch {
      next();
    }
  };
}

/** A router of the kept routes' fast paths; mount it after the security headers and the cookie parser. */
export function keptReads(routes: readonly RouteDef[], deps: AppDeps, em: EntityManager): Router {
  const router = Router();
  for (const def of routes) if (def.method === 'get' && def.keep) router.get(def.path, fastPath(def, deps, em));
  return router;
}
