import { z } from 'zod';
import { emailField, displayNameField, passwordField } from './auth';

export const CLUB_ROLES = ['owner', 'steward', 'member'] as const;
export type ClubRoleName = (typeof CLUB_ROLES)[number];

export const clubLimits = {
  clubNameMax: 80,
  clubDescriptionMax: 1000,
  invitationDays: 7,
} as const;

const clubName = z
  .string({ error: 'Give the club a name' })
  .trim()
  .min(2, 'Use at least 2 characters')
  .max(clubLimits.clubNameMax, `At most ${clubLimits.clubNameMax} characters`);

const clubDescription = z
  .string()
  .trim()
  .max(clubLimits.clubDescriptionMax, `At most ${clubLimits.clubDescriptionMax} characters`);

/** Ids in paths: our ids are short url-safe strings; anything else cannot exist. */
const rowId = z
  .string()
  .min(1)
  .max(64)
  .regex(/^[A-Za-z0-9_-]+$/, 'Not a valid id');

export const ClubCreateSchema = z.object({
  name: clubName,
  description: clubDescription.default(''),
});
export type ClubCreateInput = z.infer<typeof ClubCreateSchema>;

export const ClubUpdateSchema = z
  .object({
    name: clubName,
    description: clubDescription,
    requestsNeedApproval: z.boolean(),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one setting');
export type ClubUpdateInput = z.infer<typeof ClubUpdateSchema>;

export const ClubParamsSchema = z.object({ clubId: rowId });
export const ClubMemberParamsSchema = z.object({ clubId: rowId, userId: rowId });
export const ClubInvitationParamsSchema = z.object({ clubId: rowId, invitationId: rowId });

export const ClubMemberUpdateSchema = z.object({
  role: z.enum(CLUB_ROLES, { error: 'Choose owner, steward or member' }),
});
export type ClubMemberUpdateInput = z.infer<typeof ClubMemberUpdateSchema>;

export const ClubInvitationCreateSchema = z.object({
  email: emailField,
  role: z.enum(CLUB_ROLES, { error: 'Choose owner, steward or member' }).default('member'),
  message: z.string().trim().max(500, 'At most 500 characters').default(''),
});
export type ClubInvitationCreateInput = z.infer<typeof ClubInvitationCreateSchema>;

const invitationToken = z
  .string({ error: 'This invitation link is not valid' })
  .min(20, 'This invitation link is not valid')
  .max(200, 'This invitation link is not valid');

export const InvitationLookupSchema = z.object({ token: invitationToken });
export type InvitationLookupInput = z.infer<typeof InvitationLookupSchema>;

export const InvitationAcceptSchema = z.object({ token: invitationToken });
export type InvitationAcceptInput = z.infer<typeof InvitationAcceptSchema>;

/** An invitee without an account: the e-mail comes from the invitation, never from the form. */
export const InvitationSignUpSchema = z.object({
  token: invitationToken,
  name: displayNameField,
  password: passwordField,
});
export type InvitationSignUpInput = z.infer<typeof InvitationSignUpSchema>;

export const ClubActivityQuerySchema = z.object({
  before: z.iso.datetime({ offset: true }).optional(),
  limit: z.coerce.number().int().min(1).max(100).default(30),
});

/** Wire shapes. */
export interface ClubDto {
  id: string;
  name: string;
  description: string;
  requestsNeedApproval: boolean;
  memberCount: number;
  /** null when a site admin looks at a club they do not belong to */
  myRole: ClubRoleName | null;
  createdAt: string;
}

export interface ClubMemberDto {
  userId: string;
  name: string;
  /** only shown to owners and stewards */
  email: string | null;
  role: ClubRoleName;
  joinedAt: string;
}

export type InvitationStatus = 'pending' | 'accepted' | 'expired' | 'revoked';

export interface ClubInvitationDto {
  id: string;
  email: string;
  role: ClubRoleName;
  invitedByName: string | null;
  status: InvitationStatus;
  expiresAt: string;
  createdAt: string;
  acceptedAt: string | null;
}

export interface InvitationPreviewDto {
  clubId: string;
  clubName: string;
  clubDescription: string;
  invitedByName: string | null;
  email: string;
  role: ClubRoleName;
  expiresAt: string;
  /** true when an account with the invited e-mail exists: sign in instead of signing up */
  accountExists: boolean;
}
