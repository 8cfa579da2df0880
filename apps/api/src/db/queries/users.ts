import { eq } from 'drizzle-orm';
import type { Db } from '../client';
import { users, type UserRow } from '../schema';

export async function findUserByEmail(db: Db, email: string): Promise<UserRow | undefined> {
  const [row] = await db.select().from(users).where(eq(users.email, email)).limit(1);
  return row;
}

export async function findUserById(db: Db, id: string): Promise<UserRow | undefined> {
  const [row] = await db.select().from(users).where(eq(users.id, id)).limit(1);
  return row;
}

/** Returns undefined when the e-mail is already taken. */
export async function insertUser(
  db: Db,
  values: { id: string; email: string; name: string; passwordHash: string; role?: 'user' | 'admin' },
): Promise<UserRow | undefined> {
  const [row] = await db.insert(users).values(values).onConflictDoNothing({ target: users.email }).returning();
  return row;
}

export async function updateUser(
  db: Db,
  id: string,
  values: Partial<
    Pick<UserRow, 'name' | 'unitSystem' | 'temperatureUnit' | 'gravityUnit' | 'timeZone' | 'passwordHash'>
  >,
): Promise<UserRow | undefined> {
  const [row] = await db
    .update(users)
    .set({ ...values, updatedAt: new Date() })
    .where(eq(users.id, id))
    .returning();
  return row;
}

export async function listUsers(db: Db, params: { limit: number; offset: number }) {
  return db.select().from(users).orderBy(users.createdAt, users.id).limit(params.limit).offset(params.offset);
}
