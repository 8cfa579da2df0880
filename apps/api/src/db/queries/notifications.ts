import { and, desc, eq, inArray, isNull, lt, sql } from 'drizzle-orm';
import type { Db } from '../client';
import {
  notificationPreferences,
  notifications,
  type NotificationInsert,
  type NotificationPreferencesRow,
  type NotificationRow,
} from '../schema';
import { newId, newSecretToken } from '../../lib/ids';

type Executor = Pick<Db, 'select' | 'insert' | 'update' | 'execute' | 'delete'>;

export type NewNotice = Omit<
  NotificationInsert,
  'id' | 'createdAt' | 'readAt' | 'emailState' | 'emailClaimedAt' | 'emailedAt' | 'digestId'
>;

/**
 * Inserts notices; one that exists already (same person, kind, subject and dedupe key) is left
 * alone. Returns only the rows that were new. Chunked so a large pass stays under the parameter limit.
 */
export async function insertNotices(db: Executor, notices: NewNotice[], now: Date): Promise<NotificationRow[]> {
  const inserted: NotificationRow[] = [];
  for (let i = 0; i < notices.length; i += 1000) {
    const chunk = notices.slice(i, i + 1000).map((n) => ({ ...n, id: newId(), createdAt: now }));
    const rows = await db
      .insert(notifications)
      .values(chunk)
      .onConflictDoNothing({
        target: [notifications.userId, notifications.kind, notifications.subjectId, notifications.dedupeKey],
      })
      .returning();
    inserted.push(...rows);
  }
  return inserted;
}

/**
 * The rule engine's insert: every notice of a pass as one JSON parameter per 5,000, expanded in
 * SQL (jsonb_to_recordset), ON CONFLICT DO NOTHING on the dedupe key. Returns the ids stored.
 */
export async function insertNoticesBulk(
  db: Executor,
  notices: NewNotice[],
  now: Date,
): Promise<{ id: string; userId: string }[]> {
  const out: { id: string; userId: string }[] = [];
  for (let i = 0; i < notices.length; i += 5000) {
    const chunk = notices.slice(i, i + 5000).map((n) => ({
      id: newId(),
      user_id: n.userId,
      kind: n.kind,
      subject_id: n.subjectId,
      dedupe_key: n.dedupeKey,
      title: n.title,
      body: n.body ?? '',
      link: n.link ?? '/',
      due_at: n.dueAt ? n.dueAt.toISOString() : null,
    }));
    const { rows } = await db.execute<{ id: string; user_id: string }>(sql`
      insert into notifications (id, user_id, kind, subject_id, dedupe_key, title, body, link, due_at, created_at)
      select r.id, r.user_id, r.kind, r.subject_id, r.dedupe_key, r.title, r.body, r.link, r.due_at, ${now}::timestamptz
      from jsonb_to_recordset(${JSON.stringify(chunk)}::jsonb) as r(id text, user_id text, kind text, subject_id text,
        dedupe_key text, title text, body text, link text, due_at timestamptz)
      on conflict (user_id, kind, subject_id, dedupe_key) do nothing
      returning id, user_id`);
    out.push(...rows.map((r) => ({ id: r.id, userId: r.user_id })));
  }
  return out;
}

export async function listNoticesForUser(
  db: Executor,
  params: { userId: string; unreadOnly: boolean; limit: number; before?: Date },
): Promise<NotificationRow[]> {
  const where = [eq(notifications.userId, params.userId)];
  if (params.unreadOnly) where.push(isNull(notifications.readAt));
  if (params.before) where.push(lt(notifications.createdAt, params.before));
  return db
    .select()
    .from(notifications)
    .where(and(...where))
    .orderBy(desc(notifications.createdAt), desc(notifications.id))
    .limit(params.limit);
}

export async function countUnreadNotices(db: Executor, userId: string): Promise<number> {
  const [row] = await db
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(notifications)
    .where(and(eq(notifications.userId, userId), isNull(notifications.readAt)));
  return row?.n ?? 0;
}

/** Marks the person's notices read (all of them when `ids` is undefined); returns how many changed. */
export async function markNoticesRead(
  db: Executor,
  params: { userId: string; ids?: string[]; now: Date },
): Promise<number> {
  const where = [eq(notifications.userId, params.userId), isNull(notifications.readAt)];
  if (params.ids) where.push(inArray(notifications.id, params.ids));
  const rows = await db
    .update(notifications)
    .set({ readAt: params.now })
    .where(and(...where))
    .returning({ id: notifications.id });
  return rows.length;
}

export async function findNoticeForUser(
  db: Executor,
  userId: string,
  id: string,
): Promise<NotificationRow | undefined> {
  const [row] = await db
    .select()
    .from(notifications)
    .where(and(eq(notifications.userId, userId), eq(notifications.id, id)))
    .limit(1);
  return row;
}

export async function findPreferences(db: Executor, userId: string): Promise<NotificationPreferencesRow | undefined> {
  const [row] = await db
    .select()
    .from(notificationPreferences)
    .where(eq(notificationPreferences.userId, userId))
    .limit(1);
  return row;
}

export async function findPreferencesByToken(
  db: Executor,
  token: string,
): Promise<NotificationPreferencesRow | undefined> {
  const [row] = await db
    .select()
    .from(notificationPreferences)
    .where(eq(notificationPreferences.emailToken, token))
    .limit(1);
  return row;
}

/** Makes sure each person has a preferences row (with its e-mail token); returns the rows. */
export async function ensurePreferences(db: Executor, userIds: string[]): Promise<NotificationPreferencesRow[]> {
  if (userIds.length === 0) return [];
  const unique = [...new Set(userIds)];
  await db
    .insert(notificationPreferences)
    .values(unique.map((userId) => ({ userId, emailToken: newSecretToken() })))
    .onConflictDoNothing({ target: notificationPreferences.userId });
  return db.select().from(notificationPreferences).where(inArray(notificationPreferences.userId, unique));
}

export type PreferencesPatch = Partial<
  Pick<
    NotificationPreferencesRow,
    | 'emailDelivery'
    | 'digestHour'
    | 'viabilityThresholdPct'
    | 'warnDays'
    | 'generationLimit'
    | 'stepLeadHours'
    | 'mutedKinds'
  >
>;

export async function updatePreferences(
  db: Executor,
  userId: string,
  patch: PreferencesPatch,
  now: Date,
): Promise<NotificationPreferencesRow> {
  await ensurePreferences(db, [userId]);
  const [row] = await db
    .update(notificationPreferences)
    .set({ ...patch, updatedAt: now })
    .where(eq(notificationPreferences.userId, userId))
    .returning();
  return row!;
}
