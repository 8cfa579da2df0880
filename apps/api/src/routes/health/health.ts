import { Router } from 'express';
import { sql } from 'drizzle-orm';
import type { Db } from '../../db/client';

export function healthRouter(db: Db) {
  const router = Router();
  router.get('/', async (_req, res) => {
    await db.execute(sql`select 1`);
    res.json({ ok: true });
  });
  return router;
}
