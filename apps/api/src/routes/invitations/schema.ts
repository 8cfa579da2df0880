export { InvitationLookupSchema, InvitationAcceptSchema, InvitationSignUpSchema } from '@barmkeep/schemas';
