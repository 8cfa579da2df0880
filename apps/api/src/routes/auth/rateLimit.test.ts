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
