/**
 * The limits on anonymous routes. Each limit is a counter under a key (client address, e-mail
 * address, or both) in a store that `deps.rateLimitStore` can replace with one shared by every
 * instance; the default keeps counts in this process.
 */
import { rateLimit, ipKeyGenerator, MemoryStore, type Store } from 'express-rate-limit';
import type { Request, RequestHandler } from 'express';
import type { AppDeps, RateLimitOptions } from '../../context.ts';
import { rateLimited } from '../../errors.ts';

/** A store per limit (the name keeps counters of different limits apart in a shared store). */
export type RateLimitStoreFactory = (name: string) => Store;

export const memoryRateLimitStore: RateLimitStoreFactory = () => new MemoryStore();

const emailOf = (req: Request): string => {
  const body: unknown = req.body;
  return typeof body === 'object' && body !== null && 'email' in body && typeof body.email === 'string' ? body.email.trim().toLowerCase() : '';
};
const addressOf = (req: Request): string => ipKeyGenerator(req.ip ?? '');

type KeyOf = 'address' | 'email' | 'address+email';
const keyers: Record<KeyOf, (req: Request) => string> = {
  address: addressOf,
  email: emailOf,
  'address+email': (req) => `${addressOf(req)}|${emailOf(req)}`,
};

/** One limiter: `count` says whether every request counts or only those that fail (4xx/5xx). */
export function limiter(deps: Pick<AppDeps, 'rateLimitStore'>, name: string, options: RateLimitOptions, key: KeyOf, count: 'all' | 'failures'): RequestHandler {
  return rateLimit({
    windowMs: options.windowMs,
    limit: options.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    skipSuccessfulRequests: count === 'failures',
    store: deps.rateLimitStore(name),
    keyGenerator: keyers[key],
    handler: (_req, _res, next) => {
      next(rateLimited(`Too many attempts; try again in ${Math.ceil(options.windowMs / 60_000)} minutes`));
    },
  });
}

/**
 * Sign-in: failures per client and account (one guessed account cannot be hammered, one office
 * behind a NAT is not locked out), per client address across accounts (a flood of new e-mails),
 * and per account across addresses (password spraying from many clients).
 */
export function signInLimits(deps: Pick<AppDeps, 'rateLimitStore' | 'rateLimits'>): RequestHandler[] {
  const { login, loginPerAddress, loginPerAccount } = deps.rateLimits;
  return [
    limiter(deps, 'login:address', loginPerAddress, 'address', 'failures'),
    limiter(deps, 'login:account', loginPerAccount, 'email', 'failures'),
    limiter(deps, 'login:address+account', login, 'address+email', 'failures'),
  ];
}

/** Forgot-password answers 202 whatever happens, so every request counts: per address and per client. */
export function forgotLimits(deps: Pick<AppDeps, 'rateLimitStore' | 'rateLimits'>): RequestHandler[] {
  const { forgot, forgotPerAddress } = deps.rateLimits;
  return [limiter(deps, 'forgot:address', forgotPerAddress, 'address', 'all'), limiter(deps, 'forgot:account', forgot, 'email', 'all')];
}
