/**
 * Lighthouse (desktop preset) against the built web app, signed in as a demo keeper: the library
 * page (/cultures), plus the sign-in page and one culture page. Builds nothing: it expects
 * apps/web/dist (run `pnpm --filter @barmkeep/web build` first; `bash infra/bench.sh` does). It
 * serves the built app + API itself (`NODE_ENV=production`, the same way tests/e2e/serve.sh does)
 * on a free loopback port, on a fresh database of its own with the demo seed, and drops that
 * database afterwards. PostgreSQL: the project's (127.0.0.1:54329; started with infra/pg-start.sh
 * when it is not running, and left running), or BENCH_ADMIN_DATABASE_URL (infra/bench.sh exports it).
 *
 *   pnpm --filter @barmkeep/e2e lighthouse             # LH_RUNS=5 runs per page, the median kept
 *   cd tests && LH_PAGES=library LH_RUNS=1 pnpm exec tsx perf/lighthouse.ts
 *   LH_BASELINE_ROOT=/path/to/other/checkout …          # + that checkout, side by side, runs interleaved
 *
 * Writes the scores and metrics into docs/performance.md between the `bench:lighthouse` markers
 * (`bench:lighthouse-compare` with a baseline), and every report (HTML + JSON) into
 * .data/bench/lighthouse/. Exits 1 when the library page scores under 95 for performance or
 * accessibility.
 */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { createServer, type AddressInfo } from 'node:net';
import { mkdirSync, readFileSync, writeFileSync, existsSync, mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import * as chromeLauncher from 'chrome-launcher';
import lighthouse, { desktopConfig } from 'lighthouse';
import type { Result as LhResult } from 'lighthouse';

const REPO_ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
// LH_BASELINE_ROOT: another checkout (e.g. a `git worktree` of an earlier commit, installed and
// built) measured side by side with this one, runs interleaved, so both see the same machine.
const BASELINE_ROOT = process.env.LH_BASELINE_ROOT ? path.resolve(process.env.LH_BASELINE_ROOT) : undefined;
const OUT_DIR = path.join(REPO_ROOT, '.data/bench/lighthouse');
const DOC = path.join(REPO_ROOT, 'docs/performance.md');
const CHROME_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
const RUNS = Math.min(9, Math.max(1, Number(process.env.LH_RUNS ?? 5)));
// The maintenance database to create and drop ours from (infra/bench.sh exports it).
const ADMIN_URL =
  process.env.BENCH_ADMIN_DATABASE_URL ?? `postgres://app@127.0.0.1:${process.env.PGPORT ?? '54329'}/postgres`;
// A demo keeper from apps/api/src/db/seed.ts (the seed is invented; the password is printed by start.sh).
const DEMO = { email: 'odile@millrace.example', password: 'sourdough-lantern-42' };
const GOAL = { performance: 95, accessibility: 95 };
const CATEGORIES = ['performance', 'accessibility', 'best-practices', 'seo'] as const;
const METRICS = {
  fcp: 'first-contentful-paint',
  lcp: 'largest-contentful-paint',
  tbt: 'total-blocking-time',
  cls: 'cumulative-layout-shift',
} as const;

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  await new Promise((r) => server.close(r));
  return port;
}

function psql(sql: string) {
  execFileSync('psql', ['-d', ADMIN_URL, '-qAt', '-v', 'ON_ERROR_STOP=1', '-c', sql], {
    stdio: ['ignore', 'pipe', 'pipe'],
  });
}

function postgresAnswers() {
  try {
    psql('select 1');
    return true;
  } catch {
    return false;
  }
}

/** The built app + API, as in production, on its own database seeded with the demo club. */
async function startApp(root: string, databaseUrl: string, port: number) {
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'src/server.ts'], {
    cwd: path.join(root, 'apps/api'),
    env: {
      ...process.env,
      NODE_ENV: 'production',
      DATABASE_URL: databaseUrl,
      PORT: String(port),
      HOST: '127.0.0.1',
      APP_URL: `http://127.0.0.1:${port}`,
      FAKE_SMTP: '1',
      FAKE_SMTP_PORT: '0',
      SEED_DEMO: '1',
      LOG_LEVEL: 'warn',
      WEB_DIST: path.join(root, 'apps/web/dist'),
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout!.on('data', (d) => (output += d));
  child.stderr!.on('data', (d) => (output += d));
  const deadline = Date.now() + 60_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the API exited (${child.exitCode}):\n${output}`);
    try {
      const res = await fetch(`http://127.0.0.1:${port}/api/health`);
      if (res.ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) throw new Error(`the API did not start:\n${output}`);
    await sleep(200);
  }
  return {
    stop: async () => {
      if (child.exitCode !== null) return;
      const exited = new Promise((r) => child.once('exit', r));
      child.kill('SIGTERM');
      await Promise.race([exited, sleep(5_000)]);
      if (child.exitCode === null) child.kill('SIGKILL');
    },
  };
}

/** Signs in through the API and returns the session cookie ("name=value"). */
async function signIn(base: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify(DEMO),
  });
  if (!res.ok) throw new Error(`sign-in failed: ${res.status} ${await res.text()}`);
  const cookie = res.headers.getSetCookie().find((c) => !/max-age=0/i.test(c));
  if (!cookie) throw new Error('sign-in set no session cookie');
  return cookie.split(';')[0]!;
}

interface PageResult {
  page: string;
  path: string;
  runs: number;
  scores: Record<(typeof CATEGORIES)[number], number>;
  metrics: Record<keyof typeof METRICS, number>;
  failing: Failing[];
}

/** Audits of a category scoring under 0.9; `weighted` ones cost points, the rest are advice. */
function failingAudits(lhr: LhResult, category: string) {
  return lhr.categories[category]!.auditRefs.flatMap((ref) => {
    const a = lhr.audits[ref.id]!;
    if (a.score === null || a.score >= 0.9 || a.scoreDisplayMode === 'informative') return [];
    return [
      {
        category,
        id: a.id,
        weighted: ref.weight > 0,
        text: `${a.title}${a.displayValue ? ` — ${a.displayValue}` : ''}`,
      },
    ];
  });
}
type Failing = ReturnType<typeof failingAudits>[number];

/** One Lighthouse run in a Chromium of its own (fresh profile), so runs cannot leak into each other. */
async function runOnce(url: string, cookie: string | undefined) {
  const userDataDir = mkdtempSync(path.join(tmpdir(), 'barmkeep-lh-'));
  const chrome = await chromeLauncher.launch({
    chromePath: CHROME_PATH,
    userDataDir,
    chromeFlags: [
      '--headless=new',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  try {
    return await lighthouse(
      url,
      {
        port: chrome.port,
        output: ['html', 'json'],
        logLevel: 'error',
        // The session cookie rides on every request of the page (Lighthouse's documented way for
        // pages behind a sign-in); nothing else about the browser is changed.
        extraHeaders: cookie ? { Cookie: cookie } : undefined,
      },
      desktopConfig,
    );
  } finally {
    chrome.kill();
    rmSync(userDataDir, { recursive: true, force: true });
  }
}

interface Target {
  label: string;
  base: string;
  cookie: string;
  cultureId: string;
}

function summarize(name: string, route: string, lhrs: LhResult[]): PageResult {
  // The median run by performance score (then by LCP), as Lighthouse's own docs advise for variance.
  const sorted = [...lhrs].sort(
    (a, b) =>
      a.categories.performance!.score! - b.categories.performance!.score! ||
      a.audits[METRICS.lcp]!.numericValue! - b.audits[METRICS.lcp]!.numericValue!,
  );
  const median = sorted[Math.floor((sorted.length - 1) / 2)]!;
  return {
    page: name,
    path: route,
    runs: lhrs.length,
    scores: Object.fromEntries(
      CATEGORIES.map((c) => [c, Math.round(median.categories[c]!.score! * 100)]),
    ) as PageResult['scores'],
    metrics: Object.fromEntries(
      Object.entries(METRICS).map(([k, id]) => [k, median.audits[id]!.numericValue!]),
    ) as PageResult['metrics'],
    failing: CATEGORIES.flatMap((c) => failingAudits(median, c)),
  };
}

/** RUNS runs of one page on every target, interleaved (target A, target B, A, B…). */
async function audit(targets: Target[], name: string, routeOf: (t: Target) => string, signedIn: boolean) {
  const lhrs = targets.map(() => [] as LhResult[]);
  for (let i = 0; i < RUNS; i++) {
    for (const [k, t] of targets.entries()) {
      const route = routeOf(t);
      const cookie = signedIn ? t.cookie : undefined;
      const tag = targets.length > 1 ? `${name} (${t.label})` : name;
      let result: Awaited<ReturnType<typeof runOnce>>;
      // A trace that failed to record (NO_NAVSTART, NO_FCP…) says "run again": up to two more tries.
      for (let attempt = 1; ; attempt++) {
        result = await runOnce(`${t.base}${route}`, cookie);
        const error = result?.lhr.runtimeError;
        if (!error) break;
        if (attempt === 3) throw new Error(`${route}: ${error.code} ${error.message}`);
        console.log(`  ${tag} run ${i + 1}: ${error.code}, trying again`);
      }
      if (!result) throw new Error(`lighthouse returned nothing for ${route}`);
      const lhr = result.lhr;
      // A guarded page that bounced to /sign-in would be measuring the wrong page.
      if (cookie && new URL(lhr.finalDisplayedUrl).pathname !== route)
        throw new Error(`${route} ended on ${lhr.finalDisplayedUrl}: the session cookie was not accepted`);
      const [html, json] = result.report as string[];
      const file = `${name}${targets.length > 1 ? `-${t.label}` : ''}-${i + 1}`;
      writeFileSync(path.join(OUT_DIR, `${file}.html`), html!);
      writeFileSync(path.join(OUT_DIR, `${file}.json`), json!);
      lhrs[k]!.push(lhr);
      console.log(
        `  ${tag} run ${i + 1}: ${CATEGORIES.map((c) => `${c} ${Math.round(lhr.categories[c]!.score! * 100)}`).join(', ')}`,
      );
    }
  }
  const first = lhrs[0]![0]!;
  return {
    results: targets.map((t, k) => summarize(targets.length > 1 ? `${name} (${t.label})` : name, routeOf(t), lhrs[k]!)),
    lighthouseVersion: first.lighthouseVersion,
    userAgent: first.environment.hostUserAgent,
  };
}

function writeDocs(
  results: PageResult[],
  meta: { at: string; lighthouse: string; chrome: string; load: string },
  marker: string,
) {
  const ms = (v: number) => `${Math.round(v)} ms`;
  const lines = [
    `Last run ${meta.at.slice(0, 16).replace('T', ' ')} UTC: Lighthouse ${meta.lighthouse}, desktop preset (simulated throttling), ${meta.chrome}, headless, each run in a fresh Chromium; median of ${results[0]?.runs ?? 0} runs per page by performance score; load average ${meta.load} (2 cores shared with other work: TBT moves with it). Signed in as a demo keeper (odile@millrace.example) for the signed-in pages.`,
    '',
    '| page | path | performance | accessibility | best practices | SEO | FCP | LCP | TBT | CLS |',
    '| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |',
    ...results.map(
      (r) =>
        `| ${r.page} | \`${r.path}\` | ${r.scores.performance} | ${r.scores.accessibility} | ${r.scores['best-practices']} | ${r.scores.seo} | ${ms(r.metrics.fcp)} | ${ms(r.metrics.lcp)} | ${ms(r.metrics.tbt)} | ${r.metrics.cls.toFixed(3)} |`,
    ),
    '',
    ...results.map((r) => {
      const weighted = r.failing.filter((f) => f.weighted);
      const advice = r.failing.filter((f) => !f.weighted);
      const list = (fs: Failing[]) => fs.map((f) => `${f.id} (${f.text.replace(/\|/g, '/')})`).join('; ') || 'none';
      return `- ${r.page}: audits costing points: ${list(weighted)}. Advice only (weight 0): ${advice.map((f) => f.id).join(', ') || 'none'}.`;
    }),
  ];
  const start = `<!-- bench:${marker}:start -->`;
  const end = `<!-- bench:${marker}:end -->`;
  const text = readFileSync(DOC, 'utf8');
  const i = text.indexOf(start);
  const j = text.indexOf(end);
  const body = `${start}\n\n${lines.join('\n')}\n\n${end}`;
  const next =
    i >= 0 && j > i
      ? `${text.slice(0, i)}${body}${text.slice(j + end.length)}`
      : `${text.trimEnd()}\n\n## Lighthouse (web pages)\n\n${body}\n`;
  writeFileSync(DOC, next);
  // the repository's format check covers docs/ too
  execFileSync('pnpm', ['--silent', 'exec', 'prettier', '--write', DOC], { cwd: REPO_ROOT, stdio: 'ignore' });
  console.log(`wrote docs/performance.md (${marker} section)\n${lines.join('\n')}`);
}

/** One app (this checkout or the baseline) on a fresh database, signed in and warmed up. */
async function startTarget(root: string, label: string, stops: (() => Promise<void> | void)[]): Promise<Target> {
  if (!existsSync(path.join(root, 'apps/web/dist/index.html')))
    throw new Error(
      `no apps/web/dist/index.html in ${root}: build the web app first (pnpm --filter @barmkeep/web build)`,
    );
  const dbName = `barmkeep_lighthouse_${process.pid}_${label.replace(/\W/g, '')}`;
  psql(`create database ${dbName}`);
  stops.push(() => psql(`drop database if exists ${dbName} with (force)`));
  const port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  const dbUrl = new URL(ADMIN_URL);
  dbUrl.pathname = `/${dbName}`;
  const app = await startApp(root, dbUrl.toString(), port);
  stops.push(app.stop);
  const cookie = await signIn(base);
  const list = (await (await fetch(`${base}/api/cultures?page=1&pageSize=25`, { headers: { cookie } })).json()) as {
    cultures: { id: string }[];
  };
  const cultureId = list.cultures[0]?.id;
  if (!cultureId) throw new Error('the demo seed has no culture for this keeper');
  // A warm server, as in use: the first requests after start pay for module loading and cold
  // caches (JIT, PostgreSQL buffers, gzip), which is not what a visitor of a running app meets.
  const warmUp = ['/api/auth/me', '/api/cultures?page=1&pageSize=25', `/api/cultures/${cultureId}`, '/cultures'];
  for (let i = 0; i < 3; i++)
    for (const url of warmUp) await (await fetch(`${base}${url}`, { headers: { cookie } })).arrayBuffer();
  return { label, base, cookie, cultureId };
}

async function main() {
  mkdirSync(OUT_DIR, { recursive: true });
  const wanted = new Set((process.env.LH_PAGES ?? 'library,sign-in,culture').split(','));

  const stops: (() => Promise<void> | void)[] = [];
  if (!process.env.BENCH_ADMIN_DATABASE_URL && !postgresAnswers()) {
    // left running afterwards, as infra/pg-start.sh does: other work may have started using it
    execFileSync('bash', [path.join(REPO_ROOT, 'infra/pg-start.sh')], { stdio: 'inherit' });
  }
  const stopAll = async () => {
    while (stops.length) {
      try {
        await stops.pop()!();
      } catch (err) {
        console.warn(`cleanup: ${String(err)}`);
      }
    }
  };
  for (const [signal, code] of [
    ['SIGINT', 130],
    ['SIGTERM', 143],
  ] as const)
    process.once(signal, () => void stopAll().finally(() => process.exit(code)));
  try {
    const targets: Target[] = [];
    if (BASELINE_ROOT) targets.push(await startTarget(BASELINE_ROOT, 'before', stops));
    targets.push(await startTarget(REPO_ROOT, BASELINE_ROOT ? 'after' : 'current', stops));

    const pages: [string, (t: Target) => string, boolean][] = [
      ['library', () => '/cultures', true],
      ['sign-in', () => '/sign-in', false],
      ['culture', (t) => `/cultures/${t.cultureId}`, true],
    ];
    const results: PageResult[] = [];
    const loadsSeen: number[] = [loadavg()[0]!];
    let meta = { lighthouse: '', chrome: '' };
    for (const [name, routeOf, signedIn] of pages) {
      if (!wanted.has(name)) continue;
      const r = await audit(targets, name, routeOf, signedIn);
      results.push(...r.results);
      loadsSeen.push(loadavg()[0]!);
      meta = { lighthouse: r.lighthouseVersion, chrome: r.userAgent.match(/Chrome\/[\d.]+/)?.[0] ?? 'Chromium' };
      for (const pr of r.results)
        for (const f of pr.failing)
          console.log(`    ${pr.page}: ${f.weighted ? 'costs points' : 'advice'} · ${f.category}: ${f.id} (${f.text})`);
    }
    const loads = [Math.min(...loadsSeen), Math.max(...loadsSeen)];
    writeDocs(
      results,
      { at: new Date().toISOString(), ...meta, load: `${loads[0]!.toFixed(1)}–${loads[1]!.toFixed(1)}` },
      BASELINE_ROOT ? 'lighthouse-compare' : 'lighthouse',
    );
    const library = results.find((r) => r.page === (BASELINE_ROOT ? 'library (after)' : 'library'));
    if (
      library &&
      (library.scores.performance < GOAL.performance || library.scores.accessibility < GOAL.accessibility)
    ) {
      console.error(
        `library page under the goal (performance ${library.scores.performance}, accessibility ${library.scores.accessibility}; goal ≥ ${GOAL.performance} each)`,
      );
      process.exitCode = 1;
    }
  } finally {
    await stopAll();
  }
}

await main();
