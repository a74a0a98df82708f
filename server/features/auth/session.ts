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

/** The claims of a valid, unexpired session cookie, or null. */
export function readSession(req: Request, deps: AppDeps): { userId: number; version: number } | null {
  const token: unknown = req.cookies?.[sessionCookie];
  if (typeof token !== 'string' || token === '') return null;
  try {
    const claims = jwt.verify(token, deps.secret, {
      algorithms: ['HS256'],
      clockTimestamp: Math.floor(deps.clock.now().getTime() / 1000),
    });
    // A token without an expiry would be good forever: refused, even when correctly signed.
    if (typeof claims !== 'object' || typeof claims.sub !== 'string' || typeof claims.v !== 'number' || typeof claims.exp !== 'number') return null;
    const userId = Number(claims.sub);
    return Number.isInteger(userId) ? { userId, version: claims.v } : null;
  } catch {
    return null;
  }
}
