import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { buildTestApp, type TestApp } from '../../../test/helpers';
import { buildClub, signedUpPerson, type Person } from '../../../test/clubFactories';
import { buildDregs, buildReculture } from '../../../test/cultureFactories';
import { cultures, notifications } from '../../db/schema';

/**
 * A strain passed across owners and clubs: Kell (club A) → Rhea (clubs A and B) → Pip (club B).
 * Club members see names and the strain's path on each other's lineage nodes; nothing private
 * crosses; contamination at the root reaches every keeper downstream.
 */
let t: TestApp;
let kell: Person, rhea: Person, pip: Person, stranger: Person;
let clubA: string, clubB: string;
const SECRET = 'Kell-private-note-behind-the-pickles';
const SECRET_PLACE = 'Kell-private-shelf';
const SECRET_CAPTION = 'Kell-private-caption';
let root: { id: string; strainName: string; generation: number };
let photoId: string;
let rheaCulture: string, rheaGrandchild: string, pipCulture: string;

async function handOver(clubId: string, giver: Person, taker: Person, cultureId: string) {
  const listing = await giver.agent.post(`/api/clubs/${clubId}/bank`).send({ cultureId }).expect(201);
  const req = await taker.agent
    .post(`/api/clubs/${clubId}/requests`)
    .send({ listingId: listing.body.listing.id, message: 'For my next batch', wantedForm: 'slant' })
    .expect(201);
  await giver.agent
    .post(`/api/clubs/${clubId}/requests/${req.body.request.id}/respond`)
    .send({ action: 'accept' })
    .expect(200);
  const got = await taker.agent
    .post(`/api/clubs/${clubId}/requests/${req.body.request.id}/receive`)
    .send({ locationLabel: 'Fridge', storageTempC: 4 })
    .expect(201);
  return got.body.cultureId as string;
}

beforeAll(async () => {
  t = await buildTestApp();
  [kell, rhea, pip, stranger] = (await Promise.all([
    signedUpPerson(t, 'Kell Keeper'),
    signedUpPerson(t, 'Rhea Recipient'),
    signedUpPerson(t, 'Pip Further'),
    signedUpPerson(t, 'Sam Stranger'),
  ])) as [Person, Person, Person, Person];
  clubA = await buildClub(t, [
    { person: kell, role: 'owner' },
    { person: rhea, role: 'member' },
  ]);
  clubB = await buildClub(t, [
    { person: rhea, role: 'owner' },
    { person: pip, role: 'member' },
  ]);
  const made = await kell.agent
    .post('/api/cultures')
    .send(buildDregs({ notes: SECRET, locationLabel: SECRET_PLACE }))
    .expect(201);
  root = made.body.culture;
  await kell.agent
    .post(`/api/cultures/${root.id}/events`)
    .send({ kind: 'note', notes: `${SECRET} log` })
    .expect(201);
  const png = await sharp({ create: { width: 40, height: 30, channels: 3, background: '#7a5b2e' } })
    .png()
    .toBuffer();
  const photo = await kell.agent
    .post(`/api/cultures/${root.id}/photos`)
    .field('caption', SECRET_CAPTION)
    .attach('photo', png, 'jar.png')
    .expect(201);
  photoId = photo.body.photo.id;
  rheaCulture = await handOver(clubA, kell, rhea, root.id);
  const grand = await rhea.agent.post('/api/cultures').send(buildReculture(rheaCulture)).expect(201);
  rheaGrandchild = grand.body.culture.id;
  pipCulture = await handOver(clubB, rhea, pip, rheaGrandchild);
});
afterAll(async () => {
  await t.close();
});

const privateText = (text: string) => [SECRET, SECRET_PLACE, SECRET_CAPTION, photoId].filter((s) => text.includes(s));

describe('lineage across owners', () => {
  it('a fellow member sees the keeper’s name and the strain’s path, but cannot open the culture', async () => {
    const res = await rhea.agent.get(`/api/cultures/${rheaCulture}/lineage`).expect(200);
    const byId = new Map(res.body.nodes.map((n: { id: string }) => [n.id, n]));
    expect(byId.get(root.id)).toMatchObject({
      visible: true,
      openable: false,
      strainName: root.strainName,
      generation: root.generation,
      owner: { id: kell.id, name: 'Kell Keeper' },
    });
    expect(byId.get(rheaCulture)).toMatchObject({
      openable: true,
      owner: { name: 'Rhea Recipient' },
      parentId: root.id,
    });
    // Pip's culture, further down, is Rhea's club-B fellow's: path only
    expect(byId.get(pipCulture)).toMatchObject({ visible: true, openable: false, owner: { name: 'Pip Further' } });
    expect(privateText(res.text)).toEqual([]);
  });

  it('someone sharing no club with a keeper sees that node as a place in the tree only', async () => {
    const res = await pip.agent.get(`/api/cultures/${pipCulture}/lineage`).expect(200);
    const byId = new Map(res.body.nodes.map((n: { id: string }) => [n.id, n]));
    expect(byId.get(root.id)).toMatchObject({ visible: false, openable: false, strainName: null, owner: null });
    expect(byId.get(rheaGrandchild)).toMatchObject({ visible: true, owner: { name: 'Rhea Recipient' } });
    expect(res.body.nodes).toHaveLength(4);
    expect(privateText(res.text)).toEqual([]);
  });

  it('a received culture’s page names its parent as the lineage does: strain and keeper, not a link to open', async () => {
    const mine = await rhea.agent.get(`/api/cultures/${rheaCulture}`).expect(200);
    expect(mine.body.culture.parent).toEqual({
      id: root.id,
      strainName: root.strainName,
      openable: false,
      keeperName: 'Kell Keeper',
    });
    expect(privateText(mine.text)).toEqual([]);
    // her own re-culture's parent is hers: named and openable
    const grand = await rhea.agent.get(`/api/cultures/${rheaGrandchild}`).expect(200);
    expect(grand.body.culture.parent).toMatchObject({ id: rheaCulture, openable: true, keeperName: null });
    // Pip shares no club with Rhea's club-A keeper, but is in club B with Rhea: her node is named
    const pips = await pip.agent.get(`/api/cultures/${pipCulture}`).expect(200);
    expect(pips.body.culture.parent).toMatchObject({
      id: rheaGrandchild,
      openable: false,
      keeperName: 'Rhea Recipient',
    });
  });

  it('a parent kept by someone the viewer shares no club with is not named', async () => {
    const temp = await signedUpPerson(t, 'Tove Transient');
    const club = await buildClub(t, [
      { person: kell, role: 'owner' },
      { person: temp, role: 'member' },
    ]);
    const other = (await kell.agent.post('/api/cultures').send(buildDregs()).expect(201)).body.culture.id as string;
    const theirs = await handOver(club, kell, temp, other);
    await temp.agent.post(`/api/clubs/${club}/leave`).expect(204);
    const page = await temp.agent.get(`/api/cultures/${theirs}`).expect(200);
    expect(page.body.culture.parent).toEqual({ id: other, strainName: null, openable: false, keeperName: null });
  });

  it('the middle level follows membership: after leaving the club, the keeper’s node is hidden again', async () => {
    const temp = await signedUpPerson(t, 'Tess Temporary');
    const club = await buildClub(t, [
      { person: kell, role: 'owner' },
      { person: temp, role: 'member' },
    ]);
    const other = (await kell.agent.post('/api/cultures').send(buildDregs()).expect(201)).body.culture.id as string;
    const theirs = await handOver(club, kell, temp, other);
    const before = await temp.agent.get(`/api/cultures/${theirs}/lineage`).expect(200);
    expect(before.body.nodes.find((n: { id: string }) => n.id === other).visible).toBe(true);
    await temp.agent.post(`/api/clubs/${club}/leave`).expect(204);
    const after = await temp.agent.get(`/api/cultures/${theirs}/lineage`).expect(200);
    expect(after.body.nodes.find((n: { id: string }) => n.id === other)).toMatchObject({ visible: false, owner: null });
  });
});

describe('privacy: a member cannot read another member’s private culture, notes or photos', () => {
  it('through any culture or photo route, including the photo file URLs and the lineage of it', async () => {
    for (const path of [
      `/api/cultures/${root.id}`,
      `/api/cultures/${root.id}/events`,
      `/api/cultures/${root.id}/health`,
      `/api/cultures/${root.id}/photos`,
      `/api/cultures/${root.id}/photos/${photoId}/web`,
      `/api/cultures/${root.id}/photos/${photoId}/thumb`,
      `/api/cultures/${root.id}/lineage`,
      `/api/cultures/${root.id}/quarantine-preview`,
    ]) {
      for (const who of [rhea, pip, stranger]) {
        const res = await who.agent.get(path);
        expect({ path, who: who.name, status: res.status }).toEqual({ path, who: who.name, status: 404 });
        expect(privateText(res.text)).toEqual([]);
      }
    }
    // changing or deleting is just as invisible
    await rhea.agent.patch(`/api/cultures/${root.id}`).send({ notes: 'mine now' }).expect(404);
    await rhea.agent.delete(`/api/cultures/${root.id}/photos/${photoId}`).expect(404);
    await rhea.agent.post(`/api/cultures/${root.id}/events`).send({ kind: 'note', notes: 'x' }).expect(404);
  });

  it('through the club’s bank, requests, activity, and the recipient’s own culture, library and backup', async () => {
    const paths = [
      `/api/clubs/${clubA}/bank`,
      `/api/clubs/${clubA}/requests`,
      `/api/clubs/${clubA}/activity`,
      `/api/clubs/${clubA}/stock`,
      `/api/cultures/${rheaCulture}`,
      `/api/cultures/${rheaCulture}/events`,
      `/api/cultures/${rheaCulture}/photos`,
      `/api/cultures?pageSize=100`,
      `/api/cultures/export.csv`,
      `/api/cultures/backup.json`,
      `/api/cultures/backup.json?photos=1`,
      `/api/notifications`,
    ];
    for (const path of paths) {
      const res = await rhea.agent.get(path);
      expect({ path, status: res.status }).toEqual({ path, status: 200 });
      expect({ path, leaked: privateText(res.text) }).toEqual({ path, leaked: [] });
    }
  });
});

describe('contamination anywhere in a lineage', () => {
  it('quarantining the root flags every descendant across owners and clubs and tells each keeper once', async () => {
    const preview = await kell.agent.get(`/api/cultures/${root.id}/quarantine-preview`).expect(200);
    // Kell's own form lists only Kell's descendants; the others are flagged for their keepers
    expect(preview.body.descendants).toEqual([]);
    const q = await kell.agent
      .post(`/api/cultures/${root.id}/quarantine`)
      .send({ notes: 'Ropy and sour', flagDescendantIds: [] })
      .expect(200);
    expect(q.body).toMatchObject({ keepersNotified: 2, flagged: 3 });

    for (const [who, id] of [
      [rhea, rheaCulture],
      [rhea, rheaGrandchild],
      [pip, pipCulture],
    ] as const) {
      const res = await who.agent.get(`/api/cultures/${id}`).expect(200);
      expect(res.body.culture).toMatchObject({
        suspect: true,
        suspectFrom: { id: root.id, strainName: root.strainName },
      });
      expect(privateText(res.text)).toEqual([]);
    }
    const events = await pip.agent.get(`/api/cultures/${pipCulture}/events`).expect(200);
    expect(events.body.events.some((e: { kind: string }) => e.kind === 'contamination_suspected')).toBe(true);

    for (const who of [rhea, pip]) {
      const notices = await t.database.db
        .select()
        .from(notifications)
        .where(and(eq(notifications.userId, who.id), eq(notifications.kind, 'culture.lineage_contamination')));
      expect(notices).toHaveLength(1);
      expect(notices[0]!.title).toMatch(/Contamination confirmed upstream/);
      expect(notices[0]!.body).toContain(root.strainName);
      expect(notices[0]!.body).not.toContain('Ropy and sour');
    }
    const kellNotices = await t.database.db
      .select()
      .from(notifications)
      .where(and(eq(notifications.userId, kell.id), eq(notifications.kind, 'culture.lineage_contamination')));
    expect(kellNotices).toHaveLength(0);

    // both clubs the strain passed through record it in their feeds
    for (const [who, club] of [
      [rhea, clubA],
      [pip, clubB],
    ] as const) {
      const feed = await who.agent.get(`/api/clubs/${club}/activity`).expect(200);
      expect(feed.body.activity).toEqual(
        expect.arrayContaining([expect.objectContaining({ kind: 'culture_quarantined', cultureId: root.id })]),
      );
    }
    // a suspect culture can no longer be offered or asked for
    await pip.agent.post(`/api/clubs/${clubB}/bank`).send({ cultureId: pipCulture }).expect(409);
    const [row] = await t.database.db.select().from(cultures).where(eq(cultures.id, pipCulture));
    expect(row!.suspectFromCultureId).toBe(root.id);
  });
});
