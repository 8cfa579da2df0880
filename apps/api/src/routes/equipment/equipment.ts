import { Router } from 'express';
import { validate } from '../../middleware/validate';
import { currentUser, requireUser } from '../../middleware/session';
import type { ServiceContext } from '../../services/context';
import { getEquipment, saveEquipment } from '../../services/planning';
import { EquipmentUpdateSchema } from './schema';

/** The starter kit on the account: GET /api/account/equipment, PUT to replace it. */
export function equipmentRouter(ctx: ServiceContext) {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json({ equipment: await getEquipment(ctx, currentUser(req)) });
  });
  router.put('/', validate({ body: EquipmentUpdateSchema }), async (req, res) => {
    res.json({ equipment: await saveEquipment(ctx, currentUser(req), req.body) });
  });
  return router;
}
