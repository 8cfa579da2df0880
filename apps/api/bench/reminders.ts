/**
 * Reminder rule evaluation at scale: 100,000 cultures across 2,000 people on a fresh database.
 * Times one full pass of every rule (runReminderPass) against a bare `select count(*)` over the same
 * rows, side by side in one run, and prints the ratio.
 *
 *   cd apps/api && pnpm exec tsx bench/reminders.ts
 *
 * Needs the project's PostgreSQL (bash infra/pg-start.sh). BENCH_ADMIN_URL overrides the server.
 * BENCH_KEEP=1 leaves the database in place (its name is printed) for EXPLAIN ANALYZE by hand.
 */
import pg from 'pg';
import { randomBytes } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { sql } from 'drizzle-orm';
import { CULTURE_FORMS, maxStorageDays, type CultureForm } from '@barmkeep/core';
import { connect, runMigrations } from '../src/db/client';
import { cultures, users } from '../src/db/schema';
import { REMINDER_RULES, runReminderPass } from '../src/services/reminders/engine';

const PEOPLE = Number(process.env.BENCH_PEOPLE ?? 2_000);
const CULTURES = Number(process.env.BENCH_CULTURES ?? 100_000);
const RUNS = 5;
const DAY = 86_400_000;
const adminUrl = process.env.BENCH_ADMIN_URL ?? 'postgres://app@127.0.0.1:54329/postgres';
const name = `barmkeep_bench_${Date.now()}_${randomBytes(2).toString('hex')}`;

const admin = new pg.Client({ connectionString: adminUrl });
await admin.connect();
await admin.query(`create database "${name}"`);
const url = new URL(adminUrl);
url.pathname = `/${name}`;
const database = connect(url.toString(), { max: 4 });
const { db } = database;

// a fixed clock and a seeded generator, so every run sees the same rows
let seed = 42;
const rand = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
const NOW = new Date('2026-06-01T08:00:00Z');
const ZONES = ['UTC', 'Europe/London', 'Europe/Berlin', 'America/New_York', 'America/Los_Angeles', 'Australia/Sydney'];
const TEMPS: Record<CultureForm, number[]> = {
  liquid_pack: [2, 4, 6],
  dry_pack: [4, 10, 20],
  slurry_washed: [2, 4],
  slurry_unwashed: [1, 3, 5],
  bottle_dregs: [4, 8],
  slant: [4],
  plate: [4],
  frozen_glycerol: [-80, -20],
};

try {
  await runMigrations(db);
  const t0 = performance.now();
  const userIds: string[] = [];
  for (let i = 0; i < PEOPLE; i += 1000) {
    const rows = Array.from({ length: Math.min(1000, PEOPLE - i) }, (_, j) => ({
      id: `u${i + j}`,
      email: `keeper${i + j}@bench.test`,
      name: `Keeper ${i + j}`,
      passwordHash: 'not-a-real-hash',
      timeZone: ZONES[(i + j) % ZONES.length]!,
    }));
    await db.insert(users).values(rows);
    userIds.push(...rows.map((r) => r.id));
  }
  for (let i = 0; i < CULTURES; i += 2000) {
    const rows = Array.from({ length: Math.min(2000, CULTURES - i) }, (_, j) => {
      const n = i + j;
      const form = CULTURE_FORMS[Math.floor(rand() * CULTURE_FORMS.length)]!;
      const temps = TEMPS[form];
      const storageTempC = temps[Math.floor(rand() * temps.length)]!;
      const madeAt = new Date(NOW.getTime() - Math.floor(rand() * 400) * DAY - Math.floor(rand() * DAY));
      const measured = rand() < 0.2;
      const stateRoll = rand();
      return {
        id: `c${n}`,
        ownerUserId: userIds[n % userIds.length]!,
        strainName: `Strain ${n % 500}`,
        origin: 'gift' as const,
        originDetails: { origin: 'gift' as const, fromName: 'A friend' },
        form,
        locationLabel: `Shelf ${n % 40}`,
        storageTempC,
        madeAt,
        generation: Math.floor(rand() * 14),
        state: stateRoll < 0.7 ? ('stored' as const) : stateRoll < 0.8 ? ('active' as const) : ('pitched' as const),
        measuredAt: measured ? new Date(madeAt.getTime() + 2 * DAY) : null,
        measuredViability: measured ? 0.6 + rand() * 0.35 : null,
        attentionDueAt: new Date(madeAt.getTime() + maxStorageDays(form, storageTempC).days * DAY),
      };
    });
    await db.insert(cultures).values(rows);
  }
  await db.execute(sql`analyze`);
  console.log(`seeded ${PEOPLE} people and ${CULTURES} cultures in ${((performance.now() - t0) / 1000).toFixed(1)} s`);

  const time = async (fn: () => Promise<unknown>) => {
    const s = performance.now();
    await fn();
    return performance.now() - s;
  };
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
  const count = () => db.execute(sql`select count(*) from cultures`);
  await count();

  // the first pass finds and stores every notice due (one insert batch per 1,000)
  const countBefore = await time(count);
  let inserted = 0;
  const first = await time(async () => {
    inserted = (await runReminderPass({ db, now: NOW })).inserted.length;
  });
  // autovacuum would get to the rows the first pass updated (crossings, marks) well before long
  await db.execute(sql`vacuum analyze cultures`);
  await db.execute(sql`vacuum analyze notifications`);
  // then the steady state: the same pass every five minutes, nothing new to store
  const counts: number[] = [];
  const passes: number[] = [];
  for (let r = 0; r < RUNS; r += 1) {
    counts.push(await time(count));
    passes.push(await time(() => runReminderPass({ db, now: NOW })));
  }
  // a pass after 1,000 cultures moved somewhere warmer: the trigger marks them stale, the pass
  // recomputes their crossings with core and finds what the move brought forward
  await db.execute(
    sql`update cultures set storage_temp_c = storage_temp_c + 6 where id in (select id from cultures order by id limit 1000)`,
  );
  let afterEdit = 0;
  const edited = await time(async () => {
    afterEdit = (await runReminderPass({ db, now: NOW })).inserted.length;
  });
  for (const rule of REMINDER_RULES) {
    const ms = await time(() => rule.collect({ db, now: NOW }));
    console.log(`  rule ${rule.kind}: ${ms.toFixed(0)} ms`);
  }
  const c = median([countBefore, ...counts]);
  const p = median(passes);
  console.log(`notices stored by the first pass: ${inserted}`);
  console.log(`bare select count(*) over ${CULTURES} cultures: median ${c.toFixed(1)} ms`);
  console.log(
    `first full pass (finds and stores ${inserted} notices): ${first.toFixed(0)} ms = ${(first / c).toFixed(0)}× the count`,
  );
  console.log(`steady-state full pass, median of ${RUNS}: ${p.toFixed(0)} ms = ${(p / c).toFixed(0)}× the count`);
  console.log(
    `pass after 1,000 cultures were moved 6 °C warmer (recomputes 1,000 crossings, stores ${afterEdit} notices): ${edited.toFixed(0)} ms = ${(edited / c).toFixed(0)}× the count`,
  );
} finally {
  await database.close();
  if (process.env.BENCH_KEEP === '1') console.log(`kept database ${name}`);
  else await admin.query(`drop database if exists "${name}" with (force)`);
  await admin.end();
}
