import { describe, expect, it } from 'vitest';
import { Writable } from 'node:stream';
import express from 'express';
import supertest from 'supertest';
import { pino } from 'pino';
import { httpLogger } from './requestLog';

/** The app's request logger, writing its lines to an array. */
function loggedApp() {
  const lines: Record<string, unknown>[] = [];
  const sink = new Writable({
    write(chunk, _enc, done) {
      lines.push(JSON.parse(String(chunk)));
      done();
    },
  });
  const app = express();
  app.use(httpLogger(pino({ level: 'info' }, sink), { autoLogging: true }));
  app.get('/api/calendar/:file', (_req, res) => res.send('BEGIN:VCALENDAR'));
  app.get('/api/email-preferences/:token', (_req, res) => res.json({ ok: true }));
  app.get('/api/cultures', (_req, res) => res.json({ cultures: [] }));
  return { app, lines };
}

describe('request log lines', () => {
  it('carry method, path and status, never headers such as the session cookie', async () => {
    const { app, lines } = loggedApp();
    const res = await supertest(app).get('/api/cultures?q=saison').set('Cookie', 'barmkeep_session=s3cret').expect(200);
    expect(lines).toHaveLength(1);
    const line = lines[0] as { req: Record<string, unknown>; res: Record<string, unknown> };
    expect(line.req).toMatchObject({ id: res.headers['x-request-id'], method: 'GET', url: '/api/cultures?q=saison' });
    expect(line.res).toEqual({ statusCode: 200 });
    expect(JSON.stringify(line)).not.toContain('s3cret');
    expect(line.req.headers).toBeUndefined();
  });

  it('mask the secret in a calendar feed address and an e-mail preferences link', async () => {
    const { app, lines } = loggedApp();
    await supertest(app).get('/api/calendar/9f8e7d6c5b4a.ics').expect(200);
    await supertest(app).get('/api/email-preferences/tok_abcdef123456?x=1').expect(200);
    const urls = lines.map((l) => (l.req as { url: string }).url);
    expect(urls).toEqual(['/api/calendar/…', '/api/email-preferences/…?x=1']);
    expect(JSON.stringify(lines)).not.toMatch(/9f8e7d6c5b4a|tok_abcdef123456/);
  });
});
