import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildTestApp, type TestApp } from '../../../test/helpers';
import {
  ACTORS,
  buildClub,
  makeSiteAdmin,
  signedUpPerson,
  type ActorName,
  type Agent,
  type Person,
} from '../../../test/clubFactories';
import { clubRouteMounts } from './mounts';
import type { ServiceContext } from '../../services/context';
import { eq } from 'drizzle-orm';
import { clubInvitations, clubListings, clubStock, cultures, strainRequests } from '../../db/schema';
import { newId, newSecretToken, sha256 } from '../../lib/ids';

/**
 * The authorization matrix: every club route × every kind of caller, from ONE table. The list of
 * routes is read from the routers app.ts mounts, so a new club route without a row fails here.
 */

interface World {
  t: TestApp;
  people: Record<Exclude<ActorName, 'anonymous'>, Person>;
  anonymous: Agent;
}
interface Case {
  clubId: string;
  actor: ActorName;
  /** the caller, null when anonymous */
  me: Person | null;
}
interface Entry {
  /** builds whatever the route acts on; returns path values and the body */
  prepare?: (w: World, c: Case) => Promise<{ vars?: Record<string, string>; body?: object }>;
  body?: object;
  expect: Record<ActorName, number>;
}

const statuses = (
  anonymous: number,
  nonMember: number,
  member: number,
  steward: number,
  owner: number,
  siteAdmin: number,
): Record<ActorName, number> => ({ anonymous, nonMember, member, steward, owner, siteAdmin });

let emailCounter = 0;
const freshEmail = () => `invitee-${process.pid}-${++emailCounter}-${newId(3)}@example.test`;

async function openInvitation(w: World, clubId: string, email: string) {
  const token = newSecretToken();
  const id = newId();
  await w.t.database.db.insert(clubInvitations).values({
    id,
    clubId,
    email,
    role: 'member',
    tokenHash: sha256(token),
    invitedByUserId: w.people.owner.id,
    expiresAt: new Date(Date.now() + 86_400_000),
  });
  return { id, token };
}

/** A plain member added for routes that act on "someone else in the club". */
async function extraMember(w: World, clubId: string) {
  const p = await signedUpPerson(w.t);
  const { memberships } = await import('../../db/schema');
  await w.t.database.db.insert(memberships).values({ clubId, userId: p.id, role: 'member' });
  return p;
}

/** A culture of `keeperId`, written straight to the table. */
async function cultureOf(w: World, keeperId: string) {
  const id = newId();
  await w.t.database.db.insert(cultures).values({
    id,
    ownerUserId: keeperId,
    strainName: `Matrix strain ${id.slice(0, 4)}`,
    origin: 'purchased',
    originDetails: { origin: 'purchased', maker: 'Invented Labs', packType: 'dry' } as never,
    form: 'dry_pack',
    storageTempC: 4,
    madeAt: new Date(Date.now() - 5 * 86_400_000),
  });
  return id;
}

async function listed(w: World, clubId: string, keeperId: string) {
  const cultureId = await cultureOf(w, keeperId);
  const listingId = newId();
  await w.t.database.db.insert(clubListings).values({ id: listingId, clubId, cultureId, listedByUserId: keeperId });
  return { cultureId, listingId };
}

async function requestBetween(
  w: World,
  clubId: string,
  keeperId: string,
  requesterId: string,
  status: 'open' | 'accepted',
) {
  const { cultureId, listingId } = await listed(w, clubId, keeperId);
  const id = newId();
  await w.t.database.db.insert(strainRequests).values({
    id,
    clubId,
    listingId,
    cultureId,
    keeperUserId: keeperId,
    requesterUserId: requesterId,
    status,
  });
  return id;
}

/** Three vials of club stock held by the steward. */
async function stockOf(w: World, clubId: string) {
  const cultureId = await cultureOf(w, w.people.steward.id);
  const db = w.t.database.db;
  await db.update(cultures).set({ ownerClubId: clubId, visibility: 'club' }).where(eq(cultures.id, cultureId));
  await db.insert(clubStock).values({ cultureId, clubId, unit: 'vial', unitsLeft: 3 });
  return cultureId;
}

const inClub = (c: Case) => c.actor === 'member' || c.actor === 'steward' || c.actor === 'owner';

const MATRIX: Record<string, Entry> = {
  'GET /api/clubs': { expect: statuses(401, 200, 200, 200, 200, 200) },
  'POST /api/clubs': { body: { name: 'Matrix made club' }, expect: statuses(401, 201, 201, 201, 201, 201) },
  'GET /api/clubs/:clubId': { expect: statuses(401, 404, 200, 200, 200, 200) },
  'PATCH /api/clubs/:clubId': { body: { description: 'Changed' }, expect: statuses(401, 404, 403, 403, 200, 403) },
  'DELETE /api/clubs/:clubId': { expect: statuses(401, 404, 403, 403, 204, 204) },
  // the owner is the only owner in the fixture club: leaving is refused until they hand over
  'POST /api/clubs/:clubId/leave': { expect: statuses(401, 404, 204, 204, 409, 403) },
  'GET /api/clubs/:clubId/members': { expect: statuses(401, 404, 200, 200, 200, 200) },
  'PATCH /api/clubs/:clubId/members/:userId': {
    prepare: async (w, c) => ({ vars: { userId: (await extraMember(w, c.clubId)).id }, body: { role: 'steward' } }),
    expect: statuses(401, 404, 403, 403, 200, 403),
  },
  'DELETE /api/clubs/:clubId/members/:userId': {
    prepare: async (w, c) => ({ vars: { userId: (await extraMember(w, c.clubId)).id } }),
    expect: statuses(401, 404, 403, 403, 204, 403),
  },
  'GET /api/clubs/:clubId/invitations': { expect: statuses(401, 404, 403, 200, 200, 403) },
  'POST /api/clubs/:clubId/invitations': {
    prepare: async () => ({ body: { email: freshEmail(), role: 'member' } }),
    expect: statuses(401, 404, 403, 201, 201, 403),
  },
  'DELETE /api/clubs/:clubId/invitations/:invitationId': {
    prepare: async (w, c) => ({ vars: { invitationId: (await openInvitation(w, c.clubId, freshEmail())).id } }),
    expect: statuses(401, 404, 403, 200, 200, 403),
  },
  'GET /api/clubs/:clubId/bank': {
    prepare: async (w, c) => (await listed(w, c.clubId, w.people.steward.id), {}),
    expect: statuses(401, 404, 200, 200, 200, 200),
  },
  // everyone offers a culture of their own; only members may
  'POST /api/clubs/:clubId/bank': {
    prepare: async (w, c) => ({ body: { cultureId: await cultureOf(w, c.me?.id ?? w.people.nonMember.id) } }),
    expect: statuses(401, 404, 201, 201, 201, 403),
  },
  // listed by another member: the keeper or a steward may take it out
  'DELETE /api/clubs/:clubId/bank/:listingId': {
    prepare: async (w, c) => ({
      vars: { listingId: (await listed(w, c.clubId, (await extraMember(w, c.clubId)).id)).listingId },
    }),
    expect: statuses(401, 404, 403, 204, 204, 403),
  },
  'GET /api/clubs/:clubId/requests': { expect: statuses(401, 404, 200, 200, 200, 200) },
  'POST /api/clubs/:clubId/requests': {
    prepare: async (w, c) => ({
      body: {
        listingId: (await listed(w, c.clubId, (await extraMember(w, c.clubId)).id)).listingId,
        message: 'For a brew day',
      },
    }),
    expect: statuses(401, 404, 201, 201, 201, 403),
  },
  // the caller keeps the culture when they are in the club; the keeper answers
  'POST /api/clubs/:clubId/requests/:requestId/respond': {
    prepare: async (w, c) => {
      const other = await extraMember(w, c.clubId);
      const keeper = inClub(c) ? c.me!.id : other.id;
      return {
        vars: { requestId: await requestBetween(w, c.clubId, keeper, other.id, 'open') },
        body: { action: 'accept' },
      };
    },
    expect: statuses(401, 404, 200, 200, 200, 403),
  },
  // the caller asked and the keeper accepted; the one who asked confirms receipt
  'POST /api/clubs/:clubId/requests/:requestId/cancel': {
    prepare: async (w, c) => {
      const other = await extraMember(w, c.clubId);
      const requester = inClub(c) ? c.me!.id : other.id;
      return { vars: { requestId: await requestBetween(w, c.clubId, other.id, requester, 'open') }, body: {} };
    },
    expect: statuses(401, 404, 200, 200, 200, 403),
  },
  'POST /api/clubs/:clubId/requests/:requestId/receive': {
    prepare: async (w, c) => {
      const other = await extraMember(w, c.clubId);
      const requester = inClub(c) ? c.me!.id : other.id;
      return { vars: { requestId: await requestBetween(w, c.clubId, other.id, requester, 'accepted') }, body: {} };
    },
    expect: statuses(401, 404, 201, 201, 201, 403),
  },
  'GET /api/clubs/:clubId/activity': { expect: statuses(401, 404, 200, 200, 200, 200) },
  'GET /api/clubs/:clubId/stock': {
    prepare: async (w, c) => (await stockOf(w, c.clubId), {}),
    expect: statuses(401, 404, 200, 200, 200, 200),
  },
  // a steward makes a culture they keep into club stock
  'POST /api/clubs/:clubId/stock': {
    prepare: async (w, c) => ({
      body: { cultureId: await cultureOf(w, c.me?.id ?? w.people.nonMember.id), unit: 'slant', units: 4 },
    }),
    expect: statuses(401, 404, 403, 201, 201, 403),
  },
  'PATCH /api/clubs/:clubId/stock/:cultureId': {
    prepare: async (w, c) => ({ vars: { cultureId: await stockOf(w, c.clubId) }, body: { unitsLeft: 2 } }),
    expect: statuses(401, 404, 403, 200, 200, 403),
  },
  'POST /api/clubs/:clubId/stock/:cultureId/withdraw': {
    prepare: async (w, c) => ({ vars: { cultureId: await stockOf(w, c.clubId) }, body: { storageTempC: -70 } }),
    expect: statuses(401, 404, 403, 201, 201, 403),
  },
  // the token is the secret: whoever holds it may read what it is for
  'POST /api/invitations/lookup': {
    prepare: async (w, c) => ({ body: { token: (await openInvitation(w, c.clubId, freshEmail())).token } }),
    expect: statuses(200, 200, 200, 200, 200, 200),
  },
  // invited at the caller's own address: people already in the club get 409
  'POST /api/invitations/accept': {
    prepare: async (w, c) => ({
      body: { token: (await openInvitation(w, c.clubId, c.me?.email ?? freshEmail())).token },
    }),
    expect: statuses(401, 200, 409, 409, 409, 200),
  },
  'POST /api/invitations/sign-up': {
    prepare: async (w, c) => ({
      body: {
        token: (await openInvitation(w, c.clubId, freshEmail())).token,
        name: 'New Keeper',
        password: 'a-long-enough-secret',
      },
    }),
    expect: statuses(201, 409, 409, 409, 409, 409),
  },
};

function mountedRoutes(): string[] {
  const mounts = clubRouteMounts({} as ServiceContext, { rateLimit: { max: 1, store: 'memory', prefix: 'matrix' } });
  const routes: string[] = [];
  for (const { path, router } of mounts) {
    for (const layer of router.stack) {
      const route = layer.route as { path: string; methods: Record<string, boolean> } | undefined;
      if (!route) continue;
      for (const method of Object.keys(route.methods).filter((m) => route.methods[m] && m !== '_all')) {
        routes.push(`${method.toUpperCase()} /api${path}${route.path === '/' ? '' : route.path}`);
      }
    }
  }
  return routes.sort();
}

let w: World;
beforeAll(async () => {
  const t = await buildTestApp();
  const [nonMember, member, steward, owner, siteAdmin] = await Promise.all([
    signedUpPerson(t, 'Outside Person'),
    signedUpPerson(t, 'Plain Member'),
    signedUpPerson(t, 'Club Steward'),
    signedUpPerson(t, 'Club Owner'),
    signedUpPerson(t, 'Site Admin'),
  ]);
  await makeSiteAdmin(t, siteAdmin!);
  w = {
    t,
    anonymous: t.agent(),
    people: { nonMember: nonMember!, member: member!, steward: steward!, owner: owner!, siteAdmin: siteAdmin! },
  };
});
afterAll(async () => {
  await w.t.close();
});

describe('club authorization matrix', () => {
  it('has exactly one entry per mounted club route', () => {
    const routes = mountedRoutes();
    expect(routes.length).toBeGreaterThanOrEqual(15);
    expect(Object.keys(MATRIX).sort()).toEqual(routes);
  });

  const cases = Object.entries(MATRIX).flatMap(([route, entry]) => ACTORS.map((actor) => ({ route, entry, actor })));

  it.each(cases)('$route as $actor', async ({ route, entry, actor }) => {
    const clubId = await buildClub(w.t, [
      { person: w.people.owner, role: 'owner' },
      { person: w.people.steward, role: 'steward' },
      { person: w.people.member, role: 'member' },
    ]);
    const me = actor === 'anonymous' ? null : w.people[actor];
    const prepared = (await entry.prepare?.(w, { clubId, actor, me })) ?? {};
    const vars: Record<string, string> = { clubId, ...prepared.vars };
    const [method, template] = route.split(' ') as [string, string];
    const url = template.replace(/:(\w+)/g, (_, name: string) => {
      if (!(name in vars)) throw new Error(`no value for :${name}`);
      return encodeURIComponent(vars[name]!);
    });
    const agent = me ? me.agent : w.anonymous;
    const body = prepared.body ?? entry.body;
    const call = agent[method.toLowerCase() as 'get' | 'post' | 'patch' | 'delete'](url);
    const res = body ? await call.send(body) : await call;
    const want = entry.expect[actor];
    expect({ status: res.status, body: res.status === want ? 'as expected' : res.body }).toEqual({
      status: want,
      body: 'as expected',
    });
    if (want >= 400) {
      expect(res.headers['content-type']).toMatch(/application\/json/);
      expect(res.body.error.code).toEqual(expect.any(String));
    }
  });
});
