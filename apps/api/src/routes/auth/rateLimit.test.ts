import { afterAll, beforeAll, expect, it } from 'vitest';
import { buildTestApp, type TestApp } from '../../../test/helpers';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp({ AUTH_RATE_LIMIT: '3' });
});
afterAll(() => t.close());

it('rate limits sign-in attempts with 429 and a JSON body', async () => {
  const agent = t.agent();
  const attempt = () =>
    agent.post('/api/auth/sign-in').send({ email: 'guess@example.test', password: 'guessing-password' });
  for (let i = 0; i < 3; i++) expect((await attempt()).status).toBe(401);
  const limited = await attempt();
  expect(limited.status).toBe(429);
  expect(limited.body.error.code).toBe('rate_limited');
});

it('counts attempts per client address as the trusted proxy reports it (X-Forwarded-For from loopback)', async () => {
  const attempt = (client: string) =>
    t
      .agent()
      .post('/api/auth/sign-in')
      .set('X-Forwarded-For', client)
      .send({ email: 'guess@example.test', password: 'guessing-password' });
  for (let i = 0; i < 3; i++) expect((await attempt('198.51.100.10')).status).toBe(401);
  expect((await attempt('198.51.100.10')).status).toBe(429);
  // another client behind the same balancer has its own count
  expect((await attempt('198.51.100.11')).status).toBe(401);
});

it('ignores X-Forwarded-For from an address it was not told to trust: the sender itself is counted', async () => {
  const strict = await buildTestApp({ AUTH_RATE_LIMIT: '3', TRUST_PROXY: '10.0.0.0/8' });
  try {
    const attempt = (client: string) =>
      strict
        .agent()
        .post('/api/auth/sign-in')
        .set('X-Forwarded-For', client)
        .send({ email: 'guess@example.test', password: 'guessing-password' });
    for (let i = 0; i < 3; i++) expect((await attempt(`203.0.113.${i}`)).status).toBe(401);
    // a forged header does not buy a fresh count
    expect((await attempt('203.0.113.99')).status).toBe(429);
  } finally {
    await strict.close();
  }
});

it('two instances on one database share one count (the PostgreSQL store), and say when to come back', async () => {
  const prefix = `shared-${Date.now()}`;
  const a = await buildTestApp({ AUTH_RATE_LIMIT: '4', RATE_LIMIT_PREFIX: prefix });
  const b = await buildTestApp({ AUTH_RATE_LIMIT: '4', RATE_LIMIT_PREFIX: prefix });
  try {
    const attempt = (app: TestApp) =>
      app
        .agent()
        .post('/api/auth/sign-in')
        .set('X-Forwarded-For', '198.51.100.40')
        .send({ email: 'guess@example.test', password: 'guessing-password' });
    // four attempts spread over the two instances use the whole allowance
    for (const app of [a, b, a, b]) expect((await attempt(app)).status).toBe(401);
    const limited = await attempt(a);
    expect(limited.status).toBe(429);
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    expect((await attempt(b)).status).toBe(429);
    // with memory counting, each instance would have allowed four of its own
    const c = await buildTestApp({ AUTH_RATE_LIMIT: '4', RATE_LIMIT_PREFIX: prefix, RATE_LIMIT_STORE: 'memory' });
    try {
      expect((await attempt(c)).status).toBe(401);
    } finally {
      await c.close();
    }
  } finally {
    await a.close();
    await b.close();
  }
});
