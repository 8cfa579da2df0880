import { Router } from 'express';
import { ownChangesOnly } from '../../middleware/cacheFence';
import { validate } from '../../middleware/validate';
import { currentUser, requireUser } from '../../middleware/session';
import { presentUser } from '../../presenters/user';
import { changePassword, updateAccount } from '../../services/account';
import type { ServiceContext } from '../../services/context';
import { AccountPasswordChangeSchema, AccountUpdateSchema } from './schema';

export function accountRouter(ctx: ServiceContext) {
  const router = Router();
  // every write here changes only the signed-in person's own records (middleware/cacheFence.ts)
  router.use(ownChangesOnly);
  router.use(requireUser);
  router.patch('/', validate({ body: AccountUpdateSchema }), async (req, res) => {
    const user = await updateAccount(ctx, currentUser(req).id, req.body);
    res.json({ user: presentUser(user) });
  });
  router.post('/password', validate({ body: AccountPasswordChangeSchema }), async (req, res) => {
    const session = await changePassword(ctx, currentUser(req).id, req.body);
    res.append('Set-Cookie', ctx.lucia.createSessionCookie(session.id).serialize());
    res.status(204).end();
  });
  return router;
}
