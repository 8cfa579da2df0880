import { statuses, type AccessTable } from '../../../test/access/types';

/** Expected statuses for every route of this router; checked by test/access.test.ts. */
export const access: AccessTable = {
  'GET /api/admin/users': { expect: { none: statuses(401, 403, 403, 403, 403, 200) } },
};
