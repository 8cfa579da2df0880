import { and, asc, desc, eq, gt, isNull, sql } from 'drizzle-orm';
import type { Db } from '../client';
import { clubInvitations, clubs, memberships, users, type ClubRole, type ClubRow } from '../schema';

/** A Db or a transaction on it: the queries below work on either. */
export type DbOrTx = Db | Parameters<Parameters<Db['transaction']>[0]>[0];

export async function insertClub(
  db: DbOrTx,
  values: { id: string; name: string; description: string; createdByUserId: string },
) {
  const [row] = await db.insert(clubs).values(values).returning();
  return row!;
}

export async function findClubById(db: DbOrTx, clubId: string): Promise<ClubRow | undefined> {
  const [row] = await db.select().from(clubs).where(eq(clubs.id, clubId)).limit(1);
  return row;
}

/** Locks the club row: membership changes of one club run one after the other. */
export async function lockClub(db: DbOrTx, clubId: string): Promise<ClubRow | undefined> {
  const [row] = await db.select().from(clubs).where(eq(clubs.id, clubId)).for('update').limit(1);
  return row;
}

export async function updateClub(
  db: DbOrTx,
  clubId: string,
  values: Partial<Pick<ClubRow, 'name' | 'description' | 'requestsNeedApproval'>>,
  now: Date,
) {
  const [row] = await db
    .update(clubs)
    .set({ ...values, updatedAt: now })
    .where(eq(clubs.id, clubId))
    .returning();
  return row;
}

export async function deleteClub(db: DbOrTx, clubId: string) {
  await db.delete(clubs).where(eq(clubs.id, clubId));
}

export async function countMembers(db: DbOrTx, clubId: string): Promise<number> {
  const [row] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(memberships)
    .where(eq(memberships.clubId, clubId));
  return row?.n ?? 0;
}

export async function countOwners(db: DbOrTx, clubId: string): Promise<number> {
  const [row] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(memberships)
    .where(and(eq(memberships.clubId, clubId), eq(memberships.role, 'owner')));
  return row?.n ?? 0;
}

/** The clubs a person belongs to, with their role and the member count, by name. */
export async function listClubsOfUser(db: DbOrTx, userId: string) {
  return db
    .select({
      club: clubs,
      role: memberships.role,
      memberCount: sql<number>`(select count(*)::int from ${memberships} m where m.club_id = ${clubs.id})`,
    })
    .from(memberships)
    .innerJoin(clubs, eq(clubs.id, memberships.clubId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(clubs.name), asc(clubs.id));
}

export async function findMembership(db: DbOrTx, clubId: string, userId: string) {
  const [row] = await db
    .select()
    .from(memberships)
    .where(and(eq(memberships.clubId, clubId), eq(memberships.userId, userId)))
    .limit(1);
  return row;
}

export async function listMembers(db: DbOrTx, clubId: string) {
  return db
    .select({
      userId: memberships.userId,
      role: memberships.role,
      joinedAt: memberships.joinedAt,
      name: users.name,
      email: users.email,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.clubId, clubId))
    .orderBy(
      sql`case ${memberships.role} when 'owner' then 0 when 'steward' then 1 else 2 end`,
      asc(users.name),
      asc(users.id),
    );
}

/** Returns false when the person already belongs to the club (their role is left as it is). */
export async function insertMembership(
  db: DbOrTx,
  values: { clubId: string; userId: string; role: ClubRole; joinedAt: Date },
) {
  const rows = await db
    .insert(memberships)
    .values(values)
    .onConflictDoNothing()
    .returning({ userId: memberships.userId });
  return rows.length > 0;
}

export async function setMemberRole(db: DbOrTx, clubId: string, userId: string, role: ClubRole) {
  const [row] = await db
    .update(memberships)
    .set({ role })
    .where(and(eq(memberships.clubId, clubId), eq(memberships.userId, userId)))
    .returning();
  return row;
}

export async function deleteMembership(db: DbOrTx, clubId: string, userId: string) {
  await db.delete(memberships).where(and(eq(memberships.clubId, clubId), eq(memberships.userId, userId)));
}

/* Invitations */

export async function insertInvitation(
  db: DbOrTx,
  values: {
    id: string;
    clubId: string;
    email: string;
    role: ClubRole;
    tokenHash: string;
    invitedByUserId: string;
    expiresAt: Date;
    createdAt: Date;
  },
) {
  const [row] = await db.insert(clubInvitations).values(values).returning();
  return row!;
}

/** Revokes every still-open invitation of this e-mail to this club (a new one replaces them). */
export async function revokeOpenInvitationsFor(db: DbOrTx, clubId: string, email: string, now: Date) {
  await db
    .update(clubInvitations)
    .set({ revokedAt: now })
    .where(
      and(
        eq(clubInvitations.clubId, clubId),
        eq(clubInvitations.email, email),
        isNull(clubInvitations.acceptedAt),
        isNull(clubInvitations.revokedAt),
      ),
    );
}

export async function listInvitations(db: DbOrTx, clubId: string, limit = 100) {
  return db
    .select({ invitation: clubInvitations, invitedByName: users.name })
    .from(clubInvitations)
    .leftJoin(users, eq(users.id, clubInvitations.invitedByUserId))
    .where(eq(clubInvitations.clubId, clubId))
    .orderBy(desc(clubInvitations.createdAt), desc(clubInvitations.id))
    .limit(limit);
}

export async function findInvitationInClub(db: DbOrTx, clubId: string, invitationId: string) {
  const [row] = await db
    .select()
    .from(clubInvitations)
    .where(and(eq(clubInvitations.clubId, clubId), eq(clubInvitations.id, invitationId)))
    .limit(1);
  return row;
}

export async function revokeInvitation(db: DbOrTx, invitationId: string, now: Date) {
  const [row] = await db
    .update(clubInvitations)
    .set({ revokedAt: now })
    .where(
      and(eq(clubInvitations.id, invitationId), isNull(clubInvitations.acceptedAt), isNull(clubInvitations.revokedAt)),
    )
    .returning();
  return row;
}

/** An invitation by token with its club and inviter, whatever its state (the caller decides). */
export async function findInvitationByTokenHash(db: DbOrTx, tokenHash: string) {
  const [row] = await db
    .select({ invitation: clubInvitations, club: clubs, invitedByName: users.name })
    .from(clubInvitations)
    .innerJoin(clubs, eq(clubs.id, clubInvitations.clubId))
    .leftJoin(users, eq(users.id, clubInvitations.invitedByUserId))
    .where(eq(clubInvitations.tokenHash, tokenHash))
    .limit(1);
  return row;
}

/** Takes an invitation exactly once: marks it accepted if it was open at `now`. */
export async function consumeInvitation(db: DbOrTx, invitationId: string, userId: string, now: Date) {
  const [row] = await db
    .update(clubInvitations)
    .set({ acceptedAt: now, acceptedByUserId: userId })
    .where(
      and(
        eq(clubInvitations.id, invitationId),
        isNull(clubInvitations.acceptedAt),
        isNull(clubInvitations.revokedAt),
        gt(clubInvitations.expiresAt, now),
      ),
    )
    .returning();
  return row;
}

/** The clubs a person belongs to and everyone who shares at least one of them (the person included). */
export async function findClubTies(db: DbOrTx, userId: string) {
  const result = await db.execute<{ club_id: string; user_id: string }>(sql`
    select m.club_id, m.user_id
    from memberships mine join memberships m on m.club_id = mine.club_id
    where mine.user_id = ${userId}
  `);
  return {
    clubIds: new Set(result.rows.map((r) => r.club_id)),
    coMemberIds: new Set(result.rows.map((r) => r.user_id)),
  };
}
