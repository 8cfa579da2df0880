import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { buildTestApp, ORIGIN, signUp, type TestApp } from '../../../test/helpers';
import { passwordResetTokens, sessions } from '../../db/schema';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => {
  await t.close();
});

function sessionCookie(res: { headers: Record<string, unknown> }): string {
  const raw = res.headers['set-cookie'];
  const list = Array.isArray(raw) ? (raw as string[]) : [String(raw ?? '')];
  return list.find((c) => c.startsWith('barmkeep_session=')) ?? '';
}

describe('changing the password signs out everywhere', () => {
  it('ends every other session, keeps this browser signed in with a new id, and the old password stops working', async () => {
    const laptop = t.agent();
    const { person, user } = await signUp(laptop);
    const phone = t.agent();
    await phone.post('/api/auth/sign-in').send({ email: person.email, password: person.password }).expect(200);
    await phone.get('/api/auth/me').expect(200);
    const before = await t.database.db.select().from(sessions).where(eq(sessions.userId, user.id));
    expect(before).toHaveLength(2);

    const newPassword = 'a-fresh-kitchen-password';
    const res = await laptop
      .post('/api/account/password')
      .send({ currentPassword: person.password, newPassword })
      .expect(204);
    const cookie = sessionCookie(res);
    expect(cookie).toMatch(/^barmkeep_session=[^;]+;/);
    const newId = cookie.split(';')[0]!.split('=')[1];
    expect(before.map((s) => s.id)).not.toContain(newId);

    await phone.get('/api/auth/me').expect(401);
    await laptop.get('/api/auth/me').expect(200);
    const after = await t.database.db.select().from(sessions).where(eq(sessions.userId, user.id));
    expect(after.map((s) => s.id)).toEqual([newId]);

    await t.agent().post('/api/auth/sign-in').send({ email: person.email, password: person.password }).expect(401);
    await t.agent().post('/api/auth/sign-in').send({ email: person.email, password: newPassword }).expect(200);
  });

  it('refuses a wrong current password with a field message and changes nothing', async () => {
    const agent = t.agent();
    const { person, user } = await signUp(agent);
    const other = t.agent();
    await other.post('/api/auth/sign-in').send({ email: person.email, password: person.password }).expect(200);
    const res = await agent
      .post('/api/account/password')
      .send({ currentPassword: 'not-my-password', newPassword: 'whatever-new-password' })
      .expect(400);
    expect(res.body.error.fields['body.currentPassword']).toBeDefined();
    await other.get('/api/auth/me').expect(200);
    const rows = await t.database.db.select().from(sessions).where(eq(sessions.userId, user.id));
    expect(rows).toHaveLength(2);
    await t.agent().post('/api/auth/sign-in').send({ email: person.email, password: person.password }).expect(200);
  });

  it('burns open reset links', async () => {
    const agent = t.agent();
    const { person, user } = await signUp(agent);
    await t.agent().post('/api/auth/password-reset/request').send({ email: person.email }).expect(202);
    for (let i = 0; i < 50; i++) {
      const rows = await t.database.db
        .select()
        .from(passwordResetTokens)
        .where(eq(passwordResetTokens.userId, user.id));
      if (rows.length) break;
      await new Promise((r) => setTimeout(r, 20));
    }
    await agent
      .post('/api/account/password')
      .send({ currentPassword: person.password, newPassword: 'another-good-password' })
      .expect(204);
    const left = await t.database.db.select().from(passwordResetTokens).where(eq(passwordResetTokens.userId, user.id));
    expect(left).toHaveLength(0);
  });

  it('needs a session and a new password of the usual strength', async () => {
    await t
      .agent()
      .post('/api/account/password')
      .send({ currentPassword: 'x', newPassword: 'long-enough-secret' })
      .expect(401);
    const agent = t.agent();
    const { person } = await signUp(agent);
    const res = await agent
      .post('/api/account/password')
      .send({ currentPassword: person.password, newPassword: 'short' })
      .expect(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['body.newPassword']);
  });
});

describe('session cookie flags', () => {
  it('over plain http: HttpOnly, SameSite=Lax, Path=/, an expiry, and no Secure', async () => {
    const res = await t
      .agent()
      .post('/api/auth/sign-up')
      .send({ email: `flags-${Date.now()}@example.test`, password: 'correct-horse-yeast', name: 'Flag Keeper' })
      .expect(201);
    const cookie = sessionCookie(res);
    expect(cookie).toMatch(/;\s*HttpOnly/i);
    expect(cookie).toMatch(/;\s*SameSite=Lax/i);
    expect(cookie).toMatch(/;\s*Path=\//i);
    expect(cookie).toMatch(/;\s*(Max-Age=\d+|Expires=)/i);
    expect(cookie).not.toMatch(/;\s*Secure/i);
    expect(cookie).not.toMatch(/;\s*Domain=/i);
    // a session id long enough not to be guessed (lucia: 25 base32 characters ≈ 125 bits)
    expect(cookie.split(';')[0]!.split('=')[1]!.length).toBeGreaterThanOrEqual(25);
  });

  it('behind https: the cookie is Secure and the blank cookie on sign-out clears it', async () => {
    const https = await buildTestApp({ APP_URL: 'https://barmkeep.test', ALLOWED_ORIGINS: ORIGIN });
    try {
      const agent = https.agent();
      const res = await agent
        .post('/api/auth/sign-up')
        .send({ email: `secure-${Date.now()}@example.test`, password: 'correct-horse-yeast', name: 'Secure Keeper' })
        .expect(201);
      expect(sessionCookie(res)).toMatch(/;\s*Secure/i);
      expect(sessionCookie(res)).toMatch(/;\s*HttpOnly/i);
      // the test client speaks plain http, so it keeps Secure cookies to itself: send it by hand
      const out = await agent.post('/api/auth/sign-out').set('Cookie', sessionCookie(res).split(';')[0]!).expect(204);
      expect(sessionCookie(out)).toMatch(/^barmkeep_session=;/);
      expect(sessionCookie(out)).toMatch(/Max-Age=0/);
      expect(res.headers['strict-transport-security']).toMatch(/max-age=/);
    } finally {
      await https.close();
    }
  });

  it('a forged or unknown session id is treated as signed out and cleared', async () => {
    const res = await t
      .agent()
      .get('/api/auth/me')
      .set('Cookie', 'barmkeep_session=abcdefghijklmnopqrstuvwxy')
      .expect(401);
    expect(sessionCookie(res)).toMatch(/Max-Age=0/);
  });
});
