import { pgTable, text, timestamp, pgEnum, index, integer } from 'drizzle-orm/pg-core';

export const siteRole = pgEnum('site_role', ['user', 'admin']);
export const unitSystem = pgEnum('unit_system', ['metric', 'us']);
export const temperatureUnit = pgEnum('temperature_unit', ['C', 'F']);
export const gravityUnit = pgEnum('gravity_unit', ['sg', 'plato']);

export const users = pgTable('users', {
  id: text('id').primaryKey(),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  passwordHash: text('password_hash').notNull(),
  role: siteRole('role').notNull().default('user'),
  unitSystem: unitSystem('unit_system').notNull().default('metric'),
  temperatureUnit: temperatureUnit('temperature_unit').notNull().default('C'),
  gravityUnit: gravityUnit('gravity_unit').notNull().default('sg'),
  timeZone: text('time_zone').notNull().default('UTC'),
  /** the number in the person's last culture label code (cultures.label_code); a trigger counts it up */
  cultureLabelSeq: integer('culture_label_seq').notNull().default(0),
  /** how many cultures the person keeps (owner_user_id): the library's unfiltered total; triggers keep it */
  cultureCount: integer('culture_count').notNull().default(0),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

export const sessions = pgTable(
  'sessions',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

/** Reset tokens are stored as a SHA-256 hash; the raw token only ever exists in the e-mail. */
export const passwordResetTokens = pgTable(
  'password_reset_tokens',
  {
    tokenHash: text('token_hash').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('password_reset_tokens_user_idx').on(t.userId)],
);

export type UserRow = typeof users.$inferSelect;
