import type { RequestHandler, Request } from 'express';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import type { IUser, Role } from '../db/entities.ts';
import { booleanOf, dateOf, dateOrNull, sqlReads } from '../db/reads.ts';
import type { AppDeps } from '../context.ts';
import type { Access } from '../route-def.ts';
import { forbidden, unauthorized } from '../errors.ts';
import { readSession } from '../features/auth/session.ts';

interface UserRow {
  id: number;
  email: string;
  name: string;
  role: Role;
  password_hash: string | null;
  active: unknown;
  invite_pending: unknown;
  session_version: number;
  created_at: unknown;
  last_sign_in_at: unknown;
}

/**
 * The session's user as a plain object (one prepared read, no entity tracked): a handler that
 * changes the account loads it through its entity manager (sign-out does).
 */
async function sessionUser(em: EntityManager, userId: number): Promise<IUser | null> {
  const row = await sqlReads(em).get<UserRow>('select id, email, name, role, password_hash, active, invite_pending, session_version, created_at, last_sign_in_at from "user" where id = ?', [userId]);
  if (!row) return null;
  return {
    id: Number(row.id),
    email: row.email,
    name: row.name,
    role: row.role,
    passwordHash: row.password_hash,
    active: booleanOf(row.active),
    invitePending: booleanOf(row.invite_pending),
    sessionVersion: Number(row.session_version),
    createdAt: dateOf(row.created_at),
    lastSignInAt: dateOrNull(row.last_sign_in_at),
  } as IUser;
}

/**
 * Who is calling: a bearer token when the request carries one (and the app has a verifier),
 * else the session cookie. The user is read from the database on every request (no cache), so a
 * sign-out, a deactivation or a password reset ends existing sessions at once, on every instance.
 */
export async function identify(req: Request, deps: AppDeps, em: EntityManager): Promise<IUser | null> {
  const bearer = /^Bearer\s+(\S+)$/i.exec(req.get('authorization') ?? '');
  if (bearer) {
    if (!deps.verifyBearer) throw unauthorized('This server does not accept API tokens; sign in instead', 'token.not-accepted');
    const user = await deps.verifyBearer(bearer[1]!, em, req);
    if (!user?.active) throw unauthorized('The API token is not valid', 'token.invalid');
    return user;
  }
  const session = readSession(req, deps);
  if (!session) return null;
  const user = await sessionUser(em, session.userId);
  if (!user?.active || user.invitePending || user.sessionVersion !== session.version) return null;
  return user;
}

/** Whether the caller (null: signed out) may call a route with this access. */
export function allows(access: Access, user: IUser | null): boolean {
  if (access === 'anyone') return true;
  if (!user) return false;
  return access === 'signed-in' || access.includes(user.role);
}

/** The role check every route passes through: 401 without a session, 403 when the role is not allowed. */
export function authorize(access: Access, deps: AppDeps, em: () => EntityManager): RequestHandler {
  return async (req, res, next) => {
    const user = await identify(req, deps, em());
    if (user) res.locals.user = user;
    if (allows(access, user)) return next();
    if (!user) throw unauthorized();
    throw forbidden(`This needs one of the roles ${(access as readonly string[]).join(', ')}; you are ${user.role}`);
  };
}
