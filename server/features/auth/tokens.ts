import { createHash, randomBytes } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { UserToken, type IUserToken, type TokenKind } from '../../db/entities.ts';
import type { Clock } from '../../context.ts';

export const inviteValidDays = 7;
export const resetValidMinutes = 60;

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

/** Issues a single-use token (32 random bytes, base64url); only its hash is stored. */
export function issueToken(em: EntityManager, clock: Clock, options: { userId: number; kind: TokenKind; validMs: number }): string {
  const token = randomBytes(32).toString('base64url');
  const now = clock.now();
  em.create(UserToken, {
    userId: options.userId,
    kind: options.kind,
    tokenHash: hashToken(token),
    createdAt: now,
    expiresAt: new Date(now.getTime() + options.validMs),
    usedAt: null,
  });
  return token;
}

/** The unused, unexpired token of that kind, or null. */
export async function findLiveToken(em: EntityManager, clock: Clock, token: string, kind: TokenKind): Promise<IUserToken | null> {
  const found = await em.findOne(UserToken, { tokenHash: hashToken(token), kind });
  if (!found || found.usedAt || found.expiresAt.getTime() <= clock.now().getTime()) return null;
  return found;
}

/** Marks every live token of that kind for the user as used (after one is redeemed, or a new one is issued). */
export async function retireTokens(em: EntityManager, clock: Clock, userId: number, kind: TokenKind): Promise<void> {
  const live = await em.find(UserToken, { userId, kind, usedAt: null });
  for (const t of live) t.usedAt = clock.now();
}

/**
 * Redeems a single-use token: marks it used in one conditional update before anything else happens,
 * so of several requests racing with the same link exactly one gets the token. Null when it was
 * unknown, used or expired.
 */
export async function redeemToken(em: EntityManager, clock: Clock, token: string, kind: TokenKind): Promise<IUserToken | null> {
  const now = clock.now();
  const tokenHash = hashToken(token);
  const taken = await em.nativeUpdate(UserToken, { tokenHash, kind, usedAt: null, expiresAt: { $gt: now } }, { usedAt: now });
  if (taken !== 1) return null;
  return em.findOne(UserToken, { tokenHash, kind });
}
