import { Router } from 'express';
import type { z } from 'zod';
import { validate } from '../../middleware/validate';
import { currentUser, requireUser } from '../../middleware/session';
import type { ServiceContext } from '../../services/context';
import {
  getReminderPreferences,
  listNotifications,
  markAllRead,
  markRead,
  unreadCount,
  updateReminderPreferences,
} from '../../services/notifications';
import { NotificationIdParamsSchema, NotificationListSchema, NotificationPreferencesUpdateSchema } from './schema';

/** The signed-in person's notices: list with unread count, mark read. */
export function notificationsRouter(ctx: ServiceContext) {
  const router = Router();
  router.use(requireUser);

  router.get('/', validate({ query: NotificationListSchema }), async (req, res) => {
    res.json(
      await listNotifications(ctx, currentUser(req), req.query as unknown as z.output<typeof NotificationListSchema>),
    );
  });
  router.get('/unread-count', async (req, res) => {
    res.json(await unreadCount(ctx, currentUser(req)));
  });
  router.post('/read-all', async (req, res) => {
    res.json(await markAllRead(ctx, currentUser(req)));
  });
  router.post('/:id/read', validate({ params: NotificationIdParamsSchema }), async (req, res) => {
    res.json(await markRead(ctx, currentUser(req), (req.params as { id: string }).id));
  });
  return router;
}

/** Reminder settings of the signed-in person (thresholds, e-mail delivery, muted kinds). */
export function reminderPreferencesRouter(ctx: ServiceContext) {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json({ preferences: await getReminderPreferences(ctx, currentUser(req)) });
  });
  router.patch('/', validate({ body: NotificationPreferencesUpdateSchema }), async (req, res) => {
    res.json({ preferences: await updateReminderPreferences(ctx, currentUser(req), req.body) });
  });
  return router;
}
