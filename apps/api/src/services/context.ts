import type { Db } from '../db/client';
import type { Mailer } from '../mail/mailer';
import type { AppLucia } from './lucia';
import type { Caches } from '../cache/caches';

/** What services need from the outside world; passed in, so tests can swap any part. */
export interface ServiceContext {
  db: Db;
  lucia: AppLucia;
  mailer: Mailer;
  appUrl: string;
  now: () => Date;
  /** in-memory caches kept coherent through the database (absent: nothing is cached) */
  caches?: Caches;
}

/**
 * Run `work` in one transaction, handing it a context whose `db` is the transaction, so every
 * service and query it calls (reads included) runs on the transaction's own connection. Inside,
 * use only the context passed in: a query sent through the outer `ctx.db` needs a second pool
 * connection while this one may hold a row lock, and when the pool is full of requests queued on
 * that same lock nothing moves until the pool gives up.
 */
export function inTransaction<T>(ctx: ServiceContext, work: (tx: ServiceContext) => Promise<T>): Promise<T> {
  // A transaction offers everything services use of Db (select, insert, update, delete, execute,
  // query, and transaction as a savepoint); only the pool handle `$client` is missing.
  // No caches inside: what a transaction reads may never commit.
  return ctx.db.transaction((tx) => work({ ...ctx, db: tx as unknown as Db, caches: undefined }));
}
