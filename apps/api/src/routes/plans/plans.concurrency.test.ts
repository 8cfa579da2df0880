import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { platoFromSg } from '@barmkeep/core';
import type { PlanDto } from '@barmkeep/schemas';
import { buildTestApp, signUp, type TestApp } from '../../../test/helpers';
import { buildDregs } from '../../../test/cultureFactories';

// buildTestApp's pool holds 4 connections: fewer than the simultaneous requests below, so any query
// a transaction sends through the pool instead of its own connection waits for a connection that a
// request queued on the plan's row lock is holding.
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

async function planNeedingStarter(agent: Agent): Promise<PlanDto> {
  const c = (
    await agent
      .post('/api/cultures')
      .send(buildDregs({ madeAt: '2026-03-19T18:00:00Z' }))
      .expect(201)
  ).body.culture;
  const plan: PlanDto = (
    await agent
      .post('/api/plans')
      .send({
        name: 'Weir Street Pale',
        purpose: 'batch',
        cultureIds: [c.id],
        batchVolumeL: 20,
        ogPlato: platoFromSg(1.05),
        beerType: 'ale',
        brewAt: '2026-04-04T10:00:00Z',
      })
      .expect(201)
  ).body.plan;
  expect(plan.computed.steps.length).toBeGreaterThan(0);
  return plan;
}

async function stepsInDb(planId: string) {
  const { rows } = await t.database.db.execute<{ n: number }>(
    sql`select count(*)::int as n from starter_plan_steps where plan_id = ${planId}`,
  );
  return rows[0]!.n;
}

describe('starting steps under simultaneous requests', () => {
  // The timeout is the test: before the fix these requests waited on the pool until its 5 s
  // connection timeout, one after another, and the batch took over a minute.
  it(
    'six simultaneous starts of one plan: one step starts, the rest are told a step is under way',
    { timeout: 15_000 },
    async () => {
      const agent = t.agent();
      await signUp(agent);
      const plan = await planNeedingStarter(agent);
      t.clock.now = new Date(NOW.getTime() + 3.6e6);
      const replies = await Promise.all(Array.from({ length: 6 }, () => agent.post(`/api/plans/${plan.id}/steps`)));
      const statuses = replies.map((r) => r.status).sort();
      expect(statuses).toEqual([201, 409, 409, 409, 409, 409]);
      for (const r of replies.filter((x) => x.status === 409)) {
        expect(r.body.error.code).toBe('step_in_progress');
      }
      const started = replies.find((r) => r.status === 201)!.body.plan as PlanDto;
      expect(started.executed).toHaveLength(1);
      expect(started.status).toBe('in_progress');
      expect(await stepsInDb(plan.id)).toBe(1);
    },
  );

  it('simultaneous starts on several plans of one person all start', { timeout: 15_000 }, async () => {
    const agent = t.agent();
    await signUp(agent);
    const plans = await Promise.all([planNeedingStarter(agent), planNeedingStarter(agent), planNeedingStarter(agent)]);
    t.clock.now = new Date(NOW.getTime() + 3.6e6);
    const replies = await Promise.all([...plans, ...plans].map((p) => agent.post(`/api/plans/${p.id}/steps`)));
    expect(replies.map((r) => r.status).sort()).toEqual([201, 201, 201, 409, 409, 409]);
    for (const p of plans) expect(await stepsInDb(p.id)).toBe(1);
  });

  it('a completion racing a start on the same plan never hangs or errors', { timeout: 15_000 }, async () => {
    const agent = t.agent();
    await signUp(agent);
    const plan = await planNeedingStarter(agent);
    t.clock.now = new Date(NOW.getTime() + 3.6e6);
    const started: PlanDto = (await agent.post(`/api/plans/${plan.id}/steps`).expect(201)).body.plan;
    const step = started.executed[0]!;
    t.clock.now = new Date(NOW.getTime() + (1 + step.hours) * 3.6e6);
    const replies = await Promise.all([
      agent.post(`/api/plans/${plan.id}/steps/${step.id}/complete`).send({ notes: '' }),
      agent.post(`/api/plans/${plan.id}/steps`),
      agent.post(`/api/plans/${plan.id}/steps/${step.id}/complete`).send({ notes: '' }),
      agent.post(`/api/plans/${plan.id}/steps`),
    ]);
    for (const r of replies) expect([200, 201, 409]).toContain(r.status);
    expect(replies.filter((r) => r.status === 200)).toHaveLength(1);
    // a start may run before or after the completion: at most one more step, never two
    expect(replies.filter((r) => r.status === 201).length).toBeLessThanOrEqual(1);
    expect(await stepsInDb(plan.id)).toBeLessThanOrEqual(2);
  });
});
