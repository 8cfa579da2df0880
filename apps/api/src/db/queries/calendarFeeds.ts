import { and, eq, isNull } from 'drizzle-orm';
import type { Db } from '../client';
import { calendarFeeds, type CalendarFeedRow } from '../schema';

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
