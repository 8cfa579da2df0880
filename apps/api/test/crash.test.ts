/**
 * Crash safety with real processes: the API killed with SIGKILL in the middle of a stream of
 * writes, and the reminders worker killed in the middle of a job. Each runs on a database of its
 * own on the test server.
 */
import { afterAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import PgBoss from 'pg-boss';
import { connect, runMigrations } from '../src/db/client';
import { REMINDER_TICK_QUEUE, REMINDER_USERS_QUEUE } from '../src/jobs/reminders';
import { controllableSmtp } from './faults/smtp';
import { Browser, Processes, createDatabase, freePort, spawnNode, startApi, waitFor } from './faults/processes';

const DAY = 86_400_000;
const procs = new Processes();
afterAll(() => procs.stopAll(), 30_000);

const ago = (days: number) => new Date(Date.now() - days * DAY).toISOString();

function dregs(tag: string) {
  return {
    strainName: `Millpond Saison dregs ${tag}`,
    form: 'bottle_dregs',
    origin: { origin: 'bottle_dregs', beerName: `Wicket Gate Saison ${tag}`, bottleCount: 2, pasteurized: 'no' },
    locationLabel: 'Fridge door',
    storageTempC: 4,
    madeAt: ago(3),
  };
}

describe('the API killed mid-stream', () => {
  it('keeps every write that was answered 2xx, and no change half written', async () => {
    const databaseUrl = await createDatabase(procs);
    const port = await freePort();
    let api = await startApi({ databaseUrl, port }, procs, 'api (first life)');
    const browser = new Browser(api.url);
    await browser.signUp('crash');

    const acked = { cultures: new Set<string>(), events: new Set<string>(), moves: new Map<string, string>() };
    const KILL_AFTER = 90;
    let acks = 0;
    let killed = false;
    let killing: Promise<void> | undefined;
    const ack = () => {
      acks += 1;
      if (acks >= KILL_AFTER && !killed) {
        killed = true;
        killing = api.kill9();
      }
    };
    /** A request that must succeed unless the process is gone; undefined once it is. */
    const write = async (method: string, path: string, body: unknown, status: number) => {
      try {
        const res = await browser.request(method, path, body);
        if (res.status === status) return res;
        if (killed) return undefined;
        throw new Error(`${method} ${path}: ${res.status} ${JSON.stringify(res.body)}`);
      } catch (err) {
        if (killed) return undefined;
        throw err;
      }
    };

    // Each loop: a root culture (culture + 'created' event), a re-culture of it (child, its
    // 'created' event and the parent's 'recultured' event), a move of the child (event + culture
    // row), and every other round a split of the root (two children, their events, the parent's
    // state and 'split' event): every multi-row change the library makes.
    const loop = async (w: number) => {
      for (let i = 0; !killed && i < 1_000; i++) {
        const tag = `${w}-${i}`;
        const root = await write('POST', '/api/cultures', dregs(tag), 201);
        if (!root) return;
        acked.cultures.add(root.body.culture.id);
        ack();
        const child = await write(
          'POST',
          '/api/cultures',
          {
            strainName: `Re-culture ${tag}`,
            form: 'slant',
            origin: { origin: 'reculture', method: 'slant' },
            parentId: root.body.culture.id,
            storageTempC: 4,
            madeAt: ago(1),
          },
          201,
        );
        if (!child) return;
        acked.cultures.add(child.body.culture.id);
        ack();
        const place = `Shelf ${tag}`;
        const moved = await write(
          'POST',
          `/api/cultures/${child.body.culture.id}/events`,
          { kind: 'moved', data: { locationLabel: place } },
          201,
        );
        if (!moved) return;
        acked.events.add(moved.body.event.id);
        acked.moves.set(child.body.culture.id, place);
        ack();
        if (i % 2 === 0) {
          const split = await write('POST', `/api/cultures/${root.body.culture.id}/split`, { count: 2 }, 201);
          if (!split) return;
          for (const c of split.body.cultures) acked.cultures.add(c.id);
          ack();
        }
      }
    };
    await Promise.all([0, 1, 2, 3, 4, 5].map(loop));
    expect(killed).toBe(true);
    await killing;
    expect((await api.exited).signal).toBe('SIGKILL');

    // Restart on the same port and database.
    api = await startApi({ databaseUrl, port }, procs, 'api (second life)');

    // Every acknowledged write is readable through the API …
    for (const id of acked.cultures) {
      const res = await browser.request('GET', `/api/cultures/${id}`);
      expect(res.status, id).toBe(200);
    }
    for (const [id, place] of acked.moves) {
      const res = await browser.request('GET', `/api/cultures/${id}`);
      expect(res.body.culture.locationLabel).toBe(place);
    }
    const db = new pg.Client({ connectionString: databaseUrl });
    await db.connect();
    try {
      const events = await db.query<{ id: string }>('select id from culture_events where id = any($1::text[])', [
        [...acked.events],
      ]);
      expect(events.rows).toHaveLength(acked.events.size);
      const { rows: counts } = await db.query<{ n: string }>('select count(*) as n from cultures');
      expect(Number(counts[0]!.n)).toBeGreaterThanOrEqual(acked.cultures.size);

      // … and nothing is half written, acknowledged or not:
      // every culture has exactly one 'created' entry,
      const { rows: noCreated } = await db.query(`
        select c.id from cultures c
        where (select count(*) from culture_events e where e.culture_id = c.id and e.kind = 'created') <> 1`);
      expect(noCreated).toEqual([]);
      // every re-culture is recorded on its parent (as 'recultured' or in a 'split'),
      const { rows: orphans } = await db.query(`
        select c.id from cultures c
        where c.parent_id is not null and not exists (
          select 1 from culture_events e where e.culture_id = c.parent_id
            and ((e.kind = 'recultured' and e.data->>'childId' = c.id)
              or (e.kind = 'split' and e.data->'childIds' ? c.id)))`);
      expect(orphans).toEqual([]);
      // every split parent is used up and every 'split' entry's children exist,
      const { rows: badSplits } = await db.query(`
        select e.id from culture_events e join cultures p on p.id = e.culture_id
        where e.kind = 'split' and (p.state <> 'used_up' or jsonb_array_length(e.data->'childIds') <>
          (select count(*) from cultures c where c.parent_id = p.id and c.origin_details->>'method' = 'split'))`);
      expect(badSplits).toEqual([]);
      // and every moved culture sits where its latest 'moved' entry put it.
      const { rows: badMoves } = await db.query(`
        select c.id from cultures c
        join lateral (select e.data->>'locationLabel' as place from culture_events e
                      where e.culture_id = c.id and e.kind = 'moved' order by e.recorded_at desc limit 1) m on true
        where c.location_label is distinct from m.place`);
      expect(badMoves).toEqual([]);
    } finally {
      await db.end();
    }

    // The restarted process takes writes again.
    const after = await browser.request('POST', '/api/cultures', dregs('after'));
    expect(after.status).toBe(201);
  }, 90_000);
});

// ---------------------------------------------------------------- the worker

describe('the reminders worker killed mid-job', () => {
  it('re-runs the job and sends every notice exactly once, each and digest', async () => {
    const databaseUrl = await createDatabase(procs);
    const database = connect(databaseUrl, { max: 2 });
    procs.add('pool', () => database.close());
    await runMigrations(database.db);

    // People with packs old enough that the viability and storage-time rules fire today.
    const api = await startApi({ databaseUrl }, procs, 'api for the worker test');
    const people: { email: string; userId: string }[] = [];
    for (let i = 0; i < 6; i++) {
      const b = new Browser(api.url);
      const { person, userId } = await b.signUp(`worker-${i}`);
      people.push({ email: person.email, userId });
      for (let j = 0; j < 2; j++) {
        const res = await b.request('POST', '/api/cultures', {
          strainName: `Copperbeech Ale ${i}-${j}`,
          form: 'liquid_pack',
          origin: { origin: 'purchased', maker: 'Invented Yeast Co.' },
          locationLabel: 'Jar B3',
          storageTempC: 4,
          madeAt: ago(200 + j),
        });
        expect(res.status, JSON.stringify(res.body)).toBe(201);
      }
    }
    await api.stop();
    // The last person takes one digest a day, due from midnight local time.
    const digestPerson = people.at(-1)!;
    await database.pool.query(
      `insert into notification_preferences (user_id, email_delivery, digest_hour, email_token)
       values ($1, 'digest', 0, md5(random()::text))
       on conflict (user_id) do update set email_delivery = 'digest', digest_hour = 0`,
      [digestPerson.userId],
    );

    // The queues with a short expiry, so a job whose worker died is retried within the test
    // (production keeps ten minutes). This instance only supervises: it expires jobs, works none.
    const supervisor = new PgBoss({
      connectionString: databaseUrl,
      schema: 'pgboss',
      max: 2,
      maintenanceIntervalSeconds: 1,
    });
    supervisor.on('error', () => {});
    await supervisor.start();
    procs.add('supervisor', () => supervisor.stop({ graceful: false, wait: true, timeout: 3_000 }));
    for (const q of [REMINDER_TICK_QUEUE, REMINDER_USERS_QUEUE])
      await supervisor.createQueue(q, { name: q, retryLimit: 5, retryDelay: 0, expireInSeconds: 4 });

    const smtp = await controllableSmtp(procs);
    const workerEnv = {
      DATABASE_URL: databaseUrl,
      FAKE_SMTP_PORT: String(smtp.port),
      APP_URL: 'http://barmkeep.test',
      REMINDER_CRON: '0 0 1 1 *',
    };
    const jobState = async (id: string) => (await supervisor.getJobById(REMINDER_TICK_QUEUE, id))?.state;

    // First life: killed while sending the third e-mail of the pass.
    let heldAt = smtp.hold((_m, n) => n === 2);
    let worker = spawnNode('src/worker.ts', workerEnv, procs, 'worker (first life)');
    const jobId = (await supervisor.send(REMINDER_TICK_QUEUE, {}))!;
    await Promise.race([
      heldAt,
      worker.exited.then(() => Promise.reject(new Error(`worker exited:\n${worker.output()}`))),
    ]);
    await worker.kill9();
    // not finished: still active, or already expired and waiting for its retry
    expect(['active', 'retry']).toContain(await jobState(jobId));
    expect(smtp.delivered).toHaveLength(2);

    // Second life: the job expires, is retried, and this time the worker dies sending the digest.
    heldAt = smtp.hold((m) => m.to === digestPerson.email);
    worker = spawnNode('src/worker.ts', workerEnv, procs, 'worker (second life)');
    await Promise.race([
      heldAt,
      worker.exited.then(() => Promise.reject(new Error(`worker exited:\n${worker.output()}`))),
    ]);
    await worker.kill9();
    expect(smtp.delivered.some((m) => m.to === digestPerson.email)).toBe(false);

    // Third life: nothing held; the retried job finishes.
    smtp.release();
    worker = spawnNode('src/worker.ts', workerEnv, procs, 'worker (third life)');
    await waitFor('the retried job to complete', async () => (await jobState(jobId)) === 'completed', 30_000);
    await worker.stop();

    const { rows: notices } = await database.pool.query<{ user_id: string; title: string; email_state: string }>(
      'select user_id, title, email_state from notifications order by user_id',
    );
    expect(notices.length).toBeGreaterThanOrEqual(people.length * 2);
    expect(notices.every((n) => n.email_state === 'sent')).toBe(true);
    // One e-mail per notice for the 'each' people, one digest for the digest person, none twice.
    const eachNotices = notices.filter((n) => n.user_id !== digestPerson.userId);
    const eachMail = smtp.delivered.filter((m) => m.to !== digestPerson.email);
    expect(eachMail).toHaveLength(eachNotices.length);
    expect(new Set(eachMail.map((m) => `${m.to}|${m.subject}`)).size).toBe(eachMail.length);
    expect(smtp.delivered.filter((m) => m.to === digestPerson.email)).toHaveLength(1);
  }, 90_000);
});
