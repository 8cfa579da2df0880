/**
 * The way Barmkeep grows: two API processes and one reminders worker on one database, behind
 * nginx as the load balancer (Debian's package, on loopback, started here).
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import PgBoss from 'pg-boss';
import pg from 'pg';
import { REMINDER_TICK_QUEUE } from '../src/jobs/reminders';
import { Browser, Processes, createDatabase, spawnNode, startApi, startNginx, waitFor } from './faults/processes';
import { controllableSmtp } from './faults/smtp';

const procs = new Processes();
afterAll(() => procs.stopAll(), 30_000);

describe('two API instances and a worker behind nginx', () => {
  it('shares sessions and photos across instances and sends a scheduled notice once', async () => {
    const databaseUrl = await createDatabase(procs);
    const uploads = mkdtempSync(path.join(tmpdir(), 'barmkeep-uploads-'));
    procs.add('uploads folder', () => rmSync(uploads, { recursive: true, force: true }));
    const env = { UPLOADS_DIR: uploads, STORAGE_DRIVER: 'local' };
    // one after the other: the first applies the migrations
    const a = await startApi({ databaseUrl, env }, procs, 'api a');
    const b = await startApi({ databaseUrl, env }, procs, 'api b');
    const lb = await startNginx([`127.0.0.1:${a.port}`, `127.0.0.1:${b.port}`], procs);
    const smtp = await controllableSmtp(procs);
    const worker = spawnNode(
      'src/worker.ts',
      { DATABASE_URL: databaseUrl, FAKE_SMTP_PORT: String(smtp.port), APP_URL: lb.url, REMINDER_CRON: '0 0 1 1 *' },
      procs,
      'worker',
    );

    // A session made through the balancer holds on whichever instance answers …
    const browser = new Browser(lb.url);
    const { person, userId } = await browser.signUp('two');
    const upstreams = new Set<string>();
    for (let i = 0; i < 6; i++) {
      const me = await browser.request('GET', '/api/auth/me');
      expect(me.status).toBe(200);
      expect(me.body.user.id).toBe(userId);
      upstreams.add(me.headers.get('x-upstream') ?? '');
    }
    expect(upstreams).toEqual(new Set([`127.0.0.1:${a.port}`, `127.0.0.1:${b.port}`]));
    // … and one made on one instance directly is valid on the other.
    const onA = new Browser(a.url);
    await onA.signUp('direct');
    expect((await onA.at(b.url).request('GET', '/api/auth/me')).status).toBe(200);
    // signing out on B ends the session on A too
    expect((await onA.at(b.url).request('POST', '/api/auth/sign-out')).status).toBeLessThan(300);
    expect((await onA.request('GET', '/api/auth/me')).status).toBe(401);

    // A photo stored through one instance is served by the other.
    const made = await browser.request('POST', '/api/cultures', {
      strainName: 'Copperbeech Ale',
      form: 'liquid_pack',
      origin: { origin: 'purchased', maker: 'Invented Yeast Co.' },
      locationLabel: 'Jar B3',
      storageTempC: 4,
      madeAt: new Date(Date.now() - 200 * 86_400_000).toISOString(),
    });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    const cultureId = made.body.culture.id as string;
    const jpeg = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#a0703a' } })
      .jpeg()
      .toBuffer();
    const form = new FormData();
    form.append('caption', 'Pack on arrival');
    form.append('photo', new Blob([new Uint8Array(jpeg)], { type: 'image/jpeg' }), 'pack.jpg');
    const upload = await browser
      .at(a.url)
      .request('POST', `/api/cultures/${cultureId}/photos`, undefined, { body: form });
    expect(upload.status, JSON.stringify(upload.body)).toBe(201);
    const fromA = await browser.at(a.url).request('GET', upload.body.photo.webUrl);
    const fromB = await browser.at(b.url).request('GET', upload.body.photo.webUrl);
    expect(fromB.status).toBe(200);
    expect(fromB.headers.get('content-type')).toMatch(/^image\//);
    expect(Buffer.compare(fromB.body as unknown as Buffer, fromA.body as unknown as Buffer)).toBe(0);
    expect((await browser.at(b.url).request('GET', upload.body.photo.thumbUrl)).status).toBe(200);

    // The pack is 200 days old: the worker's scheduled pass notices it. Two schedule slots (as
    // the cron would fire them) while both instances serve; each notice is e-mailed once.
    await waitFor('the worker queues', async () => {
      const c = new pg.Client({ connectionString: databaseUrl });
      await c.connect();
      try {
        return (await c.query(`select 1 from pgboss.queue where name = $1`, [REMINDER_TICK_QUEUE])).rows.length === 1;
      } finally {
        await c.end();
      }
    });
    const boss = new PgBoss({
      connectionString: databaseUrl,
      schema: 'pgboss',
      max: 2,
      supervise: false,
      schedule: false,
    });
    boss.on('error', () => {});
    await boss.start();
    procs.add('pg-boss client', () => boss.stop({ graceful: false, wait: true, timeout: 3_000 }));
    const jobs = [(await boss.send(REMINDER_TICK_QUEUE, {}))!, (await boss.send(REMINDER_TICK_QUEUE, {}))!];
    await waitFor(
      'both passes',
      async () => {
        const states = await Promise.all(
          jobs.map(async (id) => (await boss.getJobById(REMINDER_TICK_QUEUE, id))?.state),
        );
        if (states.includes('failed')) throw new Error(`a pass failed:\n${worker.output()}`);
        return states.every((s) => s === 'completed');
      },
      30_000,
    );
    const c = new pg.Client({ connectionString: databaseUrl });
    await c.connect();
    const { rows: notices } = await c.query<{ title: string; email_state: string }>(
      'select title, email_state from notifications where user_id = $1',
      [userId],
    );
    await c.end();
    expect(notices.length).toBeGreaterThanOrEqual(1);
    expect(notices.every((n) => n.email_state === 'sent')).toBe(true);
    const mails = smtp.delivered.filter((m) => m.to === person.email);
    expect(mails.map((m) => m.subject).sort()).toEqual(notices.map((n) => n.title).sort());
    // and the notice is on the person's list through either instance
    for (const base of [a.url, b.url]) {
      const list = await browser.at(base).request('GET', '/api/notifications');
      expect(list.status).toBe(200);
      expect(JSON.stringify(list.body)).toContain(notices[0]!.title);
    }
  }, 90_000);
});
