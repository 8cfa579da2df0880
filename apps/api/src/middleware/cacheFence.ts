import type { RequestHandler } from 'express';
import type { Caches } from '../cache/caches';

const READS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * A request that may have written answers only after this process has heard every cache
 * notification committed before the answer (`Caches.fence`): whoever asks next — the same person
 * reloading their library, or someone their change concerns — is served what the database holds.
 * The answer is held back by wrapping `res.end`, the one call every Express answer ends with.
 */
export function cacheFence(caches: Caches | undefined): RequestHandler {
  return (req, res, next) => {
    if (!caches || READS.has(req.method)) return next();
    const end = res.end.bind(res) as (...args: unknown[]) => typeof res;
    res.end = ((...args: unknown[]) => {
      void caches.fence().finally(() => end(...args));
      return res;
    }) as typeof res.end;
    next();
  };
}
