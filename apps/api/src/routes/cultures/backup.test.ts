import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { buildTestApp, signUp, type TestApp } from '../../../test/helpers';
import { buildDregs, buildReculture, buildSlurry } from '../../../test/cultureFactories';
import { importBackup } from '../../services/cultureBackup';
import type { ServiceContext } from '../../services/context';
import { localDiskStorage } from '../../storage/localDisk';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => {
  await t.close();
});

async function keeperWithLineage() {
  const agent = t.agent();
  await signUp(agent);
  const root = (
    await agent
      .post('/api/cultures')
      .send(buildDregs({ strainName: '=HYPERLINK("http://x.test")' }))
      .expect(201)
  ).body.culture;
  const child = (
    await agent
      .post('/api/cultures')
      .send(
        buildSlurry(root.id, {
          origin: { origin: 'batch_slurry', batchName: 'Batch 3, "Pale"', crop: 'bottom', washed: false },
        }),
      )
      .expect(201)
  ).body.culture;
  const grand = (await agent.post('/api/cultures').send(buildReculture(child.id)).expect(201)).body.culture;
  const count = (
    await agent
      .post(`/api/cultures/${child.id}/events`)
      .send({ kind: 'counted', data: { cellsCounted: 300, squaresCounted: 5, dilution: 100, live: 80, dead: 20 } })
      .expect(201)
  ).body.event;
  await agent
    .post(`/api/cultures/${child.id}/events`)
    .send({
      kind: 'counted',
      supersedesEventId: count.id,
      data: { cellsCounted: 300, squaresCounted: 5, dilution: 100, live: 70, dead: 30 },
    })
    .expect(201);
  return { agent, root, child, grand };
}

const download = (agent: ReturnType<TestApp['agent']>, path: string) =>
  agent
    .get(path)
    .buffer(true)
    .parse((r, cb) => {
      let s = '';
      r.setEncoding('utf8');
      r.on('data', (c: string) => (s += c));
      r.on('end', () => cb(null, s));
    });

describe('export', () => {
  it('gives a CSV of the library, one row per culture, safe to open in a spreadsheet', async () => {
    const { agent, root, child } = await keeperWithLineage();
    const res = await download(agent, '/api/cultures/export.csv').expect(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="barmkeep-cultures-/);
    const lines = (res.body as string).trim().split('\r\n');
    expect(lines[0]).toMatch(/^id,strain,species,tags,form,origin,state,generation,parent_id/);
    expect(lines).toHaveLength(4);
    const rootLine = lines.find((l) => l.startsWith(root.id))!;
    expect(rootLine).toContain(`"'=HYPERLINK(""http://x.test"")"`);
    expect(lines.find((l) => l.startsWith(child.id))).toContain(`,${root.id},`);
    const other = t.agent();
    await signUp(other);
    const empty = await download(other, '/api/cultures/export.csv').expect(200);
    expect((empty.body as string).trim().split('\r\n')).toHaveLength(1);
    await t.agent().get('/api/cultures/export.csv').expect(401);
  });
});

describe('backup and import', () => {
  it('round-trips a lineage with its log into another account, with new ids', async () => {
    const { agent } = await keeperWithLineage();
    const backup = JSON.parse((await download(agent, '/api/cultures/backup.json').expect(200)).body as string);
    expect(backup).toMatchObject({ format: 'barmkeep-culture-backup', version: 2, photos: [] });
    expect(backup.cultures).toHaveLength(3);
    const other = t.agent();
    await signUp(other);
    const res = await other
      .post('/api/cultures/backup')
      .attach('file', Buffer.from(JSON.stringify(backup)), 'backup.json')
      .expect(201);
    expect(res.body.imported).toEqual({ cultures: 3, events: backup.events.length, photos: 0 });
    const list = (await other.get('/api/cultures?sort=generation').expect(200)).body.cultures;
    expect(list.map((c: { generation: number }) => c.generation)).toEqual([0, 1, 1]);
    expect(list.some((c: { id: string }) => backup.cultures.some((b: { id: string }) => b.id === c.id))).toBe(false);
    const slurry = list.find((c: { form: string }) => c.form === 'slurry_unwashed');
    const detail = (await other.get(`/api/cultures/${slurry.id}`).expect(200)).body.culture;
    expect(detail.health.measured.viability).toBeCloseTo(0.7, 5); // the correction, not the corrected count
    const lineage = (await other.get(`/api/cultures/${slurry.id}/lineage`).expect(200)).body;
    expect(lineage.nodes).toHaveLength(3);
    const events = (await other.get(`/api/cultures/${slurry.id}/events`).expect(200)).body.events;
    expect(events.filter((e: { supersededByEventId: string | null }) => e.supersededByEventId)).toHaveLength(1);
  });

  it('exports parents before children even after a culture was moved under a younger one', async () => {
    const { agent, root } = await keeperWithLineage();
    const older = (await agent.post('/api/cultures').send(buildSlurry(undefined)).expect(201)).body.culture;
    const younger = (await agent.post('/api/cultures').send(buildReculture(root.id)).expect(201)).body.culture;
    await agent.patch(`/api/cultures/${older.id}`).send({ parentId: younger.id }).expect(200);
    const backup = JSON.parse((await download(agent, '/api/cultures/backup.json').expect(200)).body as string);
    const at = (id: string) => backup.cultures.findIndex((c: { id: string }) => c.id === id);
    expect(at(younger.id)).toBeLessThan(at(older.id));
    const other = t.agent();
    await signUp(other);
    await other
      .post('/api/cultures/backup')
      .attach('file', Buffer.from(JSON.stringify(backup)), 'b.json')
      .expect(201);
  });

  it('a bad file changes nothing and says which row is wrong', async () => {
    const { agent } = await keeperWithLineage();
    const backup = JSON.parse((await download(agent, '/api/cultures/backup.json').expect(200)).body as string);
    const other = t.agent();
    await signUp(other);
    const send = (body: unknown) =>
      other
        .post('/api/cultures/backup')
        .attach('file', Buffer.from(typeof body === 'string' ? body : JSON.stringify(body)), 'b.json');

    const badForm = structuredClone(backup);
    badForm.cultures[1].form = 'jam jar';
    const r1 = await send(badForm).expect(400);
    expect(Object.keys(r1.body.error.fields)).toEqual([`cultures[1] (id ${backup.cultures[1].id}): form`]);

    const childFirst = structuredClone(backup);
    childFirst.cultures.reverse();
    const r2 = await send(childFirst).expect(400);
    expect(r2.body.error.fields[`cultures[0] (id ${childFirst.cultures[0].id})`][0]).toMatch(
      /parent must appear earlier/,
    );

    const orphanEvent = structuredClone(backup);
    orphanEvent.events[0].cultureId = 'nowhere';
    const r3 = await send(orphanEvent).expect(400);
    expect(Object.keys(r3.body.error.fields)[0]).toMatch(/^events\[0\]/);

    expect((await send('{ not json').expect(400)).body.error.code).toBe('invalid_backup');
    expect((await send({ ...backup, format: 'spreadsheet' }).expect(400)).body.error.fields['format']).toBeDefined();
    await other.post('/api/cultures/backup').expect(400);
    expect((await other.get('/api/cultures').expect(200)).body.total).toBe(0);
  });
});

describe('backup with photos', () => {
  let tp: TestApp;
  let dir: string;
  beforeAll(async () => {
    dir = await mkdtemp(path.join(tmpdir(), 'barmkeep-backup-'));
    tp = await buildTestApp({ UPLOADS_DIR: dir });
  });
  afterAll(async () => {
    await tp.close();
    await rm(dir, { recursive: true, force: true });
  });
  const stored = async () => (await readdir(dir, { recursive: true, withFileTypes: true })).filter((f) => f.isFile());
  const binary = (agent: ReturnType<TestApp['agent']>, url: string) =>
    agent
      .get(url)
      .buffer(true)
      .parse((r, cb) => {
        const parts: Buffer[] = [];
        r.on('data', (c: Buffer) => parts.push(c));
        r.on('end', () => cb(null, Buffer.concat(parts)));
      });

  /** A keeper with a dregs culture and a re-culture of it; two photos, one tied to a count. */
  async function keeperWithPhotos() {
    const agent = tp.agent();
    await signUp(agent);
    const root = (await agent.post('/api/cultures').send(buildDregs()).expect(201)).body.culture;
    const child = (await agent.post('/api/cultures').send(buildReculture(root.id)).expect(201)).body.culture;
    const count = (
      await agent
        .post(`/api/cultures/${child.id}/events`)
        .send({ kind: 'counted', data: { cellsCounted: 200, squaresCounted: 5, dilution: 100 } })
        .expect(201)
    ).body.event;
    const image = await sharp({ create: { width: 900, height: 600, channels: 3, background: '#c8a050' } })
      .jpeg()
      .toBuffer();
    await agent
      .post(`/api/cultures/${root.id}/photos`)
      .field('caption', 'Sediment in the jar')
      .attach('photo', image, 'jar.jpg')
      .expect(201);
    await agent
      .post(`/api/cultures/${child.id}/photos`)
      .field('caption', 'Chamber field')
      .field('eventId', count.id)
      .attach('photo', image, 'field.jpg')
      .expect(201);
    return { agent, root, child, count };
  }
  const backupOf = async (agent: ReturnType<TestApp['agent']>, query = '') =>
    JSON.parse((await download(agent, `/api/cultures/backup.json${query}`).expect(200)).body as string);
  const importInto = (agent: ReturnType<TestApp['agent']>, backup: unknown) =>
    agent.post('/api/cultures/backup').attach('file', Buffer.from(JSON.stringify(backup)), 'backup.json');

  it('leaves the photos out unless asked, and carries each web-size image with its caption and log entry', async () => {
    const { agent, root, child, count } = await keeperWithPhotos();
    const plain = await backupOf(agent);
    expect(plain).toMatchObject({ version: 2, photos: [] });
    const full = await backupOf(agent, '?photos=1');
    expect(full.cultures).toHaveLength(2);
    expect(full.photos).toHaveLength(2);
    expect(full.photos[0]).toMatchObject({ cultureId: root.id, eventId: null, caption: 'Sediment in the jar' });
    expect(full.photos[1]).toMatchObject({ cultureId: child.id, eventId: count.id, caption: 'Chamber field' });
    const meta = await sharp(Buffer.from(full.photos[0].imageBase64, 'base64')).metadata();
    expect([meta.format, meta.width, meta.height]).toEqual(['webp', 900, 600]);
    expect((await agent.get('/api/cultures/backup.json?photos=yes').expect(400)).body.error.fields).toHaveProperty(
      'query.photos',
    );
  });

  it('round-trips the photos through the upload pipeline into another account', async () => {
    const { agent } = await keeperWithPhotos();
    const backup = await backupOf(agent, '?photos=1');
    // an image with camera details and a GPS position, as a hand-made file might hold
    const withGps = await sharp({ create: { width: 2400, height: 1200, channels: 3, background: '#806040' } })
      .jpeg()
      .withExif({ IFD0: { Make: 'Invented Camera Co' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '52/1 22/1 0/1' } })
      .toBuffer();
    backup.photos[0].imageBase64 = withGps.toString('base64');
    backup.photos[0].contentType = 'image/jpeg';
    const other = tp.agent();
    await signUp(other);
    const before = (await stored()).length;
    const res = await importInto(other, backup).expect(201);
    expect(res.body.imported).toEqual({ cultures: 2, events: backup.events.length, photos: 2 });
    expect((await stored()).length).toBe(before + 4); // web and thumbnail of each

    const list = (await other.get('/api/cultures?sort=name').expect(200)).body.cultures as {
      id: string;
      origin: string;
    }[];
    const root = list.find((c) => c.origin === 'bottle_dregs')!;
    const child = list.find((c) => c.origin === 'reculture')!;
    const [rootPhoto] = (await other.get(`/api/cultures/${root.id}/photos`).expect(200)).body.photos;
    expect(rootPhoto).toMatchObject({ caption: 'Sediment in the jar', eventId: null, width: 1600, height: 800 });
    for (const url of [rootPhoto.webUrl, rootPhoto.thumbUrl]) {
      const img = await binary(other, url).expect(200);
      const meta = await sharp(img.body as Buffer).metadata();
      expect(meta.format).toBe('webp');
      expect(meta.exif).toBeUndefined();
      expect((img.body as Buffer).includes(Buffer.from('Invented Camera'))).toBe(false);
    }
    const [childPhoto] = (await other.get(`/api/cultures/${child.id}/photos`).expect(200)).body.photos;
    const events = (await other.get(`/api/cultures/${child.id}/events`).expect(200)).body.events as {
      id: string;
      kind: string;
    }[];
    expect(childPhoto.eventId).toBe(events.find((e) => e.kind === 'counted')!.id);
    // the first account's photos stay where they were
    expect(backup.photos.map((p: { id: string }) => p.id)).not.toContain(childPhoto.id);
  });

  it('a bad image rejects the whole import, names its row, and writes nothing anywhere', async () => {
    const { agent } = await keeperWithPhotos();
    const backup = await backupOf(agent, '?photos=1');
    const other = tp.agent();
    await signUp(other);
    const before = (await stored()).length;

    const notImage = structuredClone(backup);
    notImage.photos[1].imageBase64 = Buffer.from('just some text, renamed').toString('base64');
    const r1 = await importInto(other, notImage).expect(400);
    expect(r1.body.error.fields[`photos[1] (id ${backup.photos[1].id})`][0]).toMatch(/not a photo we can read/);
    expect(Object.keys(r1.body.error.fields)).toHaveLength(1);

    const notBase64 = structuredClone(backup);
    notBase64.photos[0].imageBase64 = '%%% not base64 %%%';
    const r2 = await importInto(other, notBase64).expect(400);
    expect(Object.keys(r2.body.error.fields)).toEqual([`photos[0] (id ${backup.photos[0].id}): imageBase64`]);

    const strayEvent = structuredClone(backup);
    strayEvent.photos[0].eventId = backup.photos[1].eventId; // a log entry of the other culture
    const r3 = await importInto(other, strayEvent).expect(400);
    expect(r3.body.error.fields[`photos[0] (id ${backup.photos[0].id})`][0]).toMatch(/another culture/);

    expect((await other.get('/api/cultures').expect(200)).body.total).toBe(0);
    expect((await stored()).length).toBe(before);
  });

  it('removes the images it stored when the database then refuses the rows', async () => {
    const { agent } = await keeperWithPhotos();
    const backup = await backupOf(agent, '?photos=1');
    const emptyDir = await mkdtemp(path.join(tmpdir(), 'barmkeep-backup-refused-'));
    try {
      const ctx = { db: tp.database.db, now: () => new Date() } as unknown as ServiceContext;
      // an actor with no account row: every image passes, then the first insert breaks a foreign key
      await expect(
        importBackup(ctx, localDiskStorage(emptyDir), { id: 'u_no_such_person' }, Buffer.from(JSON.stringify(backup))),
      ).rejects.toThrow();
      expect((await readdir(emptyDir, { recursive: true, withFileTypes: true })).filter((f) => f.isFile())).toEqual([]);
    } finally {
      await rm(emptyDir, { recursive: true, force: true });
    }
  });

  it('still imports a version 1 backup, which has no photos', async () => {
    const { agent } = await keeperWithPhotos();
    const backup = await backupOf(agent, '?photos=1');
    const other = tp.agent();
    await signUp(other);
    const v1 = { ...backup, version: 1, photos: undefined };
    expect((await importInto(other, { ...v1, photos: backup.photos }).expect(400)).body.error.fields).toHaveProperty(
      'photos',
    );
    const res = await importInto(other, v1).expect(201);
    expect(res.body.imported).toEqual({ cultures: 2, events: backup.events.length, photos: 0 });
    expect((await importInto(other, { ...v1, version: 3 }).expect(400)).body.error.fields).toHaveProperty('version');
  });
});
