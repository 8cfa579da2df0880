import type { AccountUpdateInput } from '@barmkeep/schemas';
import { updateUser } from '../db/queries/users';
import { notFound } from '../lib/errors';
import type { ServiceContext } from './context';

export async function updateAccount(ctx: ServiceContext, userId: string, input: AccountUpdateInput) {
  const user = await updateUser(ctx.db, userId, input);
  if (!user) throw notFound('Your account');
  return user;
}
