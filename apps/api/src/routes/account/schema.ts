export { AccountPasswordChangeSchema, AccountUpdateSchema } from '@barmkeep/schemas';
