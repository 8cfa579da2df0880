import type { RequestHandler } from 'express';
import type { Session, User } from 'lucia';
import type { AppLucia } from '../services/lucia';
import { forbidden, unauthenticated } from '../lib/errors';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      auth?: { user: User; session: Session };
    }
  }
}

/** Reads the session cookie; slides the expiry (lucia marks a refreshed session `fresh`). */
export function sessionMiddleware(lucia: AppLucia): RequestHandler {
  return async (req, res, next) => {
    const sessionId = lucia.readSessionCookie(req.headers.cookie ?? '');
    if (!sessionId) return next();
    const { session, user } = await lucia.validateSession(sessionId);
    if (!session) {
      res.append('Set-Cookie', lucia.createBlankSessionCookie().serialize());
      return next();
    }
    if (session.fresh) res.append('Set-Cookie', lucia.createSessionCookie(session.id).serialize());
    req.auth = { user, session };
    next();
  };
}

export const requireUser: RequestHandler = (req, _res, next) => {
  if (!req.auth) return next(unauthenticated());
  next();
};

export const requireAdmin: RequestHandler = (req, _res, next) => {
  if (!req.auth) return next(unauthenticated());
  if (req.auth.user.role !== 'admin') return next(forbidden());
  next();
};

/** The signed-in user; only call after requireUser. */
export function currentUser(req: Express.Request): User {
  if (!req.auth) throw unauthenticated();
  return req.auth.user;
}
