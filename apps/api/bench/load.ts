/**
 * Load benchmark of the two-instance setup: two API processes behind nginx (loopback) on one
 * database seeded with a club of 10,000 cultures, driven by autocannon with a mixed signed-in
 * read/write scenario, side by side with two bare Express processes returning constant JSON behind
 * a second nginx of the same shape, in the same run. Three rounds; the API processes' memory is
 * read after each. Run (PostgreSQL on 127.0.0.1:54329 and nginx installed; `bash infra/bench.sh`
 * does both):
 *
 *   cd apps/api && pnpm exec tsx bench/load.ts           # BENCH_SECONDS=60 (5…300), BENCH_CONNECTIONS=200
 *
 * Results: printed, written to .data/bench/load.json, and into docs/performance.md between the
 * `bench:load` markers.
 */
import autocannon from 'autocannon';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { connect, runMigrations } from '../src/db/client';
import { clubs, cultures, memberships, users, type CultureInsert } from '../src/db/schema';
import { hashPassword } from '../src/lib/password';
import { attentionOf } from '../src/services/cultureHealth';
import {
  Processes,
  REPO_ROOT,
  createDatabase,
  defaultAdminUrl,
  spawnNode,
  startApi,
  startNginx,
  waitFor,
} from '../test/faults/processes';

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));
const SECONDS = clamp(Number(process.env.BENCH_SECONDS ?? 60), 5, 300);
const CONNECTIONS = clamp(Number(process.env.BENCH_CONNECTIONS ?? 200), 1, 1000);
const ROUNDS = clamp(Number(process.env.BENCH_ROUNDS ?? 3), 1, 5);
const CULTURES = 10_000;
const KEEPERS = 5;
const PASSWORD = 'bench-password-long-enough';
const DAY = 86_400_000;

function mulberry32(seed: number) {
  return () => {
    seed |= 0;
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** The invented club: five keepers, each owning 2,000 club-visible cultures in lineages of 20. */
async function seed(databaseUrl: string) {
  const rand = mulberry32(20261202);
  const database = connect(databaseUrl, { max: 2 });
  try {
    await runMigrations(database.db);
    const now = Date.now();
    const hash = await hashPassword(PASSWORD);
    const keepers = Array.from({ length: KEEPERS }, (_, i) => ({
      id: `bench-keeper-${i}`,
      email: `keeper${i}@bench.example`,
      name: `Bench Keeper ${i}`,
      passwordHash: hash,
    }));
    await database.db.insert(users).values(keepers);
    await database.db.insert(clubs).values({ id: 'bench-club', name: 'Weirbank Load Club (invented)' });
    await database.db
      .insert(memberships)
      .values(
        keepers.map((k, i) => ({ clubId: 'bench-club', userId: k.id, role: i === 0 ? 'steward' : 'member' }) as const),
      );
    const rows: CultureInsert[] = [];
    const roots: string[][] = keepers.map(() => []);
    const owned: string[][] = keepers.map(() => []);
    for (let i = 0; i < CULTURES; i++) {
      const k = i % KEEPERS;
      const inLineage = Math.floor(i / KEEPERS) % 20;
      const id = `c${i}`;
      const isRoot = inLineage === 0;
      const madeAt = new Date(now - (isRoot ? 5 + Math.floor(rand() * 40) : Math.floor(rand() * 60)) * DAY);
      const form = isRoot ? 'liquid_pack' : rand() < 0.5 ? 'slant' : 'slurry_washed';
      const row: CultureInsert = {
        id,
        ownerUserId: keepers[k]!.id,
        ownerClubId: 'bench-club',
        visibility: 'club',
        parentId: isRoot ? null : `c${i - KEEPERS * (1 + Math.floor(rand() * inLineage))}`,
        generation: inLineage,
        strainName: `Load strain ${Math.floor(i / (KEEPERS * 20))}-${k} #${inLineage}`,
        tags: ['bench'],
        origin: isRoot ? 'purchased' : 'reculture',
        originDetails: isRoot
          ? { origin: 'purchased', maker: 'Invented Bench Yeast' }
          : { origin: 'reculture', method: 'starter' },
        form,
        amount: form === 'slurry_washed' ? { volumeMl: 150 } : {},
        storageTempC: 4,
        madeAt,
        state: 'stored',
        stateChangedAt: madeAt,
        stateChangedBy: keepers[k]!.id,
      };
      row.attentionDueAt = attentionOf({ form, storageTempC: 4, madeAt, state: 'stored' })?.dueAt ?? null;
      rows.push(row);
      owned[k]!.push(id);
      if (isRoot) roots[k]!.push(id);
    }
    for (let i = 0; i < rows.length; i += 1000) await database.db.insert(cultures).values(rows.slice(i, i + 1000));
    await database.pool.query('analyze');
    return { keepers, roots, owned };
  } finally {
    await database.close();
  }
}

async function signIn(base: string, email: string) {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (!res.ok) throw new Error(`sign-in ${email}: ${res.status}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

interface Measured {
  rps: number;
  p50: number;
  p99: number;
  errors: number;
  non2xx: number;
  requests: number;
  /** status codes other than 2xx, with counts */
  codes: string;
}

function summarize(r: autocannon.Result): Measured {
  return {
    rps: r.requests.average,
    p50: r.latency.p50,
    p99: r.latency.p99,
    errors: r.errors + r.timeouts,
    non2xx: r.non2xx,
    requests: r.requests.total,
    codes: Object.entries(r.statusCodeStats ?? {})
      .filter(([code]) => !code.startsWith('2'))
      .map(([code, v]) => `${code}×${(v as { count: number }).count}`)
      .join(', '),
  };
}

const rssMb = (pid: number) => {
  const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Number(m[1]) / 1024 : NaN;
};

async function main() {
  const procs = new Processes();
  const stop = () => procs.stopAll();
  process.once('SIGINT', () => void stop().then(() => process.exit(130)));
  try {
    const t0 = performance.now();
    const databaseUrl = await createDatabase(procs, process.env.BENCH_ADMIN_DATABASE_URL ?? defaultAdminUrl());
    const { keepers, roots, owned } = await seed(databaseUrl);
    console.log(
      `seeded ${CULTURES} cultures for ${KEEPERS} keepers in ${((performance.now() - t0) / 1000).toFixed(1)} s`,
    );

    const env = { LOG_LEVEL: 'silent', NODE_ENV: 'test' };
    const a = await startApi({ databaseUrl, env }, procs, 'api a');
    const b = await startApi({ databaseUrl, env }, procs, 'api b');
    const lb = await startNginx([`127.0.0.1:${a.port}`, `127.0.0.1:${b.port}`], procs);
    const bare = [0, 1].map((i) => spawnNode('bench/bare-server.ts', { PORT: String(0) }, procs, `bare ${i}`));
    const barePorts = await Promise.all(
      bare.map((p) =>
        waitFor('bare server', async () => Number(/listening on (\d+)/.exec(p.output())?.[1]) || undefined, 20_000),
      ),
    );
    const bareLb = await startNginx(
      barePorts.map((p) => `127.0.0.1:${p}`),
      procs,
    );
    const cookies = await Promise.all(keepers.map((k) => signIn(lb.url, k.email)));

    const rand = mulberry32(7);
    const pick = <T>(xs: readonly T[]) => xs[Math.floor(rand() * xs.length)]!;
    const keeper = () => Math.floor(rand() * KEEPERS);
    /** A GET as keeper k (a culture page is its keeper's alone; other members see it in lineages). */
    const get = (path: (k: number) => string) => ({
      method: 'GET' as const,
      setupRequest: (req: autocannon.Request) => {
        const k = keeper();
        return { ...req, path: path(k), headers: { ...req.headers, cookie: cookies[k]! } };
      },
    });
    const brewAt = new Date(Date.now() + 10 * DAY).toISOString();
    const requests: autocannon.Request[] = [
      get(() => `/api/cultures?sort=attention&page=${1 + Math.floor(rand() * 20)}&pageSize=25`),
      get((k) => `/api/cultures/${pick(owned[k]!)}`),
      get((k) => `/api/cultures/${pick(owned[k]!)}/lineage`),
      {
        method: 'POST',
        setupRequest: (req: autocannon.Request) => {
          const k = keeper();
          return {
            ...req,
            path: '/api/plans/preview',
            headers: { ...req.headers, cookie: cookies[k]!, origin: lb.url, 'content-type': 'application/json' },
            body: JSON.stringify({
              name: 'Load test pale',
              purpose: 'batch',
              cultureIds: [pick(roots[k]!)],
              batchVolumeL: 20,
              ogPlato: 12,
              beerType: 'ale',
              brewAt,
            }),
          };
        },
      },
      {
        method: 'POST',
        setupRequest: (req: autocannon.Request) => {
          const k = keeper();
          return {
            ...req,
            path: `/api/cultures/${pick(owned[k]!)}/events`,
            headers: { ...req.headers, cookie: cookies[k]!, origin: lb.url, 'content-type': 'application/json' },
            body: JSON.stringify({ kind: 'note', notes: 'Checked on load night' }),
          };
        },
      },
    ];

    // Every request kind must succeed once before anything is measured.
    const failures: string[] = [];
    const probe = await autocannon({
      url: lb.url,
      connections: 1,
      amount: requests.length * 4,
      requests: requests.map((r) => ({
        ...r,
        onResponse: (status: number, body: string) => {
          if (status >= 300) failures.push(`${status} ${body.slice(0, 200)}`);
        },
      })),
    });
    if (probe.non2xx || probe.errors)
      throw new Error(`a scenario request failed before the run:\n${failures.join('\n')}`);

    const rounds: { round: number; api: Measured; bare: Measured; rssA: number; rssB: number }[] = [];
    const rssStart = { a: rssMb(a.child.pid!), b: rssMb(b.child.pid!) };
    for (let round = 1; round <= ROUNDS; round++) {
      const api = summarize(
        await autocannon({ url: lb.url, connections: CONNECTIONS, duration: SECONDS, timeout: 30, requests }),
      );
      const bareRun = summarize(
        await autocannon({ url: `${bareLb.url}/bare`, connections: CONNECTIONS, duration: SECONDS, timeout: 30 }),
      );
      const r = { round, api, bare: bareRun, rssA: rssMb(a.child.pid!), rssB: rssMb(b.child.pid!) };
      rounds.push(r);
      console.log(
        `round ${round}: api ${api.rps.toFixed(0)} req/s p99 ${api.p99} ms errors ${api.errors} non-2xx ${api.non2xx} | bare ${bareRun.rps.toFixed(0)} req/s p99 ${bareRun.p99} ms | RSS a ${r.rssA.toFixed(0)} MB b ${r.rssB.toFixed(0)} MB`,
      );
    }

    const result = {
      seconds: SECONDS,
      connections: CONNECTIONS,
      cultures: CULTURES,
      rssStart,
      rounds,
      at: new Date().toISOString(),
    };
    const out = path.join(REPO_ROOT, '.data/bench');
    mkdirSync(out, { recursive: true });
    writeFileSync(path.join(out, 'load.json'), JSON.stringify(result, null, 2));
    writeDocs(result);
  } finally {
    await stop();
  }
}

function writeDocs(r: {
  seconds: number;
  connections: number;
  rssStart: { a: number; b: number };
  rounds: { round: number; api: Measured; bare: Measured; rssA: number; rssB: number }[];
  at: string;
}) {
  const lines = [
    `Last run ${r.at.slice(0, 16).replace('T', ' ')} UTC: ${r.connections} connections, ${r.seconds} s per measurement, ${r.rounds.length} rounds; API RSS before the first round: a ${r.rssStart.a.toFixed(0)} MB, b ${r.rssStart.b.toFixed(0)} MB.`,
    '',
    '| round | mixed API req/s | p50 | p99 | errors + non-2xx | bare Express req/s | bare p99 | throughput ratio (API / bare) | p99 ratio | RSS a / b after |',
    '| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |',
    ...r.rounds.map(
      (x) =>
        `| ${x.round} | ${x.api.rps.toFixed(0)} | ${x.api.p50} ms | ${x.api.p99} ms | ${x.api.errors} + ${x.api.non2xx}${x.api.codes ? ` (${x.api.codes})` : ''} of ${x.api.requests} | ${x.bare.rps.toFixed(0)} | ${x.bare.p99} ms | ${(x.api.rps / x.bare.rps).toFixed(3)} | ${(x.api.p99 / Math.max(1, x.bare.p99)).toFixed(1)}× | ${x.rssA.toFixed(0)} / ${x.rssB.toFixed(0)} MB |`,
    ),
  ];
  const doc = path.join(REPO_ROOT, 'docs/performance.md');
  const text = readFileSync(doc, 'utf8');
  const start = '<!-- bench:load:start -->';
  const end = '<!-- bench:load:end -->';
  const i = text.indexOf(start);
  const j = text.indexOf(end);
  if (i < 0 || j < i) {
    console.log(`no ${start} … ${end} markers in docs/performance.md; results:\n${lines.join('\n')}`);
    return;
  }
  writeFileSync(doc, `${text.slice(0, i + start.length)}\n\n${lines.join('\n')}\n\n${text.slice(j)}`);
  console.log(`wrote docs/performance.md (load section)\n${lines.join('\n')}`);
}

await main();
