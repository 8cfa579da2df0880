import { Router } from 'express';
import { ownChangesOnly } from '../../middleware/cacheFence';
import { validate } from '../../middleware/validate';
import { currentUser, requireUser } from '../../middleware/session';
import type { ServiceContext } from '../../services/context';
import { getEquipment, saveEquipment } from '../../services/planning';
import { EquipmentUpdateSchema } from './schema';

/** The starter kit on the account: GET /api/account/equipment, PUT to replace it. */
export function equipmentRouter(ctx: ServiceContext) {
  const router = Router();
  // every write here changes only the signed-in person's own records (middleware/cacheFence.ts)
  router.use(ownChangesOnly);
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json({ equipment: await getEquipment(ctx, currentUser(req)) });
  });
  router.put('/', validate({ body: EquipmentUpdateSchema }), async (req, res) => {
    res.json({ equipment: await saveEquipment(ctx, currentUser(req), req.body) });
  });
  return router;
}
