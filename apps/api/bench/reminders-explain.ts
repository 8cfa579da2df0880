/**
 * EXPLAIN ANALYZE of every statement one reminders pass sends, on a database the reminders bench
 * kept (BENCH_KEEP=1 pnpm exec tsx bench/reminders.ts prints its name):
 *
 *   cd apps/api && pnpm exec tsx bench/reminders-explain.ts <database> [rule kind]
 *
 * Statements are explained instead of run (EXPLAIN ANALYZE does run them, inside the plan), so the
 * rules see no rows and store nothing.
 */
import { sql, type SQL } from 'drizzle-orm';
import { connect, type Db } from '../src/db/client';
import { REMINDER_RULES } from '../src/services/reminders/engine';

const [name, only] = process.argv.slice(2);
if (!name) throw new Error('usage: tsx bench/reminders-explain.ts <database> [rule kind]');
const base = new URL(process.env.BENCH_ADMIN_URL ?? 'postgres://app@127.0.0.1:54329/postgres');
base.pathname = `/${name}`;
const database = connect(base.toString(), { max: 2 });
let label = '';
const explaining = new Proxy(database.db, {
  get(target, prop, receiver) {
    if (prop !== 'execute') return Reflect.get(target, prop, receiver);
    return async (query: SQL) => {
      const res = await target.execute<{ 'QUERY PLAN': string }>(sql`explain (analyze, buffers) ${query}`);
      console.log(`---- ${label}\n${res.rows.map((r) => r['QUERY PLAN']).join('\n')}`);
      return { rows: [], rowCount: 0 };
    };
  },
}) as Db;
const now = new Date(process.env.BENCH_NOW ?? '2026-06-01T08:00:00Z');
try {
  for (const rule of REMINDER_RULES.filter((r) => !only || r.kind === only)) {
    label = rule.kind;
    await rule.collect({ db: explaining, now });
    label = `${rule.kind} afterStore`;
    await rule.afterStore?.({ db: explaining, now });
  }
} finally {
  await database.close();
}
