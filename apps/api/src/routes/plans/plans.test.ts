import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { computeBrewPlan, growthCorrectionRatio, platoFromSg, targetPitchCells } from '@barmkeep/core';
import {
  DEFAULT_EQUIPMENT,
  cultureCellsInputOf,
  planEquipmentOf,
  type CultureDetailDto,
  type PlanDto,
} from '@barmkeep/schemas';
import { buildTestApp, signUp, type TestApp } from '../../../test/helpers';
import { buildDregs, buildSlurry } from '../../../test/cultureFactories';

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
async function keeper(timeZone = 'Europe/London') {
  const agent = t.agent();
  const { user } = await signUp(agent);
  await agent.patch('/api/account').send({ timeZone }).expect(200);
  return { agent, user };
}
async function culture(agent: Agent, body: object): Promise<CultureDetailDto> {
  const res = await agent.post('/api/cultures').send(body);
  if (res.status !== 201) throw new Error(`culture create failed ${res.status}: ${JSON.stringify(res.body)}`);
  return res.body.culture;
}
const dregsNow = () => buildDregs({ madeAt: '2026-03-19T18:00:00Z' });
const lagerPlan = (cultureId: string, over: object = {}) => ({
  name: 'Quarry Lane Helles',
  purpose: 'batch',
  cultureIds: [cultureId],
  batchVolumeL: 20,
  ogPlato: platoFromSg(1.048),
  beerType: 'lager',
  brewAt: '2026-04-04T10:00:00+01:00',
  ...over,
});

describe('equipment on the account', () => {
  it('starts from the default kit and saves a person’s own', async () => {
    const { agent } = await keeper();
    const first = (await agent.get('/api/account/equipment').expect(200)).body.equipment;
    expect(first).toMatchObject({ ...DEFAULT_EQUIPMENT, saved: false });
    expect(first.growthCorrection).toMatchObject({ ratio: 1, steps: 0, applied: 1, optedIn: false });
    const mine = {
      vessels: [
        { label: '2 L flask', volumeMl: 2000 },
        { label: 'Vial', volumeMl: 40 },
      ],
      stirPlate: true,
      withoutStirPlate: 'still',
      starterPlato: 9,
      maxStepFactor: 8,
      coldCrashHours: 36,
      growthCorrectionOptIn: false,
    };
    const saved = (await agent.put('/api/account/equipment').send(mine).expect(200)).body.equipment;
    expect(saved.saved).toBe(true);
    expect(saved.vessels.map((v: { volumeMl: number }) => v.volumeMl)).toEqual([40, 2000]);
    expect(saved.coldCrashHours).toBe(36);
  });
  it('refuses impossible equipment, every field at once', async () => {
    const { agent } = await keeper();
    const res = await agent
      .put('/api/account/equipment')
      .send({
        vessels: [{ volumeMl: 0 }, { volumeMl: 30_000 }],
        stirPlate: 'yes',
        withoutStirPlate: 'shake',
        starterPlato: 30,
        maxStepFactor: 1,
        coldCrashHours: -1,
        growthCorrectionOptIn: false,
      })
      .expect(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(
      [
        'body.coldCrashHours',
        'body.maxStepFactor',
        'body.starterPlato',
        'body.stirPlate',
        'body.vessels.0.volumeMl',
        'body.vessels.1.volumeMl',
      ].sort(),
    );
    const empty = await agent
      .put('/api/account/equipment')
      .send({ ...DEFAULT_EQUIPMENT, vessels: [] })
      .expect(400);
    expect(empty.body.error.fields['body.vessels']).toBeDefined();
    const twice = await agent
      .put('/api/account/equipment')
      .send({ ...DEFAULT_EQUIPMENT, vessels: [{ volumeMl: 500 }, { volumeMl: 500 }] })
      .expect(400);
    expect(twice.body.error.fields['body.vessels'][0]).toMatch(/same volume/);
  });
  it('needs a session', async () => {
    await t.agent().get('/api/account/equipment').expect(401);
    await t.agent().post('/api/plans/preview').send({}).expect(401);
  });
});

describe('pitch recommendation and plan validation', () => {
  it('answers with core’s computeBrewPlan for the culture as the library presents it', async () => {
    const { agent } = await keeper();
    const c = await culture(agent, dregsNow());
    const res = await agent.post('/api/plans/preview').send(lagerPlan(c.id)).expect(200);
    const got = res.body.computed;
    // the same call the browser makes, from the same culture fields
    const input = cultureCellsInputOf(c);
    if ('missing' in input) throw new Error(input.missing);
    const expected = computeBrewPlan({
      now: NOW,
      timeZone: 'Europe/London',
      brewAt: new Date('2026-04-04T10:00:00+01:00'),
      target: { kind: 'batch', volumeL: 20, plato: platoFromSg(1.048), rate: 'lager' },
      cultures: [input.input],
      equipment: planEquipmentOf(DEFAULT_EQUIPMENT),
    });
    expect(got).toEqual(JSON.parse(JSON.stringify(expected)));
    // 1.5 M/mL/°P lager rate (docs/yeast-math.md §3, Fix [PUB-2])
    expect(got.targetCells).toBeCloseTo(targetPitchCells({ volumeL: 20, plato: platoFromSg(1.048), rate: 'lager' }), 0);
    expect(got.noStarterNeeded).toBe(false);
    expect(got.steps.length).toBeGreaterThan(1);
    expect(got.steps[0].sg).toBeCloseTo(1.022, 3); // low-gravity first feed for a tiny start (§7 rule 4)
    expect(got.final.low).toBeLessThan(got.final.cells);
  });
  it('says no starter is needed when the culture already holds the target', async () => {
    const { agent } = await keeper();
    const c = await culture(
      agent,
      buildSlurry(undefined, { madeAt: '2026-03-19T09:00:00Z', amount: { volumeMl: 400 } }),
    );
    const res = await agent
      .post('/api/plans/preview')
      .send(lagerPlan(c.id, { beerType: 'ale', batchVolumeL: 10, ogPlato: 10 }))
      .expect(200);
    expect(res.body.computed.noStarterNeeded).toBe(true);
    expect(res.body.computed.steps).toEqual([]);
    expect(res.body.computed.verdict.kind).toBe('over');
  });
  it('refuses a brew date in the past, impossible volumes and missing batch fields', async () => {
    const { agent } = await keeper();
    const c = await culture(agent, dregsNow());
    const past = await agent
      .post('/api/plans')
      .send(lagerPlan(c.id, { brewAt: '2026-03-19T10:00:00Z' }))
      .expect(400);
    expect(past.body.error.fields['body.brewAt']).toEqual(['The brew date is in the past']);
    const volumes = await agent
      .post('/api/plans')
      .send(lagerPlan(c.id, { batchVolumeL: 0, extraVesselsMl: [1, 99_000] }))
      .expect(400);
    expect(Object.keys(volumes.body.error.fields).sort()).toEqual([
      'body.batchVolumeL',
      'body.extraVesselsMl.0',
      'body.extraVesselsMl.1',
    ]);
    const huge = await agent
      .post('/api/plans')
      .send(lagerPlan(c.id, { batchVolumeL: 50_000 }))
      .expect(400);
    expect(huge.body.error.fields['body.batchVolumeL'][0]).toMatch(/not possible/);
    const missing = await agent
      .post('/api/plans')
      .send({ name: 'x', purpose: 'batch', cultureIds: [c.id] })
      .expect(400);
    expect(Object.keys(missing.body.error.fields).sort()).toEqual([
      'body.batchVolumeL',
      'body.beerType',
      'body.brewAt',
      'body.ogPlato',
    ]);
    const grow = await agent
      .post('/api/plans')
      .send({ name: 'x', purpose: 'grow', cultureIds: [c.id] })
      .expect(400);
    expect(grow.body.error.fields['body.targetCells']).toBeDefined();
  });
  it('will not plan with someone else’s culture', async () => {
    const a = await keeper();
    const b = await keeper();
    const c = await culture(a.agent, dregsNow());
    const res = await b.agent.post('/api/plans/preview').send(lagerPlan(c.id)).expect(400);
    expect(res.body.error.fields['body.cultureIds']).toEqual(['No culture of yours has this id']);
  });
  it('offers the largest first vessel when the smallest is too big for the start', async () => {
    const { agent } = await keeper();
    const c = await culture(agent, dregsNow());
    await agent
      .put('/api/account/equipment')
      .send({ ...DEFAULT_EQUIPMENT, vessels: [{ volumeMl: 1000 }, { volumeMl: 2000 }] })
      .expect(200);
    const res = await agent.post('/api/plans/preview').send(lagerPlan(c.id)).expect(200);
    expect(res.body.computed.stepUp.feasible).toBe(false);
    expect(res.body.computed.maxFirstVesselMl).toBeGreaterThan(0);
    const fixed = await agent
      .post('/api/plans/preview')
      .send(lagerPlan(c.id, { extraVesselsMl: [Math.min(res.body.computed.maxFirstVesselMl, 50), 250] }))
      .expect(200);
    expect(fixed.body.computed.stepUp.feasible).toBe(true);
  });
});

describe('backward scheduling in the person’s time zone', () => {
  it('keeps 24 elapsed hours of cold crash across the spring clock change', async () => {
    // source: UK clocks go forward at 01:00 GMT on 29 March 2026 (Summer Time Order) [PUB]
    const { agent } = await keeper('Europe/London');
    const c = await culture(agent, dregsNow());
    const res = await agent
      .post('/api/plans/preview')
      .send(lagerPlan(c.id, { brewAt: '2026-03-29T12:00:00+01:00' }))
      .expect(200);
    const s = res.body.computed.schedule;
    expect(s.coldCrashStartAt).toBe('2026-03-28T11:00:00.000Z'); // 11:00 GMT on the clock, not 12:00
    expect(Date.parse(s.brewAt) - Date.parse(s.coldCrashStartAt)).toBe(24 * 3.6e6);
    const steps = res.body.computed.steps;
    expect(steps.at(-1).endAt).toBe(s.coldCrashStartAt);
    for (let i = 1; i < steps.length; i++) expect(steps[i].startAt).toBe(steps[i - 1].endAt);
    for (const st of steps)
      expect(Date.parse(st.endAt) - Date.parse(st.startAt)).toBeGreaterThanOrEqual(st.hours * 3.6e6 - 1);
  });
  it('the same brew in New York puts the times on New York’s whole hours', async () => {
    const { agent } = await keeper('America/New_York');
    const c = await culture(agent, dregsNow());
    const res = await agent
      .post('/api/plans/preview')
      .send(lagerPlan(c.id, { brewAt: '2026-03-29T12:00:00-04:00' }))
      .expect(200);
    expect(res.body.computed.schedule.coldCrashStartAt).toBe('2026-03-28T16:00:00.000Z');
  });
  it('says when the time is too short and offers a plan that fits', async () => {
    const { agent } = await keeper();
    const c = await culture(agent, dregsNow());
    const res = await agent
      .post('/api/plans/preview')
      .send(lagerPlan(c.id, { brewAt: '2026-03-23T10:00:00Z' }))
      .expect(200);
    const s = res.body.computed.schedule;
    expect(s.fitsInTime).toBe(false);
    expect(s.hoursShort).toBeGreaterThan(0);
    expect(Date.parse(res.body.computed.steps[0].startAt)).toBeGreaterThanOrEqual(NOW.getTime());
  });
});

describe('saved plans and the step log', () => {
  it('saves, lists and reads a plan; nobody else can see it', async () => {
    const { agent } = await keeper();
    const c = await culture(agent, dregsNow());
    const preview = (await agent.post('/api/plans/preview').send(lagerPlan(c.id)).expect(200)).body.computed;
    const plan: PlanDto = (await agent.post('/api/plans').send(lagerPlan(c.id)).expect(201)).body.plan;
    expect(plan.computed).toEqual(preview);
    expect(plan.status).toBe('planned');
    expect(plan.cultures[0]).toMatchObject({ id: c.id, available: true });
    const list = (await agent.get('/api/plans').expect(200)).body.plans;
    expect(list.map((p: { id: string }) => p.id)).toContain(plan.id);
    const other = await keeper();
    await other.agent.get(`/api/plans/${plan.id}`).expect(404);
    await other.agent.post(`/api/plans/${plan.id}/steps`).expect(404);
  });

  it('starts a step, completes it with a count and re-plans the rest from the measured cells', async () => {
    const { agent } = await keeper();
    const c = await culture(agent, dregsNow());
    const plan: PlanDto = (await agent.post('/api/plans').send(lagerPlan(c.id)).expect(201)).body.plan;
    const before = plan.computed;

    t.clock.now = new Date(NOW.getTime() + 3.6e6);
    const started: PlanDto = (await agent.post(`/api/plans/${plan.id}/steps`).expect(201)).body.plan;
    expect(started.status).toBe('in_progress');
    expect(started.executed).toHaveLength(1);
    const step = started.executed[0]!;
    expect(step).toMatchObject({ position: 1, volumeL: before.steps[0]!.volumeL, completedAt: null, measured: null });
    await agent.post(`/api/plans/${plan.id}/steps`).expect(409);

    // A count well below the prediction: 80 cells in 5 medium squares at 1:10 → 4×10⁷ cells/mL
    // (docs/yeast-math.md §2: 80 ÷ 5 ÷ 4×10⁻⁶ × 10), all alive without a stain.
    t.clock.now = new Date(NOW.getTime() + (1 + step.hours) * 3.6e6);
    const done: PlanDto = (
      await agent
        .post(`/api/plans/${plan.id}/steps/${step.id}/complete`)
        .send({ count: { cellsCounted: 80, squaresCounted: 5, dilution: 10 }, notes: 'krausen fell' })
        .expect(200)
    ).body.plan;
    const measured = 4e7 * step.volumeL * 1000;
    expect(done.executed[0]!.measured!.cells).toBeCloseTo(measured, -2);
    expect(done.executed[0]!.completedAt).not.toBeNull();
    expect(done.computed.startCells.cells).toBeCloseTo(measured, -2);
    expect(done.computed.steps[0]!.startCells.cells).toBeCloseTo(measured, -2);
    expect(done.computed.steps[0]!.sg).toBeCloseTo(1.036, 3); // no second low-gravity feed
    // the plan changed: the rest is re-planned from the count, exactly as core plans it
    expect(Math.abs(done.computed.startCells.cells / before.steps[0]!.expectedCells - 1)).toBeGreaterThan(0.1);
    const replanned = computeBrewPlan({
      now: t.clock.now,
      timeZone: 'Europe/London',
      brewAt: new Date('2026-04-04T10:00:00+01:00'),
      target: { kind: 'batch', volumeL: 20, plato: platoFromSg(1.048), rate: 'lager' },
      cultures: [],
      equipment: plan.equipment,
      executed: [
        {
          ...step,
          startedAt: new Date(step.startedAt),
          completedAt: new Date(done.executed[0]!.completedAt!),
          measured: done.executed[0]!.measured,
        },
      ],
    });
    expect(done.computed.steps).toEqual(JSON.parse(JSON.stringify(replanned.steps)));
    await agent.post(`/api/plans/${plan.id}/steps/${step.id}/complete`).send({}).expect(409);

    // the person's growth correction now rests on this one step, and is core's ratio
    const eq = (await agent.get('/api/account/equipment').expect(200)).body.equipment;
    const expected = growthCorrectionRatio([
      {
        startCells: step.start.cells,
        predictedCells: step.expectedCells,
        measuredCells: done.executed[0]!.measured!.cells,
      },
    ]);
    expect(eq.growthCorrection.steps).toBe(1);
    expect(eq.growthCorrection.ratio).toBeCloseTo(expected.ratio, 9);
    expect(eq.growthCorrection.applied).toBe(1); // not opted in
    await agent
      .put('/api/account/equipment')
      .send({ ...DEFAULT_EQUIPMENT, growthCorrectionOptIn: true })
      .expect(200);
    const eq2 = (await agent.get('/api/account/equipment').expect(200)).body.equipment;
    expect(eq2.growthCorrection.applied).toBeCloseTo(expected.ratio, 9);
    const c2 = await culture(agent, dregsNow());
    const corrected: PlanDto = (await agent.post('/api/plans').send(lagerPlan(c2.id)).expect(201)).body.plan;
    expect(corrected.growthCorrection).toBeCloseTo(expected.ratio, 9);
    t.clock.now = NOW;
  });

  it('refuses a bad count and a step of another plan', async () => {
    const { agent } = await keeper();
    const c = await culture(agent, dregsNow());
    const plan: PlanDto = (await agent.post('/api/plans').send(lagerPlan(c.id)).expect(201)).body.plan;
    const started: PlanDto = (await agent.post(`/api/plans/${plan.id}/steps`).expect(201)).body.plan;
    const stepId = started.executed[0]!.id;
    const bad = await agent
      .post(`/api/plans/${plan.id}/steps/${stepId}/complete`)
      .send({ count: { cellsCounted: -1, squaresCounted: 0, dilution: 0.5 } })
      .expect(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual([
      'body.count.cellsCounted',
      'body.count.dilution',
      'body.count.squaresCounted',
    ]);
    const plan2: PlanDto = (await agent.post('/api/plans').send(lagerPlan(c.id)).expect(201)).body.plan;
    await agent.post(`/api/plans/${plan2.id}/steps/${stepId}/complete`).send({}).expect(404);
  });

  it('a plan with no starter needed has no step to start', async () => {
    const { agent } = await keeper();
    const c = await culture(
      agent,
      buildSlurry(undefined, { madeAt: '2026-03-19T09:00:00Z', amount: { volumeMl: 400 } }),
    );
    const plan: PlanDto = (
      await agent
        .post('/api/plans')
        .send(lagerPlan(c.id, { beerType: 'ale', batchVolumeL: 10, ogPlato: 10 }))
        .expect(201)
    ).body.plan;
    const res = await agent.post(`/api/plans/${plan.id}/steps`).expect(409);
    expect(res.body.error.message).toBe('No starter is needed for this plan');
  });
});
