import { Router } from 'express';
import { validate } from '../../middleware/validate';
import { currentUser, requireUser } from '../../middleware/session';
import type { ServiceContext } from '../../services/context';
import {
  createCalendarFeed,
  getCalendarFeed,
  renderCalendarFeed,
  revokeCalendarFeed,
} from '../../services/calendarFeed';
import { CalendarFileParamsSchema } from './schema';

/** The signed-in person's feed address: see whether one is live, make a new one, turn it off. */
export function calendarFeedRouter(ctx: ServiceContext) {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json({ feed: await getCalendarFeed(ctx, currentUser(req)) });
  });
  router.post('/', async (req, res) => {
    res.status(201).json({ feed: await createCalendarFeed(ctx, currentUser(req)) });
  });
  router.delete('/', async (req, res) => {
    res.json({ feed: await revokeCalendarFeed(ctx, currentUser(req)) });
  });
  return router;
}

/** The feed itself, fetched by calendar apps without cookies: the secret in the address is the key. */
export function calendarFileRouter(ctx: ServiceContext) {
  const router = Router();
  router.get('/:file', validate({ params: CalendarFileParamsSchema }), async (req, res) => {
    const body = await renderCalendarFeed(ctx, (req.params as unknown as { file: string }).file);
    res.setHeader('Cache-Control', 'private, max-age=300');
    res.type('text/calendar; charset=utf-8').send(body);
  });
  return router;
}
