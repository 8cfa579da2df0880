export { AccountUpdateSchema } from '@barmkeep/schemas';
