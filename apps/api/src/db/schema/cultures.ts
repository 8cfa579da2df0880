import {
  pgTable,
  text,
  timestamp,
  pgEnum,
  integer,
  real,
  jsonb,
  index,
  uniqueIndex,
  boolean,
  check,
  type AnyPgColumn,
} from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import { CULTURE_FORMS } from '@barmkeep/core';
import {
  CULTURE_ORIGINS,
  CULTURE_STATES,
  CULTURE_VISIBILITIES,
  CULTURE_EVENT_KINDS,
  type CultureAmount,
  type CultureOriginDetails,
} from '@barmkeep/schemas';
import { users } from './users';
import { clubs } from './clubs';

export const cultureForm = pgEnum('culture_form', CULTURE_FORMS);
export const cultureOrigin = pgEnum('culture_origin', CULTURE_ORIGINS);
export const cultureState = pgEnum('culture_state', CULTURE_STATES);
export const cultureVisibility = pgEnum('culture_visibility', CULTURE_VISIBILITIES);
export const cultureEventKind = pgEnum('culture_event_kind', CULTURE_EVENT_KINDS);

/**
 * One vessel or package of living yeast. `generation` is derived from the lineage when the row is
 * written (see docs/decisions/0020-culture-generation.md); `attention_due_at` is the date core's
 * storage policy says the culture needs a starter, a subculture or the bin, so the library can sort
 * and page on it in SQL.
 */
export const cultures = pgTable(
  'cultures',
  {
    id: text('id').primaryKey(),
    ownerUserId: text('owner_user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    /** Set by the clubs work; access goes through services/cultureAccess.ts only. */
    ownerClubId: text('owner_club_id').references(() => clubs.id, { onDelete: 'set null' }),
    visibility: cultureVisibility('visibility').notNull().default('private'),
    parentId: text('parent_id').references((): AnyPgColumn => cultures.id, { onDelete: 'no action' }),
    generation: integer('generation').notNull().default(0),
    strainName: text('strain_name').notNull(),
    /**
     * The short code printed on the jar, unique per owner: the strain's first letter and the
     * owner's running number, e.g. "C-017". Assigned by a trigger (drizzle/0012) when the row is
     * inserted or changes owner, whatever the writer put there.
     */
    labelCode: text('label_code').notNull().default(''),
    species: text('species'),
    tags: text('tags')
      .array()
      .notNull()
      .default(sql`'{}'::text[]`),
    origin: cultureOrigin('origin').notNull(),
    originDetails: jsonb('origin_details').$type<CultureOriginDetails>().notNull(),
    form: cultureForm('form').notNull(),
    amount: jsonb('amount').$type<CultureAmount>().notNull().default({}),
    locationLabel: text('location_label').notNull().default(''),
    storageTempC: real('storage_temp_c').notNull(),
    /** made (packs) or harvested/frozen: the start of the viability projection */
    madeAt: timestamp('made_at', { withTimezone: true }).notNull(),
    state: cultureState('state').notNull().default('stored'),
    stateChangedAt: timestamp('state_changed_at', { withTimezone: true }).notNull().defaultNow(),
    stateChangedBy: text('state_changed_by').references(() => users.id, { onDelete: 'set null' }),
    /** latest effective count: anchors the projection at a measured viability */
    measuredAt: timestamp('measured_at', { withTimezone: true }),
    measuredViability: real('measured_viability'),
    measuredCellsPerMl: real('measured_cells_per_ml'),
    attentionDueAt: timestamp('attention_due_at', { withTimezone: true }),
    /**
     * When core's `viabilityCrossingAt` says projected viability falls to the owner's threshold (null:
     * never, or not a kept culture). Kept by the reminders pass, not by writers: a trigger sets
     * `viability_stale` whenever an input changes (form, temperature, made/measured, state, owner) or
     * the owner's threshold changes, and the pass recomputes stale rows in bulk before it reads this.
     */
    viabilityCrossingAt: timestamp('viability_crossing_at', { withTimezone: true }),
    viabilityStale: boolean('viability_stale').notNull().default(true),
    /**
     * What the pass still has to look at. `viability_check_at` is the crossing while its "on the
     * day" notice is not stored, `storage_check_at` the same for `attention_due_at`; the pass clears
     * them once that notice is stored (marks.ts), the recompute (viability) and a trigger (when the
     * due date moves) set them again. Only pending rows are in their indexes, so the range queries
     * read few rows and the planner's statistics see only what is pending.
     * `generation_noticed`: the notice at the owner's current generation limit is stored (cleared
     * when the generation or the limit changes).
     */
    viabilityCheckAt: timestamp('viability_check_at', { withTimezone: true }),
    storageCheckAt: timestamp('storage_check_at', { withTimezone: true }),
    generationNoticed: boolean('generation_noticed').notNull().default(false),
    /** set when an ancestor was confirmed contaminated */
    suspect: boolean('suspect').notNull().default(false),
    suspectFromCultureId: text('suspect_from_culture_id').references((): AnyPgColumn => cultures.id, {
      onDelete: 'set null',
    }),
    suspectSince: timestamp('suspect_since', { withTimezone: true }),
    notes: text('notes').notNull().default(''),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('cultures_owner_attention_idx').on(t.ownerUserId, t.attentionDueAt, t.id),
    index('cultures_owner_club_idx').on(t.ownerClubId),
    uniqueIndex('cultures_owner_label_code_uq').on(t.ownerUserId, t.labelCode),
    index('cultures_parent_idx').on(t.parentId),
    index('cultures_viability_check_idx')
      .on(t.viabilityCheckAt)
      .where(sql`${t.viabilityCheckAt} is not null`),
    index('cultures_storage_check_idx')
      .on(t.storageCheckAt)
      .where(sql`${t.storageCheckAt} is not null and ${t.state} in ('active', 'stored')`),
    index('cultures_generation_unnoticed_idx')
      .on(t.generation)
      .where(sql`not ${t.generationNoticed} and ${t.state} in ('active', 'stored')`),
    index('cultures_best_by_idx')
      .on(t.ownerUserId)
      .where(
        sql`${t.origin} = 'purchased' and ${t.form} in ('liquid_pack', 'dry_pack') and ${t.originDetails} ? 'bestBy' and ${t.state} in ('active', 'stored')`,
      ),
    index('cultures_viability_stale_idx')
      .on(t.id)
      .where(sql`${t.viabilityStale}`),
    check('cultures_not_own_parent', sql`${t.parentId} is null or ${t.parentId} <> ${t.id}`),
    check('cultures_generation_range', sql`${t.generation} >= 0 and ${t.generation} <= 1000`),
  ],
);

/** The handling log. Append-only: a trigger refuses UPDATE; a correction supersedes. */
export const cultureEvents = pgTable(
  'culture_events',
  {
    id: text('id').primaryKey(),
    cultureId: text('culture_id')
      .notNull()
      .references(() => cultures.id, { onDelete: 'cascade' }),
    authorUserId: text('author_user_id').references(() => users.id, { onDelete: 'set null' }),
    kind: cultureEventKind('kind').notNull(),
    occurredAt: timestamp('occurred_at', { withTimezone: true }).notNull(),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
    notes: text('notes').notNull().default(''),
    data: jsonb('data').$type<Record<string, unknown>>().notNull().default({}),
    supersedesEventId: text('supersedes_event_id').references((): AnyPgColumn => cultureEvents.id, {
      onDelete: 'cascade',
    }),
  },
  (t) => [
    index('culture_events_culture_idx').on(t.cultureId, t.occurredAt),
    index('culture_events_supersedes_idx').on(t.supersedesEventId),
  ],
);

export const culturePhotos = pgTable(
  'culture_photos',
  {
    id: text('id').primaryKey(),
    cultureId: text('culture_id')
      .notNull()
      .references(() => cultures.id, { onDelete: 'cascade' }),
    eventId: text('event_id').references(() => cultureEvents.id, { onDelete: 'set null' }),
    uploadedBy: text('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
    caption: text('caption').notNull().default(''),
    /** storage keys of the re-encoded web-size image and its thumbnail */
    webKey: text('web_key').notNull(),
    thumbKey: text('thumb_key').notNull(),
    contentType: text('content_type').notNull(),
    width: integer('width').notNull(),
    height: integer('height').notNull(),
    bytes: integer('bytes').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('culture_photos_culture_idx').on(t.cultureId, t.createdAt)],
);

export type CultureRow = typeof cultures.$inferSelect;
export type CultureInsert = typeof cultures.$inferInsert;
export type CultureEventRow = typeof cultureEvents.$inferSelect;
export type CulturePhotoRow = typeof culturePhotos.$inferSelect;
