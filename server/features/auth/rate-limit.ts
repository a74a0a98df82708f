import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import type { RequestHandler } from 'express';
import type { RateLimitOptions } from '../../context.ts';
import { rateLimited } from '../../errors.ts';

/**
 * Limits attempts per client address and e-mail address, so one guessed account cannot be
 * hammered and one office behind a NAT does not lock everybody out. Successful requests do not count.
 */
export function limitByAddressAndEmail(options: RateLimitOptions): RequestHandler {
  return rateLimit({
    windowMs: options.windowMs,
    limit: options.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    skipSuccessfulRequests: true,
    keyGenerator: (req) => {
      const body: unknown = req.body;
      const email = typeof body === 'object' && body !== null && 'email' in body && typeof body.email === 'string' ? body.email : '';
      return `${ipKeyGenerator(req.ip ?? '')}|${email.trim().toLowerCase()}`;
    },
    handler: (_req, _res, next) => {
      next(rateLimited(`Too many attempts; try again in ${Math.ceil(options.windowMs / 60_000)} minutes`));
    },
  });
}
