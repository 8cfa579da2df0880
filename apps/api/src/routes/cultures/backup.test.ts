import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildTestApp, signUp, type TestApp } from '../../../test/helpers';
import { buildDregs, buildReculture, buildSlurry } from '../../../test/cultureFactories';

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
    expect(backup).toMatchObject({ format: 'barmkeep-culture-backup', version: 1 });
    expect(backup.cultures).toHaveLength(3);
    const other = t.agent();
    await signUp(other);
    const res = await other
      .post('/api/cultures/backup')
      .attach('file', Buffer.from(JSON.stringify(backup)), 'backup.json')
      .expect(201);
    expect(res.body.imported).toEqual({ cultures: 3, events: backup.events.length });
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
