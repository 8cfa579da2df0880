import { Router } from 'express';
import { ownChangesOnly } from '../../middleware/cacheFence';
import { validate } from '../../middleware/validate';
import { currentUser, requireUser } from '../../middleware/session';
import type { ServiceContext } from '../../services/context';
import {
  completeStep,
  createPlan,
  getPlan,
  listPlans,
  previewPlan,
  setPlanStatus,
  startNextStep,
} from '../../services/planning';
import {
  makePlanCreateSchema,
  PlanIdParamsSchema,
  PlanStatusSchema,
  PlanStepCompleteSchema,
  PlanStepParamsSchema,
} from './schema';

/** Starter plans: the route parses, the service authorizes and asks core for every number. */
export function plansRouter(ctx: ServiceContext) {
  const router = Router();
  // every write here changes only the signed-in person's own records (middleware/cacheFence.ts)
  router.use(ownChangesOnly);
  router.use(requireUser);
  const params = (req: { params: unknown }) => req.params as { id: string; stepId: string };
  const create = makePlanCreateSchema(ctx.now);

  router.get('/', async (req, res) => {
    res.json({ plans: await listPlans(ctx, currentUser(req)) });
  });
  /** The pitch recommendation: the same computation as a saved plan, nothing stored. */
  router.post('/preview', validate({ body: create }), async (req, res) => {
    res.json(await previewPlan(ctx, currentUser(req), req.body));
  });
  router.post('/', validate({ body: create }), async (req, res) => {
    res.status(201).json({ plan: await createPlan(ctx, currentUser(req), req.body) });
  });
  router.get('/:id', validate({ params: PlanIdParamsSchema }), async (req, res) => {
    res.json({ plan: await getPlan(ctx, currentUser(req), params(req).id) });
  });
  router.post('/:id/status', validate({ params: PlanIdParamsSchema, body: PlanStatusSchema }), async (req, res) => {
    res.json({ plan: await setPlanStatus(ctx, currentUser(req), params(req).id, req.body.status) });
  });
  router.post('/:id/steps', validate({ params: PlanIdParamsSchema }), async (req, res) => {
    res.status(201).json({ plan: await startNextStep(ctx, currentUser(req), params(req).id) });
  });
  router.post(
    '/:id/steps/:stepId/complete',
    validate({ params: PlanStepParamsSchema, body: PlanStepCompleteSchema }),
    async (req, res) => {
      const p = params(req);
      res.json({ plan: await completeStep(ctx, currentUser(req), p.id, p.stepId, req.body) });
    },
  );
  return router;
}
