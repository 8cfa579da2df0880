import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { buildTestApp, type TestApp } from '../../../test/helpers';
import { buildClub, signedUpPerson, type Person } from '../../../test/clubFactories';
import { buildDregs } from '../../../test/cultureFactories';
import { cultures, notifications } from '../../db/schema';

let t: TestApp;
let keeper: Person, asker: Person, steward: Person, outsider: Person, bystander: Person;
let clubId: string;
beforeAll(async () => {
  t = await buildTestApp();
  [keeper, asker, steward, outsider, bystander] = (await Promise.all([
    signedUpPerson(t, 'Keeper Kell'),
    signedUpPerson(t, 'Asker Ash'),
    signedUpPerson(t, 'Steward Sol'),
    signedUpPerson(t, 'Outsider Oz'),
    signedUpPerson(t, 'Bystander Bea'),
  ])) as [Person, Person, Person, Person, Person];
  clubId = await buildClub(t, [
    { person: keeper, role: 'owner' },
    { person: asker, role: 'member' },
    { person: steward, role: 'steward' },
    { person: bystander, role: 'member' },
  ]);
});
afterAll(async () => {
  await t.close();
});

const tick = () => {
  t.clock.now = new Date(t.clock.now.getTime() + 60_000);
};

async function keeperCulture(notes = 'Private: the jar behind the pickles') {
  const res = await keeper.agent
    .post('/api/cultures')
    .send({ ...buildDregs(), notes })
    .expect(201);
  return res.body.culture as { id: string; generation: number; strainName: string };
}

describe('club bank, requests and handoffs', () => {
  it('passes a strain to another member with its lineage kept, notifying both', async () => {
    const root = await keeperCulture();
    const listing = await keeper.agent
      .post(`/api/clubs/${clubId}/bank`)
      .send({ cultureId: root.id, note: 'Ask any time' })
      .expect(201);
    await keeper.agent.post(`/api/clubs/${clubId}/bank`).send({ cultureId: root.id }).expect(409);

    const bank = await asker.agent.get(`/api/clubs/${clubId}/bank`).expect(200);
    const offered = bank.body.listings.find((l: { cultureId: string }) => l.cultureId === root.id);
    expect(offered).toMatchObject({
      strainName: root.strainName,
      keeper: { name: 'Keeper Kell' },
      canRequest: true,
      generation: root.generation,
    });
    expect(offered.projectedViability).toBeGreaterThan(0);
    expect(offered.projectedViability).toBeLessThanOrEqual(1);
    expect(JSON.stringify(bank.body)).not.toContain('jar behind the pickles');
    // the keeper cannot request their own culture
    const own = await keeper.agent.get(`/api/clubs/${clubId}/bank`).expect(200);
    expect(own.body.listings.find((l: { cultureId: string }) => l.cultureId === root.id).canRequest).toBe(false);

    tick();
    const req = await asker.agent
      .post(`/api/clubs/${clubId}/requests`)
      .send({ listingId: listing.body.listing.id, message: 'For a saison next month' })
      .expect(201);
    const requestId = req.body.request.id as string;
    expect(req.body.request.status).toBe('open');
    // receipt before acceptance is refused
    await asker.agent.post(`/api/clubs/${clubId}/requests/${requestId}/receive`).send({}).expect(409);
    // only the keeper answers
    await asker.agent.post(`/api/clubs/${clubId}/requests/${requestId}/respond`).send({ action: 'accept' }).expect(403);
    tick();
    const accepted = await keeper.agent
      .post(`/api/clubs/${clubId}/requests/${requestId}/respond`)
      .send({ action: 'accept', note: 'Pick it up Saturday' })
      .expect(200);
    expect(accepted.body.request).toMatchObject({ status: 'accepted', responseNote: 'Pick it up Saturday' });
    await keeper.agent
      .post(`/api/clubs/${clubId}/requests/${requestId}/respond`)
      .send({ action: 'decline' })
      .expect(409);

    tick();
    const received = await asker.agent
      .post(`/api/clubs/${clubId}/requests/${requestId}/receive`)
      .send({ locationLabel: 'Fridge, top shelf', storageTempC: 3 })
      .expect(201);
    expect(received.body.request.status).toBe('received');
    const [child] = await t.database.db.select().from(cultures).where(eq(cultures.id, received.body.cultureId));
    expect(child).toMatchObject({
      ownerUserId: asker.id,
      parentId: root.id,
      generation: root.generation,
      origin: 'gift',
    });
    expect(child!.notes).toBe('');
    await asker.agent.post(`/api/clubs/${clubId}/requests/${requestId}/receive`).send({}).expect(409);

    // the recipient owns the new culture and sees the lineage cross owners
    const lineage = await asker.agent.get(`/api/cultures/${child!.id}/lineage`).expect(200);
    expect(lineage.body.rootId).toBe(root.id);
    expect(lineage.body.nodes.map((n: { id: string }) => n.id)).toEqual([root.id, child!.id]);
    // …but never the giver's culture itself
    await asker.agent.get(`/api/cultures/${root.id}`).expect(404);
    await asker.agent.get(`/api/cultures/${root.id}/events`).expect(404);

    const notices = await t.database.db.select().from(notifications).where(eq(notifications.subjectId, requestId));
    expect(notices.map((n) => n.userId).sort()).toEqual([asker.id, keeper.id, keeper.id].sort());

    const activity = await steward.agent.get(`/api/clubs/${clubId}/activity?limit=2`).expect(200);
    expect(activity.body.activity.map((a: { kind: string }) => a.kind)).toEqual([
      'handoff_received',
      'request_answered',
    ]);
    expect(activity.body.nextBefore).toEqual(expect.any(String));
    const older = await steward.agent
      .get(`/api/clubs/${clubId}/activity?limit=2&before=${encodeURIComponent(activity.body.nextBefore)}`)
      .expect(200);
    expect(older.body.activity.map((a: { kind: string }) => a.kind)).toEqual(['strain_requested', 'strain_listed']);
    await steward.agent.get(`/api/clubs/${clubId}/activity?before=yesterday`).expect(400);
  });

  it('one request under way per member and strain, even when asked five times at once', async () => {
    const root = await keeperCulture();
    const listing = await keeper.agent.post(`/api/clubs/${clubId}/bank`).send({ cultureId: root.id }).expect(201);
    const listingId = listing.body.listing.id as string;
    const asks = await Promise.all(
      Array.from({ length: 5 }, () =>
        asker.agent.post(`/api/clubs/${clubId}/requests`).send({ listingId, message: 'May I have some?' }),
      ),
    );
    expect(asks.map((r) => r.status).sort()).toEqual([201, 409, 409, 409, 409]);
    expect(asks.find((r) => r.status === 409)!.body.error.code).toBe('already_requested');
    const mine = (await asker.agent.get(`/api/clubs/${clubId}/requests`).expect(200)).body.requests.filter(
      (r: { listingId: string }) => r.listingId === listingId,
    );
    expect(mine).toHaveLength(1);
    // the bank says so instead of offering to ask again
    const entry = (await asker.agent.get(`/api/clubs/${clubId}/bank`).expect(200)).body.listings.find(
      (l: { id: string }) => l.id === listingId,
    );
    expect(entry).toMatchObject({ canRequest: false, myRequest: { id: mine[0].id, status: 'open' } });
    // once declined, asking again is allowed
    await keeper.agent
      .post(`/api/clubs/${clubId}/requests/${mine[0].id}/respond`)
      .send({ action: 'decline', note: 'None to spare this month' })
      .expect(200);
    const again = await asker.agent
      .post(`/api/clubs/${clubId}/requests`)
      .send({ listingId, message: 'Next month?' })
      .expect(201);
    // the one who asked can take it back (nobody else can), and then ask anew
    await steward.agent.post(`/api/clubs/${clubId}/requests/${again.body.request.id}/cancel`).expect(403);
    tick();
    const back = await asker.agent.post(`/api/clubs/${clubId}/requests/${again.body.request.id}/cancel`).expect(200);
    expect(back.body.request).toEqual({ id: again.body.request.id, status: 'cancelled' });
    await asker.agent.post(`/api/clubs/${clubId}/requests/${again.body.request.id}/cancel`).expect(409);
    // the club's feed says so, to every member (not only the two involved), and nothing more
    const feed = await bystander.agent.get(`/api/clubs/${clubId}/activity?limit=5`).expect(200);
    expect(feed.body.activity[0]).toEqual({
      id: expect.any(String),
      kind: 'request_withdrawn',
      actorName: 'Asker Ash',
      cultureId: root.id,
      requestId: again.body.request.id,
      data: { strainName: root.strainName, listingId },
      createdAt: t.clock.now.toISOString(),
    });
    const withdrawn = feed.body.activity.filter((a: { kind: string }) => a.kind === 'request_withdrawn');
    expect(withdrawn).toHaveLength(1); // the refused second take-back wrote nothing
    for (const secret of ['Next month?', 'None to spare this month', 'jar behind the pickles']) {
      expect(JSON.stringify(feed.body)).not.toContain(secret);
    }
    await outsider.agent.get(`/api/clubs/${clubId}/activity`).expect(404);
    const told = await t.database.db.select().from(notifications).where(eq(notifications.userId, keeper.id));
    expect(told.some((n) => n.title === 'Asker Ash no longer needs ' + root.strainName)).toBe(true);
    await asker.agent.post(`/api/clubs/${clubId}/requests`).send({ listingId, message: 'Later after all' }).expect(201);
  });

  it('refuses to list someone else’s culture and hides requests from uninvolved members', async () => {
    const root = await keeperCulture();
    const res = await asker.agent.post(`/api/clubs/${clubId}/bank`).send({ cultureId: root.id }).expect(400);
    expect(res.body.error.fields['body.cultureId']).toBeDefined();
    await outsider.agent.get(`/api/clubs/${clubId}/bank`).expect(404);
    const listing = await keeper.agent.post(`/api/clubs/${clubId}/bank`).send({ cultureId: root.id }).expect(201);
    await steward.agent
      .post(`/api/clubs/${clubId}/requests`)
      .send({ listingId: listing.body.listing.id, message: 'Steward wants some' })
      .expect(201);
    const asAsker = await asker.agent.get(`/api/clubs/${clubId}/requests`).expect(200);
    expect(asAsker.body.requests.some((r: { message: string }) => r.message === 'Steward wants some')).toBe(false);
    const asKeeper = await keeper.agent.get(`/api/clubs/${clubId}/requests`).expect(200);
    expect(asKeeper.body.requests.some((r: { message: string }) => r.message === 'Steward wants some')).toBe(true);
  });

  it('needs a steward’s approval first when the club asks for it', async () => {
    await keeper.agent.patch(`/api/clubs/${clubId}`).send({ requestsNeedApproval: true }).expect(200);
    try {
      const root = await keeperCulture();
      const listing = await keeper.agent.post(`/api/clubs/${clubId}/bank`).send({ cultureId: root.id }).expect(201);
      const req = await asker.agent
        .post(`/api/clubs/${clubId}/requests`)
        .send({ listingId: listing.body.listing.id })
        .expect(201);
      expect(req.body.request.status).toBe('awaiting_approval');
      const id = req.body.request.id;
      await keeper.agent.post(`/api/clubs/${clubId}/requests/${id}/respond`).send({ action: 'accept' }).expect(409);
      await asker.agent.post(`/api/clubs/${clubId}/requests/${id}/respond`).send({ action: 'approve' }).expect(403);
      await steward.agent.post(`/api/clubs/${clubId}/requests/${id}/respond`).send({ action: 'approve' }).expect(200);
      const notice = await t.database.db
        .select()
        .from(notifications)
        .where(and(eq(notifications.subjectId, id), eq(notifications.userId, keeper.id)));
      // the keeper is also an owner here: told once that it waits for approval, once that it is theirs to answer
      expect(notice.map((n) => n.dedupeKey).sort()).toEqual(['approval', 'asked']);
      const stewardNotice = await t.database.db
        .select()
        .from(notifications)
        .where(and(eq(notifications.subjectId, id), eq(notifications.userId, steward.id)));
      expect(stewardNotice.map((n) => n.dedupeKey)).toEqual(['approval']);
      await keeper.agent.post(`/api/clubs/${clubId}/requests/${id}/respond`).send({ action: 'propose' }).expect(400);
      const proposed = await keeper.agent
        .post(`/api/clubs/${clubId}/requests/${id}/respond`)
        .send({ action: 'propose', proposedAt: new Date(Date.now() + 7 * 86_400_000).toISOString(), note: 'Next week' })
        .expect(200);
      expect(proposed.body.request.status).toBe('proposed');
    } finally {
      await keeper.agent.patch(`/api/clubs/${clubId}`).send({ requestsNeedApproval: false }).expect(200);
    }
  });
});
