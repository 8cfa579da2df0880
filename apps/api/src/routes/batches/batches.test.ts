import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { platoFromSg } from '@barmkeep/core';
import type { BatchDto, CultureDetailDto, PlanDto } from '@barmkeep/schemas';
import { buildTestApp, signUp, type TestApp } from '../../../test/helpers';
import { buildDregs } from '../../../test/cultureFactories';

let t: TestApp;
const NOW = new Date('2026-03-20T09:00:00Z');
beforeAll(async () => {
  t = await buildTestApp();
  t.clock.now = NOW;
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
async function culture(agent: Agent): Promise<CultureDetailDto> {
  const res = await agent
    .post('/api/cultures')
    .send(buildDregs({ madeAt: '2026-03-19T18:00:00Z', strainName: 'Hollow Oak house yeast' }));
  if (res.status !== 201) throw new Error(JSON.stringify(res.body));
  return res.body.culture;
}
const batch = (cultureId: string, over: object = {}) => ({
  name: 'Quarry Lane Helles',
  brewedAt: '2026-03-20T08:00:00Z',
  volumeL: 20,
  ogSg: 1.05,
  fgSg: 1.01,
  fermentationTempC: 10,
  lagHours: 14,
  pitches: [{ cultureId, cellsPitched: 360e9 }],
  ...over,
});

describe('batches', () => {
  it('pitches a culture: the batch, its derived numbers, the culture’s log and state, the plan', async () => {
    const { agent } = await keeper();
    const c = await culture(agent);
    const plan: PlanDto = (
      await agent
        .post('/api/plans')
        .send({
          name: 'Helles',
          purpose: 'batch',
          cultureIds: [c.id],
          batchVolumeL: 20,
          ogPlato: platoFromSg(1.05),
          beerType: 'lager',
          brewAt: '2026-04-01T10:00:00Z',
        })
        .expect(201)
    ).body.plan;
    const b: BatchDto = (
      await agent
        .post('/api/batches')
        .send(batch(c.id, { planId: plan.id }))
        .expect(201)
    ).body.batch;
    // core's published checks for 1.050 → 1.010 (packages/core/src/batch.test.ts): ABV 5.32% (Balling [MEM]),
    // apparent 80.0% (Palmer, How to Brew [PUB]), real 65.0% (reference §8b [CALC])
    expect(b.derived.abv!).toBeCloseTo(5.32, 2);
    expect(b.derived.apparentAttenuation!).toBeCloseTo(80, 6);
    expect(b.derived.realAttenuation!).toBeCloseTo(65.0, 1);
    // rate actually pitched = cells / (mL × °P): 360e9 / (20 000 × 12.39) ≈ 1.45 M/mL/°P (docs/yeast-math.md §3)
    expect(b.derived.pitchRate!).toBeCloseTo(360e9 / (1e6 * 20_000 * platoFromSg(1.05)), 9);
    expect(b.pitches).toEqual([{ cultureId: c.id, strainName: c.strainName, generation: 0, cellsPitched: 360e9 }]);

    const after = (await agent.get(`/api/cultures/${c.id}`).expect(200)).body.culture;
    expect(after.state).toBe('pitched');
    const events = (await agent.get(`/api/cultures/${c.id}/events`).expect(200)).body.events;
    expect(
      events.some(
        (e: { kind: string; data: { batchName?: string } }) =>
          e.kind === 'pitched' && e.data.batchName === 'Quarry Lane Helles',
      ),
    ).toBe(true);
    expect((await agent.get(`/api/plans/${plan.id}`).expect(200)).body.plan.status).toBe('pitched');

    // pitched yeast cannot be pitched again
    await agent.post('/api/batches').send(batch(c.id)).expect(409);
  });

  it('leaves the derived numbers empty until the final gravity is in, then updates them', async () => {
    const { agent } = await keeper();
    const c = await culture(agent);
    const b: BatchDto = (
      await agent
        .post('/api/batches')
        .send(batch(c.id, { fgSg: undefined }))
        .expect(201)
    ).body.batch;
    expect(b.derived.abv).toBeNull();
    const up: BatchDto = (await agent.patch(`/api/batches/${b.id}`).send({ fgSg: 1.01 }).expect(200)).body.batch;
    expect(up.derived.apparentAttenuation!).toBeCloseTo(80, 6); // Palmer [PUB], as in core's test
    const bad = await agent.patch(`/api/batches/${b.id}`).send({ fgSg: 1.06 }).expect(400);
    expect(bad.body.error.fields['body.fgSg']).toBeDefined();
  });

  it('refuses bad batches', async () => {
    const { agent } = await keeper();
    const c = await culture(agent);
    const res = await agent
      .post('/api/batches')
      .send(batch(c.id, { fgSg: 1.06, volumeL: 0, brewedAt: '2026-04-20T08:00:00Z' }))
      .expect(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['body.brewedAt', 'body.fgSg', 'body.volumeL']);
    const other = await keeper();
    const theirs = await agent
      .post('/api/batches')
      .send(batch((await culture(other.agent)).id))
      .expect(400);
    expect(theirs.body.error.fields['body.pitches.0.cultureId']).toBeDefined();
    const none = await agent
      .post('/api/batches')
      .send(batch(c.id, { pitches: [] }))
      .expect(400);
    expect(none.body.error.fields['body.pitches']).toBeDefined();
    await t.agent().get('/api/batches').expect(401);
  });

  it('harvests slurry as generation + 1 in the lineage, and charts attenuation and lag by generation', async () => {
    const { agent } = await keeper();
    const c = await culture(agent);
    const first: BatchDto = (await agent.post('/api/batches').send(batch(c.id)).expect(201)).body.batch;
    const wrong = await agent
      .post(`/api/batches/${first.id}/harvest`)
      .send({ parentCultureId: 'nope', volumeMl: 150, storageTempC: 3 })
      .expect(400);
    expect(wrong.body.error.fields['body.parentCultureId']).toBeDefined();

    t.clock.now = new Date('2026-04-05T09:00:00Z');
    const h = (
      await agent
        .post(`/api/batches/${first.id}/harvest`)
        .send({ parentCultureId: c.id, volumeMl: 150, storageTempC: 3 })
        .expect(201)
    ).body;
    expect(h.culture.generation).toBe(1);
    const child = (await agent.get(`/api/cultures/${h.culture.id}`).expect(200)).body.culture;
    expect(child).toMatchObject({ parentId: c.id, generation: 1, origin: 'batch_slurry', form: 'slurry_unwashed' });
    expect(h.batch.harvests).toEqual([
      { cultureId: h.culture.id, parentCultureId: c.id, strainName: c.strainName, generation: 1 },
    ]);
    const lineage = (await agent.get(`/api/cultures/${c.id}/lineage`).expect(200)).body;
    expect(lineage.nodes.map((n: { id: string }) => n.id)).toContain(h.culture.id);

    await agent
      .post('/api/batches')
      .send(
        batch(h.culture.id, {
          name: 'Quarry Lane Helles II',
          brewedAt: '2026-04-05T08:00:00Z',
          fgSg: 1.012,
          lagHours: 9,
        }),
      )
      .expect(201);
    const chart = (await agent.get(`/api/batches/generations?cultureId=${h.culture.id}`).expect(200)).body;
    expect(chart.scope.kind).toBe('lineage');
    expect(chart.points.map((p: { generation: number }) => p.generation)).toEqual([0, 1]);
    expect(chart.points.map((p: { lagHours: number }) => p.lagHours)).toEqual([14, 9]);
    expect(chart.points[0].apparentAttenuation).toBeCloseTo(80, 6); // Palmer [PUB]
    const byStrain = (
      await agent.get(`/api/batches/generations?strain=${encodeURIComponent(c.strainName)}`).expect(200)
    ).body;
    expect(byStrain.points).toHaveLength(2);
    await agent.get('/api/batches/generations').expect(400);
    const other = await keeper();
    await other.agent.get(`/api/batches/generations?cultureId=${c.id}`).expect(404);
    await other.agent.get(`/api/batches/${first.id}`).expect(404);
    t.clock.now = NOW;
  });
});
