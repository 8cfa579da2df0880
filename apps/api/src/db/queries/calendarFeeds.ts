import { and, eq, isNull } from 'drizzle-orm';
import type { Db } from '../client';
import { calendarFeeds, users, type CalendarFeedRow } from '../schema';

type Executor = Pick<Db, 'select' | 'insert' | 'update'>;

export async function findLiveFeed(db: Executor, userId: string): Promise<CalendarFeedRow | undefined> {
  const [row] = await db
    .select()
    .from(calendarFeeds)
    .where(and(eq(calendarFeeds.userId, userId), isNull(calendarFeeds.revokedAt)))
    .limit(1);
  return row;
}

export async function findLiveFeedByHash(db: Executor, tokenHash: string): Promise<CalendarFeedRow | undefined> {
  const [row] = await db
    .select()
    .from(calendarFeeds)
    .where(and(eq(calendarFeeds.tokenHash, tokenHash), isNull(calendarFeeds.revokedAt)))
    .limit(1);
  return row;
}

/**
 * Locks the person's row for the rest of the transaction, so one person's feed changes run one
 * after the other. `no key update` leaves rows that merely reference the person (their cultures,
 * sessions) free to be written meanwhile.
 */
export async function lockFeedOwner(db: Executor, userId: string): Promise<void> {
  await db.select({ id: users.id }).from(users).where(eq(users.id, userId)).for('no key update');
}

export async function revokeFeeds(db: Executor, userId: string, now: Date): Promise<void> {
  await db
    .update(calendarFeeds)
    .set({ revokedAt: now })
    .where(and(eq(calendarFeeds.userId, userId), isNull(calendarFeeds.revokedAt)));
}

export async function insertFeed(
  db: Executor,
  row: { id: string; userId: string; tokenHash: string; createdAt: Date },
) {
  const [created] = await db.insert(calendarFeeds).values(row).returning();
  return created!;
}

export async function touchFeed(db: Executor, id: string, now: Date): Promise<void> {
  await db.update(calendarFeeds).set({ lastUsedAt: now }).where(eq(calendarFeeds.id, id));
}
