import { inject } from 'vitest';
import supertest from 'supertest';
import { randomBytes } from 'node:crypto';
import { createApp } from '../src/app';
import { startCaches, type Caches } from '../src/cache/caches';
import { loadEnv, type Env } from '../src/config/env';
import { connect, type Database } from '../src/db/client';
import { createLogger } from '../src/lib/logger';
import { FakeInbox, startFakeSmtp } from '../src/mail/fakeSmtp';
import { createSmtpMailer } from '../src/mail/mailer';

export const ORIGIN = 'http://barmkeep.test';

export interface TestApp {
  app: import('express').Express;
  request: ReturnType<typeof supertest.agent>;
  /** A new cookie jar (another browser) on the same app. */
  agent(): ReturnType<typeof supertest.agent>;
  /**
   * The test's own connections to the app's database (not the app's pool). With the caches on,
   * each query through them returns only once the app has heard what it changed.
   */
  database: Database;
  inbox: FakeInbox;
  env: Env;
  clock: { now: Date };
  /** the app's caches (undefined when the test turned them off) */
  caches: Caches | undefined;
  close(): Promise<void>;
}

/** A full app on the run's test database, with its own fake SMTP server and a settable clock. */
export async function buildTestApp(overrides: Partial<Record<keyof Env, string>> = {}): Promise<TestApp> {
  const env = loadEnv({
    NODE_ENV: 'test',
    DATABASE_URL: inject('databaseUrl'),
    APP_URL: ORIGIN,
    AUTH_RATE_LIMIT: '1000',
    // test apps share the run's database: each counts its own attempts unless a test says otherwise
    RATE_LIMIT_PREFIX: `test-${randomBytes(4).toString('hex')}`,
    ...overrides,
  });
  const database = connect(env.DATABASE_URL, { max: 4 });
  const inbox = new FakeInbox();
  const smtp = await startFakeSmtp(inbox);
  const mailer = createSmtpMailer({ port: smtp.port }, env.MAIL_FROM);
  const clock = { now: new Date() };
  const logger = createLogger(env);
  // the caches are on as in production, so every test that writes then reads also checks they
  // follow the change (CACHE_SECONDS: '0' in overrides turns them off)
  const caches =
    env.CACHE_SECONDS > 0
      ? await startCaches({ databaseUrl: env.DATABASE_URL, seconds: env.CACHE_SECONDS, logger, now: () => clock.now })
      : undefined;
  const { app } = createApp({ env, db: database.db, mailer, logger, inbox, now: () => clock.now, caches });
  // The test's own hands on the database, apart from the app's pool: a write through them is, to
  // the app, another process's write, so each query and transaction waits until the app has heard
  // its notifications (`fence`) — as a request that writes does — before the test goes on.
  const hands = connect(env.DATABASE_URL, { max: 2 });
  if (caches) settleAfterEachWrite(hands, caches);
  const agent = () => supertest.agent(app).set('Origin', ORIGIN);
  return {
    app,
    request: agent(),
    agent,
    database: hands,
    inbox,
    env,
    clock,
    caches,
    async close() {
      await caches?.stop();
      await smtp.close();
      await hands.close();
      await database.close();
    },
  };
}

function settleAfterEachWrite(database: Database, caches: Caches) {
  const query = database.pool.query.bind(database.pool) as (...args: unknown[]) => Promise<unknown>;
  (database.pool as unknown as { query: unknown }).query = async (...args: unknown[]) => {
    const result = await query(...args);
    await caches.fence();
    return result;
  };
  const transaction = database.db.transaction.bind(database.db);
  database.db.transaction = (async (...args: Parameters<typeof transaction>) => {
    const result = await transaction(...args);
    await caches.fence();
    return result;
  }) as typeof transaction;
}

let counter = 0;
/** Deterministic-enough unique people for each test. */
export function buildPerson(overrides: Partial<{ email: string; password: string; name: string }> = {}) {
  counter += 1;
  const tag = `${process.pid}-${counter}-${randomBytes(2).toString('hex')}`;
  return {
    email: `keeper-${tag}@example.test`,
    password: 'correct-horse-yeast',
    name: `Keeper ${counter}`,
    ...overrides,
  };
}

export async function signUp(agent: ReturnType<typeof supertest.agent>, person = buildPerson()) {
  const res = await agent.post('/api/auth/sign-up').send(person).expect(201);
  return { person, user: res.body.user as { id: string; email: string } };
}
