import { Router } from 'express';
import type { FakeInbox } from '../../mail/fakeSmtp';
import { validate } from '../../middleware/validate';
import { notFound } from '../../lib/errors';
import { DevMailShowSchema } from './schema';

/** The local fake inbox, mounted only when no real SMTP provider is configured. */
export function devMailRouter(inbox: FakeInbox) {
  const router = Router();
  router.get('/', (_req, res) => {
    res.json({ messages: inbox.list() });
  });
  router.get('/:id', validate({ params: DevMailShowSchema }), (req, res) => {
    const message = inbox.get(String(req.params.id));
    if (!message) throw notFound('This message');
    res.json({ message });
  });
  return router;
}
