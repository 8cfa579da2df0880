/**
 * The in-memory caches (src/cache/caches.ts) across two app instances on one database: what one
 * instance (or any other writer) changes, the other stops serving from memory as soon as it has
 * heard the database's notification — `fence()` waits for exactly that.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { buildTestApp, signUp, type TestApp } from './helpers';
import { buildDregs, buildReculture } from './cultureFactories';
import { summaryColumns } from '../src/db/queries/cultures';

const ORIGIN = 'http://barmkeep.test';
let a: TestApp;
let b: TestApp;
beforeAll(async () => {
  a = await buildTestApp();
  b = await buildTestApp();
});
afterAll(async () => {
  await a.close();
  await b.close();
});

/** A person signed up on instance a, and their cookie for asking instance b. */
async function personOnA() {
  const agent = a.agent();
  const res = await agent
    .post('/api/auth/sign-up')
    .send({
      email: `cache-${Math.random().toString(36).slice(2)}@example.test`,
      password: 'correct-horse-yeast',
      name: 'Cache Keeper',
    })
    .expect(201);
  const cookie = (res.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
  const onB = (path: string) => supertest(b.app).get(path).set('Origin', ORIGIN).set('Cookie', cookie);
  return { agent, cookie, onB, userId: res.body.user.id as string };
}

describe('caches across two instances', () => {
  it('a session signed out on one instance is refused by the other once it has heard', async () => {
    const p = await personOnA();
    await p.onB('/api/auth/me').expect(200);
    const hits = b.caches!.sessions.stats.hits;
    await p.onB('/api/auth/me').expect(200);
    expect(b.caches!.sessions.stats.hits).toBe(hits + 1); // served from b's memory
    await p.agent.post('/api/auth/sign-out').expect(204);
    await b.caches!.fence();
    await p.onB('/api/auth/me').expect(401);
  });

  it('a change to the person (their name) reaches the other instance', async () => {
    const p = await personOnA();
    expect((await p.onB('/api/auth/me').expect(200)).body.user.name).toBe('Cache Keeper');
    await a.database.pool.query('update users set name = $1 where id = $2', ['Renamed Keeper', p.userId]);
    await b.caches!.fence();
    // the session middleware's copy of the person (what every route sees) was dropped and read again
    const sessions = b.caches!.sessions;
    const misses = sessions.stats.misses;
    await p.onB('/api/auth/me').expect(200);
    expect(sessions.stats.misses).toBe(misses + 1);
    const hits = sessions.stats.hits;
    await p.onB('/api/auth/me').expect(200);
    expect(sessions.stats.hits).toBe(hits + 1);
  });

  it('the library page another instance keeps follows adds, edits, moves and deletes', async () => {
    const p = await personOnA();
    const first = await p.agent
      .post('/api/cultures')
      .send(buildDregs({ strainName: 'Weir pale' }))
      .expect(201);
    const id = first.body.culture.id as string;
    expect((await p.onB('/api/cultures').expect(200)).body.total).toBe(1);
    const hits = b.caches!.libraryPages.stats.hits;
    await p.onB('/api/cultures').expect(200);
    expect(b.caches!.libraryPages.stats.hits).toBe(hits + 1);

    await p.agent.post('/api/cultures').send(buildReculture(id)).expect(201);
    await b.caches!.fence();
    expect((await p.onB('/api/cultures').expect(200)).body.total).toBe(2);

    await p.agent.patch(`/api/cultures/${id}`).send({ strainName: 'Weir pale, renamed' }).expect(200);
    await b.caches!.fence();
    const names = (await p.onB('/api/cultures?sort=name').expect(200)).body.cultures.map(
      (c: { strainName: string }) => c.strainName,
    );
    expect(names).toContain('Weir pale, renamed');

    // whoever writes: plain SQL, as a migration or another tool would
    await a.database.pool.query('update cultures set suspect = true where id = $1', [id]);
    await b.caches!.fence();
    const row = (await p.onB('/api/cultures').expect(200)).body.cultures.find((c: { id: string }) => c.id === id);
    expect(row.suspect).toBe(true);
  });

  it('on the same instance, a write by one person is seen at once by another it concerns', async () => {
    // a plain SQL write and the instance's own fence stand in for another person's request: the
    // fence is what every writing request awaits before it answers (middleware/cacheFence.ts)
    const p = await personOnA();
    await p.agent.post('/api/cultures').send(buildDregs()).expect(201);
    expect((await p.agent.get('/api/cultures').expect(200)).body.total).toBe(1);
    await a.database.pool.query('update cultures set state = $1 where owner_user_id = $2', ['discarded', p.userId]);
    await a.caches!.fence();
    expect((await p.agent.get('/api/cultures').expect(200)).body.cultures[0].state).toBe('discarded');
  });

  it("a write to one's own records drops one's pages at once; a write that can reach others fences", async () => {
    const p = await personOnA();
    const root = (await p.agent.post('/api/cultures').send(buildDregs()).expect(201)).body.culture;
    await p.agent.get('/api/cultures').expect(200);
    let fences = 0;
    const fence = a.caches!.fence.bind(a.caches);
    a.caches!.fence = () => {
      fences++;
      return fence();
    };
    try {
      await p.agent.post(`/api/cultures/${root.id}/events`).send({ kind: 'note', notes: 'lid re-taped' }).expect(201);
      await p.agent.patch(`/api/cultures/${root.id}`).send({ strainName: 'Weir pale, own edit' }).expect(200);
      expect(fences).toBe(0);
      // served afresh straight away, without waiting for the notification
      const listed = (await p.agent.get('/api/cultures').expect(200)).body.cultures;
      expect(listed[0].strainName).toBe('Weir pale, own edit');
      // quarantine can flag cultures other people keep: it waits for the fence
      await p.agent.post(`/api/cultures/${root.id}/quarantine`).send({ flagDescendantIds: [] }).expect(200);
      expect(fences).toBe(1);
    } finally {
      a.caches!.fence = fence;
    }
  });

  it('bookkeeping writes the library does not show leave the cached page alone', async () => {
    const p = await personOnA();
    await p.agent.post('/api/cultures').send(buildDregs()).expect(201);
    await p.agent.get('/api/cultures').expect(200);
    const evictions = a.caches!.libraryPages.stats.evictions;
    await a.database.pool.query('update cultures set viability_stale = true where owner_user_id = $1', [p.userId]);
    await a.caches!.fence();
    expect(a.caches!.libraryPages.stats.evictions).toBe(evictions);
  });

  it('the trigger watches every column the library shows', async () => {
    const { rows } = await a.database.pool.query<{ name: string }>(
      `select a.attname as name from pg_trigger t
         join pg_attribute a on a.attrelid = t.tgrelid and a.attnum = any (t.tgattr)
        where t.tgname = 'cultures_cache_notify'`,
    );
    const watched = new Set(rows.map((r) => r.name));
    const shown = Object.values(summaryColumns).map((c) => c.name);
    expect(shown.filter((n) => !watched.has(n))).toEqual([]);
  });

  it('switches itself off while its listener is cut, and back on when it reconnects', async () => {
    const t = await buildTestApp();
    try {
      const agent = t.agent();
      await signUp(agent);
      await agent.get('/api/cultures').expect(200);
      expect(t.caches!.live).toBe(true);
      // cut the listening connection (the one that ran LISTEN / pg_notify for this app)
      const cut = await t.database.pool.query(
        'select pg_terminate_backend(pid) from pg_stat_activity where application_name = $1',
        [t.caches!.listenerName],
      );
      expect(cut.rowCount).toBe(1);
      await expect.poll(() => t.caches!.live, { timeout: 5_000 }).toBe(false);
      expect(t.caches!.libraryPages.size).toBe(0);
      const misses = t.caches!.libraryPages.stats.misses;
      await agent.get('/api/cultures').expect(200);
      await agent.get('/api/cultures').expect(200);
      expect(t.caches!.libraryPages.stats.misses).toBe(misses); // not even consulted
      await expect.poll(() => t.caches!.live, { timeout: 10_000 }).toBe(true);
      await agent.get('/api/cultures').expect(200);
      await agent.get('/api/cultures').expect(200);
      expect(t.caches!.libraryPages.stats.hits).toBeGreaterThan(0);
    } finally {
      await t.close();
    }
  });
});
