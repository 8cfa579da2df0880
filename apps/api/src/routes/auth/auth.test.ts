import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { buildPerson, buildTestApp, signUp, ORIGIN, type TestApp } from '../../../test/helpers';
import { sessions, users } from '../../db/schema';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => {
  await t.close();
});

function cookieOf(res: { headers: Record<string, unknown> }): string {
  const raw = res.headers['set-cookie'];
  const list = Array.isArray(raw) ? raw : [String(raw ?? '')];
  return list.find((c: string) => c.startsWith('barmkeep_session=')) ?? '';
}

async function waitForMail(to: string, previousId?: string) {
  for (let i = 0; i < 50; i++) {
    const m = t.inbox.latestTo(to);
    if (m && m.id !== previousId) return m;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`no mail to ${to}`);
}

describe('sign-up, sign-in and sign-out', () => {
  it('signs up, is signed in at once, signs out', async () => {
    const agent = t.agent();
    const person = buildPerson();
    const res = await agent.post('/api/auth/sign-up').send(person).expect(201);
    expect(res.body.user).toMatchObject({ email: person.email, name: person.name, role: 'user', unitSystem: 'metric' });
    expect(res.body.user).not.toHaveProperty('passwordHash');
    const cookie = cookieOf(res);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/); // served over plain http in tests
    await agent.get('/api/auth/me').expect(200);
    await agent.post('/api/auth/sign-out').expect(204);
    await agent.get('/api/auth/me').expect(401);
  });

  it('stores an argon2id hash with the OWASP parameters, never the password', async () => {
    const { person, user } = await signUp(t.agent());
    const [row] = await t.database.db.select().from(users).where(eq(users.id, user.id));
    expect(row!.passwordHash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
    expect(row!.passwordHash).not.toContain(person.password);
  });

  it('normalises the e-mail and refuses a duplicate with a field message, changing nothing', async () => {
    const person = buildPerson();
    await t.agent().post('/api/auth/sign-up').send(person).expect(201);
    const res = await t
      .agent()
      .post('/api/auth/sign-up')
      .send({ ...person, email: `  ${person.email.toUpperCase()} ` })
      .expect(409);
    expect(res.body.error.code).toBe('email_taken');
    expect(res.body.error.fields['body.email']).toBeDefined();
    const rows = await t.database.db.select().from(users).where(eq(users.email, person.email));
    expect(rows).toHaveLength(1);
  });

  it('rejects a weak password and reports every bad field at once', async () => {
    const res = await t
      .agent()
      .post('/api/auth/sign-up')
      .send({ email: 'nope', password: 'short', name: '' })
      .expect(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['body.email', 'body.name', 'body.password']);
    expect(res.body.error.fields['body.password'][0]).toMatch(/at least 10/);
  });

  it('gives the same answer for a wrong password and an unknown e-mail', async () => {
    const { person } = await signUp(t.agent());
    const wrong = await t
      .agent()
      .post('/api/auth/sign-in')
      .send({ email: person.email, password: 'not-the-password' })
      .expect(401);
    const unknown = await t
      .agent()
      .post('/api/auth/sign-in')
      .send({ email: 'nobody-here@example.test', password: 'not-the-password' })
      .expect(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe('invalid_credentials');
  });

  it('rotates the session on sign-in: the old id stops working', async () => {
    const agent = t.agent();
    const { person } = await signUp(agent);
    const before = await agent.get('/api/auth/me').expect(200);
    const oldCookie = (before.request as unknown as { cookies?: string }).cookies;
    const signIn = await agent
      .post('/api/auth/sign-in')
      .send({ email: person.email, password: person.password })
      .expect(200);
    const newCookie = cookieOf(signIn).split(';')[0];
    expect(newCookie).toBeTruthy();
    expect(newCookie).not.toBe(oldCookie);
    // the session that existed before sign-in is gone
    const [u] = await t.database.db.select().from(users).where(eq(users.email, person.email));
    const left = await t.database.db.select().from(sessions).where(eq(sessions.userId, u!.id));
    expect(left).toHaveLength(1);
  });

  it('expires sessions: a session past its expiry is refused and cleared', async () => {
    const agent = t.agent();
    const { user } = await signUp(agent);
    await t.database.db
      .update(sessions)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(sessions.userId, user.id));
    const res = await agent.get('/api/auth/me').expect(401);
    expect(cookieOf(res)).toMatch(/Max-Age=0/);
  });

  it('slides a session that is past half its life', async () => {
    const agent = t.agent();
    const { user } = await signUp(agent);
    const soon = new Date(Date.now() + 2 * 24 * 3600_000);
    await t.database.db.update(sessions).set({ expiresAt: soon }).where(eq(sessions.userId, user.id));
    const res = await agent.get('/api/auth/me').expect(200);
    expect(cookieOf(res)).toMatch(/barmkeep_session=/);
    const [row] = await t.database.db.select().from(sessions).where(eq(sessions.userId, user.id));
    expect(row!.expiresAt.getTime()).toBeGreaterThan(soon.getTime() + 24 * 3600_000);
  });
});

describe('password reset through the fake SMTP inbox', () => {
  it('mails a single-use link; following it sets the password and signs out everywhere', async () => {
    const signedIn = t.agent();
    const { person } = await signUp(signedIn);
    await t.agent().post('/api/auth/password-reset/request').send({ email: person.email }).expect(202);
    const mail = await waitForMail(person.email);
    expect(mail.subject).toMatch(/reset/i);
    expect(mail.html).toContain('<a href=');
    const link = /(http\S+reset-password\?token=\S+)/.exec(mail.text)?.[1];
    expect(link).toBeDefined();
    const url = new URL(link!);
    expect(url.origin).toBe(ORIGIN);
    const token = url.searchParams.get('token')!;

    const newPassword = 'a-brand-new-password';
    await t.agent().post('/api/auth/password-reset/confirm').send({ token, password: newPassword }).expect(204);
    await signedIn.get('/api/auth/me').expect(401);
    await t.agent().post('/api/auth/sign-in').send({ email: person.email, password: person.password }).expect(401);
    await t.agent().post('/api/auth/sign-in').send({ email: person.email, password: newPassword }).expect(200);
    const again = await t
      .agent()
      .post('/api/auth/password-reset/confirm')
      .send({ token, password: 'yet-another-password' })
      .expect(400);
    expect(again.body.error.code).toBe('invalid_token');
  });

  it('refuses an expired token and keeps the old password', async () => {
    const { person } = await signUp(t.agent());
    const before = t.inbox.latestTo(person.email)?.id;
    await t.agent().post('/api/auth/password-reset/request').send({ email: person.email }).expect(202);
    const mail = await waitForMail(person.email, before);
    const token = new URL(/(http\S+)/.exec(mail.text)![1]!).searchParams.get('token')!;
    t.clock.now = new Date(Date.now() + 31 * 60_000);
    try {
      const res = await t
        .agent()
        .post('/api/auth/password-reset/confirm')
        .send({ token, password: 'another-long-password' })
        .expect(400);
      expect(res.body.error.code).toBe('invalid_token');
    } finally {
      t.clock.now = new Date();
    }
    await t.agent().post('/api/auth/sign-in').send({ email: person.email, password: person.password }).expect(200);
  });

  it('answers 202 for an unknown e-mail and sends nothing', async () => {
    const count = t.inbox.list().length;
    await t.agent().post('/api/auth/password-reset/request').send({ email: 'ghost@example.test' }).expect(202);
    await new Promise((r) => setTimeout(r, 200));
    expect(t.inbox.list().length).toBe(count);
  });
});

describe('guards', () => {
  it('401 with a JSON body when not signed in', async () => {
    const res = await t.agent().patch('/api/account').send({ name: 'X' }).expect(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('403 for a signed-in person on an admin route, 200 for an admin', async () => {
    const agent = t.agent();
    const { user } = await signUp(agent);
    const res = await agent.get('/api/admin/users').expect(403);
    expect(res.body.error.code).toBe('forbidden');
    await t.database.db.update(users).set({ role: 'admin' }).where(eq(users.id, user.id));
    const ok = await agent.get('/api/admin/users?limit=5').expect(200);
    expect(ok.body.users.length).toBeGreaterThan(0);
    const bad = await agent.get('/api/admin/users?limit=0').expect(400);
    expect(bad.body.error.fields['query.limit']).toBeDefined();
  });

  it('refuses a state-changing request without our Origin (CSRF) and changes nothing', async () => {
    const agent = t.agent();
    const { user } = await signUp(agent);
    const cross = await agent
      .patch('/api/account')
      .set('Origin', 'https://evil.example')
      .send({ name: 'Hijacked' })
      .expect(403);
    expect(cross.body.error.code).toBe('forbidden');
    const [row] = await t.database.db.select().from(users).where(eq(users.id, user.id));
    expect(row!.name).not.toBe('Hijacked');
  });

  it('refuses a POST with no Origin or Referer at all', async () => {
    const { default: supertest } = await import('supertest');
    const res = await supertest(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'a@example.test', password: 'whatever-long' });
    expect(res.status).toBe(403);
    const viaReferer = await supertest(t.app)
      .post('/api/auth/sign-in')
      .set('Referer', `${ORIGIN}/sign-in`)
      .send({ email: 'a@example.test', password: 'whatever-long' });
    expect(viaReferer.status).toBe(401);
  });

  it('answers malformed JSON with 400 and an unknown API route with 404, both as JSON', async () => {
    const bad = await t
      .agent()
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send('{"email":')
      .expect(400);
    expect(bad.body.error.code).toBe('malformed_json');
    const missing = await t.agent().get('/api/nothing-here').expect(404);
    expect(missing.body.error.code).toBe('not_found');
  });
});

describe('account', () => {
  it('updates name and unit preferences, rejects unknown values', async () => {
    const agent = t.agent();
    await signUp(agent);
    const res = await agent
      .patch('/api/account')
      .send({
        name: 'Renamed Keeper',
        unitSystem: 'us',
        temperatureUnit: 'F',
        gravityUnit: 'plato',
        timeZone: 'America/Chicago',
      })
      .expect(200);
    expect(res.body.user).toMatchObject({
      name: 'Renamed Keeper',
      unitSystem: 'us',
      temperatureUnit: 'F',
      gravityUnit: 'plato',
      timeZone: 'America/Chicago',
    });
    const bad = await agent
      .patch('/api/account')
      .send({ unitSystem: 'imperial', timeZone: 'Mars/Olympus' })
      .expect(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['body.timeZone', 'body.unitSystem']);
    const me = await agent.get('/api/auth/me').expect(200);
    expect(me.body.user.unitSystem).toBe('us');
  });
});
