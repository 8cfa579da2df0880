import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { sql } from 'drizzle-orm';
import { buildTestApp, signUp, type TestApp } from '../../../test/helpers';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => {
  await t.close();
});

async function liveFeeds(userId: string) {
  const { rows } = await t.database.db.execute<{ n: number }>(
    sql`select count(*)::int as n from calendar_feeds where user_id = ${userId} and revoked_at is null`,
  );
  return rows[0]!.n;
}

/** Several "make a new address" requests for one person at once, as a double tap or two tabs send them. */
async function makeAtOnce(agent: ReturnType<TestApp['agent']>, n: number) {
  const replies = await Promise.all(Array.from({ length: n }, () => agent.post('/api/calendar-feed')));
  expect(replies.map((r) => r.status)).toEqual(Array(n).fill(201));
  return replies.map((r) => r.body.feed as { active: boolean; url: string });
}

/** Which of these addresses still open a calendar. */
async function working(urls: string[]) {
  const statuses = await Promise.all(urls.map(async (u) => (await supertest(t.app).get(new URL(u).pathname)).status));
  return urls.filter((_, i) => statuses[i] === 200);
}

describe('calendar feed under simultaneous requests', () => {
  it('answers every simultaneous first request, and exactly one address stays live', async () => {
    const agent = t.agent();
    const { user } = await signUp(agent);
    const feeds = await makeAtOnce(agent, 6);
    expect(feeds.every((f) => f.active && f.url)).toBe(true);
    expect(new Set(feeds.map((f) => f.url)).size).toBe(6);
    expect(await liveFeeds(user.id)).toBe(1);
    expect(await working(feeds.map((f) => f.url))).toHaveLength(1);
    expect((await agent.get('/api/calendar-feed').expect(200)).body.feed.active).toBe(true);
  });

  it('replaces a live address when several new ones are asked for at once', async () => {
    const agent = t.agent();
    const { user } = await signUp(agent);
    const first = (await agent.post('/api/calendar-feed').expect(201)).body.feed.url as string;
    const feeds = await makeAtOnce(agent, 6);
    expect(await liveFeeds(user.id)).toBe(1);
    const live = await working([first, ...feeds.map((f) => f.url)]);
    expect(live).toHaveLength(1);
    expect(live[0]).not.toBe(first);
  });

  it('a revoke racing new addresses leaves at most one live feed and no error', async () => {
    const agent = t.agent();
    const { user } = await signUp(agent);
    await agent.post('/api/calendar-feed').expect(201);
    const replies = await Promise.all([
      agent.post('/api/calendar-feed'),
      agent.delete('/api/calendar-feed'),
      agent.post('/api/calendar-feed'),
    ]);
    expect(replies.map((r) => r.status)).toEqual([201, 200, 201]);
    expect(await liveFeeds(user.id)).toBeLessThanOrEqual(1);
  });
});
