import type { AccountPasswordChangeInput, AccountUpdateInput } from '@barmkeep/schemas';
import { findUserById, updateUser } from '../db/queries/users';
import { deleteResetTokensForUser } from '../db/queries/passwordResets';
import { notFound, validationFailed } from '../lib/errors';
import { hashPassword, verifyPassword } from '../lib/password';
import type { ServiceContext } from './context';

export async function updateAccount(ctx: ServiceContext, userId: string, input: AccountUpdateInput) {
  const user = await updateUser(ctx.db, userId, input);
  if (!user) throw notFound('Your account');
  return user;
}

/**
 * "Sign out everywhere": a new password ends every session of the account (other browsers, a
 * lost phone) and burns open reset links; the browser that made the change gets a fresh session.
 */
export async function changePassword(ctx: ServiceContext, userId: string, input: AccountPasswordChangeInput) {
  const user = await findUserById(ctx.db, userId);
  if (!user) throw notFound('Your account');
  if (!(await verifyPassword(user.passwordHash, input.currentPassword))) {
    throw validationFailed({ 'body.currentPassword': ['This is not your current password'] });
  }
  await updateUser(ctx.db, userId, { passwordHash: await hashPassword(input.newPassword) });
  await deleteResetTokensForUser(ctx.db, userId);
  await ctx.lucia.invalidateUserSessions(userId);
  return ctx.lucia.createSession(userId, {});
}
