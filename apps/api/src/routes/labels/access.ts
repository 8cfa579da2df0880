import { signedIn, statuses, type AccessTable } from '../../../test/access/types';

const hidden = statuses(401, 404, 404, 404, 404, 404);

/** Expected statuses for every route of this router; checked by test/access.test.ts. */
export const access: AccessTable = {
  'GET /api/labels': {
    prepare: async (w, c) => ({ query: { ids: await w.culture(c) } }),
    expect: { own: signedIn(200), other: hidden, club: hidden },
  },
  'GET /api/labels/:id/png': {
    prepare: async (w, c) => ({ vars: { id: await w.culture(c) }, query: { size: 'small' } }),
    expect: { own: signedIn(200), other: hidden, club: hidden },
  },
};
