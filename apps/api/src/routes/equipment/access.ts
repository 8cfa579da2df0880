import { signedIn, type AccessTable } from '../../../test/access/types';
import { DEFAULT_EQUIPMENT } from '@barmkeep/schemas';

/** Expected statuses for every route of this router; checked by test/access.test.ts. */
export const access: AccessTable = {
  'GET /api/account/equipment': { expect: { own: signedIn(200) } },
  'PUT /api/account/equipment': { body: DEFAULT_EQUIPMENT, expect: { own: signedIn(200) } },
};
