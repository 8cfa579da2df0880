import { Router } from 'express';
import { attemptLimiter, type AttemptLimitOptions } from '../../middleware/rateLimit';
import { validate } from '../../middleware/validate';
import { requireUser } from '../../middleware/session';
import { presentUser } from '../../presenters/user';
import * as auth from '../../services/auth';
import type { ServiceContext } from '../../services/context';
import { findUserById } from '../../db/queries/users';
import { notFound } from '../../lib/errors';
import { AuthSignInSchema, AuthSignUpSchema, PasswordResetConfirmSchema, PasswordResetRequestSchema } from './schema';

export function authRouter(ctx: ServiceContext, options: { rateLimit: AttemptLimitOptions }) {
  const router = Router();
  const limiter = attemptLimiter('auth', options.rateLimit);

  router.post('/sign-up', limiter, validate({ body: AuthSignUpSchema }), async (req, res) => {
    const { user, session } = await auth.signUp(ctx, req.body);
    res.append('Set-Cookie', ctx.lucia.createSessionCookie(session.id).serialize());
    res.status(201).json({ user: presentUser(user) });
  });

  router.post('/sign-in', limiter, validate({ body: AuthSignInSchema }), async (req, res) => {
    const { user, session } = await auth.signIn(ctx, req.body, req.auth?.session.id);
    res.append('Set-Cookie', ctx.lucia.createSessionCookie(session.id).serialize());
    res.json({ user: presentUser(user) });
  });

  router.post('/sign-out', requireUser, async (req, res) => {
    await auth.signOut(ctx, req.auth!.session.id);
    res.append('Set-Cookie', ctx.lucia.createBlankSessionCookie().serialize());
    res.status(204).end();
  });

  router.get('/me', requireUser, async (req, res) => {
    const user = await findUserById(ctx.db, req.auth!.user.id);
    if (!user) throw notFound('Your account');
    res.json({ user: presentUser(user) });
  });

  router.post('/password-reset/request', limiter, validate({ body: PasswordResetRequestSchema }), async (req, res) => {
    await auth.requestPasswordReset(ctx, req.body.email);
    res.status(202).json({ ok: true });
  });

  router.post('/password-reset/confirm', limiter, validate({ body: PasswordResetConfirmSchema }), async (req, res) => {
    await auth.confirmPasswordReset(ctx, req.body);
    res.append('Set-Cookie', ctx.lucia.createBlankSessionCookie().serialize());
    res.status(204).end();
  });

  return router;
}
