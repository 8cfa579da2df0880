import { Router } from 'express';
import { ownChangesOnly } from '../../middleware/cacheFence';
import { validate } from '../../middleware/validate';
import { currentUser, requireUser } from '../../middleware/session';
import type { ServiceContext } from '../../services/context';
import {
  createBatch,
  generationChart,
  getBatch,
  harvestFromBatch,
  listBatches,
  updateBatch,
} from '../../services/batches';
import {
  BatchHarvestSchema,
  BatchIdParamsSchema,
  BatchUpdateSchema,
  GenerationChartQuerySchema,
  makeBatchCreateSchema,
} from './schema';

export function batchesRouter(ctx: ServiceContext) {
  const router = Router();
  // every write here changes only the signed-in person's own records (middleware/cacheFence.ts)
  router.use(ownChangesOnly);
  router.use(requireUser);
  const id = (req: { params: unknown }) => (req.params as { id: string }).id;

  router.get('/', async (req, res) => {
    res.json({ batches: await listBatches(ctx, currentUser(req)) });
  });
  router.get('/generations', validate({ query: GenerationChartQuerySchema }), async (req, res) => {
    res.json(await generationChart(ctx, currentUser(req), req.query as { cultureId?: string; strain?: string }));
  });
  router.post('/', validate({ body: makeBatchCreateSchema(ctx.now) }), async (req, res) => {
    res.status(201).json({ batch: await createBatch(ctx, currentUser(req), req.body) });
  });
  router.get('/:id', validate({ params: BatchIdParamsSchema }), async (req, res) => {
    res.json({ batch: await getBatch(ctx, currentUser(req), id(req)) });
  });
  router.patch('/:id', validate({ params: BatchIdParamsSchema, body: BatchUpdateSchema }), async (req, res) => {
    res.json({ batch: await updateBatch(ctx, currentUser(req), id(req), req.body) });
  });
  router.post('/:id/harvest', validate({ params: BatchIdParamsSchema, body: BatchHarvestSchema }), async (req, res) => {
    res.status(201).json(await harvestFromBatch(ctx, currentUser(req), id(req), req.body));
  });
  return router;
}
