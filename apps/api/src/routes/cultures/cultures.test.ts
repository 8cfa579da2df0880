import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { hemocytometerCount, viabilityFromStain, maxStorageDays, projectViability } from '@barmkeep/core';
import { buildTestApp, signUp, type TestApp } from '../../../test/helpers';
import { buildDregs, buildReculture, buildSlurry, daysAgo } from '../../../test/cultureFactories';
import { deriveGeneration } from '../../services/cultureLineage';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => {
  await t.close();
});

type Agent = ReturnType<TestApp['agent']>;
async function keeper() {
  const agent = t.agent();
  const { user } = await signUp(agent);
  return { agent, user };
}
async function create(agent: Agent, body: object) {
  const res = await agent.post('/api/cultures').send(body);
  if (res.status !== 201) throw new Error(`create failed ${res.status}: ${JSON.stringify(res.body)}`);
  return res.body.culture as { id: string; generation: number; [k: string]: unknown };
}
async function total(agent: Agent) {
  return (await agent.get('/api/cultures').expect(200)).body.total as number;
}

describe('POST /api/cultures', () => {
  it('adds a bottle-dregs culture with its origin, a log entry and core-projected health', async () => {
    const { agent, user } = await keeper();
    const input = buildDregs({
      origin: { origin: 'bottle_dregs', beerName: 'Hollow Oak Saison', bottleCount: 3, pasteurized: 'unknown' },
    });
    const res = await agent.post('/api/cultures').send(input).expect(201);
    const c = res.body.culture;
    expect(c).toMatchObject({
      strainName: input.strainName,
      form: 'bottle_dregs',
      origin: 'bottle_dregs',
      generation: 0,
      state: 'stored',
      parentId: null,
      ownerUserId: user.id,
    });
    expect(c.originDetails).toMatchObject({ beerName: 'Hollow Oak Saison', bottleCount: 3, pasteurized: 'unknown' });
    const expected = projectViability({
      form: 'bottle_dregs',
      madeOrHarvestedAt: new Date(input.madeAt as string),
      at: new Date(c.health.at),
      storageTempC: 4,
    });
    expect(c.health.viability).toBeCloseTo(expected.viability, 10);
    expect(c.health.viabilityBasis).toBe('model');
    expect(c.health.cells.kind).toBe('estimate');
    expect(c.health.storage.days).toBe(maxStorageDays('bottle_dregs', 4).days);
    expect(c.warnings.join(' ')).toMatch(/pasteurized/i);
    const events = (await agent.get(`/api/cultures/${c.id}/events`).expect(200)).body.events;
    expect(events).toHaveLength(1);
    expect(events[0]).toMatchObject({ kind: 'created', author: { id: user.id } });
  });

  it('warns that pasteurized sediment is dead', async () => {
    const { agent } = await keeper();
    const c = await create(
      agent,
      buildDregs({
        origin: { origin: 'bottle_dregs', beerName: 'Tin Roof Dubbel', bottleCount: 1, pasteurized: 'yes' },
      }),
    );
    expect((c.warnings as string[])[0]).toMatch(/dead sediment/);
  });

  it('refuses impossible input, reports every field, and creates nothing', async () => {
    const { agent } = await keeper();
    const cases: [object, string][] = [
      [buildDregs({ madeAt: new Date(Date.now() + 3 * 86_400_000).toISOString() }), 'body.madeAt'],
      [
        {
          ...buildDregs(),
          form: 'liquid_pack',
          origin: {
            origin: 'purchased',
            maker: 'Made-up Yeast Co.',
            manufacturedOn: '2025-03-10',
            bestBy: '2025-01-01',
          },
        },
        'body.origin.bestBy',
      ],
      [
        buildDregs({ origin: { origin: 'bottle_dregs', beerName: 'X', bottleCount: -2, pasteurized: 'no' } }),
        'body.origin.bottleCount',
      ],
      [buildDregs({ amount: { volumeMl: -5 } }), 'body.amount.volumeMl'],
      [buildDregs({ storageTempC: 400 }), 'body.storageTempC'],
      [buildDregs({ madeAt: '2025-02-30' }), 'body.madeAt'],
      [{ ...buildDregs(), origin: { origin: 'reculture' } }, 'body.parentId'],
      [{ ...buildSlurry(undefined), form: 'slurry_washed' }, 'body.form'],
      [{ ...buildDregs(), strainName: '   ' }, 'body.strainName'],
    ];
    for (const [body, field] of cases) {
      const res = await agent.post('/api/cultures').send(body).expect(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(Object.keys(res.body.error.fields), JSON.stringify(res.body.error.fields)).toContain(field);
    }
    expect(await total(agent)).toBe(0);
  });

  it('reports several bad fields at once', async () => {
    const { agent } = await keeper();
    const res = await agent
      .post('/api/cultures')
      .send({ strainName: '', form: 'jar', storageTempC: 'cold' })
      .expect(400);
    expect(Object.keys(res.body.error.fields)).toEqual(
      expect.arrayContaining(['body.strainName', 'body.form', 'body.storageTempC', 'body.madeAt']),
    );
  });

  it('refuses a parent the keeper may not use, with the same answer as a missing one', async () => {
    const a = await keeper();
    const b = await keeper();
    const aRoot = await create(a.agent, buildDregs());
    const other = await b.agent.post('/api/cultures').send(buildReculture(aRoot.id)).expect(400);
    const missing = await b.agent.post('/api/cultures').send(buildReculture('no-such-culture')).expect(400);
    expect(other.body.error.fields['body.parentId']).toEqual(missing.body.error.fields['body.parentId']);
    expect(await total(b.agent)).toBe(0);
  });
});

describe('generation from the lineage', () => {
  it('keeps the generation on re-culture and split, adds one on a batch harvest', async () => {
    const { agent } = await keeper();
    const root = await create(agent, buildDregs());
    expect(root.generation).toBe(0);
    const slant = await create(agent, buildReculture(root.id));
    expect(slant.generation).toBe(0);
    const harvest = await create(agent, buildSlurry(slant.id));
    expect(harvest.generation).toBe(1);
    const harvest2 = await create(agent, buildSlurry(harvest.id));
    expect(harvest2.generation).toBe(2);
    const split = await agent
      .post(`/api/cultures/${harvest2.id}/split`)
      .send({ count: 3, volumeMlEach: 50 })
      .expect(201);
    expect(split.body.cultures.map((c: { generation: number }) => c.generation)).toEqual([2, 2, 2]);
    const parent = (await agent.get(`/api/cultures/${harvest2.id}`).expect(200)).body.culture;
    expect(parent.state).toBe('used_up');
    const events = (await agent.get(`/api/cultures/${harvest2.id}/events`).expect(200)).body.events;
    expect(events.at(-1)).toMatchObject({
      kind: 'split',
      data: { childIds: split.body.cultures.map((c: { id: string }) => c.id) },
    });
  });

  it('lets a lineage start at a stated generation, but never overrides a derived one', async () => {
    const { agent } = await keeper();
    const gift = await create(agent, {
      ...buildSlurry(undefined),
      origin: { origin: 'batch_slurry', batchName: 'Friend’s Porter', crop: 'top', washed: false },
      generation: 3,
    });
    expect(gift.generation).toBe(3);
    const res = await agent
      .post('/api/cultures')
      .send({ ...buildSlurry(gift.id), generation: 0 })
      .expect(400);
    expect(res.body.error.fields['body.generation']).toBeDefined();
  });

  it('derives the rule the decision record states', () => {
    expect(deriveGeneration(undefined, 'bottle_dregs')).toBe(0);
    expect(deriveGeneration(undefined, 'gift', 4)).toBe(4);
    expect(deriveGeneration({ generation: 2 }, 'reculture')).toBe(2);
    expect(deriveGeneration({ generation: 2 }, 'gift')).toBe(2);
    expect(deriveGeneration({ generation: 2 }, 'batch_slurry')).toBe(3);
  });
});

describe('PATCH /api/cultures/:id', () => {
  it('updates descriptive fields and normalises tags', async () => {
    const { agent } = await keeper();
    const c = await create(agent, buildDregs());
    const res = await agent
      .patch(`/api/cultures/${c.id}`)
      .send({ strainName: 'Hollow Oak house', tags: ['Saison', 'saison', 'Farmhouse'] })
      .expect(200);
    expect(res.body.culture).toMatchObject({ strainName: 'Hollow Oak house', tags: ['saison', 'farmhouse'] });
    await agent.patch(`/api/cultures/${c.id}`).send({}).expect(400);
    const notes = await agent.patch(`/api/cultures/${c.id}`).send({ notes: 'smells of pear' }).expect(200);
    expect(notes.body.culture.tags).toEqual(['saison', 'farmhouse']);
  });

  it('records every change of the details in the handling log, and nothing when nothing changed', async () => {
    const { agent } = await keeper();
    const c = await create(agent, buildSlurry(undefined, { strainName: 'Jar 4 ale', tags: ['house'] }));
    const notes = async () =>
      (
        (await agent.get(`/api/cultures/${c.id}/events`).expect(200)).body.events as {
          kind: string;
          notes: string;
          data: Record<string, unknown>;
        }[]
      ).filter((e) => e.kind === 'note');
    await agent
      .patch(`/api/cultures/${c.id}`)
      .send({ strainName: 'Jar 4 farmhouse ale', tags: ['house'], species: '' })
      .expect(200);
    const [rename] = await notes();
    expect(rename).toMatchObject({
      notes: 'Details corrected: strain name',
      data: { change: 'details', from: { strainName: 'Jar 4 ale' }, to: { strainName: 'Jar 4 farmhouse ale' } },
    });
    // the same values again: no entry
    await agent
      .patch(`/api/cultures/${c.id}`)
      .send({ strainName: 'Jar 4 farmhouse ale', tags: ['house'] })
      .expect(200);
    expect(await notes()).toHaveLength(1);
    // refused: neither the row nor the log changes
    await agent.patch(`/api/cultures/${c.id}`).send({ strainName: '  ' }).expect(400);
    await agent.patch(`/api/cultures/${c.id}`).send({ strainName: 'Renamed', parentId: c.id }).expect(400);
    expect((await agent.get(`/api/cultures/${c.id}`).expect(200)).body.culture.strainName).toBe('Jar 4 farmhouse ale');
    expect(await notes()).toHaveLength(1);
    // the entry the app wrote is history: it cannot be "corrected" into something else
    const fake = await agent
      .post(`/api/cultures/${c.id}/events`)
      .send({
        kind: 'note',
        notes: 'It was never renamed',
        supersedesEventId: (rename as unknown as { id: string }).id,
      })
      .expect(400);
    expect(fake.body.error.fields['body.supersedesEventId'][0]).toMatch(/record a new one/);
    expect(await notes()).toHaveLength(1);
  });

  it('rejects a parent that would close a loop and changes nothing', async () => {
    const { agent } = await keeper();
    const root = await create(agent, buildSlurry(undefined));
    const child = await create(agent, buildSlurry(root.id));
    const grandchild = await create(agent, buildReculture(child.id));
    for (const parentId of [grandchild.id, child.id, root.id]) {
      const res = await agent.patch(`/api/cultures/${root.id}`).send({ parentId }).expect(400);
      expect(res.body.error.fields['body.parentId'][0]).toMatch(/own ancestor/);
    }
    const after = (await agent.get(`/api/cultures/${root.id}`).expect(200)).body.culture;
    expect(after.parentId).toBeNull();
  });

  it('the database itself refuses a cycle even if a caller skipped the check', async () => {
    const { agent } = await keeper();
    const root = await create(agent, buildSlurry(undefined));
    const child = await create(agent, buildSlurry(root.id));
    await expect(
      t.database.pool.query('update cultures set parent_id = $1 where id = $2', [child.id, root.id]),
    ).rejects.toMatchObject({ code: '23514' });
  });

  it('moving a culture under a new parent recomputes the generation of its whole subtree', async () => {
    const { agent } = await keeper();
    const a = await create(agent, { ...buildSlurry(undefined), generation: 5 });
    const b = await create(agent, buildSlurry(undefined));
    const b1 = await create(agent, buildSlurry(b.id));
    const b2 = await create(agent, buildReculture(b1.id));
    expect([b.generation, b1.generation, b2.generation]).toEqual([0, 1, 1]);
    await agent.patch(`/api/cultures/${b.id}`).send({ parentId: a.id }).expect(200);
    const gens = await Promise.all(
      [b, b1, b2].map(async (c) => (await agent.get(`/api/cultures/${c.id}`)).body.culture.generation),
    );
    expect(gens).toEqual([6, 7, 7]);
  });

  it('refuses a parent on bottle dregs', async () => {
    const { agent } = await keeper();
    const a = await create(agent, buildSlurry(undefined));
    const d = await create(agent, buildDregs());
    await agent.patch(`/api/cultures/${d.id}`).send({ parentId: a.id }).expect(400);
  });
});

describe('authorization', () => {
  it('someone else’s culture is 404 on every route, never leaked', async () => {
    const a = await keeper();
    const b = await keeper();
    const c = await create(a.agent, buildDregs());
    const paths: [string, string, object?][] = [
      ['get', `/api/cultures/${c.id}`],
      ['patch', `/api/cultures/${c.id}`, { strainName: 'mine now' }],
      ['get', `/api/cultures/${c.id}/events`],
      ['post', `/api/cultures/${c.id}/events`, { kind: 'note', notes: 'hello' }],
      ['post', `/api/cultures/${c.id}/state`, { state: 'discarded' }],
      ['post', `/api/cultures/${c.id}/split`, { count: 2 }],
      ['get', `/api/cultures/${c.id}/lineage`],
      ['get', `/api/cultures/${c.id}/health`],
      ['get', `/api/cultures/${c.id}/quarantine-preview`],
      ['post', `/api/cultures/${c.id}/quarantine`, {}],
    ];
    for (const [method, path, body] of paths) {
      const req = (
        b.agent as unknown as Record<
          string,
          (p: string) => { send(b?: object): Promise<{ status: number; body: { error: { code: string } } }> }
        >
      )[method]!(path);
      const res = await req.send(body);
      expect(res.status, `${method} ${path}`).toBe(404);
      expect(res.body.error.code).toBe('not_found');
      expect(JSON.stringify(res.body)).not.toContain(c.strainName as string);
    }
    const list = (await b.agent.get('/api/cultures').expect(200)).body;
    expect(list.total).toBe(0);
    const still = (await a.agent.get(`/api/cultures/${c.id}`).expect(200)).body.culture;
    expect(still.strainName).toBe(c.strainName);
    expect(still.state).toBe('stored');
  });

  it('needs a signed-in person', async () => {
    const anon = t.agent();
    await anon.get('/api/cultures').expect(401);
    await anon.post('/api/cultures').send(buildDregs()).expect(401);
  });

  it('refuses a write from another site', async () => {
    const { agent } = await keeper();
    await agent.post('/api/cultures').set('Origin', 'http://evil.test').send(buildDregs()).expect(403);
  });
});

describe('handling log', () => {
  it('turns a hemocytometer count and stain into cells/mL and viability through core', async () => {
    const { agent } = await keeper();
    const c = await create(agent, buildSlurry(undefined, { amount: { volumeMl: 150 } }));
    const data = { cellsCounted: 412, squaresCounted: 5, dilution: 100, live: 188, dead: 12 };
    const res = await agent.post(`/api/cultures/${c.id}/events`).send({ kind: 'counted', data }).expect(201);
    const count = hemocytometerCount({ cellsCounted: 412, squaresCounted: 5, dilution: 100 });
    const stain = viabilityFromStain({ live: 188, dead: 12 });
    expect(res.body.event.data.result.cellsPerMl).toBeCloseTo(count.cellsPerMl, 0);
    expect(res.body.event.data.result.ci95).toEqual(count.ci95);
    expect(res.body.event.data.result.viability).toBeCloseTo(stain.viability, 12);
    const detail = (await agent.get(`/api/cultures/${c.id}`).expect(200)).body.culture;
    expect(detail.health.viabilityBasis).toBe('measured');
    expect(detail.health.cells.kind).toBe('measured');
    expect(detail.health.cells.total).toBeCloseTo(count.cellsPerMl * 150, -3);
    expect(detail.health.measured.viability).toBeCloseTo(stain.viability, 5);
  });

  it('a count can say how much culture there is, which turns cells/mL into total cells', async () => {
    const { agent } = await keeper();
    const c = await create(agent, buildDregs());
    await agent
      .post(`/api/cultures/${c.id}/events`)
      .send({ kind: 'counted', data: { cellsCounted: 120, squaresCounted: 10, dilution: 2 } })
      .expect(201);
    const before = (await agent.get(`/api/cultures/${c.id}`)).body.culture.health;
    expect(before.cells).toBeNull();
    expect(before.cellsMissing).toMatch(/volume/);
    await agent
      .post(`/api/cultures/${c.id}/events`)
      .send({ kind: 'counted', data: { cellsCounted: 120, squaresCounted: 10, dilution: 2, cultureVolumeMl: 40 } })
      .expect(201);
    const after = (await agent.get(`/api/cultures/${c.id}`)).body.culture;
    expect(after.amount.volumeMl).toBe(40);
    expect(after.health.cells.total).toBeCloseTo(
      hemocytometerCount({ cellsCounted: 120, squaresCounted: 10, dilution: 2 }).cellsPerMl * 40,
      -2,
    );
  });

  it('refuses absurd counts and half a stain', async () => {
    const { agent } = await keeper();
    const c = await create(agent, buildSlurry(undefined));
    const bad = [
      { cellsCounted: -3, squaresCounted: 5, dilution: 10 },
      { cellsCounted: 10, squaresCounted: 0, dilution: 10 },
      { cellsCounted: 10, squaresCounted: 5, dilution: 0.5 },
      { cellsCounted: 10.5, squaresCounted: 5, dilution: 10 },
      { cellsCounted: 10, squaresCounted: 5, dilution: 10, live: 20 },
      { cellsCounted: 10, squaresCounted: 5, dilution: 10, live: 0, dead: 0 },
    ];
    for (const data of bad) {
      const res = await agent.post(`/api/cultures/${c.id}/events`).send({ kind: 'counted', data }).expect(400);
      expect(Object.keys(res.body.error.fields).some((k) => k.startsWith('body.data'))).toBe(true);
    }
    await agent
      .post(`/api/cultures/${c.id}/events`)
      .send({ kind: 'note', occurredAt: new Date(Date.now() + 86_400_000).toISOString() })
      .expect(400);
    await agent
      .post(`/api/cultures/${c.id}/events`)
      .send({ kind: 'note', occurredAt: daysAgo(400) })
      .expect(400);
    await agent.post(`/api/cultures/${c.id}/events`).send({ kind: 'explode' }).expect(400);
    const events = (await agent.get(`/api/cultures/${c.id}/events`).expect(200)).body.events;
    expect(events.map((e: { kind: string }) => e.kind)).toEqual(['created']);
  });

  it('a correction supersedes a count without losing it; the newest version drives health', async () => {
    const { agent } = await keeper();
    const c = await create(agent, buildSlurry(undefined, { amount: { volumeMl: 100 } }));
    const first = (
      await agent
        .post(`/api/cultures/${c.id}/events`)
        .send({ kind: 'counted', data: { cellsCounted: 300, squaresCounted: 5, dilution: 100, live: 90, dead: 10 } })
        .expect(201)
    ).body.event;
    const fix = (
      await agent
        .post(`/api/cultures/${c.id}/events`)
        .send({
          kind: 'counted',
          supersedesEventId: first.id,
          notes: 'misread the dilution',
          data: { cellsCounted: 300, squaresCounted: 5, dilution: 10, live: 60, dead: 40 },
        })
        .expect(201)
    ).body.event;
    const events = (await agent.get(`/api/cultures/${c.id}/events`).expect(200)).body.events;
    const old = events.find((e: { id: string }) => e.id === first.id);
    expect(old.supersededByEventId).toBe(fix.id);
    expect(old.data.dilution).toBe(100);
    const detail = (await agent.get(`/api/cultures/${c.id}`).expect(200)).body.culture;
    expect(detail.health.measured.viability).toBeCloseTo(0.6, 5);
    // the old version cannot be corrected again, a different kind cannot correct it, nor can a note correct a split
    const again = await agent
      .post(`/api/cultures/${c.id}/events`)
      .send({ kind: 'counted', supersedesEventId: first.id, data: { cellsCounted: 1, squaresCounted: 1, dilution: 1 } })
      .expect(409);
    expect(again.body.error.code).toBe('already_corrected');
    await agent.post(`/api/cultures/${c.id}/events`).send({ kind: 'note', supersedesEventId: fix.id }).expect(400);
    const created = events.find((e: { kind: string }) => e.kind === 'created');
    await agent.post(`/api/cultures/${c.id}/events`).send({ kind: 'note', supersedesEventId: created.id }).expect(400);
  });

  it('the log is append-only in the database', async () => {
    const { agent } = await keeper();
    const c = await create(agent, buildDregs());
    await expect(
      t.database.pool.query(`update culture_events set notes = 'rewritten' where culture_id = $1`, [c.id]),
    ).rejects.toMatchObject({ code: '23001' });
  });

  it('a move changes where it is kept and when it needs attention', async () => {
    const { agent } = await keeper();
    const c = await create(agent, buildSlurry(undefined));
    const before = (await agent.get(`/api/cultures/${c.id}`)).body.culture;
    await agent
      .post(`/api/cultures/${c.id}/events`)
      .send({ kind: 'moved', data: { locationLabel: 'Garage shelf', storageTempC: 12 } })
      .expect(201);
    const after = (await agent.get(`/api/cultures/${c.id}`)).body.culture;
    expect(after.locationLabel).toBe('Garage shelf');
    expect(after.storageTempC).toBe(12);
    expect(after.daysUntilAttention).toBeLessThan(before.daysUntilAttention);
    await agent.post(`/api/cultures/${c.id}/events`).send({ kind: 'moved', data: {} }).expect(400);
  });

  it('pitching uses it up; a pitched culture cannot be fed', async () => {
    const { agent } = await keeper();
    const c = await create(agent, buildSlurry(undefined));
    await agent
      .post(`/api/cultures/${c.id}/events`)
      .send({ kind: 'pitched', data: { batchName: 'Batch 14: Millpond Mild' } })
      .expect(201);
    const after = (await agent.get(`/api/cultures/${c.id}`)).body.culture;
    expect(after.state).toBe('pitched');
    expect(after.daysUntilAttention).toBeNull();
    const fed = await agent
      .post(`/api/cultures/${c.id}/events`)
      .send({ kind: 'fed', data: { volumeMl: 500 } })
      .expect(409);
    expect(fed.body.error.code).toBe('culture_not_kept');
  });
});

describe('state changes', () => {
  it('records who and when, and refuses no-op and un-discarding', async () => {
    const { agent, user } = await keeper();
    const c = await create(agent, buildDregs());
    t.clock.now = new Date(Date.now() + 60_000);
    const res = await agent
      .post(`/api/cultures/${c.id}/state`)
      .send({ state: 'active', notes: 'into a starter' })
      .expect(200);
    expect(res.body.culture.state).toBe('active');
    expect(res.body.culture.stateChangedBy).toMatchObject({ id: user.id });
    expect(res.body.culture.stateChangedAt).toBe(t.clock.now.toISOString());
    t.clock.now = new Date(Date.now() + 120_000);
    await agent.post(`/api/cultures/${c.id}/state`).send({ state: 'active' }).expect(409);
    await agent.post(`/api/cultures/${c.id}/state`).send({ state: 'discarded' }).expect(200);
    const back = await agent.post(`/api/cultures/${c.id}/state`).send({ state: 'stored' }).expect(409);
    expect(back.body.error.code).toBe('culture_discarded');
    await agent.post(`/api/cultures/${c.id}/state`).send({ state: 'frozen' }).expect(400);
    await agent.post('/api/cultures').send(buildReculture(c.id)).expect(400);
    t.clock.now = new Date();
    const log = (await agent.get(`/api/cultures/${c.id}/events`)).body.events.filter(
      (e: { kind: string }) => e.kind === 'state_changed',
    );
    expect(log.map((e: { data: { from: string; to: string } }) => `${e.data.from}>${e.data.to}`)).toEqual([
      'stored>active',
      'active>discarded',
    ]);
  });
});

describe('GET /api/cultures (library)', () => {
  it('filters, searches, sorts by attention and pages on the server', async () => {
    const { agent } = await keeper();
    const dregs = await create(agent, buildDregs({ strainName: 'Hollow Oak saison', madeAt: daysAgo(3) }));
    const slurry = await create(agent, buildSlurry(undefined, { strainName: 'Quarry lager', madeAt: daysAgo(20) }));
    const slant = await create(agent, {
      ...buildReculture(slurry.id),
      strainName: 'Quarry lager slant',
      madeAt: daysAgo(10),
    });
    await create(agent, {
      strainName: 'Tidewater Kölsch',
      form: 'dry_pack',
      origin: { origin: 'purchased', maker: 'Invented Maltings', manufacturedOn: daysAgo(200) },
      amount: { grams: 11 },
      storageTempC: 4,
      madeAt: daysAgo(200),
    });
    await agent.post(`/api/cultures/${slurry.id}/state`).send({ state: 'active' }).expect(200);

    const all = (await agent.get('/api/cultures').expect(200)).body;
    expect(all.total).toBe(4);
    const due = all.cultures.map((c: { daysUntilAttention: number }) => c.daysUntilAttention);
    expect([...due].sort((a, b) => a - b)).toEqual(due);
    expect(all.cultures[0].id).toBe(dregs.id); // dregs need feeding within a week

    const byState = (await agent.get('/api/cultures?state=active').expect(200)).body;
    expect(byState.cultures.map((c: { id: string }) => c.id)).toEqual([slurry.id]);
    const byForm = (await agent.get('/api/cultures?form=slant,bottle_dregs').expect(200)).body;
    expect(byForm.total).toBe(2);
    const search = (await agent.get('/api/cultures?q=quarry').expect(200)).body;
    expect(search.total).toBe(2);
    // the code on the jar's label finds it, and every row carries its code
    const code = all.cultures.find((c: { id: string }) => c.id === slant.id).labelCode as string;
    expect(code).toMatch(/^[A-Z]-\d{3}$/);
    const byCode = (await agent.get(`/api/cultures?q=${encodeURIComponent(code.toLowerCase())}`).expect(200)).body;
    expect(byCode.cultures.map((c: { id: string }) => c.id)).toEqual([slant.id]);
    const byTag = (await agent.get('/api/cultures?tag=saison').expect(200)).body;
    expect(byTag.cultures.map((c: { id: string }) => c.id)).toEqual([dregs.id]);
    const young = (await agent.get('/api/cultures?maxAgeDays=12').expect(200)).body;
    expect(young.cultures.map((c: { id: string }) => c.id).sort()).toEqual([dregs.id, slant.id].sort());
    const old = (await agent.get('/api/cultures?minAgeDays=15').expect(200)).body;
    expect(old.total).toBe(2);
    const page2 = (await agent.get('/api/cultures?pageSize=3&page=2').expect(200)).body;
    expect(page2).toMatchObject({ total: 4, page: 2, pageSize: 3 });
    expect(page2.cultures).toHaveLength(1);
    const byName = (await agent.get('/api/cultures?sort=name&dir=desc').expect(200)).body;
    expect(byName.cultures[0].strainName).toBe('Tidewater Kölsch');
    // a page past the end is empty but still knows the total, filtered or not
    const beyond = (await agent.get('/api/cultures?pageSize=3&page=5').expect(200)).body;
    expect(beyond).toMatchObject({ total: 4, page: 5, cultures: [] });
    const beyondFiltered = (await agent.get('/api/cultures?pageSize=1&page=9&q=quarry').expect(200)).body;
    expect(beyondFiltered).toMatchObject({ total: 2, cultures: [] });
  });

  it('the unfiltered page (a statement prepared once) answers each keeper with their own cultures only', async () => {
    const a = await keeper();
    const b = await keeper();
    const mine = await create(a.agent, buildDregs({ strainName: 'Lantern Row dregs' }));
    for (const dir of ['asc', 'desc']) {
      for (const sort of ['attention', 'name', 'made', 'generation', 'state', 'form']) {
        const pa = (await a.agent.get(`/api/cultures?sort=${sort}&dir=${dir}`).expect(200)).body;
        const pb = (await b.agent.get(`/api/cultures?sort=${sort}&dir=${dir}`).expect(200)).body;
        expect(pa).toMatchObject({ total: 1, cultures: [{ id: mine.id }] });
        expect(pb).toMatchObject({ total: 0, cultures: [] });
      }
    }
  });

  it('sorts and filters by core-projected viability', async () => {
    const { agent } = await keeper();
    await create(agent, buildDregs({ madeAt: daysAgo(1) })); // ~30% default for dregs
    await create(agent, buildSlurry(undefined, { madeAt: daysAgo(2) })); // ~90%
    await create(agent, {
      strainName: 'Young pack',
      form: 'liquid_pack',
      origin: { origin: 'purchased', maker: 'Invented Labs' },
      storageTempC: 4,
      madeAt: daysAgo(10),
    });
    const now = new Date();
    const expected = [
      projectViability({ form: 'bottle_dregs', madeOrHarvestedAt: new Date(daysAgo(1)), at: now, storageTempC: 4 })
        .viability,
      projectViability({ form: 'slurry_unwashed', madeOrHarvestedAt: new Date(daysAgo(2)), at: now, storageTempC: 3 })
        .viability,
      projectViability({ form: 'liquid_pack', madeOrHarvestedAt: new Date(daysAgo(10)), at: now, storageTempC: 4 })
        .viability,
    ];
    expect(expected.filter((v) => v >= 0.5)).toHaveLength(2); // the fixture spans the threshold
    const sorted = (await agent.get('/api/cultures?sort=viability&dir=desc').expect(200)).body.cultures;
    const v = sorted.map((c: { projectedViability: number }) => c.projectedViability);
    expect([...v].sort((a, b) => b - a)).toEqual(v);
    const healthy = (await agent.get('/api/cultures?viabilityMinPct=50').expect(200)).body;
    expect(healthy.cultures.every((c: { projectedViability: number }) => c.projectedViability >= 0.5)).toBe(true);
    expect(healthy.total).toBe(2);
    const weak = (await agent.get('/api/cultures?viabilityMaxPct=50&sort=name').expect(200)).body;
    expect(weak.total).toBe(1);
    expect(weak.cultures[0].form).toBe('bottle_dregs');
  });

  it('validates the query', async () => {
    const { agent } = await keeper();
    const res = await agent
      .get('/api/cultures?state=bubbling&pageSize=1000&minAgeDays=10&maxAgeDays=2&sort=colour')
      .expect(400);
    expect(Object.keys(res.body.error.fields)).toEqual(
      expect.arrayContaining(['query.state.0', 'query.pageSize', 'query.sort']),
    );
  });
});

describe('lineage', () => {
  it('returns the whole tree from any node, with generation, state and owner', async () => {
    const { agent, user } = await keeper();
    const root = await create(agent, buildDregs());
    const a = await create(agent, buildReculture(root.id));
    const b = await create(agent, buildSlurry(a.id));
    const c = await create(agent, buildReculture(root.id));
    const res = (await agent.get(`/api/cultures/${b.id}/lineage`).expect(200)).body;
    expect(res.rootId).toBe(root.id);
    expect(res.focusId).toBe(b.id);
    const byId = new Map(res.nodes.map((n: { id: string }) => [n.id, n]));
    expect(byId.size).toBe(4);
    expect(byId.get(b.id)).toMatchObject({
      parentId: a.id,
      depth: 2,
      generation: 1,
      state: 'stored',
      owner: { id: user.id },
    });
    expect(byId.get(c.id)).toMatchObject({ parentId: root.id, depth: 1 });
  });

  it('returns a generated 5,000-node tree correctly, in one lineage query', async () => {
    const { agent, user } = await keeper();
    const prefix = `big-${Date.now()}-`;
    // node i's parent: a chain for the first 30, then i/3 — depth reaches past 30
    await t.database.pool.query(
      `insert into cultures (id, owner_user_id, parent_id, generation, strain_name, origin, origin_details, form, storage_temp_c, made_at, state)
       select $1 || i, $2, case when i = 0 then null when i < 30 then $1 || (i - 1) else $1 || (i / 3) end,
              0, 'Generated ' || i, case when i = 0 then 'gift'::culture_origin else 'reculture'::culture_origin end,
              '{"origin":"gift","fromName":"generator"}', 'slant', 4, now() - interval '1 day', 'stored'
       from generate_series(0, 4999) as i order by i`,
      [prefix, user.id],
    );
    const expectedDepth = (i: number): number =>
      i === 0 ? 0 : i < 30 ? expectedDepth(i - 1) + 1 : expectedDepth(Math.floor(i / 3)) + 1;
    const spy = vi.spyOn(t.database.pool, 'query');
    const res = (await agent.get(`/api/cultures/${prefix}4999/lineage`).expect(200)).body;
    const calls = spy.mock.calls.length;
    spy.mockRestore();
    expect(calls).toBeLessThanOrEqual(3); // session + access check + ONE lineage query
    expect(res.rootId).toBe(`${prefix}0`);
    expect(res.nodes).toHaveLength(5000);
    const depths = new Map<string, number>(res.nodes.map((n: { id: string; depth: number }) => [n.id, n.depth]));
    for (const i of [0, 1, 29, 30, 31, 89, 90, 1234, 4999])
      expect(depths.get(`${prefix}${i}`), `node ${i}`).toBe(expectedDepth(i));
    expect(Math.max(...depths.values())).toBeGreaterThan(30);
    for (const n of res.nodes) if (n.parentId) expect(depths.get(n.parentId)).toBe(n.depth - 1);
  });
});

describe('quarantine', () => {
  it('lists descendants still in use, flags the chosen ones and says where it came from', async () => {
    const { agent } = await keeper();
    const root = await create(agent, buildDregs({ strainName: 'Crooked Gate wild' }));
    const a = await create(agent, buildReculture(root.id));
    const a1 = await create(agent, buildSlurry(a.id));
    const b = await create(agent, buildReculture(root.id));
    await agent.post(`/api/cultures/${b.id}/state`).send({ state: 'discarded' }).expect(200);

    const preview = (await agent.get(`/api/cultures/${root.id}/quarantine-preview`).expect(200)).body.descendants;
    expect(preview.map((d: { id: string }) => d.id)).toEqual([a.id, a1.id]);

    const wrong = await agent
      .post(`/api/cultures/${root.id}/quarantine`)
      .send({ flagDescendantIds: [a.id, b.id] })
      .expect(400);
    expect(wrong.body.error.fields['body.flagDescendantIds'][0]).toContain(b.id);
    expect((await agent.get(`/api/cultures/${a.id}`)).body.culture.suspect).toBe(false);

    const res = await agent
      .post(`/api/cultures/${root.id}/quarantine`)
      .send({ notes: 'ropy and sour', flagDescendantIds: [a.id, a1.id] })
      .expect(200);
    expect(res.body.flagged).toBe(2);
    const rootAfter = (await agent.get(`/api/cultures/${root.id}`)).body.culture;
    expect(rootAfter.state).toBe('quarantined');
    const a1After = (await agent.get(`/api/cultures/${a1.id}`)).body.culture;
    expect(a1After.suspect).toBe(true);
    expect(a1After.suspectFrom).toMatchObject({ id: root.id, strainName: 'Crooked Gate wild' });
    expect(a1After.warnings.join(' ')).toMatch(/contamination/i);
    const a1Log = (await agent.get(`/api/cultures/${a1.id}/events`)).body.events;
    expect(a1Log.at(-1)).toMatchObject({
      kind: 'contamination_suspected',
      data: { fromCultureId: root.id, fromEventId: res.body.eventId },
    });
    // a new child of a suspect culture carries the flag from the same source
    const child = await create(agent, buildReculture(a1.id));
    expect((await agent.get(`/api/cultures/${child.id}`)).body.culture.suspectFrom.id).toBe(root.id);
    const lineage = (await agent.get(`/api/cultures/${root.id}/lineage`)).body.nodes;
    expect(
      lineage
        .filter((n: { suspect: boolean }) => n.suspect)
        .map((n: { id: string }) => n.id)
        .sort(),
    ).toEqual([root.id, a.id, a1.id, child.id].sort());
  });
});

describe('GET /api/cultures answers', () => {
  it('with a tag a browser can revalidate: 304 while nothing changed, the new page after a change', async () => {
    const { agent } = await keeper();
    const a = await create(agent, buildDregs({ strainName: 'Millpond ale' }));
    const first = await agent.get('/api/cultures').expect(200);
    const tag = first.headers.etag as string;
    expect(tag).toMatch(/^W\/"/);
    const again = await agent.get('/api/cultures').expect(200); // from the cache: same body, same tag
    expect(again.headers.etag).toBe(tag);
    expect(again.body).toEqual(first.body);
    await agent.get('/api/cultures').set('If-None-Match', tag).expect(304);
    await agent.patch(`/api/cultures/${a.id}`).send({ strainName: 'Millpond ale, second jar' }).expect(200);
    const changed = await agent.get('/api/cultures').set('If-None-Match', tag).expect(200);
    expect(changed.headers.etag).not.toBe(tag);
    expect(changed.body.cultures[0].strainName).toBe('Millpond ale, second jar');
    expect(changed.headers['content-type']).toMatch(/^application\/json; charset=utf-8/);
  });
});

describe('the library total (users.culture_count, kept by triggers)', () => {
  it('follows every insert, re-culture, change of keeper and delete, matching a count of the rows', async () => {
    const pool = t.database.pool;
    const countOf = async (userId: string) =>
      Number((await pool.query('select count(*) from cultures where owner_user_id = $1', [userId])).rows[0].count);
    const { agent, user } = await keeper();
    const other = await keeper();
    expect(await total(agent)).toBe(0);
    const a = await create(agent, buildDregs());
    const b = await create(agent, buildReculture(a.id));
    await create(agent, buildReculture(b.id));
    await create(other.agent, buildDregs());
    expect(await total(agent)).toBe(3);
    expect(await total(other.agent)).toBe(1);
    // a change of keeper moves one from one total to the other (whoever writes it: here plain SQL)
    await pool.query('update cultures set owner_user_id = $1 where id = $2', [other.user.id, b.id]);
    expect(await total(agent)).toBe(2);
    expect(await total(other.agent)).toBe(2);
    // an update that keeps the keeper leaves both alone
    await pool.query('update cultures set notes = $1 where owner_user_id = $2', ['moved shelf', user.id]);
    expect(await total(agent)).toBe(2);
    // deletes count down, one row or many in one statement
    await pool.query('update cultures set parent_id = null where owner_user_id in ($1, $2)', [user.id, other.user.id]);
    await pool.query('delete from cultures where owner_user_id = $1', [other.user.id]);
    expect(await total(other.agent)).toBe(0);
    for (const u of [user.id, other.user.id]) {
      const stored = (await pool.query('select culture_count from users where id = $1', [u])).rows[0].culture_count;
      expect(stored).toBe(await countOf(u));
    }
    // the filtered page still counts: it agrees with the counter when the filter matches everything
    const everyState = 'active,stored,pitched,used_up,discarded,quarantined';
    expect((await agent.get(`/api/cultures?state=${everyState}`).expect(200)).body.total).toBe(await total(agent));
  });
});

describe('GET /api/cultures/:id/health', () => {
  it('gives a projected series through the coming weeks with the measured points', async () => {
    const { agent } = await keeper();
    const c = await create(agent, buildSlurry(undefined, { madeAt: daysAgo(10) }));
    await agent
      .post(`/api/cultures/${c.id}/events`)
      .send({
        kind: 'counted',
        occurredAt: daysAgo(5),
        data: { cellsCounted: 400, squaresCounted: 5, dilution: 100, live: 170, dead: 30 },
      })
      .expect(201);
    const res = (await agent.get(`/api/cultures/${c.id}/health?days=28`).expect(200)).body;
    expect(res.measured).toHaveLength(1);
    expect(res.measured[0].viability).toBeCloseTo(0.85, 5);
    expect(res.series[0].viability).toBeCloseTo(0.85, 5);
    const last = res.series.at(-1);
    expect(new Date(last.at).getTime()).toBeGreaterThan(Date.now() + 26 * 86_400_000);
    for (let i = 1; i < res.series.length; i++)
      expect(res.series[i].viability).toBeLessThanOrEqual(res.series[i - 1].viability);
    await agent.get(`/api/cultures/${c.id}/health?days=9000`).expect(400);
  });
});
