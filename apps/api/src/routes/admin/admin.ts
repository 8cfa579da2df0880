import { Router } from 'express';
import { validate } from '../../middleware/validate';
import { requireAdmin } from '../../middleware/session';
import { presentUser } from '../../presenters/user';
import { listUsers } from '../../db/queries/users';
import type { ServiceContext } from '../../services/context';
import { AdminUserListSchema, type AdminUserListQuery } from './schema';

/** Site administration: only the site `admin` role gets past the router's guard. */
export function adminRouter(ctx: ServiceContext) {
  const router = Router();
  router.use(requireAdmin);
  router.get('/users', validate({ query: AdminUserListSchema }), async (req, res) => {
    const query = req.query as unknown as AdminUserListQuery;
    const rows = await listUsers(ctx.db, query);
    res.json({ users: rows.map(presentUser) });
  });
  return router;
}
