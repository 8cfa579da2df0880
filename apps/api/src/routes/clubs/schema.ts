export {
  ClubCreateSchema,
  ClubUpdateSchema,
  ClubParamsSchema,
  ClubMemberParamsSchema,
  ClubMemberUpdateSchema,
  ClubInvitationParamsSchema,
  ClubInvitationCreateSchema,
} from '@barmkeep/schemas';
