import { statuses, type AccessTable, type Statuses } from '../../../test/access/types';

/**
 * Expected statuses for every club route; checked by test/access.test.ts. `club` is the case's
 * club (the caller holds the role named); `other` is a club the caller is not in, where everyone
 * but a site admin gets what a stranger gets.
 */
const inClub = (club: Statuses) => ({
  club,
  other: { ...club, member: club.stranger, steward: club.stranger, owner: club.stranger },
});

export const access: AccessTable = {
  'GET /api/clubs': { expect: { none: statuses(401, 200, 200, 200, 200, 200) } },
  'POST /api/clubs': { body: { name: 'Matrix made club' }, expect: { none: statuses(401, 201, 201, 201, 201, 201) } },
  'GET /api/clubs/:clubId': { expect: inClub(statuses(401, 404, 200, 200, 200, 200)) },
  'PATCH /api/clubs/:clubId': {
    body: { description: 'Changed' },
    expect: inClub(statuses(401, 404, 403, 403, 200, 403)),
  },
  'DELETE /api/clubs/:clubId': { expect: inClub(statuses(401, 404, 403, 403, 204, 204)) },
  // the owner is the club's only owner: leaving is refused until they hand over
  'POST /api/clubs/:clubId/leave': { expect: inClub(statuses(401, 404, 204, 204, 409, 403)) },
  'GET /api/clubs/:clubId/members': { expect: inClub(statuses(401, 404, 200, 200, 200, 200)) },
  'PATCH /api/clubs/:clubId/members/:userId': {
    prepare: async (w, c) => ({ vars: { userId: (await w.extraMember(c.clubId)).id }, body: { role: 'steward' } }),
    expect: inClub(statuses(401, 404, 403, 403, 200, 403)),
  },
  'DELETE /api/clubs/:clubId/members/:userId': {
    prepare: async (w, c) => ({ vars: { userId: (await w.extraMember(c.clubId)).id } }),
    expect: inClub(statuses(401, 404, 403, 403, 204, 403)),
  },
  'GET /api/clubs/:clubId/invitations': { expect: inClub(statuses(401, 404, 403, 200, 200, 403)) },
  'POST /api/clubs/:clubId/invitations': {
    prepare: async (w) => ({ body: { email: w.freshEmail(), role: 'member' } }),
    expect: inClub(statuses(401, 404, 403, 201, 201, 403)),
  },
  'DELETE /api/clubs/:clubId/invitations/:invitationId': {
    prepare: async (w, c) => ({ vars: { invitationId: (await w.invitation(c.clubId)).id } }),
    expect: inClub(statuses(401, 404, 403, 200, 200, 403)),
  },
};
