import { signedIn, statuses, type AccessCase, type AccessTable, type AccessWorld } from '../../../test/access/types';
import { notifications } from '../../db/schema';
import { newId } from '../../lib/ids';

/** A notice for the holder whose text carries their private mark. */
async function notice(w: AccessWorld, c: AccessCase) {
  const id = newId();
  await w.t.database.db.insert(notifications).values({
    id,
    userId: c.holder.id,
    kind: 'culture.viability',
    subjectId: newId(),
    dedupeKey: id,
    title: w.privateMark(c.holder.id),
    body: w.privateMark(c.holder.id),
  });
  return id;
}

/** Expected statuses for every route of these routers; checked by test/access.test.ts. */
export const access: AccessTable = {
  'GET /api/notifications': { prepare: async (w, c) => (await notice(w, c), {}), expect: { own: signedIn(200) } },
  'GET /api/notifications/unread-count': { expect: { own: signedIn(200) } },
  'POST /api/notifications/read-all': { expect: { own: signedIn(200) } },
  // someone else's notice is not found
  'POST /api/notifications/:id/read': {
    prepare: async (w, c) => ({ vars: { id: await notice(w, c) } }),
    expect: { own: signedIn(200), other: statuses(401, 404, 404, 404, 404, 404) },
  },
  'GET /api/reminder-preferences': { expect: { own: signedIn(200) } },
  'PATCH /api/reminder-preferences': { body: { warnDays: 7 }, expect: { own: signedIn(200) } },
};
