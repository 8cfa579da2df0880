import pg from 'pg';
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { fileURLToPath } from 'node:url';
import * as schema from './schema';

export type Db = NodePgDatabase<typeof schema>;

export interface Database {
  db: Db;
  pool: pg.Pool;
  close(): Promise<void>;
}

export function connect(databaseUrl: string, options: { max?: number } = {}): Database {
  const pool = new pg.Pool({
    connectionString: databaseUrl,
    max: options.max ?? 10,
    connectionTimeoutMillis: 5_000,
  });
  // An idle client that loses its server must not crash the process.
  pool.on('error', () => {});
  const db = drizzle(pool, { schema });
  return { db, pool, close: () => pool.end() };
}

/** The pg pool under a Drizzle handle (drizzle keeps it as `$client`; a transaction has none). */
export function poolOf(db: Db): pg.Pool | undefined {
  const client = (db as Db & { $client?: unknown }).$client;
  return client instanceof pg.Pool ? client : undefined;
}

export const migrationsFolder = fileURLToPath(new URL('../../drizzle', import.meta.url));

export async function runMigrations(db: Db): Promise<void> {
  await migrate(db, { migrationsFolder });
}
