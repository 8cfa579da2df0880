import { Router } from 'express';
import { validate } from '../../middleware/validate';
import { currentUser, requireUser } from '../../middleware/session';
import type { ServiceContext } from '../../services/context';
import {
  addCultureEvent,
  changeCultureState,
  createCulture,
  getCultureDetail,
  getCultureHealthSeries,
  getLineage,
  listCultureEvents,
  listCultures,
  presentDetail,
  quarantineCulture,
  quarantinePreview,
  splitCulture,
  updateCulture,
} from '../../services/cultures';
import { presentCultureSummary, presentEvent } from '../../presenters/culture';
import {
  CultureEventCreateSchema,
  CultureHealthQuerySchema,
  CultureIdParamsSchema,
  CultureListSchema,
  CultureQuarantineSchema,
  CultureSplitSchema,
  CultureStateChangeSchema,
  CultureUpdateSchema,
  makeCultureCreateSchema,
  type CultureListQuery,
} from './schema';

/** The culture library: the route parses, the service authorizes and does the work. */
export function culturesRouter(ctx: ServiceContext) {
  const router = Router();
  router.use(requireUser);
  const id = (req: { params: unknown }) => (req.params as { id: string }).id;

  router.get('/', validate({ query: CultureListSchema }), async (req, res) => {
    res.json(await listCultures(ctx, currentUser(req), req.query as unknown as CultureListQuery));
  });

  router.post('/', validate({ body: makeCultureCreateSchema(ctx.now) }), async (req, res) => {
    const row = await createCulture(ctx, currentUser(req), req.body);
    res.status(201).json({ culture: await presentDetail(ctx, row) });
  });

  router.get('/:id', validate({ params: CultureIdParamsSchema }), async (req, res) => {
    res.json({ culture: await getCultureDetail(ctx, currentUser(req), id(req)) });
  });

  router.patch('/:id', validate({ params: CultureIdParamsSchema, body: CultureUpdateSchema }), async (req, res) => {
    const row = await updateCulture(ctx, currentUser(req), id(req), req.body);
    res.json({ culture: await presentDetail(ctx, row) });
  });

  router.get('/:id/health', validate({ params: CultureIdParamsSchema, query: CultureHealthQuerySchema }), async (req, res) => {
    const { days } = req.query as unknown as { days: number };
    res.json(await getCultureHealthSeries(ctx, currentUser(req), id(req), days));
  });

  router.get('/:id/events', validate({ params: CultureIdParamsSchema }), async (req, res) => {
    res.json({ events: await listCultureEvents(ctx, currentUser(req), id(req)) });
  });

  router.post('/:id/events', validate({ params: CultureIdParamsSchema, body: CultureEventCreateSchema }), async (req, res) => {
    const user = currentUser(req);
    const event = await addCultureEvent(ctx, user, id(req), req.body);
    res.status(201).json({ event: presentEvent(event, user.name, null) });
  });

  router.post('/:id/state', validate({ params: CultureIdParamsSchema, body: CultureStateChangeSchema }), async (req, res) => {
    const row = await changeCultureState(ctx, currentUser(req), id(req), req.body);
    res.json({ culture: await presentDetail(ctx, row) });
  });

  router.post('/:id/split', validate({ params: CultureIdParamsSchema, body: CultureSplitSchema }), async (req, res) => {
    const rows = await splitCulture(ctx, currentUser(req), id(req), req.body);
    const now = ctx.now();
    res.status(201).json({ cultures: rows.map((r) => presentCultureSummary(r, now)) });
  });

  router.get('/:id/lineage', validate({ params: CultureIdParamsSchema }), async (req, res) => {
    res.json(await getLineage(ctx, currentUser(req), id(req)));
  });

  router.get('/:id/quarantine-preview', validate({ params: CultureIdParamsSchema }), async (req, res) => {
    res.json({ descendants: await quarantinePreview(ctx, currentUser(req), id(req)) });
  });

  router.post('/:id/quarantine', validate({ params: CultureIdParamsSchema, body: CultureQuarantineSchema }), async (req, res) => {
    res.json(await quarantineCulture(ctx, currentUser(req), id(req), req.body));
  });

  return router;
}
