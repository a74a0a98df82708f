/**
 * CI API tokens: `prl_` + 32 random bytes (base64url), stored as their SHA-256 only. A token
 * stands for its project and grants exactly one route, `POST /api/runs`: on any other route the
 * verifier answers 403 before the route's own checks, so a leaked CI token cannot read or change
 * anything. A revoked or unknown token is 401.
 */
import { createHash, randomBytes } from 'node:crypto';
import type { Request } from 'express';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import type { IUser } from '../../db/entities.ts';
import { ApiToken, type IApiToken } from '../../db/library-entities.ts';
import type { BearerVerifier } from '../../context.ts';
import { forbidden } from '../../errors.ts';

export const TOKEN_PREFIX = 'prl_';
/** The only route a token opens. */
export const TOKEN_ROUTE = { method: 'POST', path: '/api/runs' } as const;

export function newToken(): string {
  return `${TOKEN_PREFIX}${randomBytes(32).toString('base64url')}`;
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

const tokensOfRequests = new WeakMap<Request, IApiToken>();

/** The API token a request was authorised with, if any. */
export function tokenOf(req: Request): IApiToken | undefined {
  return tokensOfRequests.get(req);
}

function pathOf(req: Request): string {
  return (req.originalUrl.split('?')[0] ?? '').replace(/\/+$/, '') || '/';
}

/** The caller a token stands for: a QA-role stand-in, never a real account (id 0, no password). */
function tokenUser(token: IApiToken): IUser {
  return {
    id: 0,
    email: `token-${token.id}@tokens.invalid`,
    name: `CI token "${token.name}"`,
    role: 'qa',
    passwordHash: null,
    active: true,
    invitePending: false,
    sessionVersion: 0,
    createdAt: token.createdAt,
    lastSignInAt: null,
  } as IUser;
}

export const verifyApiToken: BearerVerifier = async (token: string, em: EntityManager, req: Request) => {
  if (!token.startsWith(TOKEN_PREFIX) || token.length > 200) return null;
  const row = await em.findOne(ApiToken, { tokenHash: hashToken(token), revokedAt: null });
  if (!row) return null;
  if (req.method !== TOKEN_ROUTE.method || pathOf(req) !== TOKEN_ROUTE.path) {
    throw forbidden('An API token may only post test results (POST /api/runs); sign in for everything else', 'token.out-of-scope');
  }
  await em.nativeUpdate(ApiToken, { id: row.id }, { lastUsedAt: new Date() });
  tokensOfRequests.set(req, row);
  return tokenUser(row);
};
