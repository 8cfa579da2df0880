import type { RequestHandler } from 'express';
import type { Caches } from '../cache/caches';

const READS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * A request that may have written answers only once this process holds nothing its write made
 * stale. By default it awaits `Caches.fence` — this process has heard every cache notification
 * committed before the answer — so whoever asks next, the writer or anyone the change concerns, is
 * served what the database holds. A route that only ever changes the signed-in person's own data
 * says so with `ownChangesOnly`: then this process drops that person's cached session and library
 * pages itself, at once, without the round trip (other processes hear the notification as usual).
 * The answer is held back by wrapping `res.end`, the one call every Express answer ends with.
 */
export function cacheFence(caches: Caches | undefined): RequestHandler {
  return (req, res, next) => {
    if (!caches || READS.has(req.method)) return next();
    const end = res.end.bind(res) as (...args: unknown[]) => typeof res;
    res.end = ((...args: unknown[]) => {
      const userId = req.auth?.user.id;
      if (res.locals.cacheScope === 'own' && userId) {
        caches.dropPerson(userId);
        return end(...args);
      }
      void caches.fence().finally(() => end(...args));
      return res;
    }) as typeof res.end;
    next();
  };
}

/** Marks a route whose writes touch only the signed-in person's own records (see `cacheFence`). */
export const ownChangesOnly: RequestHandler = (_req, res, next) => {
  res.locals.cacheScope = 'own';
  next();
};
