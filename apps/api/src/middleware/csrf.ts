import type { RequestHandler } from 'express';
import { forbidden } from '../lib/errors';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * State-changing requests must come from our own origin: the Origin header (or, failing that,
 * Referer) must match the host the request was sent to or an allowed origin.
 */
export function originCheck(allowedOrigins: string[]): RequestHandler {
  const allowed = new Set(allowedOrigins.map((o) => o.replace(/\/$/, '')));
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next();
    let origin = req.get('origin');
    if (!origin) {
      const referer = req.get('referer');
      if (referer) {
        try {
          origin = new URL(referer).origin;
        } catch {
          origin = undefined;
        }
      }
    }
    if (!origin) return next(forbidden('This request did not say where it came from; reload the page and try again'));
    let host: string;
    try {
      host = new URL(origin).host;
    } catch {
      return next(forbidden('Cross-site request refused'));
    }
    if (allowed.has(origin) || host === req.get('host')) return next();
    next(forbidden('Cross-site request refused'));
  };
}
