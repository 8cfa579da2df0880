import { signedIn, type AccessTable } from '../../../test/access/types';

/** Expected statuses for every route of this router; checked by test/access.test.ts. */
export const access: AccessTable = {
  'GET /api/calendar-feed': { expect: { own: signedIn(200) } },
  'POST /api/calendar-feed': { expect: { own: signedIn(201) } },
  'DELETE /api/calendar-feed': { expect: { own: signedIn(200) } },
  // calendar apps fetch it without cookies: the secret address is the key, so anyone holding it
  // reads the holder's feed, and nothing else
  'GET /api/calendar/:file': {
    prepare: async (w, c) => {
      await w.culture(c);
      const feed = await c.holder.agent.post('/api/calendar-feed').expect(201);
      return { vars: { file: String(feed.body.feed.url).split('/').pop()! } };
    },
    shows: 'holder',
    expect: { own: signedIn(200, 200), other: signedIn(200, 200) },
  },
};
