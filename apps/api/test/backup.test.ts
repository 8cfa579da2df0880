import { afterAll, beforeAll, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { mkdtemp, mkdir, writeFile, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { adminQuery, databaseUrl } from './databases';
import { connect, runMigrations } from '../src/db/client';
import { users, clubs, memberships } from '../src/db/schema';

const run = promisify(execFile);
const root = path.resolve(import.meta.dirname, '../../..');
const stamp = `${Date.now()}_${process.pid}`;
// Own source and target databases: other test files write to the shared test database meanwhile.
const sourceName = `barmkeep_bk_src_${stamp}`;
const targetName = `barmkeep_bk_dst_${stamp}`;
let work: string;

async function tableFingerprints(url: string) {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    const { rows: tables } = await c.query<{ t: string }>(
      "select format('%I.%I', schemaname, tablename) as t from pg_tables where schemaname in ('public','drizzle') order by 1",
    );
    const out: Record<string, { rows: number; md5: string }> = {};
    for (const { t } of tables) {
      const { rows } = await c.query<{ n: number; h: string }>(
        `select count(*)::int as n, coalesce(md5(string_agg(x::text, '|' order by x::text)), '') as h from ${t} x`,
      );
      out[t] = { rows: rows[0]!.n, md5: rows[0]!.h };
    }
    return out;
  } finally {
    await c.end();
  }
}

beforeAll(async () => {
  work = await mkdtemp(path.join(tmpdir(), 'barmkeep-backup-'));
  await adminQuery(`create database "${sourceName}"`);
  await adminQuery(`create database "${targetName}"`);
  const source = connect(databaseUrl(sourceName), { max: 1 });
  await runMigrations(source.db);
  await source.db.insert(users).values(
    [1, 2, 3].map((i) => ({
      id: `bk-${i}`,
      email: `bk-${i}@example.test`,
      name: `Backup Keeper ${i}`,
      passwordHash: 'x',
    })),
  );
  await source.db.insert(clubs).values({ id: 'bk-club', name: 'Invented Backup Club' });
  await source.db.insert(memberships).values({ clubId: 'bk-club', userId: 'bk-1', role: 'owner' });
  await source.close();
});

afterAll(async () => {
  await adminQuery(`drop database if exists "${sourceName}" with (force)`);
  await adminQuery(`drop database if exists "${targetName}" with (force)`);
  await rm(work, { recursive: true, force: true });
});

it('backs up the database and uploads and restores them identically', async () => {
  const uploads = path.join(work, 'uploads');
  await mkdir(path.join(uploads, 'ab'), { recursive: true });
  await writeFile(path.join(uploads, 'ab', 'photo.webp'), Buffer.from('bytes to keep'));

  const backupDir = path.join(work, 'backup');
  await run('bash', [path.join(root, 'infra/backup.sh'), backupDir], {
    env: { ...process.env, DATABASE_URL: databaseUrl(sourceName), UPLOADS_DIR: uploads },
  });
  const restoredUploads = path.join(work, 'restored-uploads');
  const restore = () =>
    run('bash', [path.join(root, 'infra/restore.sh'), backupDir], {
      env: { ...process.env, DATABASE_URL: databaseUrl(targetName), UPLOADS_DIR: restoredUploads },
    });
  await restore();

  const before = await tableFingerprints(databaseUrl(sourceName));
  const after = await tableFingerprints(databaseUrl(targetName));
  expect(before['public.users']!.rows).toBe(3);
  expect(before['drizzle.__drizzle_migrations']!.rows).toBeGreaterThan(0);
  expect(after).toEqual(before);
  expect(await readFile(path.join(restoredUploads, 'ab', 'photo.webp'), 'utf8')).toBe('bytes to keep');

  // restoring over a database that has tables is refused, and a damaged backup is detected
  await expect(restore()).rejects.toThrow(/already has tables/);
  await writeFile(path.join(backupDir, 'uploads.tar.gz'), 'tampered');
  await expect(restore()).rejects.toThrow(/damaged/);
}, 60_000);
