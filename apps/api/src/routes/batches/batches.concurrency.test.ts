import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CultureDetailDto } from '@barmkeep/schemas';
import { buildTestApp, signUp, type TestApp } from '../../../test/helpers';
import { buildDregs } from '../../../test/cultureFactories';

// buildTestApp's pool holds 4 connections, fewer than the simultaneous requests below: a batch
// that sent a query through the pool while holding a culture's row lock would stall here.
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
async function culture(agent: Agent, strainName: string): Promise<CultureDetailDto> {
  const res = await agent.post('/api/cultures').send(buildDregs({ madeAt: '2026-03-19T18:00:00Z', strainName }));
  if (res.status !== 201) throw new Error(JSON.stringify(res.body));
  return res.body.culture;
}
const batch = (cultureIds: string[], name: string) => ({
  name,
  brewedAt: '2026-03-20T08:00:00Z',
  volumeL: 20,
  ogSg: 1.05,
  pitches: cultureIds.map((cultureId) => ({ cultureId })),
});
const pitchedEntries = async (agent: Agent, id: string) =>
  ((await agent.get(`/api/cultures/${id}/events`).expect(200)).body.events as { kind: string }[]).filter(
    (e) => e.kind === 'pitched',
  );

describe('batches under simultaneous requests', () => {
  it('one culture pitched (and used up) by six batches at once goes into exactly one', async () => {
    const agent = t.agent();
    await signUp(agent);
    const c = await culture(agent, 'Weir Street ale yeast');
    const results = await Promise.all(
      Array.from({ length: 6 }, (_, i) => agent.post('/api/batches').send(batch([c.id], `Brew night ${i + 1}`))),
    );
    expect(results.map((r) => r.status).sort()).toEqual([201, 409, 409, 409, 409, 409]);
    expect(results.filter((r) => r.status === 409).every((r) => r.body.error.code === 'culture_not_kept')).toBe(true);
    expect((await agent.get('/api/batches').expect(200)).body.batches).toHaveLength(1);
    expect(await pitchedEntries(agent, c.id)).toHaveLength(1);
  });

  it('a batch refused for one of its cultures leaves nothing behind: no batch, no log entry, no state change', async () => {
    const agent = t.agent();
    await signUp(agent);
    const kept = await culture(agent, 'Tannery Row saison yeast');
    const gone = await culture(agent, 'Tannery Row spare');
    await agent.post(`/api/cultures/${gone.id}/state`).send({ state: 'discarded' }).expect(200);
    const res = await agent.post('/api/batches').send(batch([kept.id, gone.id], 'Split pitch'));
    expect(res.status).toBe(409);
    expect((await agent.get('/api/batches').expect(200)).body.batches).toHaveLength(0);
    expect(await pitchedEntries(agent, kept.id)).toHaveLength(0);
    expect((await agent.get(`/api/cultures/${kept.id}`).expect(200)).body.culture.state).toBe(kept.state);
  });
});

describe('what may be pitched', () => {
  it('a quarantined or suspect culture is refused until it is cleared', async () => {
    const agent = t.agent();
    await signUp(agent);
    const c = await culture(agent, 'Floodgate farmhouse');
    await agent.post(`/api/cultures/${c.id}/state`).send({ state: 'quarantined' }).expect(200);
    const refused = await agent.post('/api/batches').send(batch([c.id], 'Too soon'));
    expect(refused.status).toBe(409);
    expect(refused.body.error).toMatchObject({ code: 'culture_suspect' });
    expect(refused.body.error.message).toMatch(/in quarantine/);
    expect((await agent.get('/api/batches').expect(200)).body.batches).toHaveLength(0);
    await agent.post(`/api/cultures/${c.id}/state`).send({ state: 'stored', clearSuspect: true }).expect(200);
    await agent
      .post('/api/batches')
      .send(batch([c.id], 'After the check'))
      .expect(201);
  });
});
