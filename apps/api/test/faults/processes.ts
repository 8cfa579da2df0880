/**
 * Real processes for the fault tests: API and worker processes, a PostgreSQL cluster of the
 * test's own, and nginx. Every start registers a stop on a `Processes` list that the test's
 * afterAll runs, so nothing outlives a failed test.
 */
import { spawn, execFileSync, type ChildProcess } from 'node:child_process';
import { createServer, type AddressInfo } from 'node:net';
import { existsSync, mkdirSync, readdirSync, rmSync, writeFileSync, mkdtempSync, chownSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { randomBytes } from 'node:crypto';
import pg from 'pg';

export const API_DIR = fileURLToPath(new URL('../../', import.meta.url));
export const REPO_ROOT = path.resolve(API_DIR, '../..');

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  await new Promise((r) => server.close(r));
  return port;
}

export async function waitFor<T>(
  what: string,
  probe: () => Promise<T | undefined | false>,
  timeoutMs = 20_000,
): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  let last: unknown;
  for (;;) {
    try {
      const v = await probe();
      if (v) return v;
    } catch (err) {
      last = err;
    }
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}${last ? `: ${String(last)}` : ''}`);
    await sleep(100);
  }
}

/** Cleanup steps, run last-registered first. */
export class Processes {
  private readonly stops: { name: string; stop: () => Promise<void> | void }[] = [];
  add(name: string, stop: () => Promise<void> | void) {
    this.stops.push({ name, stop });
  }
  async stopAll() {
    const errors: string[] = [];
    while (this.stops.length) {
      const s = this.stops.pop()!;
      try {
        await s.stop();
      } catch (err) {
        errors.push(`${s.name}: ${String(err)}`);
      }
    }
    if (errors.length) console.warn(`cleanup problems:\n${errors.join('\n')}`);
  }
}

export interface NodeProcess {
  child: ChildProcess;
  output(): string;
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
  /** SIGKILL: no shutdown handler runs, open transactions are cut off. */
  kill9(): Promise<void>;
  stop(): Promise<void>;
}

/**
 * `node --import tsx <script>` in apps/api: the same loader as the `tsx` command, but one process,
 * so a SIGKILL hits the server itself rather than a wrapper that would leave it orphaned.
 */
export function spawnNode(script: string, env: Record<string, string>, procs: Processes, name: string): NodeProcess {
  const child = spawn(process.execPath, ['--import', 'tsx', script], {
    cwd: API_DIR,
    env: { PATH: process.env.PATH ?? '', TZ: 'UTC', NODE_ENV: 'test', LOG_LEVEL: 'warn', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  const keep = (b: Buffer) => {
    out = (out + b.toString()).slice(-20_000);
  };
  child.stdout!.on('data', keep);
  child.stderr!.on('data', keep);
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.once('exit', (code, signal) => resolve({ code, signal })),
  );
  const alive = () => child.exitCode === null && child.signalCode === null;
  const proc: NodeProcess = {
    child,
    output: () => out,
    exited,
    async kill9() {
      if (alive()) child.kill('SIGKILL');
      await exited;
    },
    async stop() {
      if (!alive()) return;
      child.kill('SIGTERM');
      const done = await Promise.race([exited.then(() => true), sleep(5_000).then(() => false)]);
      if (!done) await proc.kill9();
    },
  };
  procs.add(name, () => proc.stop());
  return proc;
}

export interface ApiProcess extends NodeProcess {
  port: number;
  url: string;
}

/** The API server on its own port; resolves once /api/health answers. */
export async function startApi(
  opts: { databaseUrl: string; port?: number; env?: Record<string, string> },
  procs: Processes,
  name = 'api',
): Promise<ApiProcess> {
  const port = opts.port ?? (await freePort());
  const url = `http://127.0.0.1:${port}`;
  const proc = spawnNode(
    'src/server.ts',
    {
      PORT: String(port),
      HOST: '127.0.0.1',
      DATABASE_URL: opts.databaseUrl,
      APP_URL: url,
      AUTH_RATE_LIMIT: '100000',
      ...opts.env,
    },
    procs,
    name,
  );
  const started = Date.now();
  let lastAnswer = 'no answer yet';
  try {
    await waitFor(
      `${name} on ${url}`,
      async () => {
        if (proc.child.exitCode !== null) throw new Error(`${name} exited:\n${proc.output()}`);
        const res = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(5_000) }).catch((err: Error) => {
          lastAnswer = `${err.message} (${String((err.cause as Error | undefined)?.message ?? err.cause)})`;
          throw err;
        });
        lastAnswer = `${res.status} ${await res.text()}`;
        return res.ok;
      },
      60_000,
    );
  } catch (err) {
    throw new Error(
      `${String(err)}\nlast answer after ${Date.now() - started} ms: ${lastAnswer}\n--- ${name} output ---\n${proc.output()}`,
    );
  }
  return { ...proc, port, url };
}

/** A fresh database on a server (default: the one the test command started), dropped at cleanup. */
export async function createDatabase(procs: Processes, adminUrl = defaultAdminUrl()): Promise<string> {
  const name = `barmkeep_fault_${Date.now()}_${randomBytes(3).toString('hex')}`;
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`create database "${name}"`);
  await admin.end();
  procs.add(`database ${name}`, async () => {
    const c = new pg.Client({ connectionString: adminUrl });
    await c.connect();
    await c.query(`drop database if exists "${name}" with (force)`);
    await c.end();
  });
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  return url.toString();
}

export const defaultAdminUrl = () => process.env.TEST_ADMIN_DATABASE_URL ?? 'postgres://app@127.0.0.1:54329/postgres';

// ------------------------------------------------------------------ a PostgreSQL cluster of our own

function pgBin(): string {
  const root = '/usr/lib/postgresql';
  const versions = existsSync(root) ? readdirSync(root).sort((a, b) => Number(a) - Number(b)) : [];
  const v = versions.at(-1);
  if (!v) throw new Error('PostgreSQL binaries not found under /usr/lib/postgresql (apt-get install postgresql)');
  return path.join(root, v, 'bin');
}

const isRoot = () => process.getuid?.() === 0;

/** PostgreSQL refuses to run as root: run its binaries as the postgres user, from / (it may not enter our folder). */
function runPg(bin: string, args: string[]) {
  const cmd = isRoot() ? 'runuser' : path.join(pgBin(), bin);
  const argv = isRoot() ? ['-u', 'postgres', '--', path.join(pgBin(), bin), ...args] : args;
  return execFileSync(cmd, argv, { cwd: '/', stdio: ['ignore', 'pipe', 'pipe'], timeout: 60_000 }).toString();
}

export interface PgCluster {
  port: number;
  adminUrl: string;
  stop(): Promise<void>;
  start(): Promise<void>;
  /** stop with -m immediate (like a crash or a failover: every connection cut at once) */
  stopImmediate(): Promise<void>;
}

/**
 * A throw-away cluster under .data/ (or /var/lib/barmkeep-pg when the postgres user cannot reach
 * the checkout) on its own port; never the shared server other tests use. Removed at cleanup.
 */
export async function startPgCluster(procs: Processes, port?: number): Promise<PgCluster> {
  const p = port ?? 54400 + Math.floor(Math.random() * 500);
  let base = path.join(REPO_ROOT, '.data', `pg-fault-${p}-${process.pid}`);
  mkdirSync(base, { recursive: true });
  if (isRoot()) {
    chownSync(base, uidOf('postgres'), -1);
    try {
      execFileSync('runuser', ['-u', 'postgres', '--', 'test', '-x', base], { cwd: '/' });
    } catch {
      rmSync(base, { recursive: true, force: true });
      base = path.join('/var/lib/barmkeep-pg', `fault-${p}-${process.pid}`);
      mkdirSync(base, { recursive: true });
      chownSync(base, uidOf('postgres'), -1);
    }
  }
  const data = path.join(base, 'data');
  const log = path.join(base, 'log');
  procs.add(`pg cluster ${p} files`, () => rmSync(base, { recursive: true, force: true }));
  runPg('initdb', ['-D', data, '-A', 'trust', '-U', 'app', '-E', 'UTF8', '--locale=C.UTF-8']);
  const opts = `-p ${p} -k ${base} -c listen_addresses=127.0.0.1 -c fsync=off -c max_connections=50`;
  let running = false;
  const cluster: PgCluster = {
    port: p,
    adminUrl: `postgres://app@127.0.0.1:${p}/postgres`,
    async start() {
      runPg('pg_ctl', ['-D', data, '-l', log, '-w', '-t', '30', '-o', opts, 'start']);
      running = true;
    },
    async stop() {
      if (!running) return;
      runPg('pg_ctl', ['-D', data, '-m', 'fast', '-w', 'stop']);
      running = false;
    },
    async stopImmediate() {
      if (!running) return;
      runPg('pg_ctl', ['-D', data, '-m', 'immediate', '-w', 'stop']);
      running = false;
    },
  };
  procs.add(`pg cluster ${p}`, () => cluster.stop());
  await cluster.start();
  return cluster;
}

function uidOf(user: string): number {
  return Number(execFileSync('id', ['-u', user]).toString().trim());
}

// ------------------------------------------------------------------ nginx

export function nginxBinary(): string | undefined {
  for (const p of ['/usr/sbin/nginx', '/usr/bin/nginx']) if (existsSync(p)) return p;
  return undefined;
}

/** nginx in the foreground on loopback, round-robin over `upstreams`, config and temp files in a temp dir. */
export async function startNginx(upstreams: string[], procs: Processes): Promise<{ port: number; url: string }> {
  const bin = nginxBinary();
  if (!bin) throw new Error('nginx is not installed (infra/test.sh installs it: apt-get install nginx)');
  const port = await freePort();
  const dir = mkdtempSync(path.join(tmpdir(), 'barmkeep-nginx-'));
  procs.add('nginx files', () => rmSync(dir, { recursive: true, force: true }));
  const conf = `
worker_processes 1;
daemon off;
master_process on;
pid ${dir}/nginx.pid;
error_log ${dir}/error.log warn;
events { worker_connections 1024; }
http {
  access_log off;
  client_body_temp_path ${dir}/body;
  proxy_temp_path ${dir}/proxy;
  fastcgi_temp_path ${dir}/fastcgi;
  uwsgi_temp_path ${dir}/uwsgi;
  scgi_temp_path ${dir}/scgi;
  client_max_body_size 25m;
  upstream barmkeep {
${upstreams.map((u) => `    server ${u} max_fails=0;`).join('\n')}
    keepalive 64;
  }
  server {
    listen 127.0.0.1:${port};
    location / {
      proxy_pass http://barmkeep;
      proxy_http_version 1.1;
      proxy_set_header Connection "";
      proxy_set_header Host $http_host;
      proxy_set_header X-Forwarded-For $proxy_add_x_forwarded_for;
      proxy_set_header X-Forwarded-Proto $scheme;
      proxy_next_upstream off;
      # which instance answered, so a test can see both take part
      add_header X-Upstream $upstream_addr always;
    }
  }
}
`;
  writeFileSync(path.join(dir, 'nginx.conf'), conf);
  // nginx as root drops its workers to "nobody"; keep them as the current user instead.
  const child = spawn(bin, ['-p', dir, '-c', path.join(dir, 'nginx.conf'), ...(isRoot() ? ['-g', 'user root;'] : [])], {
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  child.stderr!.on('data', (b: Buffer) => (out += b.toString()));
  const exited = new Promise((r) => child.once('exit', r));
  procs.add('nginx', async () => {
    if (child.exitCode === null && child.signalCode === null) {
      child.kill('SIGQUIT');
      await Promise.race([exited, sleep(3_000).then(() => child.kill('SIGKILL'))]);
    }
  });
  const url = `http://127.0.0.1:${port}`;
  await waitFor('nginx', async () => {
    if (child.exitCode !== null) throw new Error(`nginx exited: ${out}`);
    return (await fetch(`${url}/api/health`)).ok;
  });
  return { port, url };
}

// ------------------------------------------------------------------ an HTTP client with a cookie jar

/** A signed-in person as a browser would be: one cookie jar, Origin on every request. */
export class Browser {
  private cookies = new Map<string, string>();
  constructor(public base: string) {}

  async request(method: string, pathname: string, body?: unknown, init: RequestInit = {}) {
    const headers: Record<string, string> = { Origin: this.base, ...(init.headers as Record<string, string>) };
    if (this.cookies.size) headers.Cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    let payload = init.body;
    if (body !== undefined) {
      headers['Content-Type'] = 'application/json';
      payload = JSON.stringify(body);
    }
    const res = await fetch(`${this.base}${pathname}`, { ...init, method, headers, body: payload });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair!.indexOf('=');
      this.cookies.set(pair!.slice(0, i), pair!.slice(i + 1));
    }
    const type = res.headers.get('content-type') ?? '';
    const data: unknown = type.includes('json') ? await res.json() : Buffer.from(await res.arrayBuffer());
    return { status: res.status, body: data as Record<string, any>, headers: res.headers }; // eslint-disable-line @typescript-eslint/no-explicit-any
  }

  /** The same cookies, sent to another address (another instance behind the balancer). */
  at(base: string): Browser {
    const b = new Browser(base);
    b.cookies = new Map(this.cookies);
    return b;
  }

  cookieHeader() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  async signUp(tag: string) {
    const person = {
      email: `fault-${tag}-${randomBytes(3).toString('hex')}@example.test`,
      password: 'correct-horse-yeast',
      name: `Keeper ${tag}`,
    };
    const res = await this.request('POST', '/api/auth/sign-up', person);
    if (res.status !== 201) throw new Error(`sign-up: ${res.status} ${JSON.stringify(res.body)}`);
    return { person, userId: res.body.user.id as string };
  }
}
