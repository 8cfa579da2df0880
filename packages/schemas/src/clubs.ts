import { z } from 'zod';
import { emailField, displayNameField, passwordField } from './auth';
import { CULTURE_FORMS, type CultureForm } from './cultures';

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
  /** the `nextBefore` cursor of the previous page */
  before: z
    .string()
    .max(120)
    .regex(/^\d{4}-\d\d-\d\dT[\d:.]+Z\|[A-Za-z0-9_-]+$/, 'Not a page cursor')
    .optional(),
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

/* The club bank: listings, requests and handoffs */

const note = (max: number) => z.string().trim().max(max, `At most ${max} characters`).default('');

export const ClubListingParamsSchema = z.object({ clubId: rowId, listingId: rowId });
export const StrainRequestParamsSchema = z.object({ clubId: rowId, requestId: rowId });

export const ClubListingCreateSchema = z.object({
  cultureId: rowId,
  note: note(500),
});
export type ClubListingCreateInput = z.infer<typeof ClubListingCreateSchema>;

export const StrainRequestCreateSchema = z.object({
  listingId: rowId,
  message: note(1000),
  neededBy: z.iso.datetime({ offset: true, message: 'Give a date and time' }).optional(),
  wantedForm: z.enum(CULTURE_FORMS, { error: 'Choose a form from the list' }).optional(),
});
export type StrainRequestCreateInput = z.infer<typeof StrainRequestCreateSchema>;

export const StrainRequestRespondSchema = z
  .object({
    action: z.enum(['approve', 'accept', 'decline', 'propose'], {
      error: 'Choose approve, accept, decline or propose',
    }),
    note: note(1000),
    proposedAt: z.iso.datetime({ offset: true, message: 'Give a date and time' }).optional(),
  })
  .refine((v) => v.action !== 'propose' || v.proposedAt !== undefined, {
    path: ['proposedAt'],
    message: 'Say when instead',
  });
export type StrainRequestRespondInput = z.infer<typeof StrainRequestRespondSchema>;

export const StrainRequestReceiveSchema = z.object({
  locationLabel: z.string().trim().max(120, 'At most 120 characters').default(''),
  storageTempC: z.coerce
    .number()
    .min(-200, 'Below −200 °C is not a storage temperature')
    .max(40, 'Above 40 °C is not storage')
    .default(4),
});
export type StrainRequestReceiveInput = z.infer<typeof StrainRequestReceiveSchema>;

export interface ClubListingDto {
  id: string;
  cultureId: string;
  strainName: string;
  species: string | null;
  form: string;
  generation: number;
  state: string;
  suspect: boolean;
  keeper: { id: string; name: string };
  note: string;
  /** 0–1, today's projection from the keeper's records */
  projectedViability: number | null;
  canRequest: boolean;
  /** the viewer's own request for it still under way, if any */
  myRequest: { id: string; status: string } | null;
  /** units left when the culture is club-owned stock; null for a member's own culture */
  stock: { unit: ClubStockUnit; unitsLeft: number } | null;
  listedAt: string;
}

/** Statuses of a request still under way: not declined, received or taken back. */
export const LIVE_REQUEST_STATUSES = ['awaiting_approval', 'open', 'proposed', 'accepted'] as const;

export interface StrainRequestDto {
  id: string;
  listingId: string;
  cultureId: string;
  strainName: string;
  requester: { id: string; name: string };
  keeper: { id: string; name: string };
  message: string;
  neededBy: string | null;
  wantedForm: CultureForm | null;
  /** the culture is club stock: any steward answers, receipt takes one unit */
  clubStock: boolean;
  status: 'awaiting_approval' | 'open' | 'proposed' | 'accepted' | 'declined' | 'received' | 'cancelled';
  responseNote: string;
  proposedAt: string | null;
  receivedCultureId: string | null;
  createdAt: string;
}

/** What a line of the club's feed can say; the database enum `club_activity_kind` is built from this list. */
export const CLUB_ACTIVITY_KINDS = [
  'member_joined',
  'member_left',
  'strain_listed',
  'strain_withdrawn',
  'strain_requested',
  'request_answered',
  'handoff_received',
  'culture_quarantined',
  'stock_added',
  'stock_withdrawn',
  /** the member who asked took their request back before receiving anything */
  'request_withdrawn',
] as const;
export type ClubActivityKind = (typeof CLUB_ACTIVITY_KINDS)[number];

export interface ClubActivityDto {
  id: string;
  kind: ClubActivityKind;
  actorName: string | null;
  cultureId: string | null;
  requestId: string | null;
  data: Record<string, unknown>;
  createdAt: string;
}

/* Club-owned stock (the frozen library, slants) */

export const CLUB_STOCK_UNITS = ['vial', 'slant', 'plate', 'pack'] as const;
export type ClubStockUnit = (typeof CLUB_STOCK_UNITS)[number];

export const clubStockLimits = { unitsMax: 10000 } as const;

export const ClubStockParamsSchema = z.object({ clubId: rowId, cultureId: rowId });

/** A steward turns one of the cultures they keep into club stock of `units` identical units. */
export const ClubStockCreateSchema = z.object({
  cultureId: rowId,
  unit: z.enum(CLUB_STOCK_UNITS, { error: 'Choose vial, slant, plate or pack' }),
  units: z.coerce
    .number({ error: 'Give how many' })
    .int('Whole units only')
    .min(1, 'At least one')
    .max(clubStockLimits.unitsMax, `At most ${clubStockLimits.unitsMax}`),
  note: note(500),
});
export type ClubStockCreateInput = z.infer<typeof ClubStockCreateSchema>;

/** A steward sets the count after a stock-take (units made or found missing). */
export const ClubStockUpdateSchema = z.object({
  unitsLeft: z.coerce
    .number({ error: 'Give how many' })
    .int('Whole units only')
    .min(0, 'Not below zero')
    .max(clubStockLimits.unitsMax, `At most ${clubStockLimits.unitsMax}`),
});
export type ClubStockUpdateInput = z.infer<typeof ClubStockUpdateSchema>;

/** A steward takes one unit out for a member (themselves when no one is named). */
export const ClubStockWithdrawSchema = z.object({
  recipientUserId: rowId.optional(),
  locationLabel: z.string().trim().max(120, 'At most 120 characters').default(''),
  storageTempC: z.coerce
    .number({ error: 'Give a temperature' })
    .min(-200, 'Below −200 °C is not a storage temperature')
    .max(40, 'Above 40 °C is not storage')
    .default(4),
  note: note(500),
});
export type ClubStockWithdrawInput = z.infer<typeof ClubStockWithdrawSchema>;

export interface ClubStockDto {
  cultureId: string;
  listingId: string | null;
  strainName: string;
  form: CultureForm;
  generation: number;
  state: string;
  suspect: boolean;
  unit: ClubStockUnit;
  unitsLeft: number;
  storageTempC: number;
  /** the steward who holds it */
  keeper: { id: string; name: string };
  projectedViability: number | null;
  updatedAt: string;
}
