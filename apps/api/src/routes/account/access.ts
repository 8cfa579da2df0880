import { signedIn, type AccessTable } from '../../../test/access/types';

/** Expected statuses for every route of this router; checked by test/access.test.ts. */
export const access: AccessTable = {
  'PATCH /api/account': { body: { unitSystem: 'metric' }, expect: { own: signedIn(200) } },
  // the same password again, so the caller can keep using it; the browser gets a new session
  'POST /api/account/password': {
    prepare: async (_w, c) => ({ body: { currentPassword: c.holder.password, newPassword: c.holder.password } }),
    expect: { own: signedIn(204) },
  },
};
