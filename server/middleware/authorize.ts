import type { RequestHandler, Request } from 'express';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { User, type IUser } from '../db/entities.ts';
import type { AppDeps } from '../context.ts';
import type { Access } from '../route-def.ts';
import { forbidden, unauthorized } from '../errors.ts';
import { readSession } from '../features/auth/session.ts';

/**
 * Who is calling: a bearer token when the request carries one (and the app has a verifier),
 * else the session cookie. The user is read from the database on every request, so a
 * deactivation or a password reset ends existing sessions at once.
 */
async function identify(req: Request, deps: AppDeps, em: EntityManager): Promise<IUser | null> {
  const bearer = /^Bearer\s+(\S+)$/i.exec(req.get('authorization') ?? '');
  if (bearer) {
    if (!deps.verifyBearer) throw unauthorized('This server does not accept API tokens; sign in instead', 'token.not-accepted');
    const user = await deps.verifyBearer(bearer[1]!, em, req);
    if (!user?.active) throw unauthorized('The API token is not valid', 'token.invalid');
    return user;
  }
  const session = readSession(req, deps);
  if (!session) return null;
  const user = await em.findOne(User, { id: session.userId });
  if (!user?.active || user.invitePending || user.sessionVersion !== session.version) return null;
  return user;
}

/** The role check every route passes through: 401 without a session, 403 when the role is not allowed. */
export function authorize(access: Access, deps: AppDeps, em: () => EntityManager): RequestHandler {
  return async (req, res, next) => {
    const user = await identify(req, deps, em());
    if (user) res.locals.user = user;
    if (access === 'anyone') return next();
    if (!user) throw unauthorized();
    if (access !== 'signed-in' && !access.includes(user.role)) {
      throw forbidden(`This needs one of the roles ${access.join(', ')}; you are ${user.role}`);
    }
    next();
  };
}
