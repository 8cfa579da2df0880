import { pgTable, text, timestamp, pgEnum, primaryKey, index } from 'drizzle-orm/pg-core';
import { users } from './users';

export const clubRole = pgEnum('club_role', ['owner', 'steward', 'member']);

export const clubs = pgTable('clubs', {
  id: text('id').primaryKey(),
  name: text('name').notNull(),
  description: text('description').notNull().default(''),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export const memberships = pgTable(
  'memberships',
  {
    clubId: text('club_id')
      .notNull()
      .references(() => clubs.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: clubRole('role').notNull().default('member'),
    joinedAt: timestamp('joined_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.clubId, t.userId] }), index('memberships_user_idx').on(t.userId)],
);

export type ClubRole = (typeof clubRole.enumValues)[number];
