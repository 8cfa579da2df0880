import type { AuthSignInInput, AuthSignUpInput, PasswordResetConfirmInput } from '@barmkeep/schemas';
import { conflict, invalidCredentials, badRequest } from '../lib/errors';
import { newId, newSecretToken, sha256 } from '../lib/ids';
import { dummyPasswordHash, hashPassword, verifyPassword } from '../lib/password';
import { findUserByEmail, insertUser, updateUser } from '../db/queries/users';
import { consumeResetToken, deleteResetTokensForUser, insertResetToken } from '../db/queries/passwordResets';
import { passwordResetMail } from '../mail/templates';
import type { ServiceContext } from './context';

export const RESET_TOKEN_MINUTES = 30;

export async function signUp(ctx: ServiceContext, input: AuthSignUpInput) {
  const passwordHash = await hashPassword(input.password);
  const user = await insertUser(ctx.db, { id: newId(), email: input.email, name: input.name, passwordHash });
  if (!user) {
    throw conflict('email_taken', 'An account with this e-mail already exists', {
      'body.email': ['An account with this e-mail already exists'],
    });
  }
  const session = await ctx.lucia.createSession(user.id, {});
  return { user, session };
}

/** Wrong password and unknown e-mail give the same answer, after the same amount of work. */
export async function signIn(ctx: ServiceContext, input: AuthSignInInput, previousSessionId?: string) {
  const user = await findUserByEmail(ctx.db, input.email);
  const ok = await verifyPassword(user?.passwordHash ?? (await dummyPasswordHash()), input.password);
  if (!user || !ok) throw invalidCredentials();
  // Rotation: whatever session the browser carried before is ended, a fresh id is issued.
  if (previousSessionId) await ctx.lucia.invalidateSession(previousSessionId);
  const session = await ctx.lucia.createSession(user.id, {});
  return { user, session };
}

export async function signOut(ctx: ServiceContext, sessionId: string) {
  await ctx.lucia.invalidateSession(sessionId);
}

/** Always succeeds from the caller's point of view, so it cannot be used to probe for accounts. */
export async function requestPasswordReset(ctx: ServiceContext, email: string) {
  const user = await findUserByEmail(ctx.db, email);
  if (!user) return;
  const token = newSecretToken();
  const expiresAt = new Date(ctx.now().getTime() + RESET_TOKEN_MINUTES * 60_000);
  await insertResetToken(ctx.db, { tokenHash: sha256(token), userId: user.id, expiresAt });
  const link = `${ctx.appUrl}/reset-password?token=${encodeURIComponent(token)}`;
  await ctx.mailer.send(
    passwordResetMail({ to: user.email, name: user.name, link, validMinutes: RESET_TOKEN_MINUTES }),
  );
}

/** Sets the new password, ends every session of the account and burns all its reset links. */
export async function confirmPasswordReset(ctx: ServiceContext, input: PasswordResetConfirmInput) {
  const userId = await consumeResetToken(ctx.db, sha256(input.token), ctx.now());
  if (!userId) throw badRequest('This reset link has expired or was already used. Ask for a new one.', 'invalid_token');
  await updateUser(ctx.db, userId, { passwordHash: await hashPassword(input.password) });
  await deleteResetTokensForUser(ctx.db, userId);
  await ctx.lucia.invalidateUserSessions(userId);
}
