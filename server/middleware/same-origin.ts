/**
 * Cross-site request forgery: a page elsewhere (even another port of the same host) can make the
 * browser send a form, multipart included, with the session cookie. Every state-changing request
 * signed in by cookie must come from our own origin: `Sec-Fetch-Site` when the browser sends it
 * (Fetch Metadata: `same-origin`, or `none` for one the user typed), else `Origin`. A request with
 * neither header is not from a browser page (scripts, CI) and passes; bearer-token requests carry
 * no cookie and pass too.
 */
import type { Request, RequestHandler } from 'express';
import { forbidden } from '../errors.ts';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

function ownOrigins(req: Request, publicUrl: string): Set<string> {
  const origins = new Set<string>([`${req.protocol}://${req.get('host') ?? ''}`]);
  try {
    origins.add(new URL(publicUrl).origin);
  } catch {
    // publicUrl is validated at start-up; a test may pass a bare string.
  }
  return origins;
}

export function sameOriginWrites(publicUrl: string): RequestHandler {
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method) || /^Bearer\s/i.test(req.get('authorization') ?? '')) return next();
    const site = req.get('sec-fetch-site');
    if (site !== undefined) {
      if (site === 'same-origin' || site === 'none') return next();
      throw forbidden('This request came from another site; reload Parley and try again', 'request.cross-site');
    }
    const origin = req.get('origin');
    if (origin !== undefined && !ownOrigins(req, publicUrl).has(origin)) {
      throw forbidden('This request came from another site; reload Parley and try again', 'request.cross-site');
    }
    next();
  };
}
