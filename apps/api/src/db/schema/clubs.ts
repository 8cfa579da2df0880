import { pgTable, text, timestamp, pgEnum, primaryKey, index, boolean } from 'drizzle-orm/pg-core';
import { users } from './users';

export const clubRole = pgEnum('club_role', ['owner', 'steward', 'member']);

export const clubs = pgTable('clubs', {
  id: text('id').primaryKey(),
  name: text('name').notNull(),
  description: text('description').notNull().default(''),
  /** When true, a steward approves every strain request before the keeper sees it. */
  requestsNeedApproval: boolean('requests_need_approval').notNull().default(false),
  createdByUserId: text('created_by_user_id').references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
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

/**
 * An invitation by e-mail. Only the SHA-256 of the token is stored; the raw token exists only in the
 * mail. It works once (accepted_at), until expires_at, unless revoked; the invited e-mail must be the
 * account that accepts it.
 */
export const clubInvitations = pgTable(
  'club_invitations',
  {
    id: text('id').primaryKey(),
    clubId: text('club_id')
      .notNull()
      .references(() => clubs.id, { onDelete: 'cascade' }),
    email: text('email').notNull(),
    role: clubRole('role').notNull().default('member'),
    tokenHash: text('token_hash').notNull().unique(),
    invitedByUserId: text('invited_by_user_id').references(() => users.id, { onDelete: 'set null' }),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    acceptedAt: timestamp('accepted_at', { withTimezone: true }),
    acceptedByUserId: text('accepted_by_user_id').references(() => users.id, { onDelete: 'set null' }),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('club_invitations_club_idx').on(t.clubId, t.createdAt),
    index('club_invitations_email_idx').on(t.email),
  ],
);

export type ClubRole = (typeof clubRole.enumValues)[number];
export type ClubRow = typeof clubs.$inferSelect;
export type MembershipRow = typeof memberships.$inferSelect;
export type ClubInvitationRow = typeof clubInvitations.$inferSelect;
