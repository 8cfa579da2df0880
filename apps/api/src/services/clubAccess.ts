import type { ClubRole, ClubRow } from '../db/schema';
import { findClubById, findMembership, type DbOrTx } from '../db/queries/clubs';
import { forbidden, notFound } from '../lib/errors';

/**
 * Who may do what in a club. THE one place that decides it: every club service asks here.
 *
 * - A person who is neither a member nor a site admin gets 404 for everything about a club, so a
 *   club's existence never leaks.
 * - `view`: any member, or a site admin (read-only moderation).
 * - `member`: any member (admins who are not members cannot act as one).
 * - `steward`: stewards and owners (curate the bank, invite members).
 * - `owner`: owners only (settings, roles, invitations above member).
 * - `moderate`: owners or a site admin (deleting the club).
 */
export type ClubNeed = 'view' | 'member' | 'steward' | 'owner' | 'moderate';

export interface ClubActor {
  id: string;
  role: 'user' | 'admin';
}

export interface ClubAccess {
  club: ClubRow;
  /** the actor's role in this club; null for a site admin who is not a member */
  role: ClubRole | null;
  isSiteAdmin: boolean;
}

const rank: Record<ClubRole, number> = { member: 1, steward: 2, owner: 3 };

export const roleAtLeast = (role: ClubRole | null, least: ClubRole) => role !== null && rank[role] >= rank[least];

export function allows(access: Omit<ClubAccess, 'club'>, need: ClubNeed): boolean {
  switch (need) {
    case 'view':
      return access.role !== null || access.isSiteAdmin;
    case 'member':
      return access.role !== null;
    case 'steward':
      return roleAtLeast(access.role, 'steward');
    case 'owner':
      return access.role === 'owner';
    case 'moderate':
      return access.role === 'owner' || access.isSiteAdmin;
  }
}

const messages: Record<ClubNeed, string> = {
  view: 'Only members can see this club',
  member: 'Only members of this club can do this',
  steward: 'Only the club’s stewards and owners can do this',
  owner: 'Only an owner of this club can do this',
  moderate: 'Only an owner of this club can do this',
};

/** Loads the club and the actor's standing in it, or throws 404 (invisible) / 403 (not enough). */
export async function loadClubFor(db: DbOrTx, actor: ClubActor, clubId: string, need: ClubNeed): Promise<ClubAccess> {
  const club = await findClubById(db, clubId);
  if (!club) throw notFound('This club');
  const membership = await findMembership(db, clubId, actor.id);
  const access: ClubAccess = { club, role: membership?.role ?? null, isSiteAdmin: actor.role === 'admin' };
  if (!allows(access, 'view')) throw notFound('This club');
  if (!allows(access, need)) throw forbidden(messages[need]);
  return access;
}
