import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { viabilityCrossingAt } from '@barmkeep/core';
import type { CultureCreateInput } from '@barmkeep/schemas';
import { buildTestApp, signUp, ORIGIN, type TestApp } from '../../../test/helpers';
import { FakeInbox, startFakeSmtp } from '../../mail/fakeSmtp';
import { createSmtpMailer } from '../../mail/mailer';
import { connect, type Database } from '../../db/client';
import { runReminderTick } from './tick';
import type { DeliveryDeps } from './delivery';
import { startReminderWorker, REMINDER_TICK_QUEUE } from '../../jobs/reminders';
import { createLogger } from '../../lib/logger';
import { refreshViabilityCrossings } from './crossings';
import type { Db } from '../../db/client';

const DAY = 86_400_000;
const HOUR = 3_600_000;

let t: TestApp;
let inbox: FakeInbox;
let smtp: { port: number; close(): Promise<void> };
let deps: DeliveryDeps;

beforeAll(async () => {
  t = await buildTestApp();
  inbox = new FakeInbox();
  smtp = await startFakeSmtp(inbox);
  deps = {
    db: t.database.db,
    mailer: createSmtpMailer({ port: smtp.port }, 'Barmkeep <no-reply@barmkeep.test>'),
    appUrl: ORIGIN,
  };
});
afterAll(async () => {
  await smtp.close();
  await t.close();
});

/** A liquid pack kept at 4 °C: 50% viable after about 94.6 days (core's 20%/month model [PUB-2]). */
function pack(madeAt: Date, overrides: Partial<CultureCreateInput> = {}): CultureCreateInput {
  return {
    strainName: `Copperbeech Ale ${Math.random().toString(36).slice(2, 7)}`,
    form: 'liquid_pack',
    origin: { origin: 'purchased', maker: 'Invented Yeast Co.' },
    locationLabel: 'Jar B3',
    storageTempC: 4,
    madeAt: madeAt.toISOString(),
    ...overrides,
  };
}

async function keeper(timeZone = 'UTC') {
  const agent = t.agent();
  const { user, person } = await signUp(agent);
  if (timeZone !== 'UTC') await agent.patch('/api/account').send({ timeZone }).expect(200);
  return { agent, user, person };
}

async function createCulture(agent: ReturnType<TestApp['agent']>, body: CultureCreateInput): Promise<string> {
  const res = await agent.post('/api/cultures').send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.culture.id as string;
}

async function noticesOf(userId: string, kind?: string) {
  const { rows } = await t.database.db.execute<{
    kind: string;
    dedupe_key: string;
    title: string;
    email_state: string;
    subject_id: string;
  }>(
    sql`select kind, dedupe_key, title, email_state, subject_id from notifications where user_id = ${userId} ${kind ? sql`and kind = ${kind}` : sql``} order by created_at, id`,
  );
  return rows;
}

const mailsTo = (email: string) => inbox.list().filter((m) => m.to.includes(email));
const tick = (now: Date, d: DeliveryDeps = deps) => runReminderTick(d, now);

describe('viability threshold', () => {
  it('warns once within the warning window and once on the day, and e-mails each notice once', async () => {
    const made = new Date('2025-01-06T12:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent, user, person } = await keeper();
    const id = await createCulture(agent, pack(made));
    const crossing = viabilityCrossingAt({ form: 'liquid_pack', anchorAt: made, storageTempC: 4, threshold: 0.5 }).at!;

    await tick(new Date(crossing.getTime() - 9 * DAY));
    expect(await noticesOf(user.id, 'culture.viability')).toHaveLength(0);

    await tick(new Date(crossing.getTime() - 6.5 * DAY));
    await tick(new Date(crossing.getTime() - 6 * DAY));
    await tick(new Date(crossing.getTime() - 2 * DAY));
    let notices = await noticesOf(user.id, 'culture.viability');
    expect(notices).toHaveLength(1);
    expect(notices[0]!.dedupe_key).toMatch(/^50:warn:/);
    expect(notices[0]!.title).toMatch(/drops below 50% viable on \w+day \d+ \w+/);
    expect(notices[0]!.subject_id).toBe(id);

    await tick(new Date(crossing.getTime() + HOUR));
    await tick(new Date(crossing.getTime() + 2 * DAY));
    notices = await noticesOf(user.id, 'culture.viability');
    expect(notices.map((n) => n.dedupe_key.split(':')[1])).toEqual(['warn', 'due']);
    expect(notices.every((n) => n.email_state === 'sent')).toBe(true);

    const mails = mailsTo(person.email).filter((m) => m.subject.includes('viable'));
    expect(mails).toHaveLength(2);
    expect(mails[0]!.text).toContain(`${ORIGIN}/cultures/${id}`);
    expect(mails[0]!.text).toMatch(/email-preferences\/[\w-]+/);
    expect(mails[0]!.html).toContain('Open in Barmkeep');
  });

  it('uses the person’s own threshold and warning days', async () => {
    const made = new Date('2025-01-06T12:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent, user } = await keeper();
    await agent.patch('/api/reminder-preferences').send({ viabilityThresholdPct: 70, warnDays: 2 }).expect(200);
    await createCulture(agent, pack(made));
    const crossing70 = viabilityCrossingAt({
      form: 'liquid_pack',
      anchorAt: made,
      storageTempC: 4,
      threshold: 0.7,
    }).at!;
    await tick(new Date(crossing70.getTime() - 4 * DAY));
    expect(await noticesOf(user.id, 'culture.viability')).toHaveLength(0);
    await tick(new Date(crossing70.getTime() - 1.5 * DAY));
    const [n] = await noticesOf(user.id, 'culture.viability');
    expect(n!.dedupe_key).toMatch(/^70:warn:/);
  });

  it('refuses settings out of range with field errors', async () => {
    const { agent } = await keeper();
    const res = await agent
      .patch('/api/reminder-preferences')
      .send({ viabilityThresholdPct: 0, warnDays: -1, emailDelivery: 'hourly' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual([
      'body.emailDelivery',
      'body.viabilityThresholdPct',
      'body.warnDays',
    ]);
  });
});

describe('editing a culture re-evaluates', () => {
  it('moving a pack somewhere warm brings the crossing forward and fires on the next pass', async () => {
    const made = new Date('2025-02-03T09:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent, user } = await keeper();
    const id = await createCulture(agent, pack(made));
    const day60 = new Date(made.getTime() + 60 * DAY);
    await tick(day60);
    expect(await noticesOf(user.id)).toHaveLength(0);

    t.clock.now = day60;
    await agent
      .post(`/api/cultures/${id}/events`)
      .send({ kind: 'moved', data: { storageTempC: 20, locationLabel: 'Garage shelf' } })
      .expect(201);
    await tick(day60);
    const kinds = (await noticesOf(user.id)).map((n) => `${n.kind}:${n.dedupe_key.split(':')[0]}`);
    // 20 °C: the death rate is 2^1.6 ≈ 3× the 4 °C rate (Q10 = 2 [MEM]): 50% after about 31 days, and the
    // 120-day storage limit shrinks to about 39 days (core maxStorageDays) — both already past at day 60.
    expect(kinds).toContain('culture.viability:50');
    expect(kinds).toContain('culture.storage:due');
    const viability = (await noticesOf(user.id, 'culture.viability'))[0]!;
    expect(viability.title).toContain('in Garage shelf');
    expect(viability.title).toMatch(/fell below 50% viable on/);
  });

  it('a culture pitched before its digest went out is left out of the e-mail', async () => {
    const made = new Date('2025-01-06T12:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent, user, person } = await keeper();
    await agent.patch('/api/reminder-preferences').send({ emailDelivery: 'digest', digestHour: 7 }).expect(200);
    const id = await createCulture(agent, pack(made));
    const late = new Date(made.getTime() + 100 * DAY);
    await tick(new Date(late.getTime() - late.getUTCHours() * HOUR + 3 * HOUR)); // 03:00 UTC, before the digest hour
    expect((await noticesOf(user.id, 'culture.viability'))[0]!.email_state).toBe('pending');
    t.clock.now = new Date(late.getTime() - late.getUTCHours() * HOUR + 4 * HOUR);
    await agent.post(`/api/cultures/${id}/state`).send({ state: 'discarded' }).expect(200);
    await tick(new Date(late.getTime() - late.getUTCHours() * HOUR + 8 * HOUR));
    expect((await noticesOf(user.id, 'culture.viability'))[0]!.email_state).toBe('skipped');
    expect(mailsTo(person.email)).toHaveLength(0);
  });
});

async function crossingRow(id: string) {
  const { rows } = await t.database.db.execute<{
    crossing: Date | null;
    stale: boolean;
    check_at: Date | null;
  }>(
    sql`select viability_crossing_at as crossing, viability_stale as stale, viability_check_at as check_at from cultures where id = ${id}`,
  );
  const r = rows[0]!;
  return { ...r, crossing: r.crossing && new Date(r.crossing), check_at: r.check_at && new Date(r.check_at) };
}

const packCrossing = (anchorAt: Date, storageTempC: number, threshold = 0.5, startViability?: number) =>
  viabilityCrossingAt({
    form: 'liquid_pack',
    anchorAt,
    storageTempC,
    threshold,
    ...(startViability !== undefined ? { startViability } : {}),
  }).at!;

describe('stored crossings', () => {
  it('a new temperature marks the crossing stale, and the next pass stores and uses the new one', async () => {
    const made = new Date('2025-02-03T09:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent, user } = await keeper();
    const id = await createCulture(agent, pack(made));
    expect((await crossingRow(id)).stale).toBe(true);
    await tick(new Date(made.getTime() + 10 * DAY));
    let row = await crossingRow(id);
    expect(row.stale).toBe(false);
    expect(row.crossing!.getTime()).toBe(packCrossing(made, 4).getTime());

    t.clock.now = new Date(made.getTime() + 10 * DAY);
    await agent
      .post(`/api/cultures/${id}/events`)
      .send({ kind: 'moved', data: { storageTempC: 20, locationLabel: 'Garage shelf' } })
      .expect(201);
    expect((await crossingRow(id)).stale).toBe(true);
    const warm = packCrossing(made, 20);
    expect(warm.getTime()).toBeLessThan(packCrossing(made, 4).getTime());
    // a pass five days before the warm crossing warns; at 4 °C it would have been two months away
    await tick(new Date(warm.getTime() - 5 * DAY));
    row = await crossingRow(id);
    expect(row.crossing!.getTime()).toBe(warm.getTime());
    const [n] = await noticesOf(user.id, 'culture.viability');
    expect(n!.dedupe_key).toMatch(/^50:warn:/);
    expect(n!.title).toMatch(/drops below 50% viable/);
  });

  it('catches a write that bypasses the culture service (plain SQL)', async () => {
    const made = new Date('2025-02-03T09:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent } = await keeper();
    const id = await createCulture(agent, pack(made));
    await tick(new Date(made.getTime() + DAY));
    await t.database.db.execute(sql`update cultures set made_at = made_at - interval '30 days' where id = ${id}`);
    expect((await crossingRow(id)).stale).toBe(true);
    await tick(new Date(made.getTime() + DAY));
    expect((await crossingRow(id)).crossing!.getTime()).toBe(
      packCrossing(new Date(made.getTime() - 30 * DAY), 4).getTime(),
    );
    // an edit that changes no input leaves the stored crossing alone
    await t.database.db.execute(sql`update cultures set notes = 'relabelled' where id = ${id}`);
    expect((await crossingRow(id)).stale).toBe(false);
  });

  it('a culture that is no longer kept has no crossing and needs no recompute', async () => {
    const made = new Date('2025-02-03T09:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent } = await keeper();
    const id = await createCulture(agent, pack(made));
    await tick(new Date(made.getTime() + DAY));
    expect((await crossingRow(id)).crossing).not.toBeNull();
    t.clock.now = new Date(made.getTime() + 2 * DAY);
    await agent.post(`/api/cultures/${id}/state`).send({ state: 'discarded' }).expect(200);
    expect(await crossingRow(id)).toEqual({ crossing: null, stale: false, check_at: null });
  });

  it('a new threshold recomputes every crossing of that person, and only theirs', async () => {
    const made = new Date('2025-01-06T12:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const a = await keeper();
    const b = await keeper();
    const ids = [
      await createCulture(a.agent, pack(made)),
      await createCulture(a.agent, pack(made, { storageTempC: 8 })),
    ];
    const other = await createCulture(b.agent, pack(made));
    await tick(new Date(made.getTime() + DAY));
    await a.agent.patch('/api/reminder-preferences').send({ viabilityThresholdPct: 70 }).expect(200);
    for (const id of ids) expect((await crossingRow(id)).stale).toBe(true);
    expect((await crossingRow(other)).stale).toBe(false);
    await tick(new Date(made.getTime() + DAY));
    expect((await crossingRow(ids[0]!)).crossing!.getTime()).toBe(packCrossing(made, 4, 0.7).getTime());
    expect((await crossingRow(ids[1]!)).crossing!.getTime()).toBe(packCrossing(made, 8, 0.7).getTime());
    expect((await crossingRow(other)).crossing!.getTime()).toBe(packCrossing(made, 4, 0.5).getTime());
    // and the notice fires at the 70% crossing
    await tick(new Date(packCrossing(made, 4, 0.7).getTime() + HOUR));
    const keys = (await noticesOf(a.user.id, 'culture.viability')).map((n) =>
      n.dedupe_key.split(':').slice(0, 2).join(':'),
    );
    expect(keys).toContain('70:due');
  });

  it('an edit landing between the read and the write keeps the row stale for the next pass', async () => {
    const made = new Date('2025-02-03T09:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent, user } = await keeper();
    const id = await createCulture(agent, pack(made));
    const db = t.database.db;
    let edited = false;
    // the first statement of the recompute is the read; the edit commits right after it
    const racing = new Proxy(db, {
      get(target, prop, receiver) {
        if (prop !== 'execute') return Reflect.get(target, prop, receiver);
        return async (query: Parameters<Db['execute']>[0]) => {
          const result = await target.execute(query);
          if (!edited) {
            edited = true;
            await target.execute(sql`update cultures set storage_temp_c = 12 where id = ${id}`);
          }
          return result;
        };
      },
    }) as Db;
    expect(await refreshViabilityCrossings(racing, [user.id])).toBe(0);
    expect(edited).toBe(true);
    expect((await crossingRow(id)).stale).toBe(true);
    expect(await refreshViabilityCrossings(db, [user.id])).toBe(1);
    expect((await crossingRow(id)).crossing!.getTime()).toBe(packCrossing(made, 12).getTime());
  });

  it('a fresh count re-anchors the projection: the new crossing fires though the old one was announced', async () => {
    const made = new Date('2025-01-06T12:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent, user } = await keeper();
    const id = await createCulture(agent, pack(made));
    const first = packCrossing(made, 4);
    await tick(new Date(first.getTime() + HOUR));
    expect((await noticesOf(user.id, 'culture.viability')).map((n) => n.dedupe_key.split(':')[1])).toEqual(['due']);
    // the due notice is stored: the culture is out of the pending index
    expect((await crossingRow(id)).check_at).toBeNull();
    await tick(new Date(first.getTime() + 2 * HOUR));
    expect(await noticesOf(user.id, 'culture.viability')).toHaveLength(1);

    const countedAt = new Date(first.getTime() + DAY);
    t.clock.now = countedAt;
    await agent
      .post(`/api/cultures/${id}/events`)
      .send({ kind: 'counted', data: { cellsCounted: 300, squaresCounted: 5, dilution: 100, live: 90, dead: 10 } })
      .expect(201);
    await tick(new Date(countedAt.getTime() + HOUR));
    const second = packCrossing(countedAt, 4, 0.5, 0.9);
    const row = await crossingRow(id);
    expect(row.crossing!.getTime()).toBe(second.getTime());
    expect(row.check_at!.getTime()).toBe(second.getTime());
    await tick(new Date(second.getTime() - 3 * DAY));
    await tick(new Date(second.getTime() + HOUR));
    const notices = await noticesOf(user.id, 'culture.viability');
    expect(notices.map((n) => n.dedupe_key.split(':')[1])).toEqual(['due', 'warn', 'due']);
    expect(new Set(notices.map((n) => n.dedupe_key.split(':')[2])).size).toBe(2);
  });
});

describe('generation limit', () => {
  it('fires when a kept culture reaches the limit, once', async () => {
    const made = new Date('2025-03-01T10:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent, user } = await keeper();
    await createCulture(agent, {
      strainName: 'Millpond Lager',
      form: 'slurry_unwashed',
      origin: { origin: 'batch_slurry', batchName: 'Batch 12', crop: 'bottom', washed: false },
      generation: 10,
      amount: { volumeMl: 300 },
      storageTempC: 3,
      madeAt: made.toISOString(),
    });
    await createCulture(agent, pack(made, { generation: 4 }));
    await tick(new Date(made.getTime() + 2 * HOUR));
    await tick(new Date(made.getTime() + 3 * HOUR));
    const gen = await noticesOf(user.id, 'culture.generation');
    expect(gen).toHaveLength(1);
    expect(gen[0]!.title).toContain('generation 10');
  });
});

describe('two workers', () => {
  it('two pg-boss instances on one database store and send every notice once', async () => {
    const made = new Date('2025-01-06T12:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const people = await Promise.all([keeper(), keeper(), keeper()]);
    for (const p of people) {
      await createCulture(p.agent, pack(made));
      await createCulture(p.agent, pack(made, { generation: 12 }));
    }
    const now = new Date(made.getTime() + 200 * DAY);
    const url = String(t.env.DATABASE_URL);
    const logger = createLogger(t.env);
    const second: Database = connect(url, { max: 3 });
    const workerDeps = [deps, { ...deps, db: second.db }];
    const workers = await Promise.all(
      workerDeps.map((d) =>
        startReminderWorker({
          databaseUrl: url,
          deps: d,
          now: () => now,
          logger,
          schedule: false,
          // other test files change cultures in this database meanwhile; recheck.test.ts covers listening
          listen: false,
          pollingIntervalSeconds: 0.5,
        }),
      ),
    );
    try {
      const boss = workers[0]!.boss;
      const ids = await Promise.all([1, 2, 3, 4].map(() => boss.send(REMINDER_TICK_QUEUE, {})));
      // and a pass run by hand at the same moment, as an API instance might
      await Promise.all([tick(now, workerDeps[0]), tick(now, workerDeps[1])]);
      const deadline = Date.now() + 20_000;
      for (;;) {
        const jobs = await Promise.all(ids.map((id) => boss.getJobById(REMINDER_TICK_QUEUE, id!)));
        if (jobs.every((j) => j?.state === 'completed')) break;
        if (jobs.some((j) => j?.state === 'failed'))
          throw new Error(`a tick failed: ${JSON.stringify(jobs.map((j) => j?.output))}`);
        if (Date.now() > deadline) throw new Error('ticks did not finish');
        await new Promise((r) => setTimeout(r, 200));
      }
    } finally {
      await Promise.all(workers.map((w) => w.stop()));
      await second.close();
    }
    for (const p of people) {
      const notices = await noticesOf(p.user.id);
      const keys = notices.map((n) => `${n.kind}|${n.subject_id}|${n.dedupe_key}`);
      expect(new Set(keys).size).toBe(keys.length);
      // two packs: viability due + storage due each; one also past the generation limit
      expect(notices.filter((n) => n.kind === 'culture.viability')).toHaveLength(2);
      expect(notices.filter((n) => n.kind === 'culture.generation')).toHaveLength(1);
      expect(notices.every((n) => n.email_state === 'sent')).toBe(true);
      const subjects = mailsTo(p.person.email).map((m) => m.subject);
      expect(subjects).toHaveLength(notices.length);
      expect(new Set(subjects).size).toBe(subjects.length);
    }
  }, 60_000);
});

describe('daily digest', () => {
  it('groups the day’s notices by kind in one e-mail at the digest hour, local time', async () => {
    const made = new Date('2025-01-06T12:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent, user, person } = await keeper('Europe/Berlin');
    await agent.patch('/api/reminder-preferences').send({ emailDelivery: 'digest', digestHour: 7 }).expect(200);
    await createCulture(agent, pack(made));
    await createCulture(agent, pack(made));
    await createCulture(agent, pack(made, { generation: 11 }));

    // 2025-06-02 05:30 UTC is 07:30 in Berlin (CEST, UTC+2); 04:30 UTC is 06:30 there.
    await tick(new Date('2025-06-02T04:30:00Z'));
    expect(await noticesOf(user.id)).not.toHaveLength(0);
    expect(mailsTo(person.email)).toHaveLength(0);

    await tick(new Date('2025-06-02T05:30:00Z'));
    await tick(new Date('2025-06-02T09:00:00Z'));
    const mails = mailsTo(person.email);
    expect(mails).toHaveLength(1);
    const text = mails[0]!.text;
    const notices = await noticesOf(user.id);
    expect(mails[0]!.subject).toBe(`Barmkeep: ${notices.length} reminders for Monday 2 June`);
    expect(text).toContain('Viability falling below your threshold (3)');
    expect(text).toContain('Storage time running out (3)');
    expect(text).toContain('Generation limit reached (1)');
    expect(text.indexOf('Viability falling')).toBeLessThan(text.indexOf('Storage time'));
    expect(text.indexOf('Storage time')).toBeLessThan(text.indexOf('Generation limit'));
    expect(notices.every((n) => n.email_state === 'sent')).toBe(true);

    // a notice fired after today's digest waits for tomorrow's
    await createCulture(agent, pack(made, { generation: 15, strainName: 'Late Riser' }));
    await tick(new Date('2025-06-02T12:00:00Z'));
    expect(mailsTo(person.email)).toHaveLength(1);
    await tick(new Date('2025-06-03T05:01:00Z'));
    const next = mailsTo(person.email);
    expect(next).toHaveLength(2);
    expect(next[0]!.subject).toMatch(/for Tuesday 3 June$/);
    expect(next[0]!.text).toContain('Late Riser');
  });
});

describe('time zones around a daylight-saving change', () => {
  it('sends the 07:00 digest at 07:00 UTC before the UK clocks go forward and at 06:00 UTC after', async () => {
    const made = new Date('2024-12-01T12:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent, person } = await keeper('Europe/London');
    await agent.patch('/api/reminder-preferences').send({ emailDelivery: 'digest', digestHour: 7 }).expect(200);
    await createCulture(agent, pack(made, { generation: 20 }));
    // Saturday 29 March 2025, GMT (UTC+0)
    await tick(new Date('2025-03-29T06:59:00Z'));
    expect(mailsTo(person.email)).toHaveLength(0);
    await tick(new Date('2025-03-29T07:00:00Z'));
    expect(mailsTo(person.email)).toHaveLength(1);

    // Clocks go forward on Sunday 30 March 01:00 UTC. On Monday 31 March 07:00 BST = 06:00 UTC.
    t.clock.now = new Date('2025-03-30T12:00:00Z');
    await createCulture(agent, pack(made, { generation: 20, strainName: 'After the change' }));
    await tick(new Date('2025-03-31T05:59:00Z'));
    expect(mailsTo(person.email)).toHaveLength(1);
    await tick(new Date('2025-03-31T06:00:00Z'));
    const mails = mailsTo(person.email);
    expect(mails).toHaveLength(2);
    expect(mails[0]!.subject).toMatch(/for Monday 31 March$/);
  });

  it('counts warning days in the person’s calendar, not in 24-hour blocks', async () => {
    // New York: a crossing at 02:00 local on some day is "tomorrow" at 23:00 the evening before.
    const made = new Date('2025-01-06T12:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent, user } = await keeper('America/New_York');
    await agent.patch('/api/reminder-preferences').send({ warnDays: 1 }).expect(200);
    await createCulture(agent, pack(made));
    const crossing = viabilityCrossingAt({ form: 'liquid_pack', anchorAt: made, storageTempC: 4, threshold: 0.5 }).at!;
    // the local midnight that starts the day before the crossing's local day
    const local = new Intl.DateTimeFormat('en-CA', {
      timeZone: 'America/New_York',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
    });
    const crossingDay = local.format(crossing);
    const dayBefore = local.format(new Date(crossing.getTime() - DAY));
    // step through the hours before the crossing: the warning fires on the first pass whose local date is the day before
    let firedAt: Date | null = null;
    for (let h = 60; h > 0; h -= 1) {
      const at = new Date(crossing.getTime() - h * HOUR);
      await tick(at);
      if ((await noticesOf(user.id, 'culture.viability')).length > 0) {
        firedAt = at;
        break;
      }
    }
    expect(firedAt).not.toBeNull();
    expect(local.format(firedAt!)).toBe(dayBefore);
    expect(local.format(new Date(firedAt!.getTime() - HOUR))).not.toBe(dayBefore);
    expect(crossingDay).not.toBe(dayBefore);
    expect((await noticesOf(user.id, 'culture.viability'))[0]!.title).toContain('tomorrow');
  }, 60_000);
});

describe('the unsubscribe link', () => {
  it('works without signing in, and stops further e-mail', async () => {
    const made = new Date('2025-01-06T12:00:00Z');
    t.clock.now = new Date(made.getTime() + HOUR);
    const { agent, user, person } = await keeper();
    await createCulture(agent, pack(made, { generation: 30 }));
    await tick(new Date(made.getTime() + 2 * HOUR));
    const [mail] = mailsTo(person.email);
    const token = decodeURIComponent(/email-preferences\/([\w-]+)/.exec(mail!.text)![1]!);

    const stranger = t.agent(); // no session
    const got = await stranger.get(`/api/email-preferences/${token}`).expect(200);
    expect(got.body.preferences).toEqual({
      emailHint: expect.stringMatching(/^k•••@example\.test$/),
      emailDelivery: 'each',
    });
    await stranger.patch(`/api/email-preferences/${token}`).send({ emailDelivery: 'weekly' }).expect(400);
    await stranger.patch(`/api/email-preferences/${token}`).send({ emailDelivery: 'digest' }).expect(200);

    // RFC 8058 one-click: a provider posts with no Origin and no cookie
    const { default: supertest } = await import('supertest');
    await supertest(t.app)
      .post(`/api/email-preferences/${token}/unsubscribe`)
      .type('form')
      .send('List-Unsubscribe=One-Click')
      .expect(200);
    await stranger.get('/api/email-preferences/not-a-real-token-at-all-xxxxxxxx').expect(404);
    const prefs = await agent.get('/api/reminder-preferences').expect(200);
    expect(prefs.body.preferences.emailDelivery).toBe('none');

    await createCulture(agent, pack(made, { generation: 31 }));
    await tick(new Date(made.getTime() + 3 * HOUR));
    expect(mailsTo(person.email)).toHaveLength(1);
    const gens = await noticesOf(user.id, 'culture.generation');
    expect(gens).toHaveLength(2);
    expect(gens[1]!.email_state).toBe('skipped');
  });
});
