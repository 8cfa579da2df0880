import { and, eq, gt, lt } from 'drizzle-orm';
import type { Db } from '../client';
import { passwordResetTokens } from '../schema';

export async function insertResetToken(db: Db, values: { tokenHash: string; userId: string; expiresAt: Date }) {
  await db.insert(passwordResetTokens).values(values);
}

/** Take a token exactly once: delete it and return its user when it was valid at `now`. */
export async function consumeResetToken(db: Db, tokenHash: string, now: Date): Promise<string | undefined> {
  const [row] = await db
    .delete(passwordResetTokens)
    .where(and(eq(passwordResetTokens.tokenHash, tokenHash), gt(passwordResetTokens.expiresAt, now)))
    .returning({ userId: passwordResetTokens.userId });
  return row?.userId;
}

export async function deleteResetTokensForUser(db: Db, userId: string) {
  await db.delete(passwordResetTokens).where(eq(passwordResetTokens.userId, userId));
}

export async function deleteExpiredResetTokens(db: Db, now: Date) {
  await db.delete(passwordResetTokens).where(lt(passwordResetTokens.expiresAt, now));
}
