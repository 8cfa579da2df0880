import { statuses, type AccessTable } from '../../../test/access/types';

/** Expected statuses for every route of this router; checked by test/access.test.ts. */
export const access: AccessTable = {
  // the token is the secret: whoever holds it may read what it is for
  'POST /api/invitations/lookup': {
    prepare: async (w, c) => ({ body: { token: (await w.invitation(c.clubId)).token } }),
    shows: 'club-about',
    expect: { club: statuses(200, 200, 200, 200, 200, 200) },
  },
  // invited at the caller's own address: people already in the club get 409
  'POST /api/invitations/accept': {
    prepare: async (w, c) => ({ body: { token: (await w.invitation(c.clubId, c.me?.email)).token } }),
    expect: { club: statuses(401, 200, 409, 409, 409, 200) },
  },
  'POST /api/invitations/sign-up': {
    prepare: async (w, c) => ({
      body: { token: (await w.invitation(c.clubId)).token, name: 'Invited Keeper', password: 'a-long-enough-secret' },
    }),
    expect: { club: statuses(201, 409, 409, 409, 409, 409) },
  },
};
