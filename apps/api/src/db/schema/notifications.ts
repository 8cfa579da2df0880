import { pgTable, text, timestamp, pgEnum, integer, index, uniqueIndex, date, check } from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import { users } from './users';

/** How a person wants notices by e-mail: each one as it fires, one digest a day, or none. */
export const emailDelivery = pgEnum('email_delivery', ['each', 'digest', 'none']);
/** Where a notice's e-mail stands. `skipped`: the person chose no e-mail, or the notice went stale. */
export const notificationEmailState = pgEnum('notification_email_state', ['pending', 'sent', 'skipped']);

/**
 * One notice for one person. Rules and other features write them through services/notify.ts; the
 * unique (user, kind, subject, dedupe key) index is what makes a notice fire once, whichever worker
 * or API instance evaluates the rule (inserts use ON CONFLICT DO NOTHING).
 */
export const notifications = pgTable(
  'notifications',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    /** the rule or feature, e.g. culture.viability, culture.storage, plan.step, club.request */
    kind: text('kind').notNull(),
    /** what it is about (a culture id, a plan step id, a request id) */
    subjectId: text('subject_id').notNull(),
    /** the threshold and stage within the subject, e.g. "50:warn:2025-03-01" */
    dedupeKey: text('dedupe_key').notNull(),
    title: text('title').notNull(),
    body: text('body').notNull().default(''),
    /** a path inside the app, e.g. /cultures/abc */
    link: text('link').notNull().default('/'),
    /** the instant the notice is about (crossing, due date, step start), when it has one */
    dueAt: timestamp('due_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    readAt: timestamp('read_at', { withTimezone: true }),
    emailState: notificationEmailState('email_state').notNull().default('pending'),
    /** set when a worker takes the e-mail; a claim older than a few minutes may be taken again */
    emailClaimedAt: timestamp('email_claimed_at', { withTimezone: true }),
    emailedAt: timestamp('emailed_at', { withTimezone: true }),
    digestId: text('digest_id'),
  },
  (t) => [
    uniqueIndex('notifications_dedupe_uq').on(t.userId, t.kind, t.subjectId, t.dedupeKey),
    index('notifications_user_created_idx').on(t.userId, t.createdAt),
    index('notifications_user_unread_idx')
      .on(t.userId)
      .where(sql`${t.readAt} is null`),
    index('notifications_email_pending_idx')
      .on(t.userId)
      .where(sql`${t.emailState} = 'pending'`),
  ],
);

/**
 * Per-person reminder settings. No row means every default below; the row is created the first
 * time the person saves settings or is sent an e-mail (which needs `email_token`).
 *
 * Defaults and their source:
 * - viability threshold 50%: below half alive a pitch needs a starter; the default and
 *   common practice [CP] (core `projectViability` gives the projection).
 * - warn 7 days before: a week leaves time to plan a starter or brew day [CP].
 * - generation limit 10: core `generationAdvice` — warn after 5, re-culture after 10 [CP].
 * - step lead 12 hours: a morning notice for an evening step [product default].
 * - digest at 07:00 local time [product default].
 */
export const notificationPreferences = pgTable(
  'notification_preferences',
  {
    userId: text('user_id')
      .primaryKey()
      .references(() => users.id, { onDelete: 'cascade' }),
    emailDelivery: emailDelivery('email_delivery').notNull().default('each'),
    digestHour: integer('digest_hour').notNull().default(7),
    viabilityThresholdPct: integer('viability_threshold_pct').notNull().default(50),
    warnDays: integer('warn_days').notNull().default(7),
    generationLimit: integer('generation_limit').notNull().default(10),
    stepLeadHours: integer('step_lead_hours').notNull().default(12),
    /** rule kinds the person turned off entirely (no in-app notice, no e-mail) */
    mutedKinds: text('muted_kinds')
      .array()
      .notNull()
      .default(sql`'{}'::text[]`),
    /** secret for the preferences / unsubscribe link in e-mail; works without signing in */
    emailToken: text('email_token').notNull().unique(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    check('notification_prefs_threshold', sql`${t.viabilityThresholdPct} between 1 and 99`),
    check('notification_prefs_warn', sql`${t.warnDays} between 0 and 60`),
    check('notification_prefs_digest_hour', sql`${t.digestHour} between 0 and 23`),
    check('notification_prefs_generation', sql`${t.generationLimit} between 1 and 200`),
    check('notification_prefs_lead', sql`${t.stepLeadHours} between 0 and 168`),
  ],
);

/** One daily digest per person per local date: the unique index stops a second worker sending it. */
export const notificationDigests = pgTable(
  'notification_digests',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    localDate: date('local_date').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp('sent_at', { withTimezone: true }),
  },
  (t) => [uniqueIndex('notification_digests_user_date_uq').on(t.userId, t.localDate)],
);

/**
 * A private iCalendar feed address. Only the SHA-256 of the secret is stored; the address is shown
 * once when made. Revoking sets `revoked_at`; at most one live feed per person.
 */
export const calendarFeeds = pgTable(
  'calendar_feeds',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    tokenHash: text('token_hash').notNull().unique(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    lastUsedAt: timestamp('last_used_at', { withTimezone: true }),
  },
  (t) => [
    uniqueIndex('calendar_feeds_one_live_uq')
      .on(t.userId)
      .where(sql`${t.revokedAt} is null`),
  ],
);

export type NotificationRow = typeof notifications.$inferSelect;
export type NotificationInsert = typeof notifications.$inferInsert;
export type NotificationPreferencesRow = typeof notificationPreferences.$inferSelect;
export type CalendarFeedRow = typeof calendarFeeds.$inferSelect;
