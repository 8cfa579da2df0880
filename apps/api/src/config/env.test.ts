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
