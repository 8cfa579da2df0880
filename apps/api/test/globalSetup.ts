import pg from 'pg';
import { randomBytes } from 'node:crypto';
import type { TestProject } from 'vitest/node';
import { connect, runMigrations } from '../src/db/client';

/**
 * One fresh database per test run on the server the test command started, migrated here and
 * dropped afterwards. The dev database is never touched.
 */
export default async function setup(project: TestProject) {
  const adminUrl = process.env.TEST_ADMIN_DATABASE_URL ?? 'postgres://app@127.0.0.1:54329/postgres';
  const name = `barmkeep_test_${Date.now()}_${randomBytes(3).toString('hex')}`;
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`create database "${name}"`);
  await admin.end();

  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  const databaseUrl = url.toString();
  const database = connect(databaseUrl, { max: 2 });
  await runMigrations(database.db);
  await database.close();
  project.provide('databaseUrl', databaseUrl);

  return async () => {
    const c = new pg.Client({ connectionString: adminUrl });
    await c.connect();
    await c.query(`drop database if exists "${name}" with (force)`);
    await c.end();
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
  }
}
