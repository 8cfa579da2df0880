import { describe, expect, it } from 'vitest';
import { loadEnv, mailModeOf } from './env';

describe('mail mode', () => {
  it('uses a real provider when SMTP_URL is set', () => {
    expect(mailModeOf(loadEnv({ NODE_ENV: 'production', SMTP_URL: 'smtp://mail.example.test:587' }))).toBe('smtp');
  });
  it('uses the fake inbox in development and tests', () => {
    expect(mailModeOf(loadEnv({ NODE_ENV: 'development' }))).toBe('fake');
    expect(mailModeOf(loadEnv({ NODE_ENV: 'test' }))).toBe('fake');
  });
  it('refuses to run production with the readable fake inbox unless asked for explicitly', () => {
    expect(() => mailModeOf(loadEnv({ NODE_ENV: 'production' }))).toThrow(/SMTP_URL/);
    expect(mailModeOf(loadEnv({ NODE_ENV: 'production', FAKE_SMTP: '1' }))).toBe('fake');
  });
  it('rejects a malformed environment with the variable named', () => {
    expect(() => loadEnv({ PORT: 'eighty' })).toThrow(/PORT/);
  });
});

describe('deployment settings', () => {
  it('pool sizes default to 10 per API process and 4 per worker, and take a number from the environment', () => {
    expect(loadEnv({})).toMatchObject({ DATABASE_POOL_MAX: 10, WORKER_POOL_MAX: 4 });
    expect(loadEnv({ DATABASE_POOL_MAX: '25', WORKER_POOL_MAX: '2' })).toMatchObject({
      DATABASE_POOL_MAX: 25,
      WORKER_POOL_MAX: 2,
    });
    expect(() => loadEnv({ DATABASE_POOL_MAX: '0' })).toThrow(/DATABASE_POOL_MAX/);
    expect(() => loadEnv({ WORKER_POOL_MAX: 'many' })).toThrow(/WORKER_POOL_MAX/);
  });

  it('trusts forwarded headers from loopback by default, or from the hops or addresses given', () => {
    expect(loadEnv({}).TRUST_PROXY).toEqual(['loopback']);
    expect(loadEnv({ TRUST_PROXY: '1' }).TRUST_PROXY).toBe(1);
    expect(loadEnv({ TRUST_PROXY: 'loopback, 10.0.0.0/8,fd00::/8 , 192.0.2.7' }).TRUST_PROXY).toEqual([
      'loopback',
      '10.0.0.0/8',
      'fd00::/8',
      '192.0.2.7',
    ]);
    for (const bad of ['', 'everyone', '10.0.0.0/33', '300.1.1.1', 'true', '10.0.0.1/8/2'])
      expect(() => loadEnv({ TRUST_PROXY: bad }), bad).toThrow(/TRUST_PROXY/);
  });
});
