import { inject } from 'vitest';
import pg from 'pg';

/** The address of database `name` on the run's test server. */
export function databaseUrl(name: string): string {
  const u = new URL(inject('databaseUrl'));
  u.pathname = `/${name}`;
  return u.toString();
}

/** One statement on the server's maintenance database (create / drop database). */
export async function adminQuery(sql: string): Promise<void> {
  const c = new pg.Client({ connectionString: databaseUrl('postgres') });
  await c.connect();
  try {
    await c.query(sql);
  } finally {
    await c.end();
  }
}
