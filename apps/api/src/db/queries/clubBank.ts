import { and, desc, eq, inArray, isNull, or, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { LIVE_REQUEST_STATUSES } from '@barmkeep/schemas';
import type { DbOrTx } from './clubs';
import {
  clubActivity,
  clubListings,
  clubStock,
  cultures,
  strainRequests,
  users,
  type StrainRequestRow,
} from '../schema';

export async function insertListing(db: DbOrTx, values: typeof clubListings.$inferInsert) {
  const rows = await db.insert(clubListings).values(values).onConflictDoNothing().returning();
  return rows[0];
}

export async function findLiveListing(db: DbOrTx, clubId: string, listingId: string) {
  const [row] = await db
    .select({ listing: clubListings, culture: cultures })
    .from(clubListings)
    .innerJoin(cultures, eq(cultures.id, clubListings.cultureId))
    .where(and(eq(clubListings.clubId, clubId), eq(clubListings.id, listingId), isNull(clubListings.withdrawnAt)))
    .limit(1);
  return row;
}

/** Locks the listing row: requests for one listing queue here, so a person cannot ask twice at once. */
export async function lockListing(db: DbOrTx, listingId: string) {
  await db.select({ id: clubListings.id }).from(clubListings).where(eq(clubListings.id, listingId)).for('update');
}

/** The person's requests still under way in a club, by listing. */
export async function liveRequestsOf(db: DbOrTx, clubId: string, requesterUserId: string, listingId?: string) {
  return db
    .select({ id: strainRequests.id, listingId: strainRequests.listingId, status: strainRequests.status })
    .from(strainRequests)
    .where(
      and(
        eq(strainRequests.clubId, clubId),
        eq(strainRequests.requesterUserId, requesterUserId),
        inArray(strainRequests.status, [...LIVE_REQUEST_STATUSES]),
        listingId ? eq(strainRequests.listingId, listingId) : undefined,
      ),
    );
}

export async function withdrawListing(db: DbOrTx, listingId: string, now: Date) {
  await db.update(clubListings).set({ withdrawnAt: now }).where(eq(clubListings.id, listingId));
}

/** The live listings of a club whose keeper still belongs to it. */
export async function listBank(db: DbOrTx, clubId: string) {
  return db
    .select({ listing: clubListings, culture: cultures, keeperName: users.name, stock: clubStock })
    .from(clubListings)
    .innerJoin(cultures, eq(cultures.id, clubListings.cultureId))
    .innerJoin(users, eq(users.id, cultures.ownerUserId))
    .leftJoin(clubStock, and(eq(clubStock.cultureId, cultures.id), eq(clubStock.clubId, clubListings.clubId)))
    .where(
      and(
        eq(clubListings.clubId, clubId),
        isNull(clubListings.withdrawnAt),
        sql`exists (select 1 from memberships m where m.club_id = ${clubListings.clubId} and m.user_id = ${cultures.ownerUserId})`,
      ),
    )
    .orderBy(cultures.strainName, clubListings.id);
}

export async function insertRequest(db: DbOrTx, values: typeof strainRequests.$inferInsert) {
  const [row] = await db.insert(strainRequests).values(values).returning();
  return row!;
}

export async function findRequestForUpdate(db: DbOrTx, clubId: string, requestId: string) {
  const [row] = await db
    .select()
    .from(strainRequests)
    .where(and(eq(strainRequests.clubId, clubId), eq(strainRequests.id, requestId)))
    .for('update')
    .limit(1);
  return row;
}

export async function updateRequest(db: DbOrTx, requestId: string, values: Partial<StrainRequestRow>) {
  const [row] = await db.update(strainRequests).set(values).where(eq(strainRequests.id, requestId)).returning();
  return row!;
}

const requester = alias(users, 'requester');
const keeper = alias(users, 'keeper');

/** Requests in a club; `involving` limits them to one person's (as requester or keeper). */
export async function listRequests(db: DbOrTx, clubId: string, involving?: string) {
  return db
    .select({
      request: strainRequests,
      strainName: cultures.strainName,
      ownerClubId: cultures.ownerClubId,
      requesterName: requester.name,
      keeperName: keeper.name,
    })
    .from(strainRequests)
    .innerJoin(cultures, eq(cultures.id, strainRequests.cultureId))
    .innerJoin(requester, eq(requester.id, strainRequests.requesterUserId))
    .innerJoin(keeper, eq(keeper.id, strainRequests.keeperUserId))
    .where(
      and(
        eq(strainRequests.clubId, clubId),
        involving
          ? or(eq(strainRequests.requesterUserId, involving), eq(strainRequests.keeperUserId, involving))
          : undefined,
      ),
    )
    .orderBy(desc(strainRequests.createdAt), desc(strainRequests.id))
    .limit(200);
}

export async function insertActivity(db: DbOrTx, values: typeof clubActivity.$inferInsert) {
  await db.insert(clubActivity).values(values);
}

export async function listActivity(
  db: DbOrTx,
  clubId: string,
  params: { before?: { at: Date; id: string }; limit: number },
) {
  return db
    .select({ activity: clubActivity, actorName: users.name })
    .from(clubActivity)
    .leftJoin(users, eq(users.id, clubActivity.actorUserId))
    .where(
      and(
        eq(clubActivity.clubId, clubId),
        params.before
          ? sql`(${clubActivity.createdAt}, ${clubActivity.id}) < (${params.before.at.toISOString()}::timestamptz, ${params.before.id})`
          : undefined,
      ),
    )
    .orderBy(desc(clubActivity.createdAt), desc(clubActivity.id))
    .limit(params.limit);
}

/* Club-owned stock */

export async function insertStock(db: DbOrTx, values: typeof clubStock.$inferInsert) {
  const rows = await db.insert(clubStock).values(values).onConflictDoNothing().returning();
  return rows[0];
}

export async function findStock(db: DbOrTx, clubId: string, cultureId: string, forUpdate = false) {
  const q = db
    .select()
    .from(clubStock)
    .where(and(eq(clubStock.clubId, clubId), eq(clubStock.cultureId, cultureId)))
    .limit(1);
  const [row] = forUpdate ? await q.for('update') : await q;
  return row;
}

export async function setStockUnits(db: DbOrTx, cultureId: string, unitsLeft: number, now: Date) {
  const [row] = await db
    .update(clubStock)
    .set({ unitsLeft, updatedAt: now })
    .where(eq(clubStock.cultureId, cultureId))
    .returning();
  return row;
}

/** Takes one unit if any is left; undefined when the stock is empty. */
export async function takeOneUnit(db: DbOrTx, cultureId: string, now: Date) {
  const [row] = await db
    .update(clubStock)
    .set({ unitsLeft: sql`${clubStock.unitsLeft} - 1`, updatedAt: now })
    .where(and(eq(clubStock.cultureId, cultureId), sql`${clubStock.unitsLeft} > 0`))
    .returning();
  return row;
}

/** The club's stock with its culture and the steward who holds it, and its live listing if any. */
export async function listStock(db: DbOrTx, clubId: string) {
  return db
    .select({ stock: clubStock, culture: cultures, keeperName: users.name, listingId: clubListings.id })
    .from(clubStock)
    .innerJoin(cultures, eq(cultures.id, clubStock.cultureId))
    .innerJoin(users, eq(users.id, cultures.ownerUserId))
    .leftJoin(
      clubListings,
      and(
        eq(clubListings.cultureId, clubStock.cultureId),
        eq(clubListings.clubId, clubStock.clubId),
        isNull(clubListings.withdrawnAt),
      ),
    )
    .where(eq(clubStock.clubId, clubId))
    .orderBy(cultures.strainName, clubStock.cultureId);
}

/** Clubs where any of these cultures was listed or handed on: they hear about a quarantine. */
export async function clubsTouchingCultures(db: DbOrTx, cultureIds: string[]): Promise<string[]> {
  if (cultureIds.length === 0) return [];
  const ids = sql.join(
    cultureIds.map((id) => sql`${id}`),
    sql`, `,
  );
  const result = await db.execute<{ club_id: string }>(sql`
    select club_id from club_listings where culture_id in (${ids})
    union
    select club_id from strain_requests where culture_id in (${ids}) or received_culture_id in (${ids})
  `);
  return result.rows.map((r) => r.club_id);
}
