import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ICAL from 'ical.js';
import supertest from 'supertest';
import { sql } from 'drizzle-orm';
import { maxStorageDays, platoFromSg, viabilityCrossingAt } from '@barmkeep/core';
import type { PlanDto } from '@barmkeep/schemas';
import { buildTestApp, signUp, ORIGIN, type TestApp } from '../../../test/helpers';
import { buildDregs } from '../../../test/cultureFactories';
import { runReminderPass } from '../../services/reminders/engine';

let t: TestApp;
const NOW = new Date('2026-03-20T09:00:00Z');
beforeAll(async () => {
  t = await buildTestApp();
  t.clock.now = NOW;
});
afterAll(async () => {
  await t.close();
});

async function keeper(timeZone = 'Europe/London') {
  const agent = t.agent();
  const { user } = await signUp(agent);
  await agent.patch('/api/account').send({ timeZone }).expect(200);
  return { agent, user };
}

function parse(text: string) {
  const cal = new ICAL.Component(ICAL.parse(text));
  return cal.getAllSubcomponents('vevent').map((v) => new ICAL.Event(v));
}

const lagerPlan = (cultureId: string) => ({
  name: 'Quarry Lane Helles',
  purpose: 'batch',
  cultureIds: [cultureId],
  batchVolumeL: 20,
  ogPlato: platoFromSg(1.048),
  beerType: 'lager',
  // source: UK clocks go forward at 01:00 GMT on 29 March 2026 (Summer Time Order) [PUB]
  brewAt: '2026-04-04T10:00:00+01:00',
});

describe('private calendar feed', () => {
  it('is made, parsed by a general iCalendar parser with the expected events, and revoked', async () => {
    const { agent } = await keeper('Europe/London');
    const pack = await agent
      .post('/api/cultures')
      .send({
        strainName: 'Copperbeech Ale',
        form: 'liquid_pack',
        origin: { origin: 'purchased', maker: 'Invented Yeast Co.' },
        locationLabel: 'Jar B3',
        storageTempC: 4,
        madeAt: '2026-03-01T12:00:00Z',
      })
      .expect(201);
    const dregs = (
      await agent
        .post('/api/cultures')
        .send(buildDregs({ madeAt: '2026-03-19T18:00:00Z' }))
        .expect(201)
    ).body.culture;
    const plan: PlanDto = (await agent.post('/api/plans').send(lagerPlan(dregs.id)).expect(201)).body.plan;

    expect((await agent.get('/api/calendar-feed').expect(200)).body.feed).toEqual({
      active: false,
      createdAt: null,
      lastUsedAt: null,
    });
    const made = (await agent.post('/api/calendar-feed').expect(201)).body.feed;
    expect(made.active).toBe(true);
    const url = new URL(made.url as string);
    expect(url.origin).toBe(ORIGIN);
    // the address alone opens it: no cookies
    const res = await supertest(t.app).get(url.pathname).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/calendar/);
    const events = parse(res.text);
    const titles = events.map((e) => e.summary);

    // re-culture by: core's storage limit for a liquid pack at 4 °C, as an all-day event on that local date
    const days = maxStorageDays('liquid_pack', 4).days;
    const storage = events.find((e) =>
      e.summary.startsWith('Use or make a starter by: The liquid pack of Copperbeech Ale'),
    )!;
    expect(storage.startDate.isDate).toBe(true);
    expect(storage.startDate.toString()).toBe(
      new Date(Date.parse('2026-03-01T12:00:00Z') + days * 86_400_000).toISOString().slice(0, 10),
    );
    // the day viability crosses 50%
    const crossing = viabilityCrossingAt({
      form: 'liquid_pack',
      anchorAt: new Date('2026-03-01T12:00:00Z'),
      storageTempC: 4,
      threshold: 0.5,
    }).at!;
    const below = events.find((e) => e.summary.startsWith('Below 50% viable: The liquid pack of Copperbeech Ale'))!;
    expect(below.startDate.toString()).toBe(crossing.toISOString().slice(0, 10));
    // brew day and the steps, at the instants the plan computed
    const brew = events.find((e) => e.summary === 'Brew day: Quarry Lane Helles')!;
    expect(brew.startDate.toJSDate().toISOString()).toBe('2026-04-04T09:00:00.000Z');
    const crash = events.find((e) => e.summary.startsWith('Chill the starter for Quarry Lane Helles'))!;
    expect(crash.startDate.toJSDate().toISOString()).toBe(plan.computed.schedule.coldCrashStartAt);
    const stepTitles = titles.filter((s) => /^Step \d of Quarry Lane Helles/.test(s));
    expect(stepTitles).toHaveLength(plan.computed.steps.length);
    const firstStep = events.find((e) => e.summary.startsWith('Step 1 of'))!;
    expect(firstStep.startDate.toJSDate().toISOString()).toBe(plan.computed.steps[0]!.startAt);
    expect(pack.body.culture.id).toBeTruthy();

    // a new address replaces the old one; turning it off ends it
    const again = (await agent.post('/api/calendar-feed').expect(201)).body.feed;
    await supertest(t.app).get(url.pathname).expect(404);
    await supertest(t.app).get(new URL(again.url).pathname).expect(200);
    expect((await agent.get('/api/calendar-feed').expect(200)).body.feed.lastUsedAt).not.toBeNull();
    await agent.delete('/api/calendar-feed').expect(200);
    await supertest(t.app).get(new URL(again.url).pathname).expect(404);
    await supertest(t.app).get('/api/calendar/short.ics').expect(400);
    await t.agent().post('/api/calendar-feed').expect(401);
  });

  it('reminds about a planned step 12 hours ahead, in the person’s time', async () => {
    const { agent, user } = await keeper('Europe/London');
    const dregs = (
      await agent
        .post('/api/cultures')
        .send(buildDregs({ madeAt: '2026-03-19T18:00:00Z' }))
        .expect(201)
    ).body.culture;
    const plan: PlanDto = (await agent.post('/api/plans').send(lagerPlan(dregs.id)).expect(201)).body.plan;
    // Step times are recomputed from the culture as it ages, so ask the plan at each moment.
    const firstStepAt = async (at: Date) => {
      t.clock.now = at;
      const p: PlanDto = (await agent.get(`/api/plans/${plan.id}`).expect(200)).body.plan;
      return new Date(p.computed.steps[0]!.startAt);
    };
    const titles = async () =>
      (
        await t.database.db.execute<{ title: string }>(
          sql`select title from notifications where user_id = ${user.id} and kind = 'plan.step' order by due_at`,
        )
      ).rows.map((r) => r.title);
    let at = new Date(plan.computed.steps[0]!.startAt.slice(0, 10) + 'T00:00:00Z');
    at = new Date(at.getTime() - 24 * 3.6e6);
    let due: Date | null = null;
    for (let h = 0; h < 72 && !due; h += 1) {
      const p = new Date(at.getTime() + h * 3.6e6);
      const s = await firstStepAt(p);
      await runReminderPass({ db: t.database.db, now: p, userIds: [user.id] });
      if (s.getTime() - p.getTime() > 12 * 3.6e6) expect(await titles()).toEqual([]);
      else due = s;
    }
    t.clock.now = NOW;
    expect(due).not.toBeNull();
    const notices = await titles();
    expect(notices).toHaveLength(1);
    const local = new Intl.DateTimeFormat('en-GB', {
      timeZone: 'Europe/London',
      hour: '2-digit',
      minute: '2-digit',
      hour12: false,
    }).format(due!);
    expect(notices[0]).toMatch(
      new RegExp(`^Step 1 of Quarry Lane Helles \\(\\d+ mL\\) starts (today|tonight|tomorrow) at ${local}$`),
    );
  });
});
