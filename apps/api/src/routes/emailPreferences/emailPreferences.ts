import { Router } from 'express';
import { validate } from '../../middleware/validate';
import type { ServiceContext } from '../../services/context';
import { getEmailPreferences, setEmailDelivery } from '../../services/notifications';
import { EmailPreferencesUpdateSchema, EmailTokenParamsSchema } from '../notifications/schema';

const token = (req: { params: unknown }) => (req.params as { token: string }).token;

/** E-mail delivery by the secret link in every reminder e-mail: no sign-in, the token is the key. */
export function emailPreferencesRouter(ctx: ServiceContext) {
  const router = Router();
  router.get('/:token', validate({ params: EmailTokenParamsSchema }), async (req, res) => {
    res.json({ preferences: await getEmailPreferences(ctx, token(req)) });
  });
  router.patch(
    '/:token',
    validate({ params: EmailTokenParamsSchema, body: EmailPreferencesUpdateSchema }),
    async (req, res) => {
      res.json({ preferences: await setEmailDelivery(ctx, token(req), req.body.emailDelivery) });
    },
  );
  return router;
}

/**
 * One-click unsubscribe (RFC 8058): mail providers POST here without cookies or an Origin header,
 * so it is mounted before the Origin check. The secret token is the only authority, and the only
 * effect is to stop reminder e-mail.
 */
export function oneClickUnsubscribeRouter(ctx: ServiceContext) {
  const router = Router();
  router.post('/:token/unsubscribe', validate({ params: EmailTokenParamsSchema }), async (req, res) => {
    res.json({ preferences: await setEmailDelivery(ctx, token(req), 'none') });
  });
  return router;
}
