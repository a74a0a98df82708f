import { Router } from 'express';
import { RequestContext } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import type { AppDeps } from './context.ts';
import type { RouteDef } from './route-def.ts';
import { authorize } from './middleware/authorize.ts';
import { validate } from './middleware/validate.ts';
import { keepAnswer, keptAnswer, keptKey, sendKept } from './http/kept-answers.ts';
import { healthRoutes } from './features/health/routes.ts';
import { authRoutes } from './features/auth/routes.ts';
import { usersRoutes } from './features/users/routes.ts';
import { outboxRoutes } from './features/outbox/routes.ts';
import { auditRoutes } from './features/audit/routes.ts';
import { devicesRoutes } from './features/devices/routes.ts';
import { tracesRoutes } from './features/traces/routes.ts';
import { shareLinkRoutes } from './features/traces/share-links.ts';
import { importMappingRoutes } from './features/import-mappings/routes.ts';
import { vectorsRoutes } from './features/vectors/routes.ts';
import { runsRoutes } from './features/runs/routes.ts';
import { tokensRoutes } from './features/tokens/routes.ts';
import { propertiesRoutes } from './features/properties/routes.ts';

/** Every API route. A feature adds its `RouteDef[]` here; the role-matrix test walks this list. */
export const routeTable: RouteDef[] = [
  ...healthRoutes,
  ...authRoutes,
  ...usersRoutes,
  ...outboxRoutes,
  ...auditRoutes,
  ...devicesRoutes,
  ...tracesRoutes,
  ...shareLinkRoutes,
  ...importMappingRoutes,
  ...vectorsRoutes,
  ...runsRoutes,
  ...tokensRoutes,
  ...propertiesRoutes,
];

/** This request's entity manager (the RequestContext fork the app opened for it). */
function requestEm(): EntityManager {
  const em = RequestContext.getEntityManager();
  if (!em) throw new Error('no MikroORM RequestContext for this request');
  return em as EntityManager;
}

/**
 * The only way a route reaches Express: role check, then the route's own middleware, then
 * validation, then the handler. There is no path that skips `authorize`.
 */
export function buildApiRouter(routes: readonly RouteDef[], deps: AppDeps): Router {
  const router = Router();
  for (const def of routes) {
    router[def.method](def.path, authorize(def.access, deps, requestEm), ...(def.middleware?.(deps) ?? []), validate({ body: def.body, query: def.query, params: def.params }), async (req, res) => {
      const valid = res.locals.valid ?? { body: undefined, query: undefined, params: undefined };
      const em = requestEm();
      const key = def.keep ? await def.keep({ query: valid.query, params: valid.params, em, deps }) : null;
      const keyed = key === null ? null : keptKey(def, key);
      const kept = keyed === null ? undefined : keptAnswer(em.config, keyed);
      if (kept) return sendKept(req, res, em.config, kept);
      const result = await def.handler({ req, res, body: valid.body, query: valid.query, params: valid.params, user: res.locals.user ?? null, em, deps });
      if (res.headersSent) return;
      if (result === undefined) res.status(204).end();
      else if (keyed !== null && res.statusCode === 200) sendKept(req, res, em.config, keepAnswer(em.config, keyed, result));
      else res.json(result);
    });
  }
  return router;
}
