import jwt from 'jsonwebtoken';
import type { Request, Response } from 'express';
import type { IUser } from '../../db/entities.ts';
import type { AppDeps } from '../../context.ts';

export const sessionCookie = 'parley_session';
export const sessionHours = 12;

interface SessionClaims {
  sub: string;
  /** The user's sessionVersion when signed; a password reset bumps it and ends older sessions. */
  v: number;
}

export function startSession(res: Response, user: IUser, deps: AppDeps): void {
  const iat = Math.floor(deps.clock.now().getTime() / 1000);
  const claims: SessionClaims & { iat: number } = { sub: String(user.id), v: user.sessionVersion, iat };
  const token = jwt.sign(claims, deps.secret, { algorithm: 'HS256', expiresIn: sessionHours * 3600 });
  res.cookie(sessionCookie, token, {
    httpOnly: true,
    sameSite: 'lax',
    secure: deps.production,
    path: '/',
    maxAge: sessionHours * 3_600_000,
  });
}

export function endSession(res: Response, deps: AppDeps): void {
  res.clearCookie(sessionCookie, { httpOnly: true, sameSite: 'lax', secure: deps.production, path: '/' });
}

interface VerifiedSession {
  userId: number;
  version: number;
  expiresAtS: number;
}

/**
 * Cookies whose signature this app already checked, with what they say. A cookie's claims are a
 * function of its text and the secret alone, so checking it again on every request (an HMAC and a
 * key object each time) buys nothing; the expiry is still compared with the clock on every request,
 * and revocation lives in the user row, which is read every time. Only valid cookies are kept.
 */
const verifiedSessions = new WeakMap<AppDeps, Map<string, VerifiedSession>>();
const VERIFIED_SESSIONS_KEPT = 10_000;

/** The claims of a valid, unexpired session cookie, or null. */
export function readSession(req: Request, deps: AppDeps): { userId: number; version: number } | null {
  const token: unknown = req.cookies?.[sessionCookie];
  if (typeof token !== 'string' || token === '') return null;
  const nowS = Math.floor(deps.clock.now().getTime() / 1000);
  let verified = verifiedSessions.get(deps);
  if (!verified) {
    verified = new Map();
    verifiedSessions.set(deps, verified);
  }
  const known = verified.get(token);
  if (known) return nowS < known.expiresAtS ? { userId: known.userId, version: known.version } : null;
  const session = verifySession(token, deps, nowS);
  if (session) {
    // Oldest first out: a Map keeps insertion order.
    if (verified.size >= VERIFIED_SESSIONS_KEPT) verified.delete(verified.keys().next().value as string);
    verified.set(token, session);
  }
  return session ? { userId: session.userId, version: session.version } : null;
}

function verifySession(token: string, deps: AppDeps, nowS: number): VerifiedSession | null {
  try {
    const claims = jwt.verify(token, deps.secret, {
      algorithms: ['HS256'],
      clockTimestamp: nowS,
    });
    // A token without an expiry would be good forever: refused, even when correctly signed.
    if (typeof claims !== 'object' || typeof claims.sub !== 'string' || typeof claims.v !== 'number' || typeof claims.exp !== 'number') return null;
    const userId = Number(claims.sub);
    return Number.isInteger(userId) ? { userId, version: claims.v, expiresAtS: claims.exp } : null;
  } catch {
    return null;
  }
}
