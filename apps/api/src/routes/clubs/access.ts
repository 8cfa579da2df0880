import {
  statuses,
  type AccessCase,
  type AccessTable,
  type AccessWorld,
  type Statuses,
} from '../../../test/access/types';
import { clubListings, clubStock, cultures, strainRequests } from '../../db/schema';
import { eq } from 'drizzle-orm';
import { newId } from '../../lib/ids';

/**
 * Expected statuses for every club route; checked by test/access.test.ts. `club` is the case's
 * club (the caller holds the role named); `other` is a club the caller is not in, where everyone
 * but a site admin gets what a stranger gets.
 */
const inClub = (club: Statuses) => ({
  club,
  other: { ...club, member: club.stranger, steward: club.stranger, owner: club.stranger },
});

/** A plain culture of `keeperId`, written straight to the database. */
async function cultureOf(w: AccessWorld, keeperId: string) {
  const id = newId();
  await w.t.database.db.insert(cultures).values({
    id,
    ownerUserId: keeperId,
    strainName: `Matrix bank strain ${id.slice(0, 4)}`,
    origin: 'purchased',
    originDetails: { origin: 'purchased', maker: 'Invented Labs', packType: 'dry' } as never,
    form: 'dry_pack',
    storageTempC: 4,
    madeAt: new Date(Date.now() - 5 * 86_400_000),
  });
  return id;
}

/** A culture of `keeperId` listed in the club's bank. */
async function listed(w: AccessWorld, clubId: string, keeperId: string) {
  const cultureId = await cultureOf(w, keeperId);
  const listingId = newId();
  await w.t.database.db.insert(clubListings).values({ id: listingId, clubId, cultureId, listedByUserId: keeperId });
  return { cultureId, listingId };
}

async function requestBetween(
  w: AccessWorld,
  clubId: string,
  keeperId: string,
  requesterId: string,
  status: 'open' | 'accepted',
) {
  const { cultureId, listingId } = await listed(w, clubId, keeperId);
  const id = newId();
  await w.t.database.db
    .insert(strainRequests)
    .values({ id, clubId, listingId, cultureId, keeperUserId: keeperId, requesterUserId: requesterId, status });
  return id;
}

/** Club stock of the case's club, held by its steward (scope `other`: by the neighbour). */
async function stockOf(w: AccessWorld, c: AccessCase, units = 3) {
  const holder = c.scope === 'club' ? w.people.steward.id : w.people.neighbour.id;
  const cultureId = await cultureOf(w, holder);
  const db = w.t.database.db;
  await db.update(cultures).set({ ownerClubId: c.clubId, visibility: 'club' }).where(eq(cultures.id, cultureId));
  await db.insert(clubStock).values({ cultureId, clubId: c.clubId, unit: 'vial', unitsLeft: units });
  await db.insert(clubListings).values({ id: newId(), clubId: c.clubId, cultureId, listedByUserId: holder });
  return cultureId;
}

/** the caller holds a role in the club the case acts on */
const inCaseClub = (c: AccessCase) => c.scope === 'club' && ['member', 'steward', 'owner'].includes(c.role);

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
  'GET /api/clubs/:clubId/bank': {
    prepare: async (w, c) => (await listed(w, c.clubId, (await w.extraMember(c.clubId)).id), {}),
    expect: inClub(statuses(401, 404, 200, 200, 200, 200)),
  },
  // everyone offers a culture of their own; only members may
  'POST /api/clubs/:clubId/bank': {
    prepare: async (w, c) => ({ body: { cultureId: await cultureOf(w, (c.me ?? c.holder).id) } }),
    expect: inClub(statuses(401, 404, 201, 201, 201, 403)),
  },
  // listed by another member: the keeper or a steward may take it out
  'DELETE /api/clubs/:clubId/bank/:listingId': {
    prepare: async (w, c) => ({
      vars: { listingId: (await listed(w, c.clubId, (await w.extraMember(c.clubId)).id)).listingId },
    }),
    expect: inClub(statuses(401, 404, 403, 204, 204, 403)),
  },
  'GET /api/clubs/:clubId/requests': { expect: inClub(statuses(401, 404, 200, 200, 200, 200)) },
  'POST /api/clubs/:clubId/requests': {
    prepare: async (w, c) => ({
      body: {
        listingId: (await listed(w, c.clubId, (await w.extraMember(c.clubId)).id)).listingId,
        message: 'For a brew day',
      },
    }),
    expect: inClub(statuses(401, 404, 201, 201, 201, 403)),
  },
  // the caller keeps the culture when they are in the club; the keeper answers
  'POST /api/clubs/:clubId/requests/:requestId/respond': {
    prepare: async (w, c) => {
      const other = await w.extraMember(c.clubId);
      const keeper = inCaseClub(c) ? c.me!.id : other.id;
      return {
        vars: { requestId: await requestBetween(w, c.clubId, keeper, other.id, 'open') },
        body: { action: 'accept' },
      };
    },
    expect: inClub(statuses(401, 404, 200, 200, 200, 403)),
  },
  // the caller asked and the keeper accepted; the one who asked confirms receipt
  // the caller asked (when they are in the club); only the one who asked takes it back
  'POST /api/clubs/:clubId/requests/:requestId/cancel': {
    prepare: async (w, c) => {
      const other = await w.extraMember(c.clubId);
      const requester = inCaseClub(c) ? c.me!.id : other.id;
      return { vars: { requestId: await requestBetween(w, c.clubId, other.id, requester, 'open') }, body: {} };
    },
    expect: inClub(statuses(401, 404, 200, 200, 200, 403)),
  },
  'POST /api/clubs/:clubId/requests/:requestId/receive': {
    prepare: async (w, c) => {
      const other = await w.extraMember(c.clubId);
      const requester = inCaseClub(c) ? c.me!.id : other.id;
      return { vars: { requestId: await requestBetween(w, c.clubId, other.id, requester, 'accepted') }, body: {} };
    },
    expect: inClub(statuses(401, 404, 201, 201, 201, 403)),
  },
  'GET /api/clubs/:clubId/activity': { expect: inClub(statuses(401, 404, 200, 200, 200, 200)) },
  'GET /api/clubs/:clubId/stock': {
    prepare: async (w, c) => (await stockOf(w, c), {}),
    expect: inClub(statuses(401, 404, 200, 200, 200, 200)),
  },
  // a steward turns a culture they keep into club stock
  'POST /api/clubs/:clubId/stock': {
    prepare: async (w, c) => ({
      body: { cultureId: await cultureOf(w, (c.me ?? c.holder).id), unit: 'vial', units: 6 },
    }),
    expect: inClub(statuses(401, 404, 403, 201, 201, 403)),
  },
  'PATCH /api/clubs/:clubId/stock/:cultureId': {
    prepare: async (w, c) => ({ vars: { cultureId: await stockOf(w, c) }, body: { unitsLeft: 5 } }),
    expect: inClub(statuses(401, 404, 403, 200, 200, 403)),
  },
  'POST /api/clubs/:clubId/stock/:cultureId/withdraw': {
    prepare: async (w, c) => ({ vars: { cultureId: await stockOf(w, c) }, body: { storageTempC: -70 } }),
    expect: inClub(statuses(401, 404, 403, 201, 201, 403)),
  },
};
