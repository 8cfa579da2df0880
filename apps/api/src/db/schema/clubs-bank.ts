import { pgTable, text, timestamp, pgEnum, index, uniqueIndex, jsonb, integer, check } from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import { CLUB_ACTIVITY_KINDS } from '@barmkeep/schemas';
import { users } from './users';
import { clubs } from './clubs';
import { cultures, cultureForm } from './cultures';

/**
 * A member offers one of their cultures in a club's bank. The culture stays theirs and private;
 * the bank shows a summary (strain, keeper, form, generation, projected viability), never notes or
 * photos. At most one live listing per culture and club.
 */
export const clubListings = pgTable(
  'club_listings',
  {
    id: text('id').primaryKey(),
    clubId: text('club_id')
      .notNull()
      .references(() => clubs.id, { onDelete: 'cascade' }),
    cultureId: text('culture_id')
      .notNull()
      .references(() => cultures.id, { onDelete: 'cascade' }),
    listedByUserId: text('listed_by_user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    note: text('note').notNull().default(''),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    withdrawnAt: timestamp('withdrawn_at', { withTimezone: true }),
  },
  (t) => [
    uniqueIndex('club_listings_live_uq')
      .on(t.clubId, t.cultureId)
      .where(sql`${t.withdrawnAt} is null`),
    index('club_listings_club_idx').on(t.clubId, t.createdAt),
  ],
);

export const strainRequestStatus = pgEnum('strain_request_status', [
  'awaiting_approval',
  'open',
  'proposed',
  'accepted',
  'declined',
  'received',
  'cancelled',
]);

/** A member asks the keeper of a listed culture for some of it. */
export const strainRequests = pgTable(
  'strain_requests',
  {
    id: text('id').primaryKey(),
    clubId: text('club_id')
      .notNull()
      .references(() => clubs.id, { onDelete: 'cascade' }),
    listingId: text('listing_id')
      .notNull()
      .references(() => clubListings.id, { onDelete: 'cascade' }),
    cultureId: text('culture_id')
      .notNull()
      .references(() => cultures.id, { onDelete: 'cascade' }),
    requesterUserId: text('requester_user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    keeperUserId: text('keeper_user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    message: text('message').notNull().default(''),
    neededBy: timestamp('needed_by', { withTimezone: true }),
    wantedForm: cultureForm('wanted_form'),
    status: strainRequestStatus('status').notNull(),
    /** the keeper's answer: a note, and a proposed other time */
    responseNote: text('response_note').notNull().default(''),
    proposedAt: timestamp('proposed_at', { withTimezone: true }),
    /** the recipient's new culture, once they confirmed receipt */
    receivedCultureId: text('received_culture_id').references(() => cultures.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('strain_requests_club_idx').on(t.clubId, t.createdAt),
    index('strain_requests_keeper_idx').on(t.keeperUserId, t.status),
    index('strain_requests_requester_idx').on(t.requesterUserId, t.status),
  ],
);

export const clubActivityKind = pgEnum('club_activity_kind', CLUB_ACTIVITY_KINDS);

/** The club's feed, newest first; each row is a sentence's worth of facts, not free text. */
export const clubActivity = pgTable(
  'club_activity',
  {
    id: text('id').primaryKey(),
    clubId: text('club_id')
      .notNull()
      .references(() => clubs.id, { onDelete: 'cascade' }),
    actorUserId: text('actor_user_id').references(() => users.id, { onDelete: 'set null' }),
    kind: clubActivityKind('kind').notNull(),
    cultureId: text('culture_id').references(() => cultures.id, { onDelete: 'set null' }),
    requestId: text('request_id').references(() => strainRequests.id, { onDelete: 'set null' }),
    data: jsonb('data').$type<Record<string, unknown>>().notNull().default({}),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('club_activity_club_idx').on(t.clubId, t.createdAt, t.id)],
);

export type ClubListingRow = typeof clubListings.$inferSelect;
export type StrainRequestRow = typeof strainRequests.$inferSelect;
export type ClubActivityRow = typeof clubActivity.$inferSelect;

export const clubStockUnit = pgEnum('club_stock_unit', ['vial', 'slant', 'plate', 'pack']);

/**
 * Club-owned stock: a culture whose owner is the club (cultures.owner_club_id), kept by a steward
 * (cultures.owner_user_id, who holds it physically), with a count of identical units (vials of a
 * frozen library, slants). "Withdraw one" takes a unit and starts the recipient's culture under it.
 */
export const clubStock = pgTable(
  'club_stock',
  {
    cultureId: text('culture_id')
      .primaryKey()
      .references(() => cultures.id, { onDelete: 'cascade' }),
    clubId: text('club_id')
      .notNull()
      .references(() => clubs.id, { onDelete: 'cascade' }),
    unit: clubStockUnit('unit').notNull(),
    unitsLeft: integer('units_left').notNull(),
    addedByUserId: text('added_by_user_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('club_stock_club_idx').on(t.clubId),
    check('club_stock_units_range', sql`${t.unitsLeft} >= 0 and ${t.unitsLeft} <= 10000`),
  ],
);

export type ClubStockRow = typeof clubStock.$inferSelect;
