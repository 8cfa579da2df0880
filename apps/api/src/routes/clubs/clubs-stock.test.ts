import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { buildTestApp, type TestApp } from '../../../test/helpers';
import { buildClub, signedUpPerson, type Person } from '../../../test/clubFactories';
import { buildReculture, buildDregs } from '../../../test/cultureFactories';
import { clubStock, cultures, notifications } from '../../db/schema';

let t: TestApp;
let steward: Person, member: Person, other: Person, outsider: Person;
let clubId: string;
beforeAll(async () => {
  t = await buildTestApp();
  [steward, member, other, outsider] = (await Promise.all([
    signedUpPerson(t, 'Steward Wren'),
    signedUpPerson(t, 'Member Moss'),
    signedUpPerson(t, 'Member Fern'),
    signedUpPerson(t, 'Outsider Oak'),
  ])) as [Person, Person, Person, Person];
  clubId = await buildClub(t, [
    { person: steward, role: 'steward' },
    { person: member, role: 'member' },
    { person: other, role: 'owner' },
  ]);
});
afterAll(async () => {
  await t.close();
});

/** A frozen glycerol vial culture the steward keeps (a re-culture of dregs). */
async function frozenVials() {
  const root = await steward.agent.post('/api/cultures').send(buildDregs()).expect(201);
  const res = await steward.agent
    .post('/api/cultures')
    .send(
      buildReculture(root.body.culture.id, {
        form: 'frozen_glycerol',
        origin: { origin: 'reculture', method: 'freeze' },
        storageTempC: -70,
        notes: 'Steward’s private: box 3, rack B',
      }),
    )
    .expect(201);
  return res.body.culture as { id: string; strainName: string; generation: number };
}

describe('club-owned stock', () => {
  it('a steward makes frozen vials club stock; members see the count, not the keeper’s notes', async () => {
    const vials = await frozenVials();
    await member.agent
      .post(`/api/clubs/${clubId}/stock`)
      .send({ cultureId: vials.id, unit: 'vial', units: 4 })
      .expect(403);
    const bad = await steward.agent
      .post(`/api/clubs/${clubId}/stock`)
      .send({ cultureId: vials.id, unit: 'jar', units: 0 })
      .expect(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['body.unit', 'body.units']);
    const made = await steward.agent
      .post(`/api/clubs/${clubId}/stock`)
      .send({ cultureId: vials.id, unit: 'vial', units: 2, note: 'The club’s house ale strain' })
      .expect(201);
    expect(made.body.stock).toMatchObject({ cultureId: vials.id, unit: 'vial', unitsLeft: 2, form: 'frozen_glycerol' });
    await steward.agent
      .post(`/api/clubs/${clubId}/stock`)
      .send({ cultureId: vials.id, unit: 'vial', units: 2 })
      .expect(409);
    const [row] = await t.database.db.select().from(cultures).where(eq(cultures.id, vials.id));
    expect(row!.ownerClubId).toBe(clubId);

    const list = await member.agent.get(`/api/clubs/${clubId}/stock`).expect(200);
    expect(list.body.stock).toHaveLength(1);
    expect(JSON.stringify(list.body)).not.toContain('box 3, rack B');
    const bank = await member.agent.get(`/api/clubs/${clubId}/bank`).expect(200);
    const listed = bank.body.listings.find((l: { cultureId: string }) => l.cultureId === vials.id);
    expect(listed).toMatchObject({ stock: { unit: 'vial', unitsLeft: 2 }, canRequest: true });
    await outsider.agent.get(`/api/clubs/${clubId}/stock`).expect(404);
  });

  it('“withdraw one” decrements the count and starts the recipient’s culture under the stock; none left is 409', async () => {
    const vials = await frozenVials();
    await steward.agent
      .post(`/api/clubs/${clubId}/stock`)
      .send({ cultureId: vials.id, unit: 'vial', units: 1 })
      .expect(201);
    await steward.agent
      .post(`/api/clubs/${clubId}/stock/${vials.id}/withdraw`)
      .send({ recipientUserId: outsider.id })
      .expect(400);
    await member.agent.post(`/api/clubs/${clubId}/stock/${vials.id}/withdraw`).send({}).expect(403);
    const out = await steward.agent
      .post(`/api/clubs/${clubId}/stock/${vials.id}/withdraw`)
      .send({ recipientUserId: member.id, storageTempC: -18, locationLabel: 'Chest freezer' })
      .expect(201);
    expect(out.body.stock.unitsLeft).toBe(0);
    const mine = await member.agent.get(`/api/cultures/${out.body.cultureId}`).expect(200);
    expect(mine.body.culture).toMatchObject({
      parentId: vials.id,
      generation: vials.generation,
      form: 'frozen_glycerol',
      ownerUserId: member.id,
      storageTempC: -18,
    });
    // in the member's lineage the stock is marked as the club's, the member's own culture is not
    const tree = (await member.agent.get(`/api/cultures/${out.body.cultureId}/lineage`).expect(200)).body.nodes as {
      id: string;
      clubStock: boolean;
    }[];
    expect(tree.find((n) => n.id === vials.id)?.clubStock).toBe(true);
    expect(tree.find((n) => n.id === out.body.cultureId)?.clubStock).toBe(false);
    const notice = await t.database.db
      .select()
      .from(notifications)
      .where(and(eq(notifications.userId, member.id), eq(notifications.subjectId, out.body.cultureId)));
    expect(notice).toHaveLength(1);
    const empty = await steward.agent.post(`/api/clubs/${clubId}/stock/${vials.id}/withdraw`).send({}).expect(409);
    expect(empty.body.error.code).toBe('stock_empty');
    const bank = await member.agent.get(`/api/clubs/${clubId}/bank`).expect(200);
    expect(bank.body.listings.find((l: { cultureId: string }) => l.cultureId === vials.id).canRequest).toBe(false);
    // a stock-take puts units back
    await member.agent.patch(`/api/clubs/${clubId}/stock/${vials.id}`).send({ unitsLeft: 3 }).expect(403);
    const fixed = await steward.agent
      .patch(`/api/clubs/${clubId}/stock/${vials.id}`)
      .send({ unitsLeft: 3 })
      .expect(200);
    expect(fixed.body.stock.unitsLeft).toBe(3);
    const activity = await member.agent.get(`/api/clubs/${clubId}/activity`).expect(200);
    expect(activity.body.activity.map((a: { kind: string }) => a.kind)).toEqual(
      expect.arrayContaining(['stock_added', 'stock_withdrawn']),
    );
  });

  it('a request for club stock is answered by any steward, and receipt takes one unit', async () => {
    const vials = await frozenVials();
    await steward.agent
      .post(`/api/clubs/${clubId}/stock`)
      .send({ cultureId: vials.id, unit: 'vial', units: 2 })
      .expect(201);
    const bank = await member.agent.get(`/api/clubs/${clubId}/bank`).expect(200);
    const listing = bank.body.listings.find((l: { cultureId: string }) => l.cultureId === vials.id);
    const bad = await member.agent
      .post(`/api/clubs/${clubId}/requests`)
      .send({ listingId: listing.id, wantedForm: 'a jar' })
      .expect(400);
    expect(bad.body.error.fields['body.wantedForm']).toBeDefined();
    const req = await member.agent
      .post(`/api/clubs/${clubId}/requests`)
      .send({ listingId: listing.id, message: 'For the spring ale', wantedForm: 'frozen_glycerol' })
      .expect(201);
    // `other` is the club's owner, not the holder: answers for club stock as a steward
    const answered = await other.agent
      .post(`/api/clubs/${clubId}/requests/${req.body.request.id}/respond`)
      .send({ action: 'accept', note: 'Saturday at the meeting' })
      .expect(200);
    expect(answered.body.request).toMatchObject({ status: 'accepted', wantedForm: 'frozen_glycerol', clubStock: true });
    await member.agent
      .post(`/api/clubs/${clubId}/requests/${req.body.request.id}/receive`)
      .send({ storageTempC: -18 })
      .expect(201);
    const [stock] = await t.database.db.select().from(clubStock).where(eq(clubStock.cultureId, vials.id));
    expect(stock!.unitsLeft).toBe(1);
  });
});
