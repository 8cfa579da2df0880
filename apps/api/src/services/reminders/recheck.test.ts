/**
 * A change to a reminder input leads to a pass for that person within seconds, not at the next
 * scheduled pass: the database triggers NOTIFY, the worker enqueues a debounced pg-boss job, and
 * the job runs the pass scoped to the person. The worker here listens to every change in its
 * database, so this file runs the API and the worker on a database of its own (other test files
 * create cultures in the shared one at the same time).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import pg from 'pg';
import { randomBytes } from 'node:crypto';
import { sql } from 'drizzle-orm';
import type { CultureCreateInput } from '@barmkeep/schemas';
import { buildTestApp, signUp, type TestApp } from '../../../test/helpers';
import { connect, runMigrations } from '../../db/client';
import { createSmtpMailer } from '../../mail/mailer';
import { startFakeSmtp, FakeInbox } from '../../mail/fakeSmtp';
import { createLogger } from '../../lib/logger';
import { REMINDER_USERS_QUEUE, startReminderWorker, type ReminderWorker } from '../../jobs/reminders';

const DAY = 86_400_000;
const adminUrl = new URL(inject('databaseUrl'));
const name = `barmkeep_recheck_${Date.now()}_${randomBytes(2).toString('hex')}`;
const databaseUrl = (() => {
  const u = new URL(adminUrl);
  u.pathname = `/${name}`;
  return u.toString();
})();
const adminOf = () => {
  const u = new URL(adminUrl);
  u.pathname = '/postgres';
  return new pg.Client({ connectionString: u.toString() });
};

/** The worker's clock: every job runs its pass at this instant. */
const NOW = new Date('2025-06-02T10:00:00Z');

let t: TestApp;
let worker: ReminderWorker;
let smtp: { port: number; close(): Promise<void> };

beforeAll(async () => {
  const admin = adminOf();
  await admin.connect();
  await admin.query(`create database "${name}"`);
  await admin.end();
  const setup = connect(databaseUrl, { max: 1 });
  await runMigrations(setup.db);
  await setup.close();

  t = await buildTestApp({ DATABASE_URL: databaseUrl });
  t.clock.now = NOW;
  smtp = await startFakeSmtp(new FakeInbox());
  worker = await startReminderWorker({
    databaseUrl,
    deps: {
      db: t.database.db,
      mailer: createSmtpMailer({ port: smtp.port }, 'Barmkeep <no-reply@barmkeep.test>'),
      appUrl: 'http://barmkeep.test',
    },
    now: () => NOW,
    logger: createLogger(t.env),
    schedule: false,
    pollingIntervalSeconds: 0.5,
  });
}, 60_000);

afterAll(async () => {
  await worker?.stop();
  await smtp?.close();
  await t?.close();
  const admin = adminOf();
  await admin.connect();
  await admin.query(`drop database if exists "${name}" with (force)`);
  await admin.end();
}, 30_000);

function pack(overrides: Partial<CultureCreateInput> = {}): CultureCreateInput {
  return {
    strainName: `Harrow Lane Ale ${randomBytes(2).toString('hex')}`,
    form: 'liquid_pack',
    origin: { origin: 'purchased', maker: 'Invented Yeast Co.' },
    locationLabel: 'Door shelf',
    storageTempC: 4,
    madeAt: new Date(NOW.getTime() - 60 * DAY).toISOString(),
    ...overrides,
  };
}

async function notices(userId: string, kind: string) {
  const { rows } = await t.database.db.execute<{ dedupe_key: string; title: string }>(
    sql`select dedupe_key, title from notifications where user_id = ${userId} and kind = ${kind} order by created_at`,
  );
  return rows;
}

async function jobsFor(userId: string) {
  const { rows } = await t.database.db.execute<{ state: string; start_after: Date }>(
    sql`select state, start_after from pgboss.job where name = ${REMINDER_USERS_QUEUE} and singleton_key = ${userId}`,
  );
  return rows;
}

async function waitFor<T>(what: string, probe: () => Promise<T | undefined | false>, ms = 20_000): Promise<T> {
  const deadline = Date.now() + ms;
  for (;;) {
    const got = await probe();
    if (got) return got;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

const settled = async (userId: string) => {
  const jobs = await jobsFor(userId);
  return jobs.length > 0 && jobs.every((j) => j.state === 'completed') && jobs;
};

describe('a changed reminder input re-checks that person soon', () => {
  it('a new culture past its limit gets its notice from a queued pass, with no scheduled pass', async () => {
    const agent = t.agent();
    const { user } = await signUp(agent);
    const res = await agent
      .post('/api/cultures')
      .send(pack({ generation: 12 }))
      .expect(201);
    const [n] = await waitFor('the generation notice', async () => {
      const found = await notices(user.id, 'culture.generation');
      return found.length > 0 && found;
    });
    expect(n!.title).toContain('generation 12');
    const jobs = await waitFor('the job to complete', () => settled(user.id));
    expect(jobs.length).toBeGreaterThanOrEqual(1);
    const { rows } = await t.database.db.execute<{ subject_id: string }>(
      sql`select subject_id from notifications where user_id = ${user.id} and kind = 'culture.generation'`,
    );
    expect(rows.map((r) => r.subject_id)).toEqual([res.body.culture.id]);
  });

  it('four quick edits make at most two passes (one now, one after the debounce slot) and one notice', async () => {
    const agent = t.agent();
    const { user } = await signUp(agent);
    const id = (await agent.post('/api/cultures').send(pack()).expect(201)).body.culture.id as string;
    await waitFor('the creation pass', () => settled(user.id));
    expect(await notices(user.id, 'culture.viability')).toHaveLength(0);
    const before = (await jobsFor(user.id)).length;

    // 60 days at 20 °C or warmer: past the 50% crossing in each case (core's Q10 model)
    for (const storageTempC of [20, 22, 24, 26])
      await agent
        .post(`/api/cultures/${id}/events`)
        .send({ kind: 'moved', data: { storageTempC, locationLabel: 'Garage shelf' } })
        .expect(201);
    const found = await waitFor('the viability notice', async () => {
      const got = await notices(user.id, 'culture.viability');
      return got.length > 0 && got;
    });
    expect(found[0]!.dedupe_key).toMatch(/^50:due:/);
    await waitFor(
      'the edit passes to complete',
      async () => {
        const jobs = await jobsFor(user.id);
        return jobs.length > before && jobs.every((j) => j.state === 'completed');
      },
      30_000,
    );
    expect((await jobsFor(user.id)).length - before).toBeLessThanOrEqual(2);
    expect(await notices(user.id, 'culture.viability')).toHaveLength(1);
  }, 40_000);

  it('a change of reminder settings re-checks too: a lower generation limit fires at once', async () => {
    const agent = t.agent();
    const { user } = await signUp(agent);
    await agent
      .post('/api/cultures')
      .send(pack({ generation: 4 }))
      .expect(201);
    await waitFor('the creation pass', () => settled(user.id));
    expect(await notices(user.id, 'culture.generation')).toHaveLength(0);
    await agent.patch('/api/reminder-preferences').send({ generationLimit: 3 }).expect(200);
    const [n] = await waitFor('the generation notice', async () => {
      const got = await notices(user.id, 'culture.generation');
      return got.length > 0 && got;
    });
    expect(n!.dedupe_key).toBe('3');
  });
});
