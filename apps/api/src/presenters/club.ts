import type {
  ClubDto,
  ClubInvitationDto,
  ClubMemberDto,
  InvitationPreviewDto,
  InvitationStatus,
} from '@barmkeep/schemas';
import type { ClubInvitationRow, ClubRole, ClubRow } from '../db/schema';

const iso = (d: Date | string) => new Date(d).toISOString();

export function presentClub(club: ClubRow, extra: { memberCount: number; myRole: ClubRole | null }): ClubDto {
  return {
    id: club.id,
    name: club.name,
    description: club.description,
    requestsNeedApproval: club.requestsNeedApproval,
    memberCount: extra.memberCount,
    myRole: extra.myRole,
    createdAt: iso(club.createdAt),
  };
}

export function presentMember(
  m: { userId: string; name: string; email: string; role: ClubRole; joinedAt: Date },
  showEmail: boolean,
): ClubMemberDto {
  return { userId: m.userId, name: m.name, email: showEmail ? m.email : null, role: m.role, joinedAt: iso(m.joinedAt) };
}

export function invitationStatus(inv: ClubInvitationRow, now: Date): InvitationStatus {
  if (inv.acceptedAt) return 'accepted';
  if (inv.revokedAt) return 'revoked';
  if (new Date(inv.expiresAt).getTime() <= now.getTime()) return 'expired';
  return 'pending';
}

export function presentInvitation(inv: ClubInvitationRow, invitedByName: string | null, now: Date): ClubInvitationDto {
  return {
    id: inv.id,
    email: inv.email,
    role: inv.role,
    invitedByName,
    status: invitationStatus(inv, now),
    expiresAt: iso(inv.expiresAt),
    createdAt: iso(inv.createdAt),
    acceptedAt: inv.acceptedAt ? iso(inv.acceptedAt) : null,
  };
}

export function presentInvitationPreview(
  inv: ClubInvitationRow,
  club: ClubRow,
  invitedByName: string | null,
  accountExists: boolean,
): InvitationPreviewDto {
  return {
    clubId: club.id,
    clubName: club.name,
    clubDescription: club.description,
    invitedByName,
    email: inv.email,
    role: inv.role,
    expiresAt: iso(inv.expiresAt),
    accountExists,
  };
}
