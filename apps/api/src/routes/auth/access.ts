import { signedIn, type AccessTable } from '../../../test/access/types';

/** Expected statuses for every route of this router; checked by test/access.test.ts. */
export const access: AccessTable = {
  // signing up while signed in is allowed: it starts a second account in this browser
  'POST /api/auth/sign-up': {
    prepare: async (w, c) => ({
      body: { email: w.freshEmail(), password: 'a-long-enough-secret', name: 'Matrix Newcomer' },
      agent: c.me ? await w.freshSession(c.me) : undefined,
    }),
    expect: { none: signedIn(201, 201) },
  },
  'POST /api/auth/sign-in': {
    prepare: async (w, c) => ({
      body: { email: c.holder.email, password: c.holder.password },
      agent: c.me ? await w.freshSession(c.me) : undefined,
    }),
    expect: { own: signedIn(200, 200) },
  },
  'POST /api/auth/sign-out': {
    prepare: async (w, c) => ({ agent: c.me ? await w.freshSession(c.me) : undefined }),
    expect: { own: signedIn(204) },
  },
  'GET /api/auth/me': { expect: { own: signedIn(200) } },
  // the same answer for every address, known or not
  'POST /api/auth/password-reset/request': {
    prepare: async (_w, c) => ({ body: { email: c.holder.email } }),
    expect: { own: signedIn(202, 202), other: signedIn(202, 202) },
  },
  // the token is the proof; who sends it does not matter (the answer clears this browser's cookie)
  'POST /api/auth/password-reset/confirm': {
    prepare: async (w, c) => ({
      body: { token: await w.resetToken(await w.throwawayPerson()), password: 'a-new-long-secret' },
      agent: c.me ? await w.freshSession(c.me) : undefined,
    }),
    expect: { none: signedIn(204, 204) },
  },
};
