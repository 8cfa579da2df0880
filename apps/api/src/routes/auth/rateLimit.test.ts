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
