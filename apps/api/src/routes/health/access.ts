import { signedIn, type AccessTable } from '../../../test/access/types';

/** Expected statuses for every route of this router; checked by test/access.test.ts. */
export const access: AccessTable = {
  // load balancers probe it without a session
  'GET /api/health': { expect: { none: signedIn(200, 200) } },
};
