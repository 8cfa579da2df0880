/**
 * PostgreSQL going away under a running API and worker: on a cluster this test starts itself (its
 * own port and data folder), never the shared server other tests use.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { Browser, Processes, freePort, spawnNode, startApi, startPgCluster, waitFor } from './faults/processes';
import pg from 'pg';

const procs = new Processes();
afterAll(() => procs.stopAll(), 30_000);

describe('PostgreSQL restarted while the API runs', () => {
  it('answers 503 quickly while it is down, recovers by itself, and no process dies', async () => {
    const cluster = await startPgCluster(procs);
    const admin = new pg.Client({ connectionString: cluster.adminUrl });
    await admin.connect();
    await admin.query('create database barmkeep');
    await admin.end();
    const databaseUrl = cluster.adminUrl.replace(/\/postgres$/, '/barmkeep');

    const smtpPort = await freePort();
    const api = await startApi({ databaseUrl, env: { FAKE_SMTP_PORT: String(smtpPort) } }, procs, 'api');
    const worker = spawnNode(
      'src/worker.ts',
      { DATABASE_URL: databaseUrl, FAKE_SMTP_PORT: String(smtpPort), REMINDER_CRON: '* * * * *' },
      procs,
      'worker',
    );
    const browser = new Browser(api.url);
    await browser.signUp('pg-restart');
    const made = await browser.request('POST', '/api/cultures', {
      strainName: 'Kiln Row Bitter slurry',
      form: 'slurry_unwashed',
      origin: { origin: 'batch_slurry', batchName: 'Batch 4: Kiln Row Bitter', crop: 'bottom', washed: false },
      amount: { volumeMl: 200 },
      locationLabel: 'Back shelf',
      storageTempC: 3,
      madeAt: new Date(Date.now() - 86_400_000).toISOString(),
    });
    expect(made.status).toBe(201);
    const cultureId = made.body.culture.id as string;
    // let the worker finish starting (its pg-boss has connections open when the server goes): the
    // cron schedule is the last thing its start-up writes, after both queues
    await waitFor(
      'the worker to start',
      async () => {
        const c = new pg.Client({ connectionString: databaseUrl });
        await c.connect();
        try {
          const { rows } = await c.query(`select 1 from pgboss.schedule where name = 'reminders-tick'`);
          return rows.length === 1;
        } finally {
          await c.end();
        }
      },
      30_000,
    );

    // Down hard (every connection cut at once, as in a crash or a failover).
    await cluster.stopImmediate();
    const reads = ['/api/health', '/api/cultures', `/api/cultures/${cultureId}`, '/api/auth/me'];
    for (const path of reads) {
      const started = Date.now();
      const res = await browser.request('GET', path);
      const ms = Date.now() - started;
      expect(res.status, `${path}: ${JSON.stringify(res.body)}`).toBe(503);
      expect(res.body.error.code).toBe('service_unavailable');
      expect(res.headers.get('retry-after')).toBe('5');
      expect(ms, `${path} took ${ms} ms`).toBeLessThan(3_000);
    }
    const write = await browser.request('POST', `/api/cultures/${cultureId}/events`, {
      kind: 'note',
      notes: 'while down',
    });
    expect(write.status).toBe(503);

    // A few seconds down, then back: the same processes answer again without a restart.
    await new Promise((r) => setTimeout(r, 2_000));
    await cluster.start();
    await waitFor(
      'the API to recover',
      async () => (await browser.request('GET', '/api/health')).status === 200,
      20_000,
    );
    expect((await browser.request('GET', `/api/cultures/${cultureId}`)).status).toBe(200);
    const after = await browser.request('POST', `/api/cultures/${cultureId}/events`, {
      kind: 'note',
      notes: 'after restart',
    });
    expect(after.status, JSON.stringify(after.body)).toBe(201);
    // the session made before the restart still holds
    expect((await browser.request('GET', '/api/auth/me')).status).toBe(200);

    expect(api.child.exitCode).toBeNull();
    expect(api.child.signalCode).toBeNull();
    expect(worker.child.exitCode, worker.output()).toBeNull();
    expect(worker.child.signalCode).toBeNull();
  }, 90_000);
});
