import type {
  ClubCreateInput,
  ClubInvitationCreateInput,
  ClubMemberUpdateInput,
  ClubUpdateInput,
  InvitationSignUpInput,
} from '@barmkeep/schemas';
import { clubLimits } from '@barmkeep/schemas';
import { AppError, conflict, forbidden, notFound, serviceUnavailable } from '../lib/errors';
import { newId, newSecretToken, sha256 } from '../lib/ids';
import { hashPassword } from '../lib/password';
import * as q from '../db/queries/clubs';
import { findUserByEmail, insertUser } from '../db/queries/users';
import type { ClubInvitationRow, ClubRole } from '../db/schema';
import type { Db } from '../db/client';
import { clubInvitationMail } from '../mail/templates';
import {
  presentClub,
  presentInvitation,
  presentInvitationPreview,
  presentMember,
  invitationStatus,
} from '../presenters/club';
import { loadClubFor, roleAtLeast, type ClubActor } from './clubAccess';
import type { ServiceContext } from './context';

export type Actor = ClubActor & { name: string; email: string };

const lastOwner = () =>
  conflict('last_owner', 'A club needs at least one owner. Make another member an owner first, or delete the club.');

export async function listMyClubs(ctx: ServiceContext, actor: Actor) {
  const rows = await q.listClubsOfUser(ctx.db, actor.id);
  return rows.map((r) => presentClub(r.club, { memberCount: r.memberCount, myRole: r.role }));
}

export async function createClub(ctx: ServiceContext, actor: Actor, input: ClubCreateInput) {
  const now = ctx.now();
  const club = await ctx.db.transaction(async (tx) => {
    const row = await q.insertClub(tx, {
      id: newId(),
      name: input.name,
      description: input.description,
      createdByUserId: actor.id,
    });
    await q.insertMembership(tx, { clubId: row.id, userId: actor.id, role: 'owner', joinedAt: now });
    return row;
  });
  return presentClub(club, { memberCount: 1, myRole: 'owner' });
}

export async function getClub(ctx: ServiceContext, actor: Actor, clubId: string) {
  const { club, role } = await loadClubFor(ctx.db, actor, clubId, 'view');
  return presentClub(club, { memberCount: await q.countMembers(ctx.db, clubId), myRole: role });
}

export async function updateClub(ctx: ServiceContext, actor: Actor, clubId: string, input: ClubUpdateInput) {
  const { role } = await loadClubFor(ctx.db, actor, clubId, 'owner');
  const club = await q.updateClub(ctx.db, clubId, input, ctx.now());
  if (!club) throw notFound('This club');
  return presentClub(club, { memberCount: await q.countMembers(ctx.db, clubId), myRole: role });
}

export async function deleteClub(ctx: ServiceContext, actor: Actor, clubId: string) {
  await loadClubFor(ctx.db, actor, clubId, 'moderate');
  await q.deleteClub(ctx.db, clubId);
}

export async function listClubMembers(ctx: ServiceContext, actor: Actor, clubId: string) {
  const access = await loadClubFor(ctx.db, actor, clubId, 'view');
  const showEmail = roleAtLeast(access.role, 'steward') || access.isSiteAdmin;
  const rows = await q.listMembers(ctx.db, clubId);
  return rows.map((m) => presentMember(m, showEmail));
}

/**
 * Owners change roles. Handing over is making someone else an owner; the last owner can never be
 * demoted. Membership changes of one club are serialised on the club row, so two owners stepping
 * down at the same moment cannot leave it ownerless.
 */
export async function changeMemberRole(
  ctx: ServiceContext,
  actor: Actor,
  clubId: string,
  userId: string,
  input: ClubMemberUpdateInput,
) {
  await loadClubFor(ctx.db, actor, clubId, 'owner');
  return ctx.db.transaction(async (tx) => {
    await q.lockClub(tx, clubId);
    const target = await q.findMembership(tx, clubId, userId);
    if (!target) throw notFound('This member');
    // Re-check under the lock: the actor may have stepped down in the meantime.
    const me = await q.findMembership(tx, clubId, actor.id);
    if (me?.role !== 'owner') throw forbidden('Only an owner of this club can do this');
    if (target.role === 'owner' && input.role !== 'owner' && (await q.countOwners(tx, clubId)) <= 1) throw lastOwner();
    await q.setMemberRole(tx, clubId, userId, input.role);
    const members = await q.listMembers(tx, clubId);
    const updated = members.find((m) => m.userId === userId)!;
    return presentMember(updated, true);
  });
}

async function removeFromClub(
  ctx: ServiceContext,
  clubId: string,
  userId: string,
  check: (tx: q.DbOrTx) => Promise<void>,
) {
  await ctx.db.transaction(async (tx) => {
    await q.lockClub(tx, clubId);
    await check(tx);
    const target = await q.findMembership(tx, clubId, userId);
    if (!target) throw notFound('This member');
    if (target.role === 'owner' && (await q.countOwners(tx, clubId)) <= 1) throw lastOwner();
    await q.deleteMembership(tx, clubId, userId);
  });
}

/** An owner removes someone (removing yourself is leaving). */
export async function removeMember(ctx: ServiceContext, actor: Actor, clubId: string, userId: string) {
  await loadClubFor(ctx.db, actor, clubId, 'owner');
  await removeFromClub(ctx, clubId, userId, async (tx) => {
    const me = await q.findMembership(tx, clubId, actor.id);
    if (me?.role !== 'owner') throw forbidden('Only an owner of this club can do this');
  });
}

export async function leaveClub(ctx: ServiceContext, actor: Actor, clubId: string) {
  await loadClubFor(ctx.db, actor, clubId, 'member');
  await removeFromClub(ctx, clubId, actor.id, async () => {});
}

/* Invitations */

const invitationClosed = (inv: ClubInvitationRow, now: Date) => {
  const status = invitationStatus(inv, now);
  const why =
    status === 'accepted'
      ? 'This invitation was already used.'
      : status === 'revoked'
        ? 'This invitation was withdrawn.'
        : 'This invitation has expired.';
  return new AppError(410, 'invitation_closed', `${why} Ask the club for a new one.`);
};
const unknownInvitation = () => notFound('This invitation');

export async function createInvitation(
  ctx: ServiceContext,
  actor: Actor,
  clubId: string,
  input: ClubInvitationCreateInput,
) {
  const { club } = await loadClubFor(ctx.db, actor, clubId, input.role === 'member' ? 'steward' : 'owner');
  const existing = await findUserByEmail(ctx.db, input.email);
  if (existing && (await q.findMembership(ctx.db, clubId, existing.id))) {
    throw conflict('already_member', 'This person already belongs to the club', {
      'body.email': ['This person already belongs to the club'],
    });
  }
  const now = ctx.now();
  const token = newSecretToken();
  const expiresAt = new Date(now.getTime() + clubLimits.invitationDays * 86_400_000);
  const invitation = await ctx.db.transaction(async (tx) => {
    // one open invitation per e-mail: invitations to the club queue on its row, so two sent at the
    // same instant leave the later one open and the earlier withdrawn
    await q.lockClub(tx, clubId);
    await q.revokeOpenInvitationsFor(tx, clubId, input.email, now);
    return q.insertInvitation(tx, {
      id: newId(),
      clubId,
      email: input.email,
      role: input.role,
      tokenHash: sha256(token),
      invitedByUserId: actor.id,
      expiresAt,
      createdAt: now,
    });
  });
  const link = `${ctx.appUrl}/invitation?token=${encodeURIComponent(token)}`;
  try {
    await ctx.mailer.send(
      clubInvitationMail({
        to: input.email,
        clubName: club.name,
        inviterName: actor.name,
        role: input.role,
        message: input.message,
        link,
        validDays: clubLimits.invitationDays,
      }),
    );
  } catch {
    // Nobody can use an invitation that was never delivered: withdraw it and say so.
    await q.revokeInvitation(ctx.db, invitation.id, now);
    throw serviceUnavailable();
  }
  return presentInvitation(invitation, actor.name, now);
}

export async function listClubInvitations(ctx: ServiceContext, actor: Actor, clubId: string) {
  await loadClubFor(ctx.db, actor, clubId, 'steward');
  const now = ctx.now();
  const rows = await q.listInvitations(ctx.db, clubId);
  return rows.map((r) => presentInvitation(r.invitation, r.invitedByName, now));
}

export async function revokeClubInvitation(ctx: ServiceContext, actor: Actor, clubId: string, invitationId: string) {
  await loadClubFor(ctx.db, actor, clubId, 'steward');
  const inv = await q.findInvitationInClub(ctx.db, clubId, invitationId);
  if (!inv) throw notFound('This invitation');
  const now = ctx.now();
  if (invitationStatus(inv, now) !== 'pending') {
    throw conflict('invitation_not_pending', 'Only an invitation that is still open can be withdrawn');
  }
  const row = await q.revokeInvitation(ctx.db, invitationId, now);
  if (!row) throw conflict('invitation_not_pending', 'Only an invitation that is still open can be withdrawn');
  return presentInvitation(row, null, now);
}

/** Whoever holds the link may see what it is for (the token is the secret). */
export async function previewInvitation(ctx: ServiceContext, token: string) {
  const found = await q.findInvitationByTokenHash(ctx.db, sha256(token));
  if (!found) throw unknownInvitation();
  const now = ctx.now();
  if (invitationStatus(found.invitation, now) !== 'pending') throw invitationClosed(found.invitation, now);
  const account = await findUserByEmail(ctx.db, found.invitation.email);
  return presentInvitationPreview(found.invitation, found.club, found.invitedByName, Boolean(account));
}

async function joinThrough(tx: q.DbOrTx, invitation: ClubInvitationRow, userId: string, now: Date) {
  await q.lockClub(tx, invitation.clubId);
  if (await q.findMembership(tx, invitation.clubId, userId)) {
    throw conflict('already_member', 'You already belong to this club');
  }
  const taken = await q.consumeInvitation(tx, invitation.id, userId, now);
  if (!taken) throw invitationClosed(invitation, now);
  await q.insertMembership(tx, { clubId: invitation.clubId, userId, role: invitation.role as ClubRole, joinedAt: now });
}

/** A signed-in person accepts: only the account with the invited e-mail may. */
export async function acceptInvitation(ctx: ServiceContext, actor: Actor, token: string) {
  const found = await q.findInvitationByTokenHash(ctx.db, sha256(token));
  if (!found) throw unknownInvitation();
  const now = ctx.now();
  if (invitationStatus(found.invitation, now) !== 'pending') throw invitationClosed(found.invitation, now);
  if (found.invitation.email !== actor.email.toLowerCase()) {
    throw new AppError(
      403,
      'invitation_for_someone_else',
      `This invitation is for ${found.invitation.email}. Sign in with that account to accept it.`,
    );
  }
  await ctx.db.transaction((tx) => joinThrough(tx, found.invitation, actor.id, now));
  return getClub(ctx, actor, found.club.id);
}

/** An invitee without an account creates one with the invited e-mail and joins in one step. */
export async function signUpThroughInvitation(ctx: ServiceContext, input: InvitationSignUpInput) {
  const found = await q.findInvitationByTokenHash(ctx.db, sha256(input.token));
  if (!found) throw unknownInvitation();
  const now = ctx.now();
  if (invitationStatus(found.invitation, now) !== 'pending') throw invitationClosed(found.invitation, now);
  const passwordHash = await hashPassword(input.password);
  const user = await ctx.db.transaction(async (tx) => {
    const created = await insertUser(tx as unknown as Db, {
      id: newId(),
      email: found.invitation.email,
      name: input.name,
      passwordHash,
    });
    if (!created) {
      throw conflict(
        'email_taken',
        `An account with ${found.invitation.email} already exists. Sign in to accept the invitation.`,
      );
    }
    await joinThrough(tx, found.invitation, created.id, now);
    return created;
  });
  const session = await ctx.lucia.createSession(user.id, {});
  return { user, session, clubId: found.club.id };
}
