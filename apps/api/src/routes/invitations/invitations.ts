import { Router } from 'express';
import { attemptLimiter, type AttemptLimitOptions } from '../../middleware/rateLimit';
import { validate } from '../../middleware/validate';
import { currentUser, requireUser } from '../../middleware/session';
import { conflict } from '../../lib/errors';
import { presentUser } from '../../presenters/user';
import type { ServiceContext } from '../../services/context';
import * as clubs from '../../services/clubs';
import { InvitationAcceptSchema, InvitationLookupSchema, InvitationSignUpSchema } from './schema';

/**
 * Following an invitation link. The token travels in the body (never in a URL that ends up in
 * logs); lookups and sign-ups are rate limited like the auth routes.
 */
export function invitationsRouter(ctx: ServiceContext, options: { rateLimit: AttemptLimitOptions }) {
  const router = Router();
  const limiter = attemptLimiter('invitations', options.rateLimit);

  router.post('/lookup', limiter, validate({ body: InvitationLookupSchema }), async (req, res) => {
    res.json({ invitation: await clubs.previewInvitation(ctx, req.body.token) });
  });

  router.post('/accept', requireUser, validate({ body: InvitationAcceptSchema }), async (req, res) => {
    res.json({ club: await clubs.acceptInvitation(ctx, currentUser(req), req.body.token) });
  });

  router.post('/sign-up', limiter, validate({ body: InvitationSignUpSchema }), async (req, res) => {
    if (req.auth) throw conflict('signed_in', 'You are signed in already: accept the invitation instead');
    const { user, session, clubId } = await clubs.signUpThroughInvitation(ctx, req.body);
    res.append('Set-Cookie', ctx.lucia.createSessionCookie(session.id).serialize());
    res.status(201).json({ user: presentUser(user), clubId });
  });

  return router;
}
