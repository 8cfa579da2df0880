import { afterAll, beforeAll, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { adminQuery, databaseUrl } from './databases';
import { connect, runMigrations, type Database } from '../src/db/client';
import { DEMO_MEMBERS, seedDemoIfEmpty } from '../src/db/seed';
import { clubListings, cultures, notifications, starterPlans, strainRequests, users } from '../src/db/schema';

// The demo seed only fills an empty database, so it gets one of its own.
const name = `barmkeep_seed_${Date.now()}_${process.pid}`;
let database: Database;
beforeAll(async () => {
  await adminQuery(`create database "${name}"`);
  database = connect(databaseUrl(name), { max: 2 });
  await runMigrations(database.db);
});
afterAll(async () => {
  await database.close();
  await adminQuery(`drop database if exists "${name}" with (force)`);
});

it('fills an empty database with the invented club at work, through the services, and only once', async () => {
  const printed = await seedDemoIfEmpty(database.db);
  expect(printed).toHaveLength(DEMO_MEMBERS.length);
  const { db } = database;
  expect(await db.select().from(users)).toHaveLength(3);
  const kept = await db.select().from(cultures);
  expect(kept.length).toBeGreaterThanOrEqual(5);
  // every culture got a label code from the trigger
  expect(kept.every((c) => /^[A-Z]-\d{3}$/.test(c.labelCode))).toBe(true);
  expect(await db.select().from(clubListings)).toHaveLength(2);
  const [request] = await db.select().from(strainRequests);
  expect(request).toMatchObject({ requesterUserId: 'demo-user-pia', keeperUserId: 'demo-user-bram', status: 'open' });
  // the keeper has the request waiting in the app
  const bramsNotices = await db.select().from(notifications).where(eq(notifications.userId, 'demo-user-bram'));
  expect(bramsNotices.some((n) => n.title.includes('Pia Nordqvist asks for'))).toBe(true);
  const [plan] = await db.select().from(starterPlans);
  expect(plan).toMatchObject({ ownerUserId: 'demo-user-pia', name: 'Lockkeeper lager, spring' });

  expect(await seedDemoIfEmpty(database.db)).toEqual([]);
  expect(await db.select().from(users)).toHaveLength(3);
});
