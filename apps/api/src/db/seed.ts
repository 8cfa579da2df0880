import { sql } from 'drizzle-orm';
import type { Db } from './client';
import { clubs, memberships, users } from './schema';
import { hashPassword } from '../lib/password';
import { seedDemoCultures } from './seeds/cultures';
import { seedDemoClubActivity } from './seeds/clubActivity';

/** An invented club and its members. Every name here is made up. */
export const DEMO_PASSWORD = 'sourdough-lantern-42';
export const DEMO_CLUB = {
  id: 'demo-club-millrace',
  name: 'Millrace Lane Fermenters',
  description: 'A made-up neighbourhood club that keeps a shared fridge of yeast.',
};
export const DEMO_MEMBERS = [
  {
    id: 'demo-user-odile',
    email: 'odile@millrace.example',
    name: 'Odile Marsh',
    role: 'owner' as const,
    siteRole: 'admin' as const,
  },
  {
    id: 'demo-user-bram',
    email: 'bram@millrace.example',
    name: 'Bram Castellan',
    role: 'steward' as const,
    siteRole: 'user' as const,
  },
  {
    id: 'demo-user-pia',
    email: 'pia@millrace.example',
    name: 'Pia Nordqvist',
    role: 'member' as const,
    siteRole: 'user' as const,
  },
];

export type DemoSeeder = (db: Db) => Promise<void>;
/** Other features register the demo rows they own (cultures, plans…) here. */
export const demoSeeders: DemoSeeder[] = [seedDemoCultures, (db) => seedDemoClubActivity(db, DEMO_MEMBERS)];

/** Seeds only an empty database; returns the sign-ins to print. */
export async function seedDemoIfEmpty(db: Db): Promise<string[]> {
  const [{ count } = { count: 0 }] = await db.select({ count: sql<number>`count(*)::int` }).from(users);
  if (count > 0) return [];
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    await tx.insert(users).values(
      DEMO_MEMBERS.map((m) => ({
        id: m.id,
        email: m.email,
        name: m.name,
        passwordHash,
        role: m.siteRole,
        timeZone: 'Europe/Berlin',
      })),
    );
    await tx.insert(clubs).values(DEMO_CLUB);
    await tx
      .insert(memberships)
      .values(DEMO_MEMBERS.map((m) => ({ clubId: DEMO_CLUB.id, userId: m.id, role: m.role })));
    for (const seed of demoSeeders) await seed(tx as unknown as Db);
  });
  return DEMO_MEMBERS.map(
    (m) => `${m.email}  (${m.role} of ${DEMO_CLUB.name}${m.siteRole === 'admin' ? ', site admin' : ''})`,
  );
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { loadEnv } = await import('../config/env');
  const { connect, runMigrations } = await import('./client');
  const env = loadEnv();
  const database = connect(env.DATABASE_URL);
  await runMigrations(database.db);
  const printed = await seedDemoIfEmpty(database.db);
  console.log(printed.length ? printed.join('\n') : 'database not empty; nothing seeded');
  await database.close();
}
