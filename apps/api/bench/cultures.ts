/**
 * Culture library benchmark: the library list (first page, sorted by attention) and a 5,000-node
 * lineage, through the whole API (HTTP, session, validation, service, core projections, JSON) with
 * autocannon (in its own process), side by side with the very SQL those requests send, replayed straight through `pg`
 * with the same pool size and concurrency. Run:
 *
 *   cd apps/api && pnpm exec tsx bench/cultures.ts          # BENCH_SECONDS=10 by default
 *
 * It creates its own database (dropped afterwards) on the local server: 10,000 cultures for one
 * club's steward, in lineages up to depth 30 — one lineage of 5,000, the rest in 250 lineages of 20.
 */
import type autocannon from 'autocannon';
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { randomBytes } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { performance } from 'node:perf_hooks';
import { createApp } from '../src/app';
import { loadEnv } from '../src/config/env';
import { connect, runMigrations } from '../src/db/client';
import { clubs, cultures, memberships, users, type CultureInsert } from '../src/db/schema';
import { hashPassword } from '../src/lib/password';
import { createLogger } from '../src/lib/logger';
import { startCaches } from '../src/cache/caches';
import { attentionOf } from '../src/services/cultureHealth';
import { CULTURE_FORMS, type CultureForm } from '@barmkeep/core';
import { Processes, spawnNode, waitFor } from '../test/faults/processes';

const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 50);
const POOL = 10;
const ADMIN_URL = process.env.BENCH_ADMIN_DATABASE_URL ?? 'postgres://app@127.0.0.1:54329/postgres';

function mulberry32(seed: number) {
  return () => {
    seed |= 0;
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const rand = mulberry32(20261201);
const pick = <T>(xs: readonly T[]) => xs[Math.floor(rand() * xs.length)]!;

const TEMP: Record<CultureForm, number> = {
  liquid_pack: 4,
  dry_pack: 4,
  slurry_washed: 3,
  slurry_unwashed: 3,
  bottle_dregs: 4,
  slant: 4,
  plate: 4,
  frozen_glycerol: -20,
};

/** One lineage of `size` nodes: a chain to depth `maxDepth` first, then random parents above that depth. */
function lineage(
  prefix: string,
  size: number,
  maxDepth: number,
  owner: string,
  club: string,
  now: Date,
): CultureInsert[] {
  const rows: CultureInsert[] = [];
  const depth: number[] = [];
  for (let i = 0; i < size; i++) {
    let parent: number | null = null;
    if (i > 0 && i <= maxDepth) parent = i - 1;
    else if (i > 0) {
      do parent = Math.floor(rand() * i);
      while (depth[parent]! >= maxDepth);
    }
    depth.push(parent === null ? 0 : depth[parent]! + 1);
    const form = i === 0 ? 'liquid_pack' : pick(CULTURE_FORMS.filter((f) => f !== 'bottle_dregs'));
    const madeAt = new Date(now.getTime() - Math.floor(rand() * 200) * 86_400_000);
    const row: CultureInsert = {
      id: `${prefix}-${i}`,
      ownerUserId: owner,
      ownerClubId: club,
      visibility: 'club',
      parentId: parent === null ? null : `${prefix}-${parent}`,
      generation: depth[i]!,
      strainName: `Bench strain ${prefix} #${i}`,
      tags: ['bench'],
      origin: i === 0 ? 'purchased' : 'reculture',
      originDetails:
        i === 0 ? { origin: 'purchased', maker: 'Invented Bench Yeast' } : { origin: 'reculture', method: 'starter' },
      form,
      amount: form === 'slurry_washed' || form === 'slurry_unwashed' ? { volumeMl: 150 } : {},
      storageTempC: TEMP[form],
      madeAt,
      state: rand() < 0.8 ? 'stored' : pick(['active', 'pitched', 'used_up'] as const),
      stateChangedAt: madeAt,
      stateChangedBy: owner,
    };
    row.attentionDueAt =
      attentionOf({ form, storageTempC: row.storageTempC, madeAt, state: row.state! })?.dueAt ?? null;
    rows.push(row);
  }
  return rows;
}

const AUTOCANNON = fileURLToPath(new URL('../node_modules/.bin/autocannon', import.meta.url));
/** autocannon in its own process, so its HTTP client does not share the server's thread. */
async function cannon(o: {
  url: string;
  connections: number;
  duration: number;
  cookie: string;
}): Promise<autocannon.Result> {
  const { stdout } = await promisify(execFile)(
    AUTOCANNON,
    ['-j', '-c', String(o.connections), '-d', String(o.duration), '-t', '60', '-H', `cookie=${o.cookie}`, o.url],
    { maxBuffer: 64 * 1024 * 1024 },
  );
  return JSON.parse(stdout) as autocannon.Result;
}

function pct(sorted: number[], p: number) {
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]!;
}

/** Replays a request's queries straight through pg: CONNECTIONS callers, each waiting for its last reply. */
async function rawLoop(pool: pg.Pool, queries: unknown[], seconds: number, connections = CONNECTIONS) {
  const latencies: number[] = [];
  const end = performance.now() + seconds * 1000;
  let done = 0;
  await Promise.all(
    Array.from({ length: connections }, async () => {
      while (performance.now() < end) {
        const t0 = performance.now();
        for (const q of queries) await pool.query(q as pg.QueryConfig);
        latencies.push(performance.now() - t0);
        done++;
      }
    }),
  );
  latencies.sort((a, b) => a - b);
  return {
    p50: pct(latencies, 50),
    p99: pct(latencies, 99),
    mean: latencies.reduce((a, b) => a + b, 0) / latencies.length,
    rps: done / seconds,
  };
}

async function main() {
  const name = `barmkeep_bench_${Date.now()}_${randomBytes(2).toString('hex')}`;
  const admin = new pg.Client({ connectionString: ADMIN_URL });
  await admin.connect();
  await admin.query(`create database "${name}"`);
  const url = new URL(ADMIN_URL);
  url.pathname = `/${name}`;
  const databaseUrl = url.toString();
  const database = connect(databaseUrl, { max: POOL });
  const raw = new pg.Pool({ connectionString: databaseUrl, max: POOL });
  raw.on('error', () => {}); // the final drop ends idle connections
  let server: import('node:http').Server | undefined;
  let serverUncached: import('node:http').Server | undefined;
  let caches: Awaited<ReturnType<typeof startCaches>> | undefined;
  try {
    await runMigrations(database.db);
    const now = new Date();
    const owner = 'bench-steward';
    const password = 'bench-password-long-enough';
    await database.db.insert(users).values({
      id: owner,
      email: 'steward@bench.example',
      name: 'Bench Steward',
      passwordHash: await hashPassword(password),
    });
    await database.db.insert(clubs).values({ id: 'bench-club', name: 'Weirbank Bench Club (invented)' });
    await database.db.insert(memberships).values({ clubId: 'bench-club', userId: owner, role: 'steward' });
    const rows = [...lineage('big', 5000, 30, owner, 'bench-club', now)];
    for (let l = 0; l < 250; l++)
      rows.push(...lineage(`l${l}`, 20, Math.min(30, 5 + (l % 26)), owner, 'bench-club', now));
    const t0 = performance.now();
    for (let i = 0; i < rows.length; i += 1000) await database.db.insert(cultures).values(rows.slice(i, i + 1000));
    await raw.query('vacuum analyze'); // as autovacuum leaves a settled table: visibility map set, statistics fresh
    const deepLeaf = 'big-30'; // the end of the initial chain: depth 30, a leaf
    console.log(
      `seeded ${rows.length} cultures in ${((performance.now() - t0) / 1000).toFixed(1)} s; lineage from ${deepLeaf}`,
    );

    const env = loadEnv({
      NODE_ENV: 'test',
      DATABASE_URL: databaseUrl,
      APP_URL: 'http://bench.test',
      LOG_LEVEL: 'silent',
      AUTH_RATE_LIMIT: '1000',
    });
    const mailer = { send: async () => {} };
    // as deployed: sessions and unfiltered library pages kept in memory (src/cache/caches.ts) …
    caches = await startCaches({ databaseUrl, seconds: 30, logger: createLogger(env), now: () => new Date() });
    const { app } = createApp({ env, db: database.db, mailer, logger: createLogger(env), caches });
    server = app.listen(0, '127.0.0.1');
    await new Promise((r) => server!.once('listening', r));
    const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    // … and the same app without them, for the cost of a request the caches cannot answer
    const uncached = createApp({ env, db: database.db, mailer, logger: createLogger(env) }).app;
    serverUncached = uncached.listen(0, '127.0.0.1');
    await new Promise((r) => serverUncached!.once('listening', r));
    const baseUncached = `http://127.0.0.1:${(serverUncached.address() as AddressInfo).port}`;
    const signIn = await fetch(`${base}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: 'http://bench.test' },
      body: JSON.stringify({ email: 'steward@bench.example', password }),
    });
    if (!signIn.ok) throw new Error(`sign-in failed: ${signIn.status}`);
    const cookie = signIn.headers
      .getSetCookie()
      .map((c) => c.split(';')[0])
      .join('; ');

    const cases: { name: string; path: string; connections: number; signedIn?: boolean; uncached?: boolean }[] = [
      {
        name: 'library list, page 1 of 25 by attention',
        path: '/api/cultures?sort=attention&page=1&pageSize=25',
        connections: CONNECTIONS,
      },
      {
        name: 'library list, page 1 of 25 by attention, caches off',
        path: '/api/cultures?sort=attention&page=1&pageSize=25',
        connections: CONNECTIONS,
        uncached: true,
      },
      // projected viability is core's model, not a column: every matching culture is projected per request
      {
        name: 'library list, page 1 of 25 by projected viability',
        path: '/api/cultures?sort=viability&dir=asc&page=1&pageSize=25',
        connections: 10,
      },
      // each answer is ~1 MB of JSON: fewer callers, so the loop measures work rather than a queue
      {
        name: 'lineage of 5,000 nodes (from a depth-30 leaf)',
        path: `/api/cultures/${deepLeaf}/lineage`,
        connections: 10,
      },
      // the rungs below the list, to see where a request's time goes (run with BENCH_CASES=stack)
      { name: 'stack: GET /api/health, signed out', path: '/api/health', connections: CONNECTIONS, signedIn: false },
      { name: 'stack: GET /api/health, signed in', path: '/api/health', connections: CONNECTIONS },
    ];
    const results: string[] = [];
    if (process.env.BENCH_SPLIT === '1') {
      const { listCultures } = await import('../src/services/cultures');
      const { CultureListSchema } = await import('@barmkeep/schemas');
      const ctx = {
        db: database.db,
        now: () => new Date(),
      } as unknown as import('../src/services/context').ServiceContext;
      const q = CultureListSchema.parse({ sort: 'attention', page: 1, pageSize: 25 });
      const time = async (label: string, fn: () => Promise<unknown>, n = 300) => {
        for (let i = 0; i < 30; i++) await fn();
        const t = performance.now();
        for (let i = 0; i < n; i++) await fn();
        console.log(`${label}: ${((performance.now() - t) / n).toFixed(2)} ms per call, sequential`);
      };
      await time('service listCultures (drizzle + presenter)', () => listCultures(ctx, { id: owner }, q));
      const listed = await listCultures(ctx, { id: owner }, q);
      if (process.env.BENCH_PROFILE) {
        const session = new (await import('node:inspector/promises')).Session();
        session.connect();
        await session.post('Profiler.enable');
        await session.post('Profiler.start');
        for (let i = 0; i < 2000; i++) await listCultures(ctx, { id: owner }, q);
        const { profile } = await session.post('Profiler.stop');
        (await import('node:fs')).writeFileSync(
          `${process.env.BENCH_PROFILE}/listCultures.cpuprofile`,
          JSON.stringify(profile),
        );
        session.disconnect();
      }
      await time('JSON.stringify of that page', async () => JSON.stringify(listed), 3000);
      await time('zod parse of the list query', async () => CultureListSchema.parse({ sort: 'attention' }), 3000);
      const { createLucia } = await import('../src/services/lucia');
      const lucia = createLucia(database.db, { secureCookie: false, sessionDays: 30 });
      const sessionId = lucia.readSessionCookie(cookie)!;
      await time('lucia validateSession (prepared session + user)', () => lucia.validateSession(sessionId));
      await time('raw pg select 1', () => raw.query('select 1'));
      await time('HTTP GET /api/cultures (whole stack, caches on)', () =>
        fetch(`${base}/api/cultures?sort=attention&page=1&pageSize=25`, { headers: { cookie } }).then((r) =>
          r.arrayBuffer(),
        ),
      );
      await time('HTTP GET /api/health (stack, no session work)', () =>
        fetch(`${base}/api/health`).then((r) => r.arrayBuffer()),
      );
    }
    // BENCH_CASES=list (or lineage) runs only the cases whose name contains it, e.g. for a CPU profile
    const only = process.env.BENCH_CASES;
    for (const c of cases.filter((k) => (only ? k.name.includes(only) : !k.name.startsWith('stack:')))) {
      const cookieOf = c.signedIn === false ? '' : cookie;
      const target = c.uncached ? baseUncached : base;
      // capture exactly what one request sends to PostgreSQL
      const captured: unknown[] = [];
      const original = database.pool.query.bind(database.pool);
      (database.pool as unknown as { query: unknown }).query = (...args: unknown[]) => {
        const [q, values] = args;
        const config = typeof q === 'string' ? { text: q } : { ...(q as object) };
        captured.push(Array.isArray(values) ? { ...config, values } : config);
        return (original as (...a: unknown[]) => unknown)(...args);
      };
      const check = await fetch(`${target}${c.path}`, { headers: { cookie: cookieOf } });
      (database.pool as unknown as { query: unknown }).query = original;
      const body = (await check.json()) as { total?: number; nodes?: unknown[] };
      if (!check.ok) throw new Error(`${c.path}: ${check.status}`);
      const sizeNote = body.nodes
        ? `${body.nodes.length} nodes`
        : body.total !== undefined
          ? `${body.total} cultures in all`
          : 'no data';
      const dataQueries = captured.filter((q) => !/"sessions"/.test((q as { text: string }).text));
      if (process.env.BENCH_EXPLAIN === '1') {
        for (const q of dataQueries) {
          const { text, values } = q as { text: string; values?: unknown[] };
          const plan = await raw.query(`explain analyze ${text}`, values);
          console.log(text, '\n', plan.rows.map((r) => r['QUERY PLAN']).join('\n'));
        }
      }

      // warm both sides
      await cannon({ url: `${target}${c.path}`, connections: 10, duration: 2, cookie: cookieOf });
      await rawLoop(raw, captured, 2);

      // BENCH_PROFILE=dir writes a CPU profile of the server side of each API run (only that phase)
      const profiler = process.env.BENCH_PROFILE ? new (await import('node:inspector/promises')).Session() : null;
      if (profiler) {
        profiler.connect();
        await profiler.post('Profiler.enable');
        await profiler.post('Profiler.start');
      }
      const cpu0 = process.cpuUsage();
      const api = await cannon({
        url: `${target}${c.path}`,
        connections: c.connections,
        duration: SECONDS,
        cookie: cookieOf,
      });
      const cpu = process.cpuUsage(cpu0);
      // CPU the server process used per answered request (user + system): not skewed by waiting for a core
      const cpuPerRequest = (cpu.user + cpu.system) / 1000 / api.requests.total;
      if (profiler) {
        const { profile } = await profiler.post('Profiler.stop');
        const file = `${process.env.BENCH_PROFILE}/${c.name.replace(/\W+/g, '-')}.cpuprofile`;
        (await import('node:fs')).writeFileSync(file, JSON.stringify(profile));
        console.log(`CPU profile of the API run: ${file}`);
        profiler.disconnect();
      }
      if (api.non2xx > 0 || api.errors > 0) throw new Error(`${c.path}: ${api.non2xx} non-2xx, ${api.errors} errors`);
      const sqlAll = await rawLoop(raw, captured, SECONDS, c.connections);
      const sqlData = await rawLoop(raw, dataQueries, SECONDS, c.connections);
      const line = [
        `| ${c.name} (${sizeNote}), ${c.connections} connections | API | ${api.latency.p50} | ${api.latency.p99} | ${api.latency.average.toFixed(1)} | ${Math.round(api.requests.average)} |`,
        `| | same SQL via pg (${captured.length} queries: session + data) | ${sqlAll.p50.toFixed(1)} | ${sqlAll.p99.toFixed(1)} | ${sqlAll.mean.toFixed(1)} | ${Math.round(sqlAll.rps)} |`,
        `| | data SQL only via pg (${dataQueries.length} queries) | ${sqlData.p50.toFixed(1)} | ${sqlData.p99.toFixed(1)} | ${sqlData.mean.toFixed(1)} | ${Math.round(sqlData.rps)} |`,
        `| | **ratio API / same SQL** (mean latency; throughput) | | | **${(api.latency.average / sqlAll.mean).toFixed(2)}×** | **${(sqlAll.rps / api.requests.average).toFixed(2)}×** |`,
        `| | API server CPU per request (user + system) | | | ${cpuPerRequest.toFixed(2)} ms (${(cpu.system / 1000 / api.requests.total).toFixed(2)} system) | |`,
      ];
      results.push(...line);
      console.log(line.join('\n'));
    }
    // the yardstick, in the same run: Express answering a constant JSON in its own process, same load
    if (!only || /bare|library|stack/.test(only)) {
      const procs = new Processes();
      try {
        const bare = spawnNode('bench/bare-server.ts', { PORT: '0' }, procs, 'bare');
        const port = await waitFor('bare server', async () => Number(/listening on (\d+)/.exec(bare.output())?.[1]));
        const bareUrl = `http://127.0.0.1:${port}/bare`;
        await cannon({ url: bareUrl, connections: 10, duration: 2, cookie: '' });
        const r = await cannon({ url: bareUrl, connections: CONNECTIONS, duration: SECONDS, cookie: '' });
        const line = `| bare Express 5, constant JSON (own process, no session or database), ${CONNECTIONS} connections | yardstick | ${r.latency.p50} | ${r.latency.p99} | ${r.latency.average.toFixed(1)} | ${Math.round(r.requests.average)} |`;
        results.push(line);
        console.log(line);
      } finally {
        await procs.stopAll();
      }
    }
    console.log('\n| case | side | p50 ms | p99 ms | mean ms | req/s |\n| --- | --- | --- | --- | --- | --- |');
    console.log(results.join('\n'));
    console.log(
      `\n${SECONDS} s per side, pool of ${POOL}; Node ${process.version}; load average ${(await import('node:os'))
        .loadavg()
        .map((l) => l.toFixed(1))
        .join(' ')}.`,
    );
  } finally {
    server?.close();
    serverUncached?.close();
    await caches?.stop();
    await raw.end();
    await database.close();
    await admin.query(`drop database if exists "${name}" with (force)`);
    await admin.end();
  }
}

await main();
